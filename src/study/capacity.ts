/**
 * Capacity: the largest factor on all demands (or on a chosen group) that the network delivers
 * before the first edge chokes or a limit is reached (a smallest or largest junction pressure,
 * a Mach number, a velocity), and which edge or node limits it. Browser-safe.
 */

import type { QuantityInput } from "../input/document-types.js";
import type { EdgeResult, NetworkResult } from "../results/result-types.js";
import { bracketedRoot } from "./bracketed-root.js";
import { parameterSolver, prepareQuestion } from "./question-setup.js";
import type { CapacityLimits, PreparedStudy, StudyGroupInput } from "./study-types.js";

/** Options of {@link capacity}. */
export interface CapacityOptions {
  /** What to scale. @defaultValue "demands" (every positive demand) */
  group?: StudyGroupInput;
  /**
   * Limits besides the choke (which always applies): `minPressure` (smallest junction pressure;
   * default the network's `settings.limits.minPressure`), `maxPressure` (largest junction
   * pressure, a back-pressure limit for a vent header), `maxMach`, `maxVelocity`.
   */
  limits?: {
    minPressure?: QuantityInput;
    maxPressure?: QuantityInput;
    maxMach?: number;
    maxVelocity?: QuantityInput;
  };
  /** The scale is found to this relative width. @defaultValue 1e-6 */
  relativeTolerance?: number;
  /** Stop searching upwards here. @defaultValue 1000 */
  maxScale?: number;
  /** Largest number of network solves. @defaultValue 80 */
  maxSolves?: number;
}

/** What limits the capacity. */
export interface CapacityLimit {
  /**
   * `choke`: an edge reaches its capacity; `min-pressure` / `max-pressure`: a junction's
   * pressure reaches the limit; `max-mach` / `max-velocity`: at an end of an edge.
   */
  kind: "choke" | "min-pressure" | "max-pressure" | "max-mach" | "max-velocity";
  /** The edge or node id. */
  id: string;
  /** Its value at the capacity [SI] (the choke ratio for a choke) and the limit. */
  value: number;
  limit: number;
}

/** What {@link capacity} found. */
export type CapacityAnswer =
  | {
      found: true;
      /** Largest factor on the group that meets every limit (within the tolerance). */
      scale: number;
      /** What reaches its limit there. */
      limitedBy: CapacityLimit;
      /** The solve at `scale`. */
      result: NetworkResult;
      /**
       * The smallest factor tried that did not meet the limits, and why: the limit broken there
       * (`limit`), or the solver's message when the network did not solve.
       */
      beyond: { scale: number; reason: string; limit?: CapacityLimit };
      solves: number;
      iterations: number;
    }
  | {
      found: false;
      /** `unlimited`: no limit was reached up to `maxScale`; `infeasible`: not even a small factor
       * meets the limits; `budget`: the solve budget ran out. */
      reason: "unlimited" | "infeasible" | "budget";
      message: string;
      solves: number;
      iterations: number;
    };

