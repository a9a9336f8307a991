/**
 * The whole solve: document -> checked document -> model -> Newton (with continuation on the
 * demands as a rescue) -> results with an independent balance check.
 */
import type { CheckedDocument } from "../input/document-types.js";
import { InputError } from "../input/issues.js";
import { checkedDocumentOrThrow } from "../input/read-document.js";
import { buildNetwork, type NetworkModel } from "../model/build-network.js";
import { PipeFlowEvaluation } from "../physics/pipe-flow.js";
import { designWarnings, resultsAtState } from "../results/build-results.js";
import type { NetworkResult, NoSolutionDiagnosis, SolverWarning } from "../results/result-types.js";
import { reuseOfStartFactorsPays } from "./frozen-factor-gmres.js";
import { initialGuess } from "./initial-guess.js";
import {
  createNetworkSystem,
  edgeEndsAt,
  emptyEdgeEnds,
  evaluateEdgeAt,
  evaluateSystem,
  handOverEdgeStarts,
  type NetworkSystem,
  pressureUnknown,
  type StructureHolder,
  withPressureReferences,
} from "./network-system.js";
import {
  type NewtonOptions,
  type NewtonOutcome,
  newtonSolve,
  ROUND_OFF_CEILING,
} from "./newton.js";

/** Options of {@link solveNetwork}. */
export interface SolveOptions {
  /**
   * Stop after this many milliseconds of wall time, returning the best iterate marked not
   * converged. Overrides `settings.timeLimit` of the document. The time counts from when the
   * checked document is handed to the solver: building the model, the first guess, Newton and
   * the rescue; not reading and checking the document, nor assembling the results.
   * @defaultValue no limit
   */
  timeLimitMs?: number;
  /**
   * Clock in milliseconds for the time limit. @defaultValue `performance.now` when a time limit
   * is set; no clock is read otherwise
   */
  now?: () => number;
  /**
   * Start from a previous result of the same network (warm start): its junction pressures and
   * temperatures are the first iterate.
   */
  initialResult?: Pick<NetworkResult, "nodes">;
  /**
   * What consecutive solves of one network layout share (see {@link SolveReuse}): pass the same
   * object to each of them.
   */
  reuse?: SolveReuse;
}

/**
 * Kept by a caller between solves of one network layout (the same nodes and edges with other
 * values: an app that solves again after a demand, a supply pressure or a pipe size changed, a
 * script that loops over cases) and passed to each of them as `reuse`. The solves then share
 * the analysis of the sparse Newton matrix (its fill-reducing ordering and symbolic
 * factorization); a solve that starts from the result before (`initialResult`) also takes each
 * edge's last inner solution and, on large meshed networks, the factors the last converged
 * solve's Newton steps were solved with. A solve from the first guess gives the same numbers as
 * without it, bit for bit; a warm-started one agrees with the same warm start without it to the
 * solver tolerance. A network of another layout is solved as without it and leaves its own
 * analysis there. For one solve at a time: solves running at once each need their own.
 *
 * @example
 * const reuse = new SolveReuse();
 * let result = solveNetwork(document, { reuse });
 * // ... a demand changes ...
 * result = solveNetwork(changedDocument, { reuse, initialResult: result });
 */
export class SolveReuse {
  /** The solver's own records, read and written by machnet alone (see heldBy). */
  // biome-ignore lint/correctness/noUnusedPrivateClassMembers: read by heldBy, outside the class.
  private readonly held: StructureHolder = {};
}

/** The records of a SolveReuse (TypeScript's element access reaches a private field). */
export function heldBy(reuse: SolveReuse): StructureHolder {
  // biome-ignore lint/complexity/useLiteralKeys: `held` is private; element access is the way in.
  return reuse["held"];
}

/**
 * Options of the solves inside machnet (studies, design questions): {@link SolveOptions} and a
 * holder in which consecutive solves of one network layout share their sparse structure (a
 * {@link SolveReuse}'s records; `reuse`, when given, takes precedence).
 */
export interface InternalSolveOptions extends SolveOptions {
  structureHolder?: StructureHolder;
}

