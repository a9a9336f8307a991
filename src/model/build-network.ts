/**
 * Checked document -> network model: the graph (graphlib), topology checks, and the index arrays
 * the solver works on.
 */
import { Graph } from "@dagrejs/graphlib";
import type { CheckedDocument } from "../input/document-types.js";
import { type InputIssue, jsonPointer, sortIssues } from "../input/issues.js";

/**
 * The network as the solver sees it. Nodes and edges are in canonical order (sorted by id), not
 * the file's, so that every index, sum and tie-break of the solver, and so every number it
 * returns, is the same whatever the order of the lists in the file; `filePosition` leads back.
 */
export interface NetworkModel {
  /** The checked document with its nodes and edges in canonical order. */
  document: CheckedDocument;
  /** Per node and per edge of the model: its position in the file's list. */
  filePosition: { nodes: Int32Array; edges: Int32Array };
  /** Node id -> position in document.nodes. */
  nodeIndex: ReadonlyMap<string, number>;
  /** Per edge: index of its `from` node and its `to` node. */
  edgeFrom: Int32Array;
  edgeTo: Int32Array;
  /** Per node: 1 for a reservoir (fixed state), 0 for a junction (unknown state). */
  isReservoir: Uint8Array;
  /** Per node: its position among the junctions (the solver's unknowns), or -1 for a reservoir. */
  unknownIndex: Int32Array;
  /** The node index of each junction, in unknown order. */
  junctionNodes: Int32Array;
  /** Per node: the edges that touch it, as offsets into incidentEdges. */
  incidentStart: Int32Array;
  incidentEdges: Int32Array;
}

/** Result of building: the model, or every topology problem. */
export type BuildResult = { ok: true; model: NetworkModel } | { ok: false; issues: InputIssue[] };

/**
 * Build the graph and check its topology: unique ids across nodes and edges, edges naming
 * defined nodes, no self-loops, no isolated nodes, a reservoir in every connected part.
 */
export function buildNetwork(document: CheckedDocument): BuildResult {
  const issues: InputIssue[] = [];
  const nodeIndex = new Map<string, number>();
  const firstUse = new Map<string, string>();

  document.nodes.forEach((node, index) => {
    const path = jsonPointer("nodes", index, "id");
    const earlier = firstUse.get(node.id);
    if (earlier !== undefined) {
      issues.push({
        code: "duplicate-id",
        path,
        id: node.id,
        message: `id "${node.id}" is already used at ${earlier}; ids must be unique across nodes and edges`,
      });
      return;
    }
    firstUse.set(node.id, path);
    nodeIndex.set(node.id, index);
  });
  document.edges.forEach((edge, index) => {
    const path = jsonPointer("edges", index, "id");
    const earlier = firstUse.get(edge.id);
    if (earlier !== undefined) {
      issues.push({
        code: "duplicate-id",
        path,
        id: edge.id,
        message: `id "${edge.id}" is already used at ${earlier}; ids must be unique across nodes and edges`,
      });
      return;
    }
    firstUse.set(edge.id, path);
  });

  const graph = new Graph({ directed: false, multigraph: true });
  for (const id of nodeIndex.keys()) graph.setNode(id);
  const definedList = listIds([...nodeIndex.keys()]);
  document.edges.forEach((edge, index) => {
    let ends = true;
    for (const end of ["from", "to"] as const) {
      if (!nodeIndex.has(edge[end])) {
        issues.push({
          code: "unknown-node",
          path: jsonPointer("edges", index, end),
          nodeId: edge[end],
          message: `node "${edge[end]}" is not defined; defined nodes are ${definedList}`,
        });
        ends = false;
      }
    }
    if (!ends) return;
    if (edge.from === edge.to) {
      issues.push({
        code: "self-loop",
        path: jsonPointer("edges", index),
        edgeId: edge.id,
        message: `edge "${edge.id}" starts and ends at node "${edge.from}"; an edge must join two different nodes`,
      });
      return;
    }
    graph.setEdge(edge.from, edge.to, index, String(index));
  });

  for (const [id, index] of nodeIndex) {
    if ((graph.nodeEdges(id) ?? []).length === 0) {
      issues.push({
        code: "isolated-node",
        path: jsonPointer("nodes", index),
        nodeId: id,
        message: `node "${id}" is not connected to any edge; connect it or remove it`,
      });
    }
  }

  for (const component of connectedParts(graph)) {
    if (component.length === 1 && (graph.nodeEdges(component[0] as string) ?? []).length === 0) {
      continue; // already reported as isolated
    }
    const hasReservoir = component.some(
      (id: string) => document.nodes[nodeIndex.get(id) as number]?.kind === "reservoir",
    );
    if (!hasReservoir) {
      const ordered = [...component].sort(
        (a, b) => (nodeIndex.get(a) as number) - (nodeIndex.get(b) as number),
      );
      issues.push({
        code: "no-reservoir",
        path: "/nodes",
        nodeIds: ordered,
        message: `${listIds(ordered)} form a part of the network with no reservoir; add one or connect them`,
      });
    }
  }

  if (issues.length > 0) return { ok: false, issues: sortIssues(issues) };
  return { ok: true, model: indexedModel(canonicalOrder(document)) };
}

