/**
 * What a solve ended in, sorted into the outcomes the hardening tests accept (a solution, a
 * diagnosed no-solution, a not-converged result, an input error with paths) and the ones they
 * do not (any other exception, an internal-check failure, a non-finite number in a result).
 * The checks here are the tests' own: they read only the result object, never solver state.
 */
import {
  checkNetwork,
  InputError,
  InternalCheckError,
  type NetworkResult,
  type SolveOptions,
  solveNetwork,
} from "../../src/index.js";

export type Outcome =
  | { kind: "converged"; result: NetworkResult }
  | { kind: "no-solution"; result: NetworkResult }
  | { kind: "not-converged"; result: NetworkResult }
  | { kind: "input-error"; error: InputError }
  | { kind: "internal-check"; error: InternalCheckError }
  | { kind: "exception"; error: unknown };

/**
 * The known defect an outcome shows, if any (hard-networks.test.ts has each reduced):
 * "K" for an internal-check failure of the mass and energy balance with the exit pressures
 * fine, the signature of a convergence accepted at the flows' round-off.
 */
export function knownDefect(outcome: Outcome): "K" | undefined {
  if (outcome.kind !== "internal-check") return undefined;
  const match = /exit-pressure mismatch ([-+0-9.eE]+|NaN|Infinity)/.exec(outcome.error.message);
  const mismatch = match ? Number(match[1]) : Number.NaN;
  return mismatch <= 1e-7 && /largest mass imbalance/.test(outcome.error.message) ? "K" : undefined;
}

/** Solve and sort the ending; never throws. */
export function solveOutcome(document: unknown, options: SolveOptions = {}): Outcome {
  try {
    const result = solveNetwork(document, options);
    if (result.status === "converged") return { kind: "converged", result };
    if (result.status === "no-solution") return { kind: "no-solution", result };
    return { kind: "not-converged", result };
  } catch (error) {
    if (error instanceof InputError) return { kind: "input-error", error };
    if (error instanceof InternalCheckError) return { kind: "internal-check", error };
    return { kind: "exception", error };
  }
}

/** JSON Pointers of every number in `value` that is NaN or infinite (and of any null). */
export function nonFinitePaths(value: unknown, path = ""): string[] {
  if (typeof value === "number") return Number.isFinite(value) ? [] : [`${path} = ${value}`];
  if (value === null) return [`${path} = null`];
  if (Array.isArray(value))
    return value.flatMap((item, index) => nonFinitePaths(item, `${path}/${index}`));
  if (typeof value === "object") {
    return Object.entries(value as Record<string, unknown>).flatMap(([key, item]) =>
      nonFinitePaths(item, `${path}/${key}`),
    );
  }
  return [];
}

/**
 * Largest mass imbalance of any node over the throughput, recomputed from the result alone:
 * at each node, the edge flows in minus the node's demand (a reservoir's demand is what it takes
 * from the network) must vanish.
 */
export function largestMassImbalance(result: NetworkResult): number {
  const net = new Map<string, number>();
  for (const node of result.nodes) net.set(node.id, 0);
  for (const edge of result.edges) {
    net.set(edge.from, (net.get(edge.from) ?? 0) - edge.massFlow);
    net.set(edge.to, (net.get(edge.to) ?? 0) + edge.massFlow);
  }
  let throughput = 0;
  for (const node of result.nodes) throughput += Math.abs(node.demand);
  throughput = Math.max(throughput / 2, 1e-9);
  let worst = 0;
  for (const node of result.nodes) {
    worst = Math.max(worst, Math.abs((net.get(node.id) ?? 0) - node.demand) / throughput);
  }
  return worst;
}

/**
 * Largest error of a junction temperature against the mass-weighted mean of the stagnation
 * temperatures arriving there (edges and the injection), over that temperature: the junction
 * energy balance with constant cp (hand calculation). Junctions with no gas arriving are skipped.
 *
 * @param injectionTemperature - node id -> temperature [K] of an injection (negative demand)
 */
export function largestMixingError(
  result: NetworkResult,
  injectionTemperature: ReadonlyMap<string, number>,
): number {
  const mass = new Map<string, number>();
  const weighted = new Map<string, number>();
  for (const edge of result.edges) {
    if (edge.massFlow === 0) continue;
    const downstream = edge.massFlow > 0 ? edge.to : edge.from;
    const flow = Math.abs(edge.massFlow);
    mass.set(downstream, (mass.get(downstream) ?? 0) + flow);
    weighted.set(
      downstream,
      (weighted.get(downstream) ?? 0) + flow * edge.outlet.stagnationTemperature,
    );
  }
  let throughput = 0;
  for (const node of result.nodes) throughput += Math.abs(node.demand);
  throughput /= 2;
  let worst = 0;
  for (const node of result.nodes) {
    if (node.kind !== "junction") continue;
    let m = mass.get(node.id) ?? 0;
    let w = weighted.get(node.id) ?? 0;
    const injected = injectionTemperature.get(node.id);
    if (node.demand < 0 && injected !== undefined) {
      m += -node.demand;
      w += -node.demand * injected;
    }
    // Below 1e-6 of the throughput a junction's temperature is that of a trickle: the solver
    // weighs it against the ambient term (docs/model.md), so the mean is not a fair check there.
    if (!(m > 1e-6 * throughput)) continue;
    worst = Math.max(worst, Math.abs(node.temperature / (w / m) - 1));
  }
  return worst;
}