/** Thrown when the solver's own independent check of a "converged" state fails: a defect. */
export class InternalCheckError extends Error {
  constructor(message: string) {
    super(`internal error: ${message}`);
    this.name = "InternalCheckError";
  }
}

/** Tolerance of the independent check, as a multiple of the solver tolerance. */
const CHECK_MARGIN = 100;
/** Largest accepted mismatch of a recomputed exit pressure, relative. */
const EXIT_PRESSURE_TOLERANCE = 1e-7;

/**
 * Solve a network document (a parsed JSON value, an object built in code, or JSON text).
 *
 * Throws {@link InputError} when the document is invalid (every problem with its JSON Pointer).
 * A solve that does not converge, or a network with no solution, is a result with
 * `converged: false` and a `status` and `diagnosis` that say why.
 *
 * @example
 * const result = solveNetwork({
 *   gas: { preset: "air" },
 *   nodes: [
 *     { id: "SUPPLY", kind: "reservoir", pressure: "7 bar(g)", temperature: "20 degC" },
 *     { id: "TOOL", kind: "junction", demand: "0.2 kg/s" },
 *   ],
 *   edges: [{ id: "P1", kind: "pipe", from: "SUPPLY", to: "TOOL", length: "40 m", diameter: "40.9 mm" }],
 * });
 * result.nodes[1].pressure; // Pa absolute at TOOL
 */
export function solveNetwork(document: unknown, options: SolveOptions = {}): NetworkResult {
  if (options.reuse !== undefined && !(options.reuse instanceof SolveReuse)) {
    throw new TypeError(
      `options.reuse: expected a SolveReuse (made by new SolveReuse()), got ${typeof options.reuse === "object" ? "another object" : typeof options.reuse}`,
    );
  }
  const checked = checkedDocumentOrThrow(document);
  return solveCheckedDocument(checked, options);
}

/**
 * Newton's options with start factors. Written out rather than spread: a spread copy's hidden
 * class depends on whether the engine runs the code optimized, and code optimized on the
 * options of earlier solves was thrown away on a later one's ("wrong map" deoptimizations).
 */
function newtonOptionsWith(
  options: NewtonOptions,
  startFactors: NonNullable<NewtonOptions["startFactors"]>,
): NewtonOptions {
  return {
    tolerance: options.tolerance,
    maxIterations: options.maxIterations,
    deadline: options.deadline,
    now: options.now,
    startFactors,
  };
}

/** Build the model of a checked document or throw the topology issues. */
export function modelOf(checked: CheckedDocument): NetworkModel {
  const built = buildNetwork(checked);
  if (!built.ok) throw new InputError(built.issues);
  return built.model;
}

/** Solve a document that has already been read and checked. */
export function solveCheckedDocument(
  checked: CheckedDocument,
  options: InternalSolveOptions = {},
): NetworkResult {
  return solveWithState(checked, options).result;
}

/** A solve with the solver's own state, for callers inside machnet (sensitivities, studies). */
export interface SolvedState {
  result: NetworkResult;
  /** The network's system (structure, elements, warm starts). */
  system: NetworkSystem;
  /** Scaled unknowns of the final state (2 per junction: p / pScale - 1, T / TScale). */
  x: Float64Array;
}

