/**
 * The hardening corpus: 1 008 seeded random networks of 5 to 40 edges (test/hardening/corpus.ts)
 * in nine families (112 of each, but 56 overloaded and 168 near-choke networks). Every one must converge with conservation, checked here from the result
 * alone, or come back as no-solution with a diagnosis; nothing else may come out as a solution.
 * The rate is printed with the test output.
 */
import { beforeAll, describe, expect, it } from "vitest";
import type { NetworkDocument, NetworkResult } from "../../src/index.js";
import { type CorpusCase, type CorpusFamily, corpus, FAMILIES } from "./corpus.js";
import {
  describeOutcome,
  diagnosisProblems,
  knownDefect,
  type Outcome,
  solutionProblems,
  solveOutcome,
} from "./outcome.js";

/** Seeds 1 to 1008: 56 runs of 18 seeds (corpus.ts, familyOf). */
const CORPUS_SIZE = 56 * 18;

/**
 * The share converged or diagnosed when this test was written: a floor, so that a change that
 * makes more networks fail is caught. Since defect B3 was fixed every network converges or is
 * diagnosed, which the 100 % test below holds; the floor stays as the rate table's own check.
 */
const RATE_FLOOR = 0.995;

interface Solved {
  item: CorpusCase;
  outcome: Outcome;
}

let solved: Solved[] = [];

/**
 * Edge flows of a tree with one reservoir, from the demands alone: the flow into a subtree is
 * the sum of its demands (conservation on a tree has one solution). Signed by the declared
 * direction of each edge. Undefined when the document is not such a tree.
 */
function treeFlows(document: NetworkDocument): Map<string, number> | undefined {
  const reservoirs = document.nodes.filter((node) => node.kind === "reservoir");
  if (reservoirs.length !== 1 || document.edges.length !== document.nodes.length - 1) {
    return undefined;
  }
  const root = (reservoirs[0] as { id: string }).id;
  const demand = new Map(document.nodes.map((node) => [node.id, Number(node.demand ?? 0)]));
  const adjacent = new Map<string, { edge: string; other: string; forward: boolean }[]>();
  for (const edge of document.edges) {
    const add = (at: string, other: string, forward: boolean) => {
      const list = adjacent.get(at) ?? [];
      list.push({ edge: edge.id, other, forward });
      adjacent.set(at, list);
    };
    add(edge.from, edge.to, true);
    add(edge.to, edge.from, false);
  }
  const flows = new Map<string, number>();
  const subtreeDemand = (node: string, parent: string | undefined): number => {
    let sum = demand.get(node) ?? 0;
    for (const { edge, other, forward } of adjacent.get(node) ?? []) {
      if (other === parent) continue;
      const below = subtreeDemand(other, node);
      flows.set(edge, forward ? below : -below);
      sum += below;
    }
    return sum;
  };
  subtreeDemand(root, undefined);
  return flows.size === document.edges.length ? flows : undefined;
}

function kindOf(entry: Solved): string {
  return entry.outcome.kind;
}

beforeAll(() => {
  solved = corpus(CORPUS_SIZE).map((item) => ({ item, outcome: solveOutcome(item.document) }));
  // The convergence table, printed with the test output.
  const rows = FAMILIES.map((family) => {
    const ofFamily = solved.filter((entry) => entry.item.family === family);
    const count = (kind: string) => ofFamily.filter((entry) => kindOf(entry) === kind).length;
    return `${family.padEnd(18)} ${String(ofFamily.length).padStart(4)} ${String(count("converged")).padStart(9)} ${String(count("no-solution")).padStart(11)} ${String(count("not-converged")).padStart(13)}`;
  });
  const good = solved.filter((entry) => ["converged", "no-solution"].includes(kindOf(entry)));
  console.log(
    [
      `hardening corpus: ${solved.length} networks, ${good.length} converged or diagnosed (${((100 * good.length) / solved.length).toFixed(1)} %)`,
      `${"family".padEnd(18)} ${"n".padStart(4)} converged no-solution not-converged`,
      ...rows,
    ].join("\n"),
  );
}, 300_000);

