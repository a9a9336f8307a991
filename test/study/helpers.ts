/**
 * Helpers of the study tests, written apart from src/study so that the checks do not reuse the
 * code they check: set a value in a network document by JSON Pointer, and read a result field.
 */
import type { NetworkResult } from "../../src/index.js";

/** A deep copy of a document with the value at a JSON Pointer (indices only) replaced. */
export function withValue<T>(document: T, pointer: string, value: unknown): T {
  const copy = structuredClone(document) as Record<string, unknown>;
  const segments = pointer.split("/").slice(1);
  let place: Record<string, unknown> = copy;
  for (const segment of segments.slice(0, -1)) place = place[segment] as Record<string, unknown>;
  place[segments.at(-1) as string] = value;
  return copy as T;
}

/** A deep copy with every positive junction demand multiplied by a factor (SI numbers). */
export function withDemandsScaled<T extends { nodes: { demand?: unknown }[] }>(
  document: T,
  demandsSI: readonly number[],
  factor: number,
): T {
  const copy = structuredClone(document);
  copy.nodes.forEach((node, index) => {
    const demand = demandsSI[index] as number;
    if (demand > 0) node.demand = demand * factor;
  });
  return copy;
}

/** A result field as the study docs define it: `nodes/ID/pressure`, `edges/ID/mach`, ... */
export function readField(result: NetworkResult, output: string): number {
  const [scope, id, ...rest] = output.split("/");
  const field = rest.join("/");
  if (scope === "network") {
    const junctions = result.nodes.filter((node) => node.kind === "junction");
    switch (id) {
      case "minPressure":
        return Math.min(...junctions.map((node) => node.pressure));
      case "maxMach":
        return Math.max(...result.edges.map((e) => Math.max(e.inlet.mach, e.outlet.mach)));
      case "maxVelocity":
        return Math.max(...result.edges.map((e) => Math.max(e.inlet.velocity, e.outlet.velocity)));
      default:
        throw new Error(`readField: network/${id} is not read by the tests`);
    }
  }
  if (scope === "nodes") {
    const node = result.nodes.find((n) => n.id === id);
    if (!node) throw new Error(`no node ${id}`);
    return node[field as "pressure" | "temperature" | "demand"];
  }
  const edge = result.edges.find((e) => e.id === id);
  if (!edge) throw new Error(`no edge ${id}`);
  if (field === "mach" || field === "velocity")
    return Math.max(edge.inlet[field], edge.outlet[field]);
  if (field.startsWith("inlet/") || field.startsWith("outlet/")) {
    const [end, name] = field.split("/") as ["inlet" | "outlet", "pressure"];
    return edge[end][name];
  }
  return edge[field as "massFlow" | "pressureDrop" | "chokeRatio"];
}