/** Solve a checked document and keep the solver's state (internal API). */
export function solveWithState(
  checked: CheckedDocument,
  options: InternalSolveOptions = {},
): SolvedState {
  const settings = checked.settings;
  const limitMs =
    options.timeLimitMs ??
    (settings.timeLimit !== undefined ? 1000 * settings.timeLimit : undefined);
  const now = limitMs !== undefined ? (options.now ?? (() => performance.now())) : undefined;
  // The budget starts before the model is built: building, the sparse structure and the first
  // guess count against it (reading the document does not: its time limit is not known before).
  // Every property written out, not spread: see newtonOptionsWith.
  const newtonOptions: NewtonOptions = {
    tolerance: settings.tolerance,
    maxIterations: settings.maxIterations,
    deadline: limitMs !== undefined && now !== undefined ? now() + limitMs : undefined,
    now,
    startFactors: undefined,
  };
  const model = modelOf(checked);
  const holder =
    (options.reuse !== undefined ? heldBy(options.reuse) : undefined) ?? options.structureHolder;
  const built = createNetworkSystem(model, holder);
  const fromResult = options.initialResult
    ? stateFromResult(built, options.initialResult)
    : undefined;
  // Only a warm start takes what the solve before left (StructureHolder); every solve leaves
  // its edge warm starts for the next.
  if (holder !== undefined) handOverEdgeStarts(built, holder, fromResult !== undefined);
  const guess = fromResult ?? initialGuess(built);
  // Each junction's pressure unknown is then its offset from the highest first-guess pressure of
  // its group of close junctions (defect B3), fixed for this Newton run (a continuation takes
  // its own, and the result is built in the system whose state it is).
  const referenced = withPressureReferences(built, guess);
  let system = referenced.system;
  const start = referenced.x;
  // A warm start from a solved case of the same layout: the factors its last steps were solved
  // with precondition these steps (StructureHolder).
  const startFactors =
    fromResult !== undefined && holder?.factors?.structure === built.structure
      ? holder.factors
      : undefined;
  let outcome = newtonSolve(
    system,
    start,
    startFactors !== undefined ? newtonOptionsWith(newtonOptions, startFactors) : newtonOptions,
  );
  let iterations = outcome.iterations;
  const warnings: SolverWarning[] = checked.notes.map((note) => ({
    code: "bare-pressure-unit-absolute",
    message: `${note.path}: ${note.message}`,
  }));
  let diagnosis: NoSolutionDiagnosis | undefined;
  let status: NetworkResult["status"] = outcome.converged ? "converged" : "not-converged";
  let stopReason = outcome.stopReason;

  if (!outcome.converged && outcome.stopReason !== "time") {
    const rescue = continuation(built, newtonOptions);
    iterations += rescue.iterations;
    if (rescue.outcome?.converged && rescue.scale === 1) {
      outcome = rescue.outcome;
      system = rescue.system;
      status = "converged";
      warnings.push({
        code: "continuation",
        message: `solved by ramping the demands up from zero in ${rescue.steps} steps (plain Newton from the first guess did not converge)`,
      });
    } else if (rescue.timedOut) {
      // Cut short by the time limit: the largest scale reached so far says nothing about the
      // largest feasible one, so there is no evidence of infeasibility (defect M).
      stopReason = "time";
    } else if (rescue.scale > 0 && rescue.scale < 1 && hasDemands(system)) {
      // Evidence of infeasibility: part of the demand solves, more does not, and edges are at
      // their capacity there. Without that evidence the result stays "not converged".
      const found = diagnose(rescue.system, outcome, rescue);
      if (found.limitingEdges.length > 0) {
        status = "no-solution";
        diagnosis = found;
      }
    }
  }

  if (holder !== undefined) {
    if (
      status === "converged" &&
      outcome.factors !== undefined &&
      reuseOfStartFactorsPays(built.structure)
    ) {
      holder.factors = outcome.factors;
    } else {
      delete holder.factors;
    }
  }
  // Not held past here unless the holder keeps them: the factors are the largest arrays of a
  // solve (40 MB at 100,000 edges of mixed network), and the results are built next.
  delete outcome.factors;
  const state = resultsAtState(system, outcome.x);
  const converged = status === "converged";
  if (converged) {
    const tolerance = CHECK_MARGIN * settings.tolerance;
    const noise = Math.min(
      outcome.evaluation.massNoise.reduce((a, b) => Math.max(a, b), 0),
      ROUND_OFF_CEILING,
    );
    const b = state.balance;
    if (
      !(b.largestMassImbalance <= tolerance + CHECK_MARGIN * noise) ||
      !(b.largestEnergyImbalance <= tolerance + CHECK_MARGIN * noise) ||
      !(b.largestExitPressureMismatch <= EXIT_PRESSURE_TOLERANCE)
    ) {
      throw new InternalCheckError(
        `the solver reported convergence but the independent check of the final state failed (largest mass imbalance ${b.largestMassImbalance}, energy ${b.largestEnergyImbalance}, exit-pressure mismatch ${b.largestExitPressureMismatch}); please report this network`,
      );
    }
  }
  warnings.push(...designWarnings(state, settings.limits, system));
  if (status === "not-converged") {
    warnings.unshift({
      code: "not-converged",
      message: `not converged after ${iterations} iterations (${stopReason ?? "iterations"})${stopReason === "time" && limitMs !== undefined ? `, the time limit of ${limitMs} ms ran out` : ""}; largest scaled residual ${Math.max(outcome.massResidual, outcome.energyResidual).toExponential(2)}: the numbers below are the best iterate, not a solution`,
    });
  }
  if (status === "no-solution" && diagnosis) {
    warnings.unshift({ code: "no-solution", message: diagnosis.message });
  }

  const result: NetworkResult = {
    converged,
    status,
    iterations,
    residual: Math.max(outcome.massResidual, outcome.energyResidual),
    residuals: { mass: outcome.massResidual, energy: outcome.energyResidual },
    warnings,
    nodes: state.nodes,
    edges: state.edges,
    balance: state.balance,
    name: checked.name,
    gas: {
      name: checked.gas.name,
      molarMass: checked.gas.molarMass,
      heatCapacityRatio: checked.gas.heatCapacityRatio,
      specificGasConstant: checked.gas.specificGasConstant,
      specificHeatCp: checked.gas.specificHeatCp,
    },
    ambient: { pressure: checked.ambientPressure, temperature: checked.ambientTemperature },
  };
  if (diagnosis) result.diagnosis = diagnosis;
  return { result, system, x: outcome.x };
}

