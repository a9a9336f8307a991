/**
 * Determinism: the same input gives bit-identical output on every run, whatever was solved
 * before it; another order of the nodes and edges in the file gives the same per-id results.
 *
 * Both hold bit for bit: the model sorts nodes and edges by id before it numbers them
 * (src/model/build-network.ts), so the sparse LU's elimination order, the sums over edges and
 * every tie-break are the same whatever the file's order; the results are listed in the file's
 * order. Before that, two orders ended at two states that both met the tolerance, and the test
 * of agreement to the tolerance below is kept from then (it now measures 0).
 */
import { describe, expect, it } from "vitest";
import { type NetworkDocument, type NetworkResult, solveNetwork } from "../../src/index.js";
import { resultJson } from "../../src/output/result-json.js";
import { corpus, seededRandom } from "./corpus.js";

/** 8 networks of each family (seeds 1 to 72), converged and not. */
const SAMPLE = corpus(72);

function shuffled<T>(list: readonly T[], random: () => number): T[] {
  const copy = [...list];
  for (let i = copy.length - 1; i > 0; i--) {
    const j = Math.floor(random() * (i + 1));
    [copy[i], copy[j]] = [copy[j] as T, copy[i] as T];
  }
  return copy;
}

/** The document with its nodes and edges in a seeded random order. */
function reordered(document: NetworkDocument, seed: number): NetworkDocument {
  const random = seededRandom(seed);
  return {
    ...document,
    nodes: shuffled(document.nodes, random),
    edges: shuffled(document.edges, random),
  };
}

/** Junctions that either result reports without flow (their temperature is a fallback). */
function noFlowNodes(a: NetworkResult, b: NetworkResult): Set<string> {
  return new Set(
    [...a.warnings, ...b.warnings]
      .filter((warning) => warning.code === "no-flow")
      .map((warning) => warning.node as string),
  );
}

/**
 * Largest differences between two results of one network, matched by id: `state` over
 * pressures and the temperatures of junctions with flow, `noFlowTemperature` over the junctions
 * with a no-flow warning, `flow` over the edge flows relative to the throughput.
 */
function differences(a: NetworkResult, b: NetworkResult) {
  const nodes = new Map(b.nodes.map((node) => [node.id, node]));
  const edges = new Map(b.edges.map((edge) => [edge.id, edge]));
  const quiet = noFlowNodes(a, b);
  let state = 0;
  let noFlowTemperature = 0;
  let flow = 0;
  let bitIdentical = true;
  for (const node of a.nodes) {
    const other = nodes.get(node.id);
    if (!other) throw new Error(`node ${node.id} missing`);
    const temperature = Math.abs(other.temperature / node.temperature - 1);
    state = Math.max(state, Math.abs(other.pressure / node.pressure - 1));
    if (quiet.has(node.id)) noFlowTemperature = Math.max(noFlowTemperature, temperature);
    else state = Math.max(state, temperature);
    if (other.pressure !== node.pressure || other.temperature !== node.temperature) {
      bitIdentical = false;
    }
  }
  for (const edge of a.edges) {
    const other = edges.get(edge.id);
    if (!other) throw new Error(`edge ${edge.id} missing`);
    flow = Math.max(flow, Math.abs(other.massFlow - edge.massFlow) / a.balance.throughput);
    if (other.massFlow !== edge.massFlow) bitIdentical = false;
  }
  return { state, noFlowTemperature, flow, bitIdentical };
}

/** A message whose list of edges is in the file's order, with its list parts sorted. */
const sortedParts = (message: string): string =>
  message.replace(
    /(edges? )(.*?)( (?:is|are) choked)/,
    (_, before: string, list: string, after: string) =>
      `${before}${list.split(", ").sort().join(", ")}${after}`,
  );

/**
 * The result with every list sorted (nodes and edges by id, the rest by their JSON text), the
 * lists inside the no-solution message too.
 */
function sortedLists(result: NetworkResult): NetworkResult {
  const byText = <T>(list: readonly T[]): T[] =>
    [...list].sort((a, b) => {
      const ta = JSON.stringify(a);
      const tb = JSON.stringify(b);
      return ta < tb ? -1 : ta > tb ? 1 : 0;
    });
  const byId = <T extends { id: string }>(list: readonly T[]): T[] =>
    [...list].sort((a, b) => (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));
  const sorted: NetworkResult = {
    ...result,
    nodes: byId(result.nodes),
    edges: byId(result.edges),
    warnings: byText(
      result.warnings.map((warning) =>
        warning.code === "no-solution"
          ? { ...warning, message: sortedParts(warning.message) }
          : warning,
      ),
    ),
  };
  if (result.diagnosis) {
    sorted.diagnosis = {
      ...result.diagnosis,
      message: sortedParts(result.diagnosis.message),
      limitingEdges: byId(result.diagnosis.limitingEdges),
      openEquations: byText(result.diagnosis.openEquations),
    };
  }
  return sorted;
}

const baseline = SAMPLE.map((item) => ({ item, result: solveNetwork(item.document) }));
const converged = baseline.filter((entry) => entry.result.status === "converged");
const reorders = converged.map((entry) => ({
  ...entry,
  other: solveNetwork(reordered(entry.item.document, entry.item.seed + 1000)),
}));

