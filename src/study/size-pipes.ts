/**
 * Pipe sizing: the smallest allowed size for each chosen pipe such that the network meets every
 * limit (Mach number, velocity, pressure drop along a pipe, smallest delivery pressure), with the
 * limit that keeps each pipe from the next smaller size. Browser-safe.
 */

import type { CheckedDocument, QuantityInput } from "../input/document-types.js";
import type { EdgeResult, NetworkResult } from "../results/result-types.js";
import type { StructureHolder } from "../solve/network-system.js";
import { prepareQuestion } from "./question-setup.js";
import { solveCase } from "./solve-case.js";
import type { PreparedStudy, ResolvedParameter, SizingLimits } from "./study-types.js";

/** Options of {@link sizePipes}. */
export interface SizingOptions {
  /** The pipes to size: "all" or edge ids. @defaultValue "all" */
  edges?: "all" | string[];
  /** Allowed inside diameters. @defaultValue ASME B36.10M Sch 40, DN 25 to DN 300 */
  diameters?: QuantityInput[];
  /**
   * Instead of diameters: a schedule of ASME B36.10M or B36.19M ("40", "STD", "10S") with
   * nominal `sizes` ("DN 50", "2 in"); without sizes, every size of the schedule from DN 15 to
   * DN 600. Inside diameters from machnet's pipe catalog.
   */
  schedule?: string;
  sizes?: string[];
  /**
   * Limits. `maxMach` and `maxVelocity` default to the network's `settings.limits`,
   * `minDeliveryPressure` (smallest pressure at a junction with a positive demand) to its
   * `minPressure`; `maxPressureDrop` (along one pipe) has no default.
   */
  limits?: {
    maxMach?: number;
    maxVelocity?: QuantityInput;
    maxPressureDrop?: QuantityInput;
    minDeliveryPressure?: QuantityInput;
  };
  /** Largest number of network solves. @defaultValue 5000 */
  maxSolves?: number;
}

/** A limit that is not met. */
export interface SizingViolation {
  /**
   * `no-solution`: the network does not solve (an edge chokes below the demands); `choke`,
   * `max-mach`, `max-velocity`, `max-pressure-drop`: at a sized edge; `min-delivery-pressure`:
   * at a consumer.
   */
  limit:
    | "no-solution"
    | "choke"
    | "max-mach"
    | "max-velocity"
    | "max-pressure-drop"
    | "min-delivery-pressure";
  /** The edge or node id (none for no-solution). */
  id?: string;
  /** The value and the limit [SI] (none for no-solution). */
  value?: number;
  bound?: number;
  message: string;
}

/** The choice for one pipe. */
export interface PipeChoice {
  id: string;
  /** Chosen inside diameter [m] and its label ("DN 50", or "52.5 mm" for a size of one's own). */
  diameter: number;
  label: string;
  /** The diameter in the network before sizing [m]. */
  previousDiameter: number;
  /**
   * Why not one size smaller: the first limit the network fails with this pipe one size smaller
   * (the others as chosen), or undefined when the pipe is at the smallest allowed size.
   */
  binding?: SizingViolation;
  /** At the chosen sizes: largest Mach number and velocity at its ends, and its pressure drop. */
  mach: number;
  velocity: number;
  pressureDrop: number;
}

/** What {@link sizePipes} found. */
export interface SizingAnswer {
  /** True when every limit is met with the chosen sizes. */
  feasible: boolean;
  /** One entry per sized pipe, in the network's order. */
  pipes: PipeChoice[];
  /** The limits not met at the final sizes (empty when feasible). */
  violations: SizingViolation[];
  /** The network with the chosen diameters, and its solve. */
  network: CheckedDocument;
  result: NetworkResult | undefined;
  solves: number;
  iterations: number;
  message: string;
}

/** A number for a message. */
function show(value: number): string {
  return Number(value.toPrecision(5)).toString();
}

/** Limits a result fails at the sized edges and the consumers, in a fixed order. */
export function sizingViolations(
  result: NetworkResult,
  sizedEdges: readonly number[],
  limits: SizingLimits,
): SizingViolation[] {
  const violations: SizingViolation[] = [];
  for (const index of sizedEdges) {
    const edge = result.edges[index] as EdgeResult;
    const mach = Math.max(edge.inlet.mach, edge.outlet.mach);
    const velocity = Math.max(edge.inlet.velocity, edge.outlet.velocity);
    if (edge.choked) {
      violations.push({
        limit: "choke",
        id: edge.id,
        value: 1,
        bound: 1,
        message: `edge ${edge.id} chokes`,
      });
    } else if (limits.maxMach !== undefined && mach > limits.maxMach) {
      violations.push({
        limit: "max-mach",
        id: edge.id,
        value: mach,
        bound: limits.maxMach,
        message: `edge ${edge.id} reaches Mach ${show(mach)} (limit ${show(limits.maxMach)})`,
      });
    }
    if (limits.maxVelocity !== undefined && velocity > limits.maxVelocity) {
      violations.push({
        limit: "max-velocity",
        id: edge.id,
        value: velocity,
        bound: limits.maxVelocity,
        message: `edge ${edge.id} reaches ${show(velocity)} m/s (limit ${show(limits.maxVelocity)} m/s)`,
      });
    }
    if (limits.maxPressureDrop !== undefined && edge.pressureDrop > limits.maxPressureDrop) {
      violations.push({
        limit: "max-pressure-drop",
        id: edge.id,
        value: edge.pressureDrop,
        bound: limits.maxPressureDrop,
        message: `edge ${edge.id} loses ${show(edge.pressureDrop)} Pa (limit ${show(limits.maxPressureDrop)} Pa)`,
      });
    }
  }
  if (limits.minDeliveryPressure !== undefined) {
    for (const node of result.nodes) {
      if (
        node.kind === "junction" &&
        node.demand > 0 &&
        node.pressure < limits.minDeliveryPressure
      ) {
        violations.push({
          limit: "min-delivery-pressure",
          id: node.id,
          value: node.pressure,
          bound: limits.minDeliveryPressure,
          message: `node ${node.id} gets ${show(node.pressure)} Pa (limit ${show(limits.minDeliveryPressure)} Pa)`,
        });
      }
    }
  }
  return violations;
}