function hasDemands(system: NetworkSystem): boolean {
  return system.demand.some((value) => value !== 0);
}

/** Scaled unknowns from a previous result (matching node ids), or undefined if it does not fit. */
function stateFromResult(
  system: NetworkSystem,
  previous: Pick<NetworkResult, "nodes">,
): Float64Array | undefined {
  const byId = new Map(previous.nodes.map((node) => [node.id, node]));
  const x = new Float64Array(2 * system.junctionCount);
  const nodes = system.model.document.nodes;
  for (let j = 0; j < system.junctionCount; j++) {
    const node = nodes[system.model.junctionNodes[j] as number];
    const old = node ? byId.get(node.id) : undefined;
    if (!old || !(old.pressure > 0) || !(old.temperature > 0)) return undefined;
    x[2 * j] = pressureUnknown(system, j, old.pressure);
    x[2 * j + 1] = old.temperature / system.temperatureScale;
  }
  return x;
}

interface ContinuationOutcome {
  /** Largest demand scale solved (0 if even that failed). */
  scale: number;
  /**
   * The system at the stated demands with the continuation's own pressure references (from the
   * first guess of the network at rest), in which `outcome.x` is expressed.
   */
  system: NetworkSystem;
  outcome: NewtonOutcome | undefined;
  iterations: number;
  steps: number;
  /** The time limit ended the ramp before it reached the stated demands or gave up. */
  timedOut: boolean;
}

/** The system with every demand multiplied by `scale` (injections too). */
function withDemandScale(system: NetworkSystem, scale: number): NetworkSystem {
  return { ...system, demand: system.demand.map((value) => value * scale) };
}

/**
 * Ramp the demands from zero to their stated values, each step warm-started from the last solved
 * one, halving the step on failure. Returns the largest scale reached.
 */
function continuation(
  built: NetworkSystem,
  options: Parameters<typeof newtonSolve>[2],
): ContinuationOutcome {
  let iterations = 0;
  let steps = 0;
  // References from the first guess of the network at rest, not from a warm start that may be
  // far off nor from the stated demands: junctions at rest at one pressure must share one
  // reference, or the zero-demand start sees round-off flows between them.
  const atRest = withDemandScale(built, 0);
  const start = withPressureReferences(atRest, initialGuess(atRest));
  const zero = start.system;
  const system: NetworkSystem = { ...built, pressureReference: zero.pressureReference };
  let solved = newtonSolve(zero, start.x, options);
  iterations += solved.iterations;
  if (!solved.converged) {
    const timedOut = solved.stopReason === "time";
    return { scale: 0, system, outcome: undefined, iterations, steps, timedOut };
  }
  let scale = 0;
  let step = 0.25;
  let timedOut = false;
  while (scale < 1 && step >= 1 / 1024) {
    if (
      options.deadline !== undefined &&
      options.now !== undefined &&
      options.now() > options.deadline
    ) {
      timedOut = true;
      break;
    }
    const target = Math.min(1, scale + step);
    const attempt = newtonSolve(withDemandScale(system, target), solved.x, options);
    iterations += attempt.iterations;
    steps++;
    if (attempt.stopReason === "time") {
      timedOut = true;
      break;
    }
    if (attempt.converged) {
      scale = target;
      solved = attempt;
      step *= 1.5;
    } else {
      step *= 0.5;
    }
  }
  // Evaluate the original system at the last solved state so flows and chokes are at hand.
  return { scale, system, outcome: solved, iterations, steps, timedOut };
}