describe("the hardening corpus", () => {
  it("holds at least 1 000 networks of 5 to 40 edges, every family alike", () => {
    expect(solved.length).toBeGreaterThanOrEqual(1000);
    for (const { item } of solved) {
      expect(item.document.edges.length).toBeGreaterThanOrEqual(5);
      expect(item.document.edges.length).toBeLessThanOrEqual(41);
    }
    const expected = (family: CorpusFamily) =>
      family === "overload" ? 56 : family === "near-choke" ? 168 : 112;
    for (const family of FAMILIES) {
      expect(solved.filter((entry) => entry.item.family === family).length).toBe(expected(family));
    }
  });

  it("is the same for the same seed (seeded, no clock, no Math.random)", () => {
    const again = corpus(20);
    expect(again.map((item) => JSON.stringify(item.document))).toEqual(
      solved.slice(0, 20).map((entry) => JSON.stringify(entry.item.document)),
    );
  });

  it("never throws, never is an input error, never fails the internal check but by defect K (counted)", () => {
    const bad = solved.filter(
      (entry) =>
        ["exception", "internal-check", "input-error"].includes(entry.outcome.kind) &&
        knownDefect(entry.outcome) === undefined,
    );
    expect(
      bad.map((entry) => `seed ${entry.item.seed}: ${describeOutcome(entry.outcome)}`),
    ).toEqual([]);
    const k = solved.filter((entry) => knownDefect(entry.outcome) === "K");
    console.log(
      `defect K (internal check fails after a round-off convergence): ${k.length} networks, seeds ${k.map((entry) => entry.item.seed).join(", ")}`,
    );
  });

  // Defect K (hard-networks.test.ts, tiny-flow-large-bore.json): since fff371f the solver
  // accepts a mass residual at the flows' own round-off, and its independent check, which
  // allows 100 x the tolerance, then fails: solveNetwork throws InternalCheckError.
  it("never fails the internal check (defect K, fixed)", () => {
    const k = solved.filter((entry) => entry.outcome.kind === "internal-check");
    expect(k.map((entry) => entry.item.seed)).toEqual([]);
  });

  it("every converged network conserves mass and energy at every node (recomputed here from the result), keeps every edge within its capacity and has no NaN or Infinity", () => {
    const problems = solved.flatMap((entry) =>
      entry.outcome.kind === "converged"
        ? solutionProblems(entry.outcome.result, entry.item.document).map(
            (problem) => `seed ${entry.item.seed} (${entry.item.family}): ${problem}`,
          )
        : [],
    );
    expect(problems).toEqual([]);
    const loose = solved.filter(
      (entry) => entry.outcome.kind === "converged" && entry.outcome.result.residual > 1e-9,
    );
    console.log(
      `converged with a residual above the 1e-9 tolerance (accepted at the flows' round-off): ${loose.length}, largest ${Math.max(0, ...loose.map((entry) => (entry.outcome as { result: NetworkResult }).result.residual)).toExponential(1)}`,
    );
  });

  it("in every converged tree, each edge carries the sum of the demands beyond it (conservation on a tree, 1e-8 of the throughput)", () => {
    let trees = 0;
    for (const { item, outcome } of solved) {
      if (outcome.kind !== "converged") continue;
      const expected = treeFlows(item.document);
      if (expected === undefined) continue;
      trees++;
      const result: NetworkResult = outcome.result;
      const throughput = result.balance.throughput;
      for (const edge of result.edges) {
        const flow = expected.get(edge.id) as number;
        // 1e-8 of the throughput: ten times the solver tolerance (scaled residual 1e-9).
        expect(Math.abs(edge.massFlow - flow), `seed ${item.seed} edge ${edge.id}`).toBeLessThan(
          1e-8 * throughput,
        );
      }
    }
    expect(trees).toBeGreaterThan(100);
  });

  it("every no-solution result names its limiting edges and how much of the demand can be met", () => {
    const problems = solved.flatMap((entry) =>
      entry.outcome.kind === "no-solution"
        ? diagnosisProblems(entry.outcome.result).map(
            (problem) => `seed ${entry.item.seed}: ${problem}`,
          )
        : [],
    );
    expect(problems).toEqual([]);
  });

  it("every other result says it is not a solution: converged false, a not-converged warning first, finite numbers", () => {
    for (const { item, outcome } of solved) {
      if (outcome.kind !== "not-converged") continue;
      expect(outcome.result.converged, `seed ${item.seed}`).toBe(false);
      expect(outcome.result.warnings[0]?.code, `seed ${item.seed}`).toBe("not-converged");
      expect(JSON.stringify(outcome.result), `seed ${item.seed}`).not.toMatch(/NaN|Infinity|null/);
    }
  });

  it(`converges or diagnoses at least ${100 * RATE_FLOOR} % (the rate when this test was written)`, () => {
    const good = solved.filter((entry) => ["converged", "no-solution"].includes(kindOf(entry)));
    expect(good.length / solved.length).toBeGreaterThanOrEqual(RATE_FLOOR);
  });

  // Defect B3 (fixed by a reference pressure per group of close junctions): two tiny-huge
  // networks (seeds 736 and 871) whose flows were below the resolution of pressure offsets from
  // the highest reservoir pressure at junctions far below it stalled
  // (offsets-far-below-supply-*.json in hard-networks.test.ts). B2 (22 networks) is fixed by the
  // pressure offsets and the small-drop law; B to E, which kept the rate at 83 % when the corpus
  // was first run, by fff371f.
  it("converges or diagnoses every network of the corpus (100 %)", () => {
    const failing = solved.filter((entry) => !["converged", "no-solution"].includes(kindOf(entry)));
    const byFamily = new Map<CorpusFamily, number[]>();
    for (const entry of failing) {
      byFamily.set(entry.item.family, [
        ...(byFamily.get(entry.item.family) ?? []),
        entry.item.seed,
      ]);
    }
    expect(Object.fromEntries(byFamily)).toEqual({});
  });
});
