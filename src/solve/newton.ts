/**
 * Damped Newton iteration on a network system: sparse Jacobian, step limits that keep pressures
 * and temperatures positive, and a backtracking line search on the scaled residual norm.
 */

import {
  norm as euclideanNorm,
  reuseOfFactorsPays,
  solveWithFrozenFactors,
} from "./frozen-factor-gmres.js";
import {
  evaluateSystem,
  type NetworkSystem,
  networkThroughput,
  type SystemEvaluation,
} from "./network-system.js";
import { type BlockLuFactorization, factorBlockMatrix, solveFactored } from "./sparse-block-lu.js";

/** Options of {@link newtonSolve}. */
export interface NewtonOptions {
  /** Largest scaled residual accepted as converged. */
  tolerance: number;
  /** Iterations before giving up. */
  maxIterations: number;
  /** Stop when `now()` passes this time [ms] (checked once per iteration). */
  deadline?: number;
  /** Clock for the deadline (injected so the core reads no clock of its own unless asked). */
  now?: () => number;
  /**
   * Factors of a Jacobian of the same structure near this solve's start (the final one of a
   * solved case close to this one): the first steps are solved by GMRES with them as the
   * preconditioner, until it no longer reaches a step's tolerance in a few iterations.
   */
  startFactors?: BlockLuFactorization;
}

/** What a Newton run ended with. */
export interface NewtonOutcome {
  /** Scaled unknowns of the best iterate (the last one when converged). */
  x: Float64Array;
  converged: boolean;
  iterations: number;
  /** Largest scaled mass and energy residuals at x. */
  massResidual: number;
  /** Largest enthalpy imbalance of a junction over W T_ref. */
  energyResidual: number;
  /** Largest temperature error of a junction over T_ref (the energy rows as Newton sees them). */
  temperatureResidual: number;
  /** The system evaluated at x (flows, choke flags, throughput). */
  evaluation: SystemEvaluation;
  /** Why it stopped when not converged. */
  stopReason?: "iterations" | "time" | "stalled" | "non-finite";
  /** Number of system evaluations (each one pipe relation per edge), line-search trials included. */
  evaluations: number;
  /** The factors the last step was solved with (undefined when no step was taken). */
  factors?: BlockLuFactorization;
}

/** Largest fraction by which one step may change a pressure or a temperature. */
const MAX_PRESSURE_CHANGE = 0.5;
const MAX_TEMPERATURE_CHANGE = 0.3;
/**
 * The most the mass tolerance gives way to the flows' round-off (1e-6 of the throughput): a
 * network whose flows cannot be resolved better than that in double precision (a huge pipe in
 * creeping flow beside small ones) is reported not converged rather than solved loosely.
 */
export const ROUND_OFF_CEILING = 1e-6;

/** Largest accepted temperature error of a junction, relative to T_ref (0.3 mK at 300 K). */
export const TEMPERATURE_TOLERANCE = 1e-6;
/** Armijo constant and smallest step of the line search. */
const SUFFICIENT_DECREASE = 1e-4;
const MIN_STEP = 1e-6;

/**
 * Where reusing factors pays (large meshed networks, `reuseOfFactorsPays`), a Newton step is
 * first solved by GMRES preconditioned with the factors of an earlier Jacobian
 * (src/solve/frozen-factor-gmres.ts) and the Jacobian is factored again only when GMRES does not
 * reach the step's tolerance in FROZEN_STEP_ITERATIONS; small networks and trees factor every
 * Jacobian (it costs less than the edge evaluations there) and solve each step exactly. A solve
 * given start factors (a warm start from a solved case nearby, `NewtonOptions.startFactors`)
 * solves its steps with them the same way whatever the network, until GMRES fails once.
 *
 * The step's tolerance (relative residual of J s = -R) follows Eisenstat and Walker's second
 * choice, eta = 0.9 (|R_k| / |R_k-1|)^2, within [1e-10, 1e-3]: a loose step while far from the
 * solution, where Newton's model is poor anyway, and an exact one (1e-10) as the residual falls,
 * which keeps Newton's fast final convergence. Convergence is judged on the residuals alone, so
 * the solution does not depend on it. Source: S. C. Eisenstat and H. F. Walker, "Choosing the
 * forcing terms in an inexact Newton method", SIAM J. Sci. Comput. 17 (1996) 16-32, choice 2
 * (there with a safeguard; here the ceiling of 1e-3 plays its part), with a floor of what
 * convergence needs (FINISH_SHARE, {@link stepTolerance}).
 */