/** The tightest limit of a result: the smallest relative margin, 0 at the limit, < 0 beyond. */
export function tightestLimit(
  result: NetworkResult,
  limits: CapacityLimits,
): { margin: number; limit: CapacityLimit } {
  let margin = Number.POSITIVE_INFINITY;
  let limit: CapacityLimit | undefined;
  const consider = (value: number, candidate: CapacityLimit) => {
    if (value < margin) {
      margin = value;
      limit = candidate;
    }
  };
  const pressureOf = new Map(result.nodes.map((node) => [node.id, node.pressure]));
  for (const edge of result.edges) {
    consider(chokeMargin(edge, pressureOf), {
      kind: "choke",
      id: edge.id,
      value: edge.chokeRatio,
      limit: 1,
    });
    const mach = Math.max(edge.inlet.mach, edge.outlet.mach);
    if (limits.maxMach !== undefined) {
      consider((limits.maxMach - mach) / limits.maxMach, {
        kind: "max-mach",
        id: edge.id,
        value: mach,
        limit: limits.maxMach,
      });
    }
    const velocity = Math.max(edge.inlet.velocity, edge.outlet.velocity);
    if (limits.maxVelocity !== undefined) {
      consider((limits.maxVelocity - velocity) / limits.maxVelocity, {
        kind: "max-velocity",
        id: edge.id,
        value: velocity,
        limit: limits.maxVelocity,
      });
    }
  }
  for (const node of result.nodes) {
    if (node.kind !== "junction") continue;
    if (limits.minPressure !== undefined) {
      consider((node.pressure - limits.minPressure) / limits.minPressure, {
        kind: "min-pressure",
        id: node.id,
        value: node.pressure,
        limit: limits.minPressure,
      });
    }
    if (limits.maxPressure !== undefined) {
      consider((limits.maxPressure - node.pressure) / limits.maxPressure, {
        kind: "max-pressure",
        id: node.id,
        value: node.pressure,
        limit: limits.maxPressure,
      });
    }
  }
  return { margin, limit: limit as CapacityLimit };
}

/**
 * How far an edge is from choking: 1 - choke ratio while it is not choked; once choked, minus
 * how far its exit pressure stands above the downstream node's (relative), which is 0 at the
 * onset and grows as the flow is pushed further: a margin that is continuous through the choke.
 */
function chokeMargin(edge: EdgeResult, pressureOf: Map<string, number>): number {
  if (!edge.choked) return 1 - edge.chokeRatio;
  const downstream = pressureOf.get(edge.massFlow >= 0 ? edge.to : edge.from) as number;
  return -Math.max(0, edge.outlet.pressure - downstream) / downstream;
}

/** A number for a message. */
function show(value: number): string {
  return Number(value.toPrecision(8)).toString();
}

/** One line about a limit. */
export function describeLimit(limit: CapacityLimit): string {
  switch (limit.kind) {
    case "choke":
      return `edge ${limit.id} chokes (choke ratio ${show(limit.value)})`;
    case "min-pressure":
      return `node ${limit.id} reaches the smallest pressure ${show(limit.limit)} Pa (${show(limit.value)} Pa)`;
    case "max-pressure":
      return `node ${limit.id} reaches the largest pressure ${show(limit.limit)} Pa (${show(limit.value)} Pa)`;
    case "max-mach":
      return `edge ${limit.id} reaches Mach ${show(limit.limit)} (${show(limit.value)})`;
    case "max-velocity":
      return `edge ${limit.id} reaches ${show(limit.limit)} m/s (${show(limit.value)} m/s)`;
  }
}

/**
 * The largest factor on a group of demands that the network can deliver within its limits.
 *
 * The margin of a solve is the smallest relative distance of any edge from its choke and of any
 * limit from its value (0 at a limit, negative beyond); a scale whose solve fails (no solution)
 * lies beyond. Starting at the network's own demands (factor 1), the factor is doubled or
 * halved until the margin changes sign, then the bracket is narrowed (Illinois method, or the
 * secant extrapolated from the last two solved factors while the far end does not solve) until
 * it is narrower than `relativeTolerance` of the factor. The answer is the largest factor found
 * that meets every limit, so solving at it meets them all, while at `beyond.scale`, at most
 * `relativeTolerance` above it, a limit is broken or there is no solution; `limitedBy` names the
 * edge or node closest to its limit at the answer.
 *
 * @param network - the network document (parsed JSON, an object, or JSON text)
 * @param options - the group to scale and the limits
 * @throws InputError for an invalid network; StudyError for options that cannot be used
 * @example
 * const answer = capacity(network, { group: "demands" });
 * if (answer.found) console.log(answer.scale, answer.limitedBy.kind, answer.limitedBy.id);
 * // (checked in test/study/examples.test.ts)
 */
export function capacity(network: unknown, options: CapacityOptions = {}): CapacityAnswer {
  return answerCapacity(prepareQuestion(network, "capacity", options));
}

