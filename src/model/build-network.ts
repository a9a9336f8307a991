/**
 * Checked document -> network model: topology checks and the index arrays the solver works on.
 *
 * The graph is held as typed incidence arrays (per node, the edges touching it), built in one
 * pass: graphlib's per-edge `setEdge` took 3.8 s for a 100,000-edge network and only its
 * neighbour lists were used here. graphlib stays in the report's layout (dagre).
 */
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
  // Where each id is first used: a node's index, or -1 - index for an edge (paths are written
  // only for an issue; writing one per element cost a third of the build at 100,000 edges).
  const firstUse = new Map<string, number>();
  const firstUsePath = (use: number): string =>
    use >= 0 ? jsonPointer("nodes", use, "id") : jsonPointer("edges", -1 - use, "id");
  const checkUnique = (id: string, use: number): boolean => {
    const earlier = firstUse.get(id);
    if (earlier === undefined) {
      firstUse.set(id, use);
      return true;
    }
    issues.push({
      code: "duplicate-id",
      path: firstUsePath(use),
      id,
      message: `id "${id}" is already used at ${firstUsePath(earlier)}; ids must be unique across nodes and edges`,
    });
    return false;
  };
  document.nodes.forEach((node, index) => {
    if (checkUnique(node.id, index)) nodeIndex.set(node.id, index);
  });
  document.edges.forEach((edge, index) => {
    checkUnique(edge.id, -1 - index);
  });

  const nodeCount = document.nodes.length;
  const definedList = listIds([...nodeIndex.keys()]);
  const edgeFrom = new Int32Array(document.edges.length);
  const edgeTo = new Int32Array(document.edges.length);
  // Edges that join two defined, different nodes (the others are reported and left out).
  const valid = new Uint8Array(document.edges.length);
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
    edgeFrom[index] = nodeIndex.get(edge.from) as number;
    edgeTo[index] = nodeIndex.get(edge.to) as number;
    valid[index] = 1;
  });
  const { incidentStart, incidentEdges } = incidence(nodeCount, edgeFrom, edgeTo, valid);
  // Ids that occur twice: the second node with an id is not in nodeIndex and not checked here.
  const counted = new Uint8Array(nodeCount);
  for (const index of nodeIndex.values()) counted[index] = 1;

  for (const [id, index] of nodeIndex) {
    if (incidentStart[index + 1] === incidentStart[index]) {
      issues.push({
        code: "isolated-node",
        path: jsonPointer("nodes", index),
        nodeId: id,
        message: `node "${id}" is not connected to any edge; connect it or remove it`,
      });
    }
  }

  for (const component of connectedParts(counted, incidentStart, incidentEdges, edgeFrom, edgeTo)) {
    if (component.length === 1) continue; // a lone node is already reported as isolated
    const hasReservoir = component.some((index) => document.nodes[index]?.kind === "reservoir");
    if (!hasReservoir) {
      const ordered = component
        .sort((a, b) => a - b)
        .map((index) => document.nodes[index]?.id as string);
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
  // Every property written out, not spread: a spread copy's hidden class depends on whether the
  // engine runs this code optimized, and code optimized on the documents of earlier solves was
  // thrown away on a later one's ("wrong map" deoptimizations of the first guess and of the
  // residual evaluation in the first large solve of a process).
  return {
    document: {
      name: document.name,
      gas: document.gas,
      ambientPressure: document.ambientPressure,
      ambientTemperature: document.ambientTemperature,
      settings: document.settings,
      nodes: Array.from(nodes, (i) => document.nodes[i] as CheckedDocument["nodes"][number]),
      edges: Array.from(edges, (i) => document.edges[i] as CheckedDocument["edges"][number]),
      notes: document.notes,
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
  const { incidentStart, incidentEdges } = incidence(
    nodeCount,
    edgeFrom,
    edgeTo,
    new Uint8Array(edgeFrom.length).fill(1),
  );
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
 * Per node, the edges that touch it (offsets into `incidentEdges`), edges in index order; edges
 * with `valid[e] === 0` are left out.
 */
function incidence(
  nodeCount: number,
  edgeFrom: Int32Array,
  edgeTo: Int32Array,
  valid: Uint8Array,
): { incidentStart: Int32Array; incidentEdges: Int32Array } {
  const incidentStart = new Int32Array(nodeCount + 1);
  for (let e = 0; e < edgeFrom.length; e++) {
    if (valid[e] !== 1) continue;
    const from = (edgeFrom[e] as number) + 1;
    const to = (edgeTo[e] as number) + 1;
    incidentStart[from] = (incidentStart[from] as number) + 1;
    incidentStart[to] = (incidentStart[to] as number) + 1;
  }
  for (let i = 0; i < nodeCount; i++) {
    incidentStart[i + 1] = (incidentStart[i + 1] as number) + (incidentStart[i] as number);
  }
  const fill = Int32Array.from(incidentStart.subarray(0, nodeCount));
  const incidentEdges = new Int32Array(incidentStart[nodeCount] as number);
  for (let e = 0; e < edgeFrom.length; e++) {
    if (valid[e] !== 1) continue;
    const from = edgeFrom[e] as number;
    const to = edgeTo[e] as number;
    incidentEdges[fill[from] as number] = e;
    fill[from] = (fill[from] as number) + 1;
    incidentEdges[fill[to] as number] = e;
    fill[to] = (fill[to] as number) + 1;
  }
  return { incidentStart, incidentEdges };
}

/**
 * Connected parts of the network among the nodes with `included[node] === 1`, each as node
 * indices in the order found, parts in order of their lowest node. Iterative (an explicit stack):
 * a recursive search overflows the call stack on long chains of tens of thousands of nodes.
 */
function connectedParts(
  included: Uint8Array,
  incidentStart: Int32Array,
  incidentEdges: Int32Array,
  edgeFrom: Int32Array,
  edgeTo: Int32Array,
): number[][] {
  const seen = new Uint8Array(included.length);
  const parts: number[][] = [];
  const stack: number[] = [];
  for (let start = 0; start < included.length; start++) {
    if (included[start] !== 1 || seen[start] === 1) continue;
    const part: number[] = [];
    stack.push(start);
    seen[start] = 1;
    while (stack.length > 0) {
      const node = stack.pop() as number;
      part.push(node);
      for (let k = incidentStart[node] as number; k < (incidentStart[node + 1] as number); k++) {
        const e = incidentEdges[k] as number;
        const next =
          (edgeFrom[e] as number) === node ? (edgeTo[e] as number) : (edgeFrom[e] as number);
        if (seen[next] !== 1) {
          seen[next] = 1;
          stack.push(next);
        }
      }
    }
    parts.push(part);
  }
  return parts;
}