const FROZEN_STEP_ITERATIONS = 12;
/**
 * The step's tolerance is never tighter than needed to converge: a linear residual of
 * FINISH_SHARE of the tolerance (2-norm of J s + R) leaves every row within the tolerance but
 * for the step's second-order error, which is far smaller by then. Without this floor the last
 * step of the 100,000-edge grid asked for 7e-6 where the ceiling, 1e-3, would have done (the
 * floor there is 0.08), and GMRES gave up and the Jacobian was factored once more (0.9 s of
 * 12 s). The safeguard against oversolving of C. T. Kelley, Iterative Methods for Linear and
 * Nonlinear Equations, SIAM, 1995, section 6.3 (eta >= 0.5 tau / |F(x_k)|; the reference from
 * memory).
 */
const FINISH_SHARE = 0.5;
const STEP_TOLERANCE_CEILING = 1e-3;
const STEP_TOLERANCE_FLOOR = 1e-10;

/** Kept factors of an earlier Jacobian and the step tolerance of the next solve. */
interface StepSolver {
  /** Factors that later steps are solved with by GMRES (where reusing them pays). */
  factors: BlockLuFactorization | undefined;
  /**
   * The last factors where they are not reused: their storage is lent to the next
   * factorization, so that a large network does not allocate its factors afresh every
   * iteration (40 MB at 100,000 edges; the garbage collector ran a full collection for each).
   */
  spare: BlockLuFactorization | undefined;
  /** The factors the last step was solved with. */
  last: BlockLuFactorization | undefined;
  tolerance: number;
}

/**
 * The Newton step -J^-1 R: with the kept factors of an earlier Jacobian when they still do (large
 * networks), otherwise by factoring J (and keeping those factors for the next steps).
 */
function newtonStep(
  system: NetworkSystem,
  jacobian: Float64Array,
  rhs: Float64Array,
  solver: StepSolver,
): Float64Array {
  if (solver.factors !== undefined) {
    const frozen = solveWithFrozenFactors(
      jacobian,
      solver.factors,
      rhs,
      solver.tolerance,
      FROZEN_STEP_ITERATIONS,
    );
    if (frozen.x !== undefined) {
      solver.last = solver.factors;
      return frozen.x;
    }
  }
  const factors = factorBlockMatrix(system.structure, jacobian, solver.factors ?? solver.spare);
  if (reuseOfFactorsPays(system.structure)) solver.factors = factors;
  else {
    // Given start factors that no longer do: factor every Jacobian from here on.
    solver.factors = undefined;
    solver.spare = factors;
  }
  solver.last = factors;
  return solveFactored(factors, rhs);
}

/**
 * The relative tolerance of a Newton step's linear solve: Eisenstat and Walker's choice 2,
 * 0.9 (|R_k| / |R_k-1|)^2 (merit norms), raised to what convergence needs,
 * FINISH_SHARE x min(tolerance, |R_k|) / |rhs| (|rhs| the 2-norm of the right-hand side -R the
 * linear solve is relative to), and kept within [STEP_TOLERANCE_FLOOR, STEP_TOLERANCE_CEILING].
 */
export function stepTolerance(
  residualNorm: number,
  previousNorm: number,
  rhsNorm: number,
  tolerance: number,
): number {
  const eta = 0.9 * (residualNorm / previousNorm) ** 2;
  // Half the tolerance, or half the merit norm once that is below it: the linear residual then
  // stays below the merit norm in any weighting of the rows, so the step still descends.
  const enough = (FINISH_SHARE * Math.min(tolerance, residualNorm)) / rhsNorm;
  return Math.min(STEP_TOLERANCE_CEILING, Math.max(STEP_TOLERANCE_FLOOR, eta, enough));
}

function largest(residual: Float64Array, offset: number): number {
  let value = 0;
  for (let i = offset; i < residual.length; i += 2)
    value = Math.max(value, Math.abs(residual[i] as number));
  return value;
}

/**
 * Every junction's mass residual within the tolerance, or within the round-off of its flows
 * when that is larger (a flow from a pressure drop of 1e-9 of the pressure is known to 1e-7).
 */
function massBalanced(evaluation: SystemEvaluation, tolerance: number): boolean {
  const residual = evaluation.residual;
  for (let j = 0; 2 * j < residual.length; j++) {
    const allowed = Math.max(
      tolerance,
      Math.min(evaluation.massNoise[j] as number, ROUND_OFF_CEILING),
    );
    if (!(Math.abs(residual[2 * j] as number) <= allowed)) return false;
  }
  return true;
}

/** Largest |enthalpy imbalance| of a junction over W T_ref. */
function largestEnthalpyImbalance(evaluation: SystemEvaluation, temperatureScale: number): number {
  const residual = evaluation.residual;
  const enthalpyScale = evaluation.throughput * temperatureScale;
  let value = 0;
  for (let j = 0; 2 * j < residual.length; j++) {
    const imbalance =
      ((residual[2 * j + 1] as number) * (evaluation.energyScale[j] as number)) / enthalpyScale;
    value = Math.max(value, Math.abs(imbalance));
  }
  return value;
}

