/**
 * Sensitivities: derivatives of chosen results with respect to chosen inputs at a solved case,
 * from the converged Jacobian by the implicit function theorem. Browser-safe.
 *
 * At a solution the residuals vanish, R(x(theta), theta) = 0, so
 *
 *   dx/dtheta = -J^-1 dR/dtheta,   J = dR/dx at the solution,
 *
 * one solve with the LU factors of J (already the Newton matrix) per input. dR/dtheta is taken by
 * differences of the residual function at the fixed converged state, the input changed by steps
 * up to h = 1e-4 of its value; a result y(x, theta) is then differentiated along the solution's
 * tangent, from y(x + d dx/dtheta, theta + d) at the same steps d, which takes in both its
 * dependence on the state and its direct dependence on the input (the velocity in a pipe whose
 * diameter changes). The differences are fourth-order (central differences at h and h/2 combined
 * by Richardson extrapolation; one-sided for an input at a bound, such as a roughness of 0): a
 * reservoir pressure moved by 1e-4 of itself moves the pressure drop of the pipe it feeds by far
 * more than 1e-4 of that drop, and a second-order difference leaves an error of 1e-3 there. No
 * Newton iteration runs beyond the base solve.
 */

import type { CheckedDocument } from "../input/document-types.js";
import { resultsAtState } from "../results/build-results.js";
import type { NetworkResult } from "../results/result-types.js";
import {
  createNetworkSystem,
  evaluateSystem,
  type NetworkSystem,
} from "../solve/network-system.js";
import { modelOf, solveWithState } from "../solve/solve-network.js";
import { factorBlockMatrix, solveFactored } from "../solve/sparse-block-lu.js";
import { outputNumber } from "./outputs.js";
import { applyParameters, caseProblems } from "./parameters.js";
import { prepareQuestion } from "./question-setup.js";
import type {
  PreparedStudy,
  ResolvedOutput,
  ResolvedParameter,
  StudyParameterInput,
} from "./study-types.js";

/** Options of {@link sensitivities}. */
export interface SensitivityOptions {
  /** The inputs to differentiate by: `{ path }` (the value, SI) or `{ group }` (its scale factor). */
  inputs: StudyParameterInput[];
  /** The results to differentiate. @defaultValue "all" */
  outputs?: string | string[];
}

/** Relative step of the differences. */
const RELATIVE_STEP = 1e-4;

/** What {@link sensitivities} found. */
export interface SensitivityAnswer {
  /** The inputs: label, value in the network [SI, or 1 for a scale], the step h used, and whether
   * the difference was central or one-sided (an input at a bound, such as a roughness of 0). */
  inputs: { label: string; value: number; step: number; difference: "central" | "forward" }[];
  /** The results: label and value at the base case [SI]. */
  outputs: { label: string; value: number }[];
  /** derivatives[i][j] = d output_i / d input_j [SI output unit per SI input unit]. */
  derivatives: number[][];
  /** relative[i][j] = (input_j / output_i) d output_i / d input_j [-] (NaN where output_i is 0). */
  relative: number[][];
  /** The base solve. */
  result: NetworkResult;
}

/**
 * Derivatives of results with respect to inputs at the network's own solution.
 *
 * @param network - the network document (parsed JSON, an object, or JSON text)
 * @param options - inputs and outputs
 * @returns the derivative matrix (outputs by inputs) with the base values and relative forms
 * @throws InputError for an invalid network; StudyError for options that cannot be used; an
 *   Error when the base network does not converge (there is no solution to differentiate)
 * @example
 * const s = sensitivities(network, {
 *   inputs: [{ path: "/edges/0/diameter" }, { group: "demands" }],
 *   outputs: ["network/minPressure"],
 * });
 * s.derivatives[0][0]; // Pa of smallest junction pressure per m of diameter of edge 0 (> 0;
 * // checked in test/study/examples.test.ts)
 */
export function sensitivities(network: unknown, options: SensitivityOptions): SensitivityAnswer {
  return answerSensitivities(prepareQuestion(network, "sensitivities", options));
}

/**
 * The scaled state of one system moved to another's scales (same junctions, same order, and the
 * same junction reference pressures, see {@link changedSystem}: the pressure unknowns carry over
 * as they are, digits and all).
 */
function rescaled(x: Float64Array, from: NetworkSystem, to: NetworkSystem): Float64Array {
  const temperatureRatio = from.temperatureScale / to.temperatureScale;
  const moved = Float64Array.from(x);
  for (let j = 0; j < from.junctionCount; j++) {
    moved[2 * j + 1] = (x[2 * j + 1] as number) * temperatureRatio;
  }
  return moved;
}

/**
 * The system of a changed network with the base system's junction reference pressures, so that
 * the base state means the same pressures in both (the pressure unknowns are offsets p / p_ref,j
 * - 1).
 */
function changedSystem(base: NetworkSystem, network: CheckedDocument): NetworkSystem {
  return { ...createNetworkSystem(modelOf(network)), pressureReference: base.pressureReference };
}