/**
 * The document with its nodes and edges sorted by id (UTF-16 code units, no locale), and the
 * file position of each. Ids are unique, so the order is total.
 */
function canonicalOrder(document: CheckedDocument): {
  document: CheckedDocument;
  filePosition: NetworkModel["filePosition"];
} {
  const byId = (list: readonly { id: string }[]): Int32Array =>
    Int32Array.from(list.keys()).sort((a, b) => {
      const idA = (list[a] as { id: string }).id;
      const idB = (list[b] as { id: string }).id;
      return idA < idB ? -1 : idA > idB ? 1 : 0;
    });
  const nodes = byId(document.nodes);
  const edges = byId(document.edges);
  return {
    document: {
      ...document,
      nodes: Array.from(nodes, (i) => document.nodes[i] as CheckedDocument["nodes"][number]),
      edges: Array.from(edges, (i) => document.edges[i] as CheckedDocument["edges"][number]),
    },
    filePosition: { nodes, edges },
  };
}

/** The index arrays of a topologically valid document, in the order of its lists. */
function indexedModel({ document, filePosition }: ReturnType<typeof canonicalOrder>): NetworkModel {
  const nodeIndex = new Map<string, number>();
  document.nodes.forEach((node, index) => {
    nodeIndex.set(node.id, index);
  });
  const edgeFrom = Int32Array.from(document.edges, (edge) => nodeIndex.get(edge.from) as number);
  const edgeTo = Int32Array.from(document.edges, (edge) => nodeIndex.get(edge.to) as number);
  const nodeCount = document.nodes.length;
  const isReservoir = new Uint8Array(nodeCount);
  const unknownIndex = new Int32Array(nodeCount).fill(-1);
  const junctions: number[] = [];
  document.nodes.forEach((node, index) => {
    if (node.kind === "reservoir") {
      isReservoir[index] = 1;
    } else {
      unknownIndex[index] = junctions.length;
      junctions.push(index);
    }
  });

  const degree = new Int32Array(nodeCount);
  for (let e = 0; e < edgeFrom.length; e++) {
    degree[edgeFrom[e] as number] = (degree[edgeFrom[e] as number] as number) + 1;
    degree[edgeTo[e] as number] = (degree[edgeTo[e] as number] as number) + 1;
  }
  const incidentStart = new Int32Array(nodeCount + 1);
  for (let i = 0; i < nodeCount; i++) {
    incidentStart[i + 1] = (incidentStart[i] as number) + (degree[i] as number);
  }
  const fill = Int32Array.from(incidentStart.subarray(0, nodeCount));
  const incidentEdges = new Int32Array(2 * edgeFrom.length);
  for (let e = 0; e < edgeFrom.length; e++) {
    for (const node of [edgeFrom[e] as number, edgeTo[e] as number]) {
      incidentEdges[fill[node] as number] = e;
      fill[node] = (fill[node] as number) + 1;
    }
  }

  return {
    document,
    filePosition,
    nodeIndex,
    edgeFrom,
    edgeTo,
    isReservoir,
    unknownIndex,
    junctionNodes: Int32Array.from(junctions),
    incidentStart,
    incidentEdges,
  };
}

/** "A, B, C" for up to 12 ids, then "and N more". */
function listIds(ids: readonly string[]): string {
  const shown = ids.slice(0, 12).join(", ");
  return ids.length > 12 ? `${shown} and ${ids.length - 12} more` : shown;
}

/**
 * Connected parts of an undirected graph, each in the order found. Iterative (an explicit stack)
 * because graphlib's own `alg.components` recurses once per node and overflows the call stack on
 * long chains of tens of thousands of nodes.
 */
function connectedParts(graph: Graph): string[][] {
  const seen = new Set<string>();
  const parts: string[][] = [];
  for (const start of graph.nodes()) {
    if (seen.has(start)) continue;
    const part: string[] = [];
    const stack = [start];
    seen.add(start);
    while (stack.length > 0) {
      const id = stack.pop() as string;
      part.push(id);
      for (const next of graph.neighbors(id) ?? []) {
        if (!seen.has(next)) {
          seen.add(next);
          stack.push(next);
        }
      }
    }
    parts.push(part);
  }
  return parts;
}