/** Injection temperatures [K] of a document's junctions, read (in SI) by checkNetwork. */
export function injectionTemperatures(document: unknown): Map<string, number> {
  const checked = checkNetwork(document);
  const temperatures = new Map<string, number>();
  if (!checked.ok) return temperatures;
  for (const node of checked.document.nodes) {
    if (node.kind === "junction" && node.demand < 0 && node.temperature !== undefined) {
      temperatures.set(node.id, node.temperature);
    }
  }
  return temperatures;
}

/**
 * What is wrong with a result that claims to be a solution, by the tests' own checks. An empty
 * list when all hold:
 * - mass balance at every node, recomputed from the result: within 1e-8 of the throughput (ten
 *   times the default tolerance, room for the rounding of the sums here) or, where the solver
 *   accepted a mass residual at the round-off of its flows (src/solve/newton.ts, since fff371f),
 *   within the residual it reports; never above 1e-6, whatever it reports;
 * - the mixing temperature at every junction with flow: within 2e-6 relative, the solver's
 *   temperature tolerance (1e-6 of T_ref, TEMPERATURE_TOLERANCE in src/solve/newton.ts) with
 *   T_ref / T below 2 in the corpus;
 * - no edge above its capacity, choke ratio 1 exactly when choked, constant stagnation
 *   temperature along adiabatic pipes, no NaN or Infinity anywhere.
 */
export function solutionProblems(result: NetworkResult, document: unknown): string[] {
  const problems: string[] = [];
  const bad = nonFinitePaths(result);
  if (bad.length > 0) problems.push(`non-finite numbers: ${bad.slice(0, 5).join(", ")}`);
  const mass = largestMassImbalance(result);
  const allowed = Math.min(1e-6, Math.max(1e-8, 1.01 * result.residuals.mass));
  if (!(mass <= allowed)) {
    problems.push(`mass imbalance ${mass} (reported residual ${result.residuals.mass})`);
  }
  const mixing = largestMixingError(result, injectionTemperatures(document));
  if (!(mixing <= 2e-6)) problems.push(`mixing temperature error ${mixing}`);
  for (const edge of result.edges) {
    const flow = Math.abs(edge.massFlow);
    if (flow > edge.capacity * (1 + 1e-9)) {
      problems.push(`edge ${edge.id} carries ${flow} kg/s above its capacity ${edge.capacity}`);
    }
    if (edge.choked && edge.chokeRatio !== 1)
      problems.push(`edge ${edge.id} choked at ratio ${edge.chokeRatio}`);
    if (!edge.choked && !(edge.chokeRatio <= 1))
      problems.push(`edge ${edge.id} ratio ${edge.chokeRatio}`);
    if (
      edge.kind === "pipe" &&
      edge.model === "adiabatic" &&
      edge.outlet.stagnationTemperature !== edge.inlet.stagnationTemperature
    ) {
      problems.push(`adiabatic edge ${edge.id} changes its stagnation temperature`);
    }
  }
  return problems;
}

/** What is wrong with a no-solution result: it must say which edges limit and how far it got. */
export function diagnosisProblems(result: NetworkResult): string[] {
  const diagnosis = result.diagnosis;
  if (diagnosis === undefined) return ["no diagnosis"];
  const problems: string[] = [];
  if (result.converged) problems.push("no-solution marked converged");
  if (diagnosis.limitingEdges.length === 0) problems.push("no limiting edge named");
  for (const edge of diagnosis.limitingEdges) {
    if (!diagnosis.message.includes(edge.id)) problems.push(`message does not name ${edge.id}`);
    if (!(edge.capacity > 0)) problems.push(`limiting edge ${edge.id} without a capacity`);
  }
  if (!(diagnosis.largestFeasibleDemandScale >= 0 && diagnosis.largestFeasibleDemandScale < 1)) {
    problems.push(`feasible scale ${diagnosis.largestFeasibleDemandScale}`);
  }
  if (result.warnings[0]?.code !== "no-solution") problems.push("first warning is not no-solution");
  const bad = nonFinitePaths(result);
  if (bad.length > 0) problems.push(`non-finite numbers: ${bad.slice(0, 5).join(", ")}`);
  return problems;
}

/** A short description of an outcome for failure messages. */
export function describeOutcome(outcome: Outcome): string {
  switch (outcome.kind) {
    case "converged":
    case "no-solution":
    case "not-converged":
      return `${outcome.kind} after ${outcome.result.iterations} iterations, residual ${outcome.result.residual.toExponential(2)}: ${outcome.result.warnings[0]?.message ?? ""}`;
    case "input-error":
      return `input error: ${outcome.error.message.split("\n").slice(0, 3).join(" | ")}`;
    case "internal-check":
      return `internal check: ${outcome.error.message}`;
    case "exception":
      return `exception: ${outcome.error instanceof Error ? (outcome.error.stack ?? outcome.error.message) : String(outcome.error)}`;
  }
}
