/**
 * Automatic layout of the network drawing with dagre (layered graph drawing): nodes in ranks
 * from left to right in the direction of flow, pipe labels placed by dagre as edge labels so
 * that they do not overlap each other or the nodes.
 */

import { Graph, layout } from "@dagrejs/dagre";
import type { CheckedDocument } from "../../input/document-types.js";
import type { NetworkResult } from "../../results/result-types.js";
import { type NodeSymbolKind, nodeSymbolKind, SYMBOL_RADIUS, SYMBOL_SIZE } from "./node-symbols.js";

/** A point of the drawing [px]. */
export interface Point {
  x: number;
  y: number;
}

/** Width of one character of the label font at 11 px and 10 px (monospace, 0.6 em) [px]. */
export const CHARACTER_WIDTH = { large: 6.8, small: 6.2 } as const;
/** Line height of label text [px]. */
export const LINE_HEIGHT = 12;

/** A node as laid out. */
export interface LaidOutNode {
  index: number;
  id: string;
  symbol: NodeSymbolKind;
  /** Centre of the symbol [px]. */
  x: number;
  y: number;
  /** Width of the node's box (symbol and labels) [px]. */
  width: number;
}

/** A pipe as laid out. */
export interface LaidOutEdge {
  index: number;
  id: string;
  /** Polyline from the upstream node to the downstream one (the direction of flow). */
  points: Point[];
  /** Centre of the label box [px]. */
  labelX: number;
  labelY: number;
  labelWidth: number;
  labelHeight: number;
}

/** The layout of a network. */
export interface NetworkLayout {
  width: number;
  height: number;
  nodes: LaidOutNode[];
  edges: LaidOutEdge[];
}

/** Width of a text line in the label font [px]. */
export function textWidth(text: string, size: "large" | "small"): number {
  return [...text].length * CHARACTER_WIDTH[size];
}

/**
 * Lay out a network.
 *
 * @param document - the checked document (node kinds and demands)
 * @param result - the solve result (flow directions)
 * @param nodeLabels - per node (document order): the line above the symbol and the line below
 * @param edgeLabels - per edge (document order): the lines of its label
 * @param clearances - per edge: half the drawn line width (casing included) [px], kept clear
 *   between the line and its label
 * @returns positions in px, the drawing's size, pipe polylines in the direction of flow
 * @remarks dagre ranks the nodes along the edges as given: each edge is handed to it from the
 *   upstream node to the downstream one of the solved flow (the declared direction when the flow
 *   is zero), so a converged network, whose flow runs from high to low stagnation pressure, is a
 *   graph without cycles and reads from left to right. Nodes and edges are named by their index,
 *   not their id, so any id is safe. Deterministic: same input, same layout.
 */
export function layoutNetwork(
  document: CheckedDocument,
  result: NetworkResult,
  nodeLabels: readonly (readonly [string, string])[],
  edgeLabels: readonly (readonly string[])[],
  clearances: readonly number[] = [],
): NetworkLayout {
  const graph = new Graph({ multigraph: true });
  graph.setGraph({
    rankdir: "LR",
    nodesep: 26,
    ranksep: 46,
    edgesep: 14,
    marginx: 16,
    marginy: 16,
  });
  const indexOf = new Map<string, number>();
  const symbols: NodeSymbolKind[] = [];
  const widths: number[] = [];
  document.nodes.forEach((node, index) => {
    indexOf.set(node.id, index);
    const [above, below] = nodeLabels[index] ?? [node.id, ""];
    const width = Math.max(SYMBOL_SIZE, textWidth(above, "large"), textWidth(below, "small")) + 6;
    symbols.push(nodeSymbolKind(node));
    widths.push(width);
    graph.setNode(`n${index}`, { width, height: SYMBOL_SIZE + 2 * LINE_HEIGHT + 6 });
  });
  const directions: { upstream: number; downstream: number }[] = [];
  document.edges.forEach((edge, index) => {
    const from = indexOf.get(edge.from) ?? 0;
    const to = indexOf.get(edge.to) ?? 0;
    const flow = result.edges[index]?.massFlow ?? 0;
    const direction =
      flow < 0 ? { upstream: to, downstream: from } : { upstream: from, downstream: to };
    directions.push(direction);
    const lines = edgeLabels[index] ?? [edge.id];
    const labelWidth = Math.max(...lines.map((line) => textWidth(line, "large"))) + 8;
    graph.setEdge(
      `n${direction.upstream}`,
      `n${direction.downstream}`,
      {
        width: labelWidth,
        height: lines.length * LINE_HEIGHT + 4,
        labelpos: "l",
        labeloffset: 4 + (clearances[index] ?? 2),
        minlen: 1,
      },
      `e${index}`,
    );
  });
  layout(graph);

  const nodes: LaidOutNode[] = document.nodes.map((node, index) => {
    const placed = graph.node(`n${index}`) as { x?: number; y?: number } | undefined;
    return {
      index,
      id: node.id,
      symbol: symbols[index] as NodeSymbolKind,
      x: placed?.x ?? 0,
      y: placed?.y ?? 0,
      width: widths[index] as number,
    };
  });
  const edges: LaidOutEdge[] = document.edges.map((edge, index) => {
    const direction = directions[index] as { upstream: number; downstream: number };
    const label = graph.edge({
      v: `n${direction.upstream}`,
      w: `n${direction.downstream}`,
      name: `e${index}`,
    }) as { points?: Point[]; x?: number; y?: number; width?: number; height?: number };
    const upstream = nodes[direction.upstream] as LaidOutNode;
    const downstream = nodes[direction.downstream] as LaidOutNode;
    return {
      index,
      id: edge.id,
      points: clipToSymbols(label.points ?? [], upstream, downstream),
      labelX: label.x ?? 0.5 * (upstream.x + downstream.x),
      labelY: label.y ?? 0.5 * (upstream.y + downstream.y),
      labelWidth: label.width ?? 0,
      labelHeight: label.height ?? 0,
    };
  });
  const size = graph.graph() as { width?: number; height?: number };
  return { width: size.width ?? 0, height: size.height ?? 0, nodes, edges };
}

/**
 * dagre ends an edge on the border of the node's box (symbol and labels); let it end on the
 * symbol instead: the inner points are kept, the ends move to the symbol's rim.
 */
function clipToSymbols(
  points: readonly Point[],
  upstream: LaidOutNode,
  downstream: LaidOutNode,
): Point[] {
  const inner = points.slice(1, -1);
  const first = inner[0] ?? { x: downstream.x, y: downstream.y };
  const last = inner[inner.length - 1] ?? { x: upstream.x, y: upstream.y };
  return [
    rimPoint(upstream, first),
    ...inner.map((point) => ({ x: point.x, y: point.y })),
    rimPoint(downstream, last),
  ];
}

function rimPoint(node: LaidOutNode, toward: Point): Point {
  const dx = toward.x - node.x;
  const dy = toward.y - node.y;
  const length = Math.hypot(dx, dy);
  if (!(length > 0)) return { x: node.x, y: node.y };
  const radius = Math.min(SYMBOL_RADIUS[node.symbol], length);
  return { x: node.x + (radius * dx) / length, y: node.y + (radius * dy) / length };
}
