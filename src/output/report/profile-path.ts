/**
 * The path of a pressure and Mach profile: from a source (a reservoir, or a junction where gas
 * is injected) to a chosen node, pipe by pipe.
 */

import type { CheckedDocument } from "../../input/document-types.js";
import type { NetworkResult } from "../../results/result-types.js";

/** One pipe of a profile path, in the order the path runs. */
export interface ProfileStep {
  edgeIndex: number;
  edgeId: string;
  /** The node the path enters the pipe from, and the node it leaves to. */
  start: string;
  end: string;
  /** True when the path runs through the pipe in the direction of its flow. */
  alongFlow: boolean;
}

/** A profile path. */
export interface ProfilePath {
  /** Node ids from the first to the last. */
  nodes: string[];
  steps: ProfileStep[];
  /** True when every step runs along the flow. */
  followsFlow: boolean;
}

/** Options of {@link findProfilePath}. */
export interface ProfilePathOptions {
  /** Id of the last node. @defaultValue the lowest-pressure node that gas flows into */
  to?: string;
  /** Id of the first node (usually a reservoir). @defaultValue found by walking upstream */
  from?: string;
}

/** A path, or why there is none. */
export type ProfilePathResult =
  | { ok: true; path: ProfilePath }
  | {
      ok: false;
      code: "unknown-node" | "same-node" | "no-path" | "no-flow";
      /** The option at fault, when one is. */
      option?: "to" | "from";
      message: string;
    };

interface FlowEdge {
  index: number;
  upstream: string;
  downstream: string;
  flow: number;
}

function listIds(ids: readonly string[]): string {
  const shown = ids.slice(0, 12).join(", ");
  return ids.length > 12 ? `${shown}, ... (${ids.length} in all)` : shown;
}

/**
 * Find the path of a profile.
 *
 * Without `from`, the path is found from `to` upstream: at each node, the pipe that brings the
 * largest mass flow into it (the first in document order on a tie), until a node that no pipe
 * feeds (a supplying reservoir or an injecting junction). With `from`, the same walk is kept to
 * nodes that the flow from `from` reaches; when the flow from `from` does not reach `to`, the
 * path with the fewest pipes is taken whatever the flow directions. Without `to`, the target is
 * the lowest-pressure node that gas flows into (reached from `from`, when given): the worst-off
 * consumer of a supply network, the sink of a vent header.
 *
 * @param document - the checked document
 * @param result - its result (flows and pressures)
 * @param options - the ends of the path
 * @returns the path, or an error with a code and a message naming the ids
 */
export function findProfilePath(
  document: CheckedDocument,
  result: NetworkResult,
  options: ProfilePathOptions = {},
): ProfilePathResult {
  const ids = document.nodes.map((node) => node.id);
  const known = new Set(ids);
  for (const [option, id] of [
    ["to", options.to],
    ["from", options.from],
  ] as const) {
    if (id !== undefined && !known.has(id)) {
      return {
        ok: false,
        code: "unknown-node",
        option,
        message: `no node "${id}" in the network; nodes are ${listIds(ids)}`,
      };
    }
  }
  if (options.to !== undefined && options.to === options.from) {
    return {
      ok: false,
      code: "same-node",
      option: "from",
      message: `the start and the end of the profile are the same node "${options.to}"`,
    };
  }

  const flowEdges: FlowEdge[] = [];
  document.edges.forEach((edge, index) => {
    const flow = result.edges[index]?.massFlow ?? 0;
    if (!(Number.isFinite(flow) && flow !== 0) || edge.from === edge.to) return;
    flowEdges.push(
      flow > 0
        ? { index, upstream: edge.from, downstream: edge.to, flow }
        : { index, upstream: edge.to, downstream: edge.from, flow: -flow },
    );
  });
  const incoming = new Map<string, FlowEdge[]>();
  const outgoing = new Map<string, FlowEdge[]>();
  for (const edge of flowEdges) {
    incoming.set(edge.downstream, [...(incoming.get(edge.downstream) ?? []), edge]);
    outgoing.set(edge.upstream, [...(outgoing.get(edge.upstream) ?? []), edge]);
  }
  const reached = options.from === undefined ? undefined : downstreamOf(options.from, outgoing);
  const pressureOf = new Map(result.nodes.map((node) => [node.id, node.pressure]));

  let target = options.to;
  if (target === undefined) {
    let best: { id: string; pressure: number } | undefined;
    for (const id of ids) {
      if (!incoming.has(id) || id === options.from) continue;
      if (reached && !reached.has(id)) continue;
      const pressure = pressureOf.get(id) ?? Number.NaN;
      if (!Number.isFinite(pressure)) continue;
      if (best === undefined || pressure < best.pressure) best = { id, pressure };
    }
    if (best === undefined) {
      return {
        ok: false,
        code: "no-flow",
        message:
          options.from === undefined
            ? "no gas flows into any node, so there is no path to draw a profile along; name its start and end"
            : `no gas flows from "${options.from}" into another node; name the end of the profile`,
      };
    }
    target = best.id;
  }

  const walked = walkUpstream(target, options.from, incoming, reached);
  if (walked) return { ok: true, path: pathOf(walked, document, result, true) };
  const start = options.from;
  if (start === undefined) {
    return {
      ok: false,
      code: "no-flow",
      option: "to",
      message: `no gas flows into "${target}"; name the start of the profile`,
    };
  }
  const shortest = fewestPipes(start, target, document);
  if (!shortest) {
    return {
      ok: false,
      code: "no-path",
      option: "from",
      message: `no pipes connect "${start}" and "${target}"`,
    };
  }
  return { ok: true, path: pathOf(shortest, document, result, false) };
}