/**
 * Choose the smallest allowed size for each pipe such that every limit is met.
 *
 * 1. Every sized pipe starts at the smallest allowed diameter. While a sized pipe fails a limit of
 *    its own (it chokes, or exceeds the Mach number, the velocity or the pressure drop), it moves
 *    one size up; while the network does not solve, the pipes its diagnosis names as limiting
 *    (or, without one, every sized pipe) move up.
 * 2. While a consumer gets less than the smallest delivery pressure, the sized pipe with the
 *    largest pressure drop on the route the gas takes to that consumer (from it upstream, always
 *    along the edge bringing the most flow) moves one size up; then step 1 again.
 * 3. Each pipe in turn is tried one size smaller, the others as they are, and kept there if every
 *    limit is still met, until no pipe can go down. The result is therefore minimal pipe by pipe:
 *    no single pipe can be one size smaller, and `binding` says which limit stops it.
 *
 * Each solve is warm-started from the last solved sizes. Deterministic: pipes are visited in the
 * network's order.
 *
 * @param network - the network document (parsed JSON, an object, or JSON text)
 * @param options - the pipes, the allowed diameters and the limits
 * @throws InputError for an invalid network; StudyError for options that cannot be used
 * @example
 * const sized = sizePipes(network, { limits: { maxVelocity: "15 m/s", minDeliveryPressure: "6.3 bar(g)" } });
 * for (const pipe of sized.pipes) console.log(pipe.id, pipe.label, pipe.binding?.limit);
 * // (checked in test/study/examples.test.ts)
 */
export function sizePipes(network: unknown, options: SizingOptions = {}): SizingAnswer {
  return answerSizing(prepareQuestion(network, "sizing", options));
}