describe("the same input", () => {
  it("gives bit-identical JSON output twice in a row (converged or not)", () => {
    for (const { item, result } of baseline) {
      const again = solveNetwork(structuredClone(item.document));
      expect(resultJson(again), `seed ${item.seed}`).toBe(resultJson(result));
    }
  });

  it("gives the same bits whatever was solved before (no state kept between solves)", () => {
    const first = baseline[0] as (typeof baseline)[number];
    // Solve the sample in reverse, then the first network again.
    for (const { item } of [...baseline].reverse()) solveNetwork(item.document);
    expect(resultJson(solveNetwork(first.item.document))).toBe(resultJson(first.result));
  });

  it("gives the same bits from the JSON text as from the parsed object", () => {
    for (const { item, result } of baseline.slice(0, 18)) {
      expect(resultJson(solveNetwork(JSON.stringify(item.document)))).toBe(resultJson(result));
    }
  });
});

describe("another order of nodes and edges in the file", () => {
  it("has converged networks to compare (the sample has every family)", () => {
    expect(converged.length).toBeGreaterThan(50);
  });

  it("gives the same results by id to the solver's tolerance: flows to 1e-8 of the throughput, pressures and temperatures to 1e-9 relative", () => {
    let worstState = 0;
    let worstFlow = 0;
    let worstQuiet = 0;
    for (const { item, result, other } of reorders) {
      if (other.status !== "converged") continue; // counted in the last test
      const d = differences(result, other);
      worstState = Math.max(worstState, d.state);
      worstFlow = Math.max(worstFlow, d.flow);
      worstQuiet = Math.max(worstQuiet, d.noFlowTemperature);
      // Both states meet the scaled residual 1e-9: their flows may differ by about that much
      // (a loop's circulating flow by a little more), so 1e-8 of the throughput, and the
      // pressures and mixing temperatures behind those flows by far less (1e-9 relative).
      expect(d.flow, `seed ${item.seed}`).toBeLessThan(1e-8);
      expect(d.state, `seed ${item.seed}`).toBeLessThan(1e-9);
      // A junction without flow takes the ambient temperature through a weight that a trickle
      // of round-off flow (order 1e-9 of the throughput) moves: 1e-6 relative, 0.3 mK.
      expect(d.noFlowTemperature, `seed ${item.seed}`).toBeLessThan(1e-6);
    }
    console.log(
      `reordered nodes and edges: largest flow difference ${worstFlow.toExponential(1)} of the throughput; largest relative pressure or temperature difference ${worstState.toExponential(1)}; at junctions without flow ${worstQuiet.toExponential(1)}`,
    );
  });

  it("gives the very same numbers when only the lists are copied, not reordered", () => {
    for (const { item, result } of converged.slice(0, 10)) {
      const copy = {
        ...item.document,
        nodes: [...item.document.nodes],
        edges: [...item.document.edges],
      };
      expect(differences(result, solveNetwork(copy)).bitIdentical).toBe(true);
    }
  });

  // Issue 9 asks for bit-identical output with any order of nodes and edges. The model puts
  // nodes and edges in canonical order (by id) before anything is numbered, so every index, sum
  // and tie-break of the solver is the same; the results are listed in the file's order.
  it("gives bit-identical per-id results in any order (issue 9)", () => {
    for (const { item, result, other } of reorders) {
      expect(differences(result, other).bitIdentical, `seed ${item.seed}`).toBe(true);
    }
  });

  it("gives the very same whole result in any order, up to the order of lists, converged or not", () => {
    const statuses = new Set<string>();
    // The sample as it is, and a few networks cut short after two iterations (not converged).
    const cutShort = SAMPLE.slice(0, 6).map((item) => {
      const document = {
        ...item.document,
        settings: { ...item.document.settings, maxIterations: 2 },
      };
      return { item: { ...item, document }, result: solveNetwork(document) };
    });
    for (const { item, result } of [...baseline, ...cutShort]) {
      const other = solveNetwork(reordered(item.document, item.seed + 2000));
      statuses.add(result.status);
      expect(resultJson(sortedLists(other)), `seed ${item.seed}`).toBe(
        resultJson(sortedLists(result)),
      );
      // And in the file's order: the results follow the lists of the document solved, and so
      // do the limiting edges of a diagnosis (each list in the order of the document's edges).
      const document = reordered(item.document, item.seed + 2000);
      expect(
        other.nodes.map((node) => node.id),
        `seed ${item.seed}`,
      ).toEqual(document.nodes.map((node) => node.id));
      expect(
        other.edges.map((edge) => edge.id),
        `seed ${item.seed}`,
      ).toEqual(document.edges.map((edge) => edge.id));
      if (other.diagnosis !== undefined) {
        const position = new Map(document.edges.map((edge, index) => [edge.id, index]));
        const positions = other.diagnosis.limitingEdges.map((edge) => position.get(edge.id) ?? -1);
        expect(positions, `seed ${item.seed}`).toEqual([...positions].sort((a, b) => a - b));
      }
    }
    expect([...statuses].sort()).toEqual(["converged", "no-solution", "not-converged"]);
  });

  // Before the canonical order, a network at the edge of convergence (defects B and C in
  // hard-networks.test.ts) could converge in one order and not in another.
  it("ends in the same status in any order", () => {
    const changed = reorders.filter(({ result, other }) => other.status !== result.status);
    expect(changed.length).toBe(0);
  });
});