/** {@link capacity} on a prepared study with a `capacity` block. */
export function answerCapacity(study: PreparedStudy): CapacityAnswer {
  const block = study.capacity;
  if (block === undefined) throw new RangeError("the study has no capacity block");
  const solver = parameterSolver(study, block.group);
  const results = new Map<number, NetworkResult>();
  const reasons = new Map<number, string>();
  const broken = new Map<number, CapacityLimit>();
  const evaluate = (scale: number): number | undefined => {
    const outcome = solver.solve(scale);
    if (outcome.status !== "converged" || !outcome.result) {
      reasons.set(scale, outcome.message ?? `status ${outcome.status}`);
      return undefined;
    }
    results.set(scale, outcome.result);
    const tight = tightestLimit(outcome.result, block.limits);
    if (tight.margin < 0) {
      reasons.set(scale, describeLimit(tight.limit));
      broken.set(scale, tight.limit);
    }
    return tight.margin;
  };
  const stop = (
    reason: "unlimited" | "infeasible" | "budget",
    message: string,
  ): CapacityAnswer => ({
    found: false,
    reason,
    message,
    solves: solver.solves,
    iterations: solver.iterations,
  });

  let inside: { x: number; value: number } | undefined;
  let beyond: { x: number; value: number | undefined } | undefined;
  const first = evaluate(1);
  if (first !== undefined && first >= 0) {
    inside = { x: 1, value: first };
    for (let scale = 2; ; scale *= 2) {
      if (scale > block.maxScale) {
        return stop(
          "unlimited",
          `no limit is reached up to ${show(block.maxScale)} times the network's values (${block.group.label}; the smallest margin left is ${show(inside.value)}); raise "maxScale" or add limits`,
        );
      }
      if (solver.solves >= block.maxSolves)
        return stop("budget", "the solve budget ran out while bracketing");
      const value = evaluate(scale);
      if (value === undefined || value < 0) {
        beyond = { x: scale, value };
        break;
      }
      inside = { x: scale, value };
    }
  } else {
    beyond = { x: 1, value: first };
    for (let scale = 0.5; ; scale /= 2) {
      if (scale < 1e-6) {
        return stop(
          "infeasible",
          `even ${show(scale * 2)} times the group's demands do not meet the limits: ${reasons.get(scale * 2) ?? "no solution"}`,
        );
      }
      if (solver.solves >= block.maxSolves)
        return stop("budget", "the solve budget ran out while bracketing");
      const value = evaluate(scale);
      if (value !== undefined && value >= 0) {
        inside = { x: scale, value };
        break;
      }
      beyond = { x: scale, value };
    }
  }
  const found = bracketedRoot({
    evaluate,
    inside,
    beyond: beyond as { x: number; value: number | undefined },
    xTolerance: block.relativeTolerance * inside.x,
    // Only the bracket's width ends the search: a margin can be tiny well before its limit (the
    // choke ratio creeps up to 1), so "close to the limit" is not "close to the scale".
    valueTolerance: 0,
    maxEvaluations: Math.max(0, block.maxSolves - solver.solves),
  });
  if (!found.converged) {
    return stop(
      "budget",
      `after ${solver.solves} solves the capacity lies between ${show(found.inside.x)} and ${show(found.beyond.x)} times the group's demands; raise "maxSolves" or the tolerance`,
    );
  }
  const scale = found.inside.x;
  const result = results.get(scale) as NetworkResult;
  const beyondLimit = broken.get(found.beyond.x);
  return {
    found: true,
    scale,
    limitedBy: tightestLimit(result, block.limits).limit,
    result,
    beyond: {
      scale: found.beyond.x,
      reason: reasons.get(found.beyond.x) ?? "within the tolerance of the limit",
      ...(beyondLimit ? { limit: beyondLimit } : {}),
    },
    solves: solver.solves,
    iterations: solver.iterations,
  };
}