/** {@link sensitivities} on a prepared study with a `sensitivities` block. */
export function answerSensitivities(study: PreparedStudy): SensitivityAnswer {
  const block = study.sensitivities;
  if (block === undefined) throw new RangeError("the study has no sensitivities block");
  const base = solveWithState(study.network);
  if (!base.result.converged) {
    throw new Error(
      `the base network does not converge (status ${base.result.status}), so it has no solution to take derivatives at`,
    );
  }
  const { system, x } = base;
  const evaluation = evaluateSystem(system, x, true);
  const throughput = evaluation.throughput;
  const factors = factorBlockMatrix(system.structure, evaluation.jacobian as Float64Array);
  const outputs = block.outputs;
  const baseOutputs = outputs.map((output) => outputNumber(base.result, output));

  const inputs: SensitivityAnswer["inputs"] = [];
  const columns: number[][] = [];
  for (const parameter of block.inputs) {
    const column = inputDerivatives(
      study.network,
      system,
      x,
      throughput,
      factors,
      parameter,
      outputs,
    );
    inputs.push({
      label: parameter.label,
      value: parameter.base,
      step: column.step,
      difference: column.difference,
    });
    columns.push(column.derivatives);
  }
  const derivatives = outputs.map((_, i) => columns.map((column) => column[i] as number));
  const relative = derivatives.map((row, i) =>
    row.map((derivative, j) => {
      const y = baseOutputs[i] as number;
      return y === 0 ? Number.NaN : ((inputs[j]?.value as number) / y) * derivative;
    }),
  );
  return {
    inputs,
    outputs: outputs.map((output, i) => ({ label: output.label, value: baseOutputs[i] as number })),
    derivatives,
    relative,
    result: base.result,
  };
}

/** The step of an input: 1e-4 of its value, or of a natural scale when the value is 0. */
function stepOf(
  network: CheckedDocument,
  parameter: ResolvedParameter,
  throughput: number,
): number {
  if (parameter.base !== 0) return RELATIVE_STEP * Math.abs(parameter.base);
  const target = parameter.targets[0];
  if (target?.field === "demand") return RELATIVE_STEP * throughput;
  if (target?.field === "roughness") {
    return RELATIVE_STEP * (network.edges[target.index]?.diameter ?? 1);
  }
  return RELATIVE_STEP;
}

function inputDerivatives(
  network: CheckedDocument,
  system: NetworkSystem,
  x: Float64Array,
  throughput: number,
  factors: ReturnType<typeof factorBlockMatrix>,
  parameter: ResolvedParameter,
  outputs: readonly ResolvedOutput[],
): { derivatives: number[]; step: number; difference: "central" | "forward" } {
  const h = stepOf(network, parameter, throughput);
  const theta = parameter.base;
  const lowerValid =
    caseProblems(applyParameters(network, [parameter], [theta - h]), [parameter]).length === 0;
  // Fourth-order stencils with s = h/2 (central differences at h and h/2 combined by Richardson
  // extrapolation): f' = [f(-2s) - 8 f(-s) + 8 f(s) - f(2s)] / 12s; one-sided at a bound,
  // f' = [-25 f(0) + 48 f(s) - 36 f(2s) + 16 f(3s) - 3 f(4s)] / 12s.
  const s = h / 2;
  const offsets = lowerValid ? [-2 * s, -s, s, 2 * s] : [0, s, 2 * s, 3 * s, 4 * s];
  const weights = (lowerValid ? [1, -8, 8, -1] : [-25, 48, -36, 16, -3]).map(
    (weight) => weight / (12 * s),
  );
  const systems = offsets.map((offset) =>
    offset === 0
      ? system
      : changedSystem(system, applyParameters(network, [parameter], [theta + offset])),
  );

  // dR/dtheta at the fixed state, with the mass scale of the base state held.
  const residualSlope = new Float64Array(x.length);
  systems.forEach((changed, k) => {
    const residual = evaluateSystem(
      changed,
      rescaled(x, system, changed),
      false,
      throughput,
    ).residual;
    const weight = weights[k] as number;
    for (let i = 0; i < residual.length; i++) {
      residualSlope[i] = (residualSlope[i] as number) + weight * (residual[i] as number);
    }
  });
  const tangent = solveFactored(
    factors,
    residualSlope.map((value) => -value),
  );

  // Results along the tangent of the solution curve.
  const derivatives = new Array<number>(outputs.length).fill(0);
  systems.forEach((changed, k) => {
    const offset = offsets[k] as number;
    const state = new Float64Array(x.length);
    for (let i = 0; i < x.length; i++)
      state[i] = (x[i] as number) + offset * (tangent[i] as number);
    const at = resultsAtState(changed, rescaled(state, system, changed));
    const partial = { nodes: at.nodes, edges: at.edges, balance: at.balance } as NetworkResult;
    outputs.forEach((output, i) => {
      derivatives[i] =
        (derivatives[i] as number) + (weights[k] as number) * outputNumber(partial, output);
    });
  });
  return { derivatives, step: h, difference: lowerValid ? "central" : "forward" };
}