/**
 * Merit of the line search: the sum of squares of the mass residuals over W and of the enthalpy
 * imbalances over W T_ref. The energy rows of the Newton system are scaled per junction (a
 * temperature error), which weighs a junction with a trickle of flow like a main one; for the
 * merit each junction counts by the enthalpy it carries, so that the ill-conditioned mixing
 * temperature of a near-stagnant junction cannot veto a step that balances the network.
 */
function merit(evaluation: SystemEvaluation, temperatureScale: number): number {
  const residual = evaluation.residual;
  const enthalpyScale = evaluation.throughput * temperatureScale;
  let sum = 0;
  for (let j = 0; 2 * j < residual.length; j++) {
    const mass = residual[2 * j] as number;
    const energy =
      ((residual[2 * j + 1] as number) * (evaluation.energyScale[j] as number)) / enthalpyScale;
    sum += mass * mass + energy * energy;
  }
  return sum;
}

function allFinite(values: Float64Array): boolean {
  for (let i = 0; i < values.length; i++) if (!Number.isFinite(values[i] as number)) return false;
  return true;
}

/** Run damped Newton from x0 (scaled unknowns). */
export function newtonSolve(
  system: NetworkSystem,
  x0: Float64Array,
  options: NewtonOptions,
): NewtonOutcome {
  let x: Float64Array = Float64Array.from(x0);
  let evaluations = 1;
  let evaluation = evaluateSystem(system, x, true);
  let best = { x, evaluation, norm: merit(evaluation, system.temperatureScale) };
  let iterations = 0;
  const solver: StepSolver = {
    factors: options.startFactors,
    spare: undefined,
    last: undefined,
    tolerance: STEP_TOLERANCE_CEILING,
  };
  // States no longer needed (neither the current iterate nor the best one): their arrays are
  // lent to the next trials (see evaluateSystem's `retired`).
  const spares: IterateState[] = [];
  const retire = (state: IterateState): void => {
    if (state.evaluation === evaluation || state.evaluation === best.evaluation) return;
    if (!spares.some((spare) => spare.evaluation === state.evaluation)) spares.push(state);
  };
  const trialState = (alpha: number, step: Float64Array, spare?: IterateState): IterateState => {
    const trial = spare?.x ?? new Float64Array(x.length);
    for (let i = 0; i < x.length; i++) trial[i] = (x[i] as number) + alpha * (step[i] as number);
    // With the Jacobian: if the trial is accepted, it is the next iterate as it stands.
    const trialEvaluation = evaluateSystem(
      system,
      trial,
      true,
      evaluation.throughput,
      spare?.evaluation,
    );
    evaluations++;
    return { x: trial, evaluation: trialEvaluation };
  };
  const rhs = new Float64Array(x.length);
  let previousNorm = Number.NaN;
  const outcome = (converged: boolean, stopReason?: NewtonOutcome["stopReason"]): NewtonOutcome => {
    const chosen = converged ? { x, evaluation } : best;
    const result: NewtonOutcome = {
      x: chosen.x,
      converged,
      iterations,
      massResidual: largest(chosen.evaluation.residual, 0),
      energyResidual: largestEnthalpyImbalance(chosen.evaluation, system.temperatureScale),
      temperatureResidual: largest(chosen.evaluation.residual, 1),
      evaluation: chosen.evaluation,
      evaluations,
    };
    if (solver.last !== undefined) result.factors = solver.last;
    if (stopReason !== undefined) result.stopReason = stopReason;
    return result;
  };

  for (;;) {
    if (!allFinite(evaluation.residual)) return outcome(false, "non-finite");
    // Converged when the residuals at this state's own throughput meet the tolerance.
    // Converged: mass and enthalpy balances to the tolerance (over W and W T_ref), and every
    // junction temperature to TEMPERATURE_TOLERANCE or better. The temperature test holds the
    // junctions with little or no flow, whose enthalpy imbalance is small whatever their
    // temperature; it is not tighter, because where two trickles of different temperature mix,
    // the flows themselves are known only to about 1e-7 (they follow from pressure differences
    // of 1e-9 of the pressure), and so is their mixing temperature.
    if (
      massBalanced(evaluation, options.tolerance) &&
      largestEnthalpyImbalance(evaluation, system.temperatureScale) <= options.tolerance &&
      largest(evaluation.residual, 1) <= Math.max(options.tolerance, TEMPERATURE_TOLERANCE)
    ) {
      return outcome(true);
    }
    if (iterations >= options.maxIterations) return outcome(false, "iterations");
    if (
      options.deadline !== undefined &&
      options.now !== undefined &&
      options.now() > options.deadline
    ) {
      return outcome(false, "time");
    }
    iterations++;

    const jacobian = evaluation.jacobian as Float64Array;
    for (let i = 0; i < rhs.length; i++) rhs[i] = -(evaluation.residual[i] as number);
    const residualNorm = Math.sqrt(merit(evaluation, system.temperatureScale));
    if (Number.isFinite(previousNorm) && previousNorm > 0) {
      solver.tolerance = stepTolerance(
        residualNorm,
        previousNorm,
        euclideanNorm(rhs),
        options.tolerance,
      );
    }
    previousNorm = residualNorm;
    const step = newtonStep(system, jacobian, rhs, solver);
    if (!allFinite(step)) return outcome(false, "non-finite");

    // Step limits. Pressures are strongly coupled: the whole step is shortened so that none
    // changes by more than a set fraction. A temperature's own step is clipped alone: a junction
    // whose few inflows are reversing can ask for a large change of its mixing temperature
    // without that holding back the rest of the network.
    let limit = 1;
    for (let j = 0; j < system.junctionCount; j++) {
      const p = 1 + (x[2 * j] as number); // p / p_ref,j
      const dp = step[2 * j] as number;
      if (Math.abs(dp) > MAX_PRESSURE_CHANGE * p) {
        limit = Math.min(limit, (MAX_PRESSURE_CHANGE * p) / Math.abs(dp));
      }
      const t = x[2 * j + 1] as number;
      const largestChange = MAX_TEMPERATURE_CHANGE * t;
      const dt = step[2 * j + 1] as number;
      if (Math.abs(dt) > largestChange) step[2 * j + 1] = dt > 0 ? largestChange : -largestChange;
    }

    // Backtracking line search on 0.5 |R|^2 with the mass scale of this iteration held fixed.
    const norm = merit(evaluation, system.temperatureScale);
    let alpha = limit;
    let accepted: IterateState | undefined;
    let rejected = spares.pop();
    while (alpha >= MIN_STEP) {
      const trial = trialState(alpha, step, rejected);
      const trialNorm = merit(trial.evaluation, system.temperatureScale);
      if (Number.isFinite(trialNorm) && trialNorm <= (1 - 2 * SUFFICIENT_DECREASE * alpha) * norm) {
        accepted = trial;
        rejected = undefined;
        break;
      }
      rejected = trial;
      alpha *= 0.5;
    }
    if (accepted === undefined) {
      // No decrease along the Newton direction: take one short step anyway to leave a kink of
      // the residual (a choke or flow-reversal point), if it keeps every state positive and
      // lowers the residual; otherwise stop.
      const alphaShort = Math.min(limit, 1e-3);
      for (let i = 0; i < x.length; i++) {
        const value = (x[i] as number) + alphaShort * (step[i] as number);
        if (!((i % 2 === 0 ? 1 + value : value) > 0)) return outcome(false, "stalled");
      }
      const trial = trialState(alphaShort, step, rejected);
      rejected = undefined;
      if (!(merit(trial.evaluation, system.temperatureScale) < norm))
        return outcome(false, "stalled");
      accepted = trial;
    }
    if (rejected !== undefined) spares.push(rejected);
    const previous: IterateState = { x, evaluation };
    const previousBest = best;
    x = accepted.x;
    // Re-evaluate only if the mass scale moved (the throughput follows the reservoir flows).
    // The trial was scaled by the old throughput; bring its mass rows to this state's own.
    evaluation = withOwnThroughput(system, accepted.evaluation);
    const currentNorm = merit(evaluation, system.temperatureScale);
    if (currentNorm < best.norm || !Number.isFinite(best.norm))
      best = { x, evaluation, norm: currentNorm };
    retire(previous);
    retire(previousBest);
  }
}

/** An iterate and the system evaluated there. */
interface IterateState {
  x: Float64Array;
  evaluation: SystemEvaluation;
}

/**
 * The evaluation, which the caller alone holds, with its mass rows (residuals and Jacobian)
 * rescaled in place to the throughput of its own state. Mass rows are linear in 1/W; the energy
 * rows depend on W only through the no-flow weight, by a relative (eps W)^2 that is below
 * rounding.
 */
function withOwnThroughput(system: NetworkSystem, evaluation: SystemEvaluation): SystemEvaluation {
  const own = networkThroughput(system, evaluation.nodeNetOutflow);
  if (own === evaluation.throughput) return evaluation;
  const factor = evaluation.throughput / own;
  const residual = evaluation.residual;
  for (let i = 0; i < residual.length; i += 2) residual[i] = (residual[i] as number) * factor;
  const jacobian = evaluation.jacobian;
  if (jacobian !== undefined) {
    for (let b = 0; b < jacobian.length; b += 4) {
      jacobian[b] = (jacobian[b] as number) * factor;
      jacobian[b + 1] = (jacobian[b + 1] as number) * factor;
    }
  }
  evaluation.throughput = own;
  return evaluation;
}