/** Why a network with fixed demands has no solution: how far it gets, and which edges choke. */
function diagnose(
  system: NetworkSystem,
  direct: NewtonOutcome,
  rescue: ContinuationOutcome,
): NoSolutionDiagnosis {
  const doc = system.model.document;
  const limitingEdges: NoSolutionDiagnosis["limitingEdges"] = [];
  if (rescue.outcome) {
    // Each edge afresh at the largest solved case, with its capacity (Newton skips it).
    const at = withDemandScale(system, rescue.scale);
    const evaluation = evaluateSystem(at, rescue.outcome.x, false);
    const scratch = new PipeFlowEvaluation();
    const ends = emptyEdgeEnds();
    const limitingIndices: number[] = [];
    for (let e = 0; e < system.edgeCount; e++) {
      edgeEndsAt(at, rescue.outcome.x, e, scratch, ends);
      const edgeState = evaluateEdgeAt(at, e, ends, scratch, true);
      const flow = Math.abs(evaluation.massFlow[e] as number);
      const capacity = edgeState.capacity;
      if (edgeState.choked || (capacity > 0 && flow / capacity > 0.98)) {
        limitingEdges.push({ id: doc.edges[e]?.id ?? String(e), capacity, massFlow: flow });
        limitingIndices.push(e);
      }
    }
    // Listed in the file's order, as the results are (the model's order is by id).
    const inFile = system.model.filePosition.edges;
    const rank = limitingIndices.map((e) => inFile[e] as number);
    const sorted = limitingEdges
      .map((edge, k) => ({ edge, position: rank[k] as number }))
      .sort((a, b) => a.position - b.position);
    limitingEdges.splice(0, limitingEdges.length, ...sorted.map((entry) => entry.edge));
  }
  const openEquations: NoSolutionDiagnosis["openEquations"] = [];
  const residual = direct.evaluation.residual;
  for (let j = 0; j < system.junctionCount; j++) {
    const node = doc.nodes[system.model.junctionNodes[j] as number]?.id ?? String(j);
    openEquations.push({ node, equation: "mass", residual: residual[2 * j] as number });
    openEquations.push({ node, equation: "energy", residual: residual[2 * j + 1] as number });
  }
  openEquations.sort((a, b) => Math.abs(b.residual) - Math.abs(a.residual));
  const worst = openEquations.filter((entry) => Math.abs(entry.residual) > 1e-6).slice(0, 10);
  const percent = (100 * rescue.scale).toFixed(1);
  const edgesText =
    limitingEdges.length > 0
      ? `; at that point ${limitingEdges.length === 1 ? "edge" : "edges"} ${limitingEdges
          .map(
            (edge) =>
              `${edge.id} (${edge.massFlow.toPrecision(4)} kg/s of a capacity of ${edge.capacity.toPrecision(4)} kg/s)`,
          )
          .join(", ")} ${limitingEdges.length === 1 ? "is" : "are"} choked or at capacity`
      : "";
  const message =
    rescue.scale > 0
      ? `no solution: the supplies can deliver only ${percent} % of the stated demands${edgesText}. Lower the demands, raise the supply pressure or enlarge the limiting edges.`
      : `no solution: not even a small fraction of the stated demands can be delivered${edgesText}. Check the demands, the supply pressures and the pipe sizes.`;
  return { largestFeasibleDemandScale: rescue.scale, limitingEdges, openEquations: worst, message };
}
