import { describe, expect, it } from "vitest";
import { analyzeBlockPattern, type BlockLuStructure } from "../../src/solve/sparse-block-lu.js";
import { factorScalarMatrix, solveScalarFactored } from "../../src/solve/sparse-scalar-lu.js";
import {
  completeGraph,
  denseSolve,
  type Graph,
  gridGraph,
  random,
  randomGraph,
  treeGraph,
} from "./sparse-matrix-cases.js";

function neighboursOf(graph: Graph): number[][] {
  const neighbours: number[][] = Array.from({ length: graph.size }, () => []);
  for (const [i, j] of graph.edges) {
    if (!neighbours[i]?.includes(j)) neighbours[i]?.push(j);
    if (!neighbours[j]?.includes(i)) neighbours[j]?.push(i);
  }
  return neighbours;
}

/** A random non-symmetric scalar matrix on a block structure's pattern, sparse and dense. */
function randomMatrix(structure: BlockLuStructure, neighbours: number[][], rand: () => number) {
  const n = structure.size;
  const values = new Float64Array(structure.blockCount);
  const dense: number[][] = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  const put = (row: number, column: number, value: number) => {
    const index = structure.blockIndex(row, column);
    expect(index).toBeGreaterThanOrEqual(0);
    values[index] = (values[index] as number) + value;
    (dense[row] as number[])[column] = ((dense[row] as number[])[column] as number) + value;
  };
  for (let i = 0; i < n; i++) {
    for (const j of neighbours[i] as number[]) put(i, j, rand() - 0.7);
    // Diagonally dominant, as the first guess's Laplacians and mixing balances are.
    put(i, i, 1 + (neighbours[i] as number[]).length + rand());
  }
  const rhs = Float64Array.from({ length: n }, () => rand() * 2 - 1);
  return { values, dense, rhs };
}

describe("sparse scalar LU on a block structure", () => {
  const cases: [string, (rand: () => number) => Graph][] = [
    ["a tree", (rand) => treeGraph(80, rand)],
    ["a grid with many loops", () => gridGraph(7, 9)],
    ["a random meshed graph", (rand) => randomGraph(60, 50, rand)],
    ["a single node", () => ({ size: 1, edges: [] })],
    // One front of 31 pivots: the pairs of the elimination and its odd last pivot.
    ["a complete graph (one front of 31 rows)", () => completeGraph(31)],
    ["a 14 x 15 grid", () => gridGraph(14, 15)],
  ];
  for (const [name, make] of cases) {
    it(`agrees with a dense pivoted solve to 1e-12 relative on ${name}`, () => {
      for (let seed = 1; seed <= 10; seed++) {
        const rand = random(seed);
        const graph = make(rand);
        const neighbours = neighboursOf(graph);
        const structure = analyzeBlockPattern({ size: graph.size, neighbours });
        const { values, dense, rhs } = randomMatrix(structure, neighbours, rand);
        const x = solveScalarFactored(factorScalarMatrix(structure, values), rhs);
        const reference = denseSolve(dense, [...rhs]);
        const scale = Math.max(...reference.map(Math.abs));
        for (let i = 0; i < reference.length; i++) {
          expect(Math.abs((x[i] as number) - (reference[i] as number))).toBeLessThan(1e-12 * scale);
        }
      }
    });
  }

  it("gives the same solution when it reuses an earlier factorization's storage", () => {
    const graph = gridGraph(9, 11);
    const neighbours = neighboursOf(graph);
    const structure = analyzeBlockPattern({ size: graph.size, neighbours });
    const first = randomMatrix(structure, neighbours, random(3));
    const second = randomMatrix(structure, neighbours, random(4));
    const fresh = solveScalarFactored(factorScalarMatrix(structure, second.values), second.rhs);
    const old = factorScalarMatrix(structure, first.values);
    const reused = solveScalarFactored(
      factorScalarMatrix(structure, second.values, old),
      second.rhs,
    );
    expect([...reused]).toEqual([...fresh]);
  });

  it("shifts a zero pivot, lists its row and stays finite", () => {
    const graph = treeGraph(10, random(5));
    const neighbours = neighboursOf(graph);
    const structure = analyzeBlockPattern({ size: graph.size, neighbours });
    const { values, rhs } = randomMatrix(structure, neighbours, random(6));
    const isolated = 4;
    // Row and column 4 all zero: singular, its pivot exactly zero whatever comes before it.
    for (let j = 0; j < graph.size; j++) {
      for (const index of [structure.blockIndex(isolated, j), structure.blockIndex(j, isolated)])
        if (index >= 0) values[index] = 0;
    }
    const factors = factorScalarMatrix(structure, values);
    expect(factors.perturbedPivots).toEqual([isolated]);
    expect([...solveScalarFactored(factors, rhs)].every(Number.isFinite)).toBe(true);
  });
});