/** {@link sizePipes} on a prepared study with a `sizing` block. */
export function answerSizing(study: PreparedStudy): SizingAnswer {
  const block = study.sizing;
  if (block === undefined) throw new RangeError("the study has no sizing block");
  const { edges: sized, diameters, labels, limits } = block;
  const network = study.network;
  const parameters: ResolvedParameter[] = sized.map((index) => ({
    label: network.edges[index]?.id ?? String(index),
    mode: "set",
    kind: "diameter",
    targets: [
      { collection: "edges", index, field: "diameter", base: network.edges[index]?.diameter ?? 0 },
    ],
    base: network.edges[index]?.diameter ?? 0,
  }));
  const size = sized.map(() => 0);
  const largestSize = diameters.length - 1;
  let solves = 0;
  let iterations = 0;
  let start: Pick<NetworkResult, "nodes"> | undefined;
  // Every trial has the base network's layout (only diameters change): one sparse structure.
  const structureHolder: StructureHolder = {};
  const trial = (sizes: readonly number[]) => {
    const outcome = solveCase(
      network,
      parameters,
      sizes.map((s) => diameters[s] as number),
      start,
      structureHolder,
    );
    solves++;
    iterations += outcome.iterations;
    if (outcome.status === "converged" && outcome.result) {
      start = { nodes: outcome.result.nodes };
      return { outcome, violations: sizingViolations(outcome.result, sized, limits) };
    }
    const violation: SizingViolation = {
      limit: "no-solution",
      message: `the network does not solve (${outcome.status}): ${outcome.message ?? ""}`.trim(),
    };
    return { outcome, violations: [violation] };
  };
  const positionOf = new Map(sized.map((index, position) => [index, position]));
  const budgetLeft = () => solves < block.maxSolves;

  // Steps 1 and 2: grow until every limit is met or nothing can grow.
  let current = trial(size);
  let stuck: string | undefined;
  while (current.violations.length > 0 && budgetLeft()) {
    const grow = new Set<number>();
    const own = current.violations.filter(
      (v) => v.limit !== "min-delivery-pressure" && v.limit !== "no-solution",
    );
    if (current.violations.some((v) => v.limit === "no-solution")) {
      const limiting = current.outcome.result?.diagnosis?.limitingEdges ?? [];
      for (const edge of limiting) {
        const position = positionOf.get(network.edges.findIndex((e) => e.id === edge.id));
        if (position !== undefined && (size[position] as number) < largestSize) grow.add(position);
      }
      if (grow.size === 0) {
        size.forEach((s, position) => {
          if (s < largestSize) grow.add(position);
        });
      }
    } else if (own.length > 0) {
      for (const violation of own) {
        const position = positionOf.get(network.edges.findIndex((e) => e.id === violation.id));
        if (position !== undefined && (size[position] as number) < largestSize) grow.add(position);
      }
    }
    if (grow.size === 0 && current.outcome.result) {
      const delivery = current.violations.find((v) => v.limit === "min-delivery-pressure");
      if (delivery !== undefined && own.length === 0) {
        const position = routeCandidate(
          current.outcome.result,
          delivery.id as string,
          positionOf,
          size,
          largestSize,
        );
        if (position !== undefined) grow.add(position);
      }
    }
    if (grow.size === 0) {
      stuck = current.violations.map((v) => v.message).join("; ");
      break;
    }
    for (const position of grow) size[position] = (size[position] as number) + 1;
    current = trial(size);
  }

  // Step 3: shrink pipe by pipe while every limit holds; record what stops each.
  const binding = new Map<number, SizingViolation>();
  if (current.violations.length === 0) {
    let changed = true;
    while (changed && budgetLeft()) {
      changed = false;
      for (let position = 0; position < sized.length && budgetLeft(); position++) {
        if ((size[position] as number) === 0) {
          binding.delete(position);
          continue;
        }
        const smaller = [...size];
        smaller[position] = (smaller[position] as number) - 1;
        const attempt = trial(smaller);
        if (attempt.violations.length === 0) {
          size[position] = smaller[position] as number;
          current = attempt;
          changed = true;
          binding.delete(position);
        } else {
          binding.set(position, attempt.violations[0] as SizingViolation);
        }
      }
    }
    // The last state tried may be a rejected one: solve the chosen sizes for the final result.
    current = trial(size);
  }

  const finalNetwork = current.outcome.network;
  const result = current.outcome.result;
  const pipes: PipeChoice[] = sized.map((index, position) => {
    const edge = result?.edges[index];
    const diameter = diameters[size[position] as number] as number;
    const choice: PipeChoice = {
      id: network.edges[index]?.id ?? String(index),
      diameter,
      label: labels[size[position] as number] ?? `${diameter} m`,
      previousDiameter: network.edges[index]?.diameter ?? Number.NaN,
      mach: edge ? Math.max(edge.inlet.mach, edge.outlet.mach) : Number.NaN,
      velocity: edge ? Math.max(edge.inlet.velocity, edge.outlet.velocity) : Number.NaN,
      pressureDrop: edge ? edge.pressureDrop : Number.NaN,
    };
    const limit = binding.get(position);
    if (limit !== undefined && (size[position] as number) > 0) choice.binding = limit;
    return choice;
  });
  const feasible = current.violations.length === 0;
  const message = feasible
    ? `every limit is met; ${pipes.filter((p) => p.binding === undefined).length} of ${pipes.length} pipes are at the smallest allowed size`
    : !budgetLeft()
      ? `the solve budget (${block.maxSolves}) ran out; raise "maxSolves"`
      : `the limits cannot all be met with the allowed sizes: ${stuck ?? current.violations.map((v) => v.message).join("; ")}`;
  return {
    feasible,
    pipes,
    violations: current.violations,
    network: finalNetwork,
    result,
    solves,
    iterations,
    message,
  };
}

/**
 * The sized pipe to enlarge for a consumer's pressure: walking upstream from the consumer along
 * the edge that brings it the most flow, the sized pipe (below the largest size) with the
 * largest pressure drop on the way.
 */
function routeCandidate(
  result: NetworkResult,
  consumer: string,
  positionOf: ReadonlyMap<number, number>,
  size: readonly number[],
  largestSize: number,
): number | undefined {
  const nodeKind = new Map(result.nodes.map((node) => [node.id, node.kind]));
  const visited = new Set<string>();
  let node = consumer;
  let best: { position: number; drop: number } | undefined;
  while (!visited.has(node) && nodeKind.get(node) === "junction") {
    visited.add(node);
    let feeding: { index: number; flow: number; upstream: string } | undefined;
    result.edges.forEach((edge, index) => {
      const inflow =
        edge.to === node && edge.massFlow > 0
          ? edge.massFlow
          : edge.from === node && edge.massFlow < 0
            ? -edge.massFlow
            : 0;
      if (inflow > 0 && (feeding === undefined || inflow > feeding.flow)) {
        feeding = { index, flow: inflow, upstream: edge.massFlow > 0 ? edge.from : edge.to };
      }
    });
    if (feeding === undefined) break;
    const position = positionOf.get(feeding.index);
    const drop = (result.edges[feeding.index] as EdgeResult).pressureDrop;
    if (
      position !== undefined &&
      (size[position] as number) < largestSize &&
      (best === undefined || drop > best.drop)
    ) {
      best = { position, drop };
    }
    node = feeding.upstream;
  }
  return best?.position;
}
