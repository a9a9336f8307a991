import { describe, expect, it } from "vitest";
import {
  minimumDegreeOrdering,
  nestedDissectionOrdering,
  type SymmetricPattern,
} from "../../src/solve/fill-reducing-ordering.js";
import { analyzeBlockPattern } from "../../src/solve/sparse-block-lu.js";
import { random } from "./sparse-matrix-cases.js";

function patternOf(size: number, edges: [number, number][]): SymmetricPattern {
  const neighbours: number[][] = Array.from({ length: size }, () => []);
  for (const [i, j] of edges) {
    if (i === j || neighbours[i]?.includes(j)) continue;
    neighbours[i]?.push(j);
    neighbours[j]?.push(i);
  }
  return { size, neighbours };
}

function grid(rows: number, columns: number): SymmetricPattern {
  const edges: [number, number][] = [];
  for (let r = 0; r < rows; r++) {
    for (let c = 0; c < columns; c++) {
      const i = r * columns + c;
      if (c + 1 < columns) edges.push([i, i + 1]);
      if (r + 1 < rows) edges.push([i, i + columns]);
    }
  }
  return patternOf(rows * columns, edges);
}

function tree(size: number, rand: () => number): SymmetricPattern {
  const edges: [number, number][] = [];
  for (let i = 1; i < size; i++) edges.push([Math.floor(rand() * i), i]);
  return patternOf(size, edges);
}

/** A grid with trees hanging off it and a few random chords: a generated network's shape. */
function meshWithBranches(rand: () => number): SymmetricPattern {
  const core = grid(30, 30);
  const edges: [number, number][] = [];
  core.neighbours.forEach((list, i) => {
    for (const j of list) if (i < j) edges.push([i, j]);
  });
  let size = core.size;
  for (let k = 0; k < 1500; k++) edges.push([Math.floor(rand() * size), size++]);
  for (let k = 0; k < 40; k++) edges.push([Math.floor(rand() * size), Math.floor(rand() * size)]);
  return patternOf(size, edges);
}

/**
 * Fill and work of eliminating in `order`, counted on the elimination graph itself (every
 * eliminated row couples its remaining neighbours pairwise; Rose, "A graph-theoretic study of the
 * numerical solution of sparse positive definite systems", 1972): independent of the
 * factorization's symbolic code.
 */
function eliminationCounts(pattern: SymmetricPattern, order: Int32Array) {
  const adjacency = pattern.neighbours.map((list) => new Set(list));
  let fill = 0;
  let updates = 0;
  for (const pivot of order) {
    const rest = [...(adjacency[pivot] as Set<number>)];
    updates += rest.length * rest.length;
    for (const s of rest) {
      const own = adjacency[s] as Set<number>;
      own.delete(pivot);
      for (const t of rest) {
        if (t !== s && !own.has(t)) {
          own.add(t);
          if (s < t) fill++;
        }
      }
    }
    (adjacency[pivot] as Set<number>).clear();
  }
  return { fill, updates };
}

function expectPermutation(order: Int32Array, size: number): void {
  expect(order.length).toBe(size);
  expect([...order].sort((a, b) => a - b)).toEqual(Array.from({ length: size }, (_, i) => i));
}

const cases: [string, SymmetricPattern][] = [
  ["a 40 x 40 grid", grid(40, 40)],
  ["a tree of 2,000 rows", tree(2000, random(1))],
  ["a grid with branches and chords", meshWithBranches(random(2))],
  [
    "two separate grids and isolated rows",
    patternOf(25 + 36 + 3, [
      ...grid(5, 5).neighbours.flatMap((list, i) => list.map((j): [number, number] => [i, j])),
      ...grid(6, 6).neighbours.flatMap((list, i) =>
        list.map((j): [number, number] => [25 + i, 25 + j]),
      ),
    ]),
  ],
  ["no rows", { size: 0, neighbours: [] }],
];

describe("fill-reducing orderings", () => {
  for (const [name, pattern] of cases) {
    it(`both orderings are permutations on ${name}`, () => {
      expectPermutation(minimumDegreeOrdering(pattern), pattern.size);
      expectPermutation(nestedDissectionOrdering(pattern), pattern.size);
    });
  }

  it("minimum degree eliminates a tree leaves first: no fill", () => {
    const pattern = tree(2000, random(3));
    expect(eliminationCounts(pattern, minimumDegreeOrdering(pattern)).fill).toBe(0);
    expect(analyzeBlockPattern(pattern).fillBlocks).toBe(0);
  });

  it("nested dissection needs fewer block updates than minimum degree on a 70 x 70 grid", () => {
    // George (1973): dissection's work grows as k^3 on a k x k grid; minimum degree's faster.
    const pattern = grid(70, 70);
    const dissection = eliminationCounts(pattern, nestedDissectionOrdering(pattern));
    const degree = eliminationCounts(pattern, minimumDegreeOrdering(pattern));
    expect(dissection.updates).toBeLessThan(degree.updates);
  });

  for (const [name, pattern] of cases.slice(0, 3)) {
    it(`the factorization's ordering is never worse than minimum degree alone on ${name}`, () => {
      const structure = analyzeBlockPattern(pattern);
      const chosen = eliminationCounts(pattern, structure.order);
      const degree = eliminationCounts(pattern, minimumDegreeOrdering(pattern));
      expect(chosen.updates).toBeLessThanOrEqual(degree.updates);
      // The symbolic factorization counts what the elimination graph does.
      expect(structure.fillBlocks).toBe(chosen.fill);
      expect(structure.factorUpdates).toBe(chosen.updates);
    });
  }
});
