/**
 * Patterns and references shared by the tests of the sparse factorizations
 * (sparse-block-lu.test.ts, sparse-scalar-lu.test.ts): a seeded generator, graphs, and a dense
 * solve with partial pivoting written here as the independent reference.
 */

export { seededRandom as random } from "../seeded-random.js";

/** Dense Gaussian elimination with partial pivoting: the independent reference. */
export function denseSolve(matrix: number[][], rhs: number[]): number[] {
  const n = rhs.length;
  const a = matrix.map((row, i) => [...row, rhs[i] as number]);
  for (let k = 0; k < n; k++) {
    let best = k;
    for (let i = k + 1; i < n; i++) {
      if (Math.abs(a[i]?.[k] as number) > Math.abs(a[best]?.[k] as number)) best = i;
    }
    [a[k], a[best]] = [a[best] as number[], a[k] as number[]];
    const pivotRow = a[k] as number[];
    for (let i = k + 1; i < n; i++) {
      const row = a[i] as number[];
      const factor = (row[k] as number) / (pivotRow[k] as number);
      for (let j = k; j <= n; j++) row[j] = (row[j] as number) - factor * (pivotRow[j] as number);
    }
  }
  const x = new Array<number>(n).fill(0);
  for (let i = n - 1; i >= 0; i--) {
    const row = a[i] as number[];
    let sum = row[n] as number;
    for (let j = i + 1; j < n; j++) sum -= (row[j] as number) * (x[j] as number);
    x[i] = sum / (row[i] as number);
  }
  return x;
}

export type Graph = { size: number; edges: [number, number][] };

export function treeGraph(size: number, rand: () => number): Graph {
  const edges: [number, number][] = [];
  for (let i = 1; i < size; i++) edges.push([Math.floor(rand() * i), i]);
  return { size, edges };
}

export function gridGraph(rows: number, columns: number): Graph {
  const edges: [number, number][] = [];
  for (let r = 0; r < rows; r++) {
    for (let c = 0; c < columns; c++) {
      const i = r * columns + c;
      if (c + 1 < columns) edges.push([i, i + 1]);
      if (r + 1 < rows) edges.push([i, i + columns]);
    }
  }
  return { size: rows * columns, edges };
}

export function completeGraph(size: number): Graph {
  const edges: [number, number][] = [];
  for (let i = 0; i < size; i++) for (let j = i + 1; j < size; j++) edges.push([i, j]);
  return { size, edges };
}

export function randomGraph(size: number, extra: number, rand: () => number): Graph {
  const graph = treeGraph(size, rand);
  for (let e = 0; e < extra; e++) {
    const i = Math.floor(rand() * size);
    const j = Math.floor(rand() * size);
    if (i !== j) graph.edges.push([i, j]);
  }
  return graph;
}