/** Nodes reached from `start` along the flow (including `start`). */
function downstreamOf(start: string, outgoing: ReadonlyMap<string, FlowEdge[]>): Set<string> {
  const seen = new Set([start]);
  const queue = [start];
  for (let head = 0; head < queue.length; head++) {
    for (const edge of outgoing.get(queue[head] as string) ?? []) {
      if (!seen.has(edge.downstream)) {
        seen.add(edge.downstream);
        queue.push(edge.downstream);
      }
    }
  }
  return seen;
}

/** A walk as (node, edge index used to arrive) pairs from the first node to the last. */
type Walk = { nodes: string[]; edges: number[] };

function walkUpstream(
  target: string,
  from: string | undefined,
  incoming: ReadonlyMap<string, FlowEdge[]>,
  reached: ReadonlySet<string> | undefined,
): Walk | undefined {
  const nodes = [target];
  const edges: number[] = [];
  const visited = new Set([target]);
  let current = target;
  while (current !== from) {
    let best: FlowEdge | undefined;
    for (const edge of incoming.get(current) ?? []) {
      if (visited.has(edge.upstream) || (reached && !reached.has(edge.upstream))) continue;
      if (best === undefined || edge.flow > best.flow) best = edge;
    }
    if (best === undefined) break;
    current = best.upstream;
    visited.add(current);
    nodes.push(current);
    edges.push(best.index);
  }
  if (edges.length === 0 || (from !== undefined && current !== from)) return undefined;
  return { nodes: nodes.reverse(), edges: edges.reverse() };
}

/** Breadth-first search over the pipes in either direction, neighbours in document order. */
function fewestPipes(start: string, target: string, document: CheckedDocument): Walk | undefined {
  const neighbours = new Map<string, { node: string; edge: number }[]>();
  document.edges.forEach((edge, index) => {
    neighbours.set(edge.from, [
      ...(neighbours.get(edge.from) ?? []),
      { node: edge.to, edge: index },
    ]);
    neighbours.set(edge.to, [...(neighbours.get(edge.to) ?? []), { node: edge.from, edge: index }]);
  });
  const cameFrom = new Map<string, { node: string; edge: number }>();
  const seen = new Set([start]);
  const queue = [start];
  for (let head = 0; head < queue.length && !seen.has(target); head++) {
    const node = queue[head] as string;
    for (const next of neighbours.get(node) ?? []) {
      if (seen.has(next.node)) continue;
      seen.add(next.node);
      cameFrom.set(next.node, { node, edge: next.edge });
      queue.push(next.node);
    }
  }
  if (!seen.has(target)) return undefined;
  const nodes = [target];
  const edges: number[] = [];
  let current = target;
  while (current !== start) {
    const step = cameFrom.get(current) as { node: string; edge: number };
    edges.push(step.edge);
    nodes.push(step.node);
    current = step.node;
  }
  return { nodes: nodes.reverse(), edges: edges.reverse() };
}

function pathOf(
  walk: Walk,
  document: CheckedDocument,
  result: NetworkResult,
  followsFlow: boolean,
): ProfilePath {
  const steps = walk.edges.map((edgeIndex, position): ProfileStep => {
    const edge = document.edges[edgeIndex];
    const start = walk.nodes[position] as string;
    const end = walk.nodes[position + 1] as string;
    const flow = result.edges[edgeIndex]?.massFlow ?? 0;
    const upstream = flow < 0 ? edge?.to : edge?.from;
    return {
      edgeIndex,
      edgeId: edge?.id ?? String(edgeIndex),
      start,
      end,
      alongFlow: upstream === start,
    };
  });
  return {
    nodes: walk.nodes,
    steps,
    followsFlow: followsFlow && steps.every((step) => step.alongFlow),
  };
}
