/**
 * Sparse LU factorization of a matrix made of 2 x 2 blocks whose block pattern is symmetric,
 * such as the Jacobian of a network with a pressure and a temperature unknown per node.
 *
 * Written by hand: the npm registry carries no maintained sparse direct solver (searched for
 * "sparse" among its packages; what exists is sparse storage without factorization). Kept small:
 * a greedy minimum-degree ordering, a symbolic elimination that fixes the fill pattern once, and a
 * numeric factorization that reuses that pattern for every matrix with the same structure (every
 * Newton iteration, every case of a study).
 *
 * Pivots are the 2 x 2 diagonal blocks in the chosen order (no row exchanges between blocks).
 * This suits nodal network Jacobians, whose diagonal blocks dominate: each node's balance depends
 * most on its own pressure and temperature. A pivot block that is singular or nearly so is
 * reported through {@link BlockLuFactorization.perturbedPivots} after a tiny diagonal shift, so the
 * caller (a Newton iteration that checks its residual) can tell.
 */

/** Structure of a block matrix: `neighbours[i]` lists the blocks j != i with A_ij != 0. */
export interface BlockPattern {
  /** Number of block rows (and columns). */
  size: number;
  /** Off-diagonal neighbours of each block row; must be symmetric (j in i's list iff i in j's). */
  neighbours: readonly (readonly number[])[];
}

/** The symbolic part of a factorization: ordering and fill, shared by every matrix of a pattern. */
export interface BlockLuStructure {
  size: number;
  /** Elimination order: `order[step]` is the block row eliminated at that step. */
  order: Int32Array;
  /** Position of each block row in the elimination order. */
  position: Int32Array;
  /** Number of stored blocks (diagonal, original off-diagonal and fill). */
  blockCount: number;
  /** Offsets into `laterNeighbours` per elimination step. */
  laterStart: Int32Array;
  /**
   * For each step, the block rows eliminated after it that it is coupled to (after fill), in
   * elimination order.
   */
  laterNeighbours: Int32Array;
  /** For each step and each later neighbour s: index of block (s, pivot). */
  lowerBlock: Int32Array;
  /** For each step and each later neighbour t: index of block (pivot, t). */
  upperBlock: Int32Array;
  /**
   * Cumulative count of block updates (pairs of later neighbours) per step: `updateStart[size]`
   * is the work of one numeric factorization in 2 x 2 block updates.
   */
  updateStart: Int32Array;
  /** Map from (row, column) to stored block index for the original pattern, row-major lookup. */
  blockIndex: (row: number, column: number) => number;
  /** Number of fill blocks the ordering created (0 for a tree eliminated leaves first). */
  fillBlocks: number;
}

/** A numeric factorization, ready for solves. */
export interface BlockLuFactorization {
  structure: BlockLuStructure;
  /** Factored blocks: L below the diagonal (unit block diagonal implied), U above. */
  values: Float64Array;
  /** Inverse of each pivot block, per block row. */
  pivotInverse: Float64Array;
  /** Block rows whose pivot had to be shifted because it was (nearly) singular. */
  perturbedPivots: number[];
}

/**
 * Order the blocks by greedy minimum degree and fix the fill pattern.
 *
 * Minimum degree (Tinney and Walker, Proc. IEEE 55 (1967) 1801, "scheme 2") eliminates at each
 * step a block row with the fewest remaining neighbours, breaking ties by the lowest index so the
 * result is deterministic. On a tree it eliminates leaves first and creates no fill at all.
 */
export function analyzeBlockPattern(pattern: BlockPattern): BlockLuStructure {
  const n = pattern.size;
  // Adjacency as plain arrays with lazy deletion (entries of eliminated nodes are dropped when a
  // list is next compacted); a stamp array dedupes without a Set.
  const adjacency: number[][] = [];
  for (let i = 0; i < n; i++) adjacency.push([...(pattern.neighbours[i] ?? [])]);
  const eliminated = new Uint8Array(n);
  const stamp = new Int32Array(n).fill(-1);
  const degree = new Int32Array(n);
  const compact = (node: number, mark: number): number[] => {
    const list = adjacency[node] as number[];
    let kept = 0;
    for (let k = 0; k < list.length; k++) {
      const other = list[k] as number;
      if (eliminated[other] === 1 || other === node || stamp[other] === mark) continue;
      stamp[other] = mark;
      list[kept++] = other;
    }
    list.length = kept;
    return list;
  };
  // Binary heap of (degree, index) with lazy deletion: a popped entry whose degree is stale is
  // skipped. Ties go to the lowest index, so the ordering is deterministic.
  const heap = new MinHeap();
  let mark = 0;
  for (let i = 0; i < n; i++) {
    degree[i] = compact(i, mark++).length;
    heap.push(degree[i] as number, i);
  }
  const order = new Int32Array(n);
  const laterLists: number[][] = [];
  let fillBlocks = 0;
  for (let step = 0; step < n; step++) {
    let pivot = -1;
    while (pivot < 0) {
      const [d, node] = heap.pop();
      if (eliminated[node] === 0 && degree[node] === d) pivot = node;
    }
    order[step] = pivot;
    eliminated[pivot] = 1;
    const neighbours = compact(pivot, mark++).slice();
    laterLists.push(neighbours);
    // Eliminating the pivot couples all its remaining neighbours pairwise (fill).
    for (const s of neighbours) {
      const list = compact(s, mark); // stamps s's live neighbours with `mark`
      for (const t of neighbours) {
        if (t !== s && stamp[t] !== mark) {
          stamp[t] = mark;
          list.push(t);
          fillBlocks++;
        }
      }
      mark++;
      degree[s] = list.length;
      heap.push(degree[s] as number, s);
    }
  }
  fillBlocks /= 2;

  const position = new Int32Array(n);
  for (let step = 0; step < n; step++) position[order[step] as number] = step;

  // Block numbering: diagonal blocks first (index = row); then, for the k-th later neighbour s
  // of each step's pivot, block (s, pivot) at n + 2k and block (pivot, s) at n + 2k + 1. Every
  // off-diagonal pair of the filled pattern belongs to exactly one step: the one that eliminates
  // the first of its two rows.
  const laterStart = new Int32Array(n + 1);
  const updateStart = new Int32Array(n + 1);
  for (let step = 0; step < n; step++) {
    const count = (laterLists[step] as number[]).length;
    laterStart[step + 1] = (laterStart[step] as number) + count;
    updateStart[step + 1] = (updateStart[step] as number) + count * count;
  }
  const laterNeighbours = new Int32Array(laterStart[n] as number);
  for (let step = 0; step < n; step++)
    laterNeighbours.set(
      (laterLists[step] as number[]).sort(
        (a, b) => (position[a] as number) - (position[b] as number),
      ),
      laterStart[step] as number,
    );
  const blockCount = n + 2 * (laterStart[n] as number);
  const lookup = (row: number, column: number): number => {
    if (row === column) return row;
    const rowFirst = (position[row] as number) < (position[column] as number);
    const first = rowFirst ? row : column;
    const second = rowFirst ? column : row;
    const step = position[first] as number;
    // Binary search of the later neighbours of `first`, sorted by elimination order.
    let lo = laterStart[step] as number;
    let hi = (laterStart[step + 1] as number) - 1;
    while (lo <= hi) {
      const mid = (lo + hi) >> 1;
      const value = laterNeighbours[mid] as number;
      if (value === second) return n + 2 * mid + (rowFirst ? 1 : 0);
      if ((position[value] as number) < (position[second] as number)) lo = mid + 1;
      else hi = mid - 1;
    }
    return -1;
  };
  const lowerBlock = new Int32Array(laterStart[n] as number);
  const upperBlock = new Int32Array(laterStart[n] as number);
  for (let k = 0; k < laterNeighbours.length; k++) {
    lowerBlock[k] = n + 2 * k;
    upperBlock[k] = n + 2 * k + 1;
  }
  return {
    size: n,
    order,
    position,
    blockCount,
    laterStart,
    laterNeighbours,
    lowerBlock,
    upperBlock,
    updateStart,
    blockIndex: lookup,
    fillBlocks,
  };
}

/**
 * Factor a block matrix with the given structure. `values` holds 4 numbers per stored block,
 * row-major within the block ([a11, a12, a21, a22]), at the indices of `structure.blockIndex`;
 * fill blocks must be zero. The array is copied, not changed.
 */
export function factorBlockMatrix(
  structure: BlockLuStructure,
  values: Float64Array,
): BlockLuFactorization {
  const a = Float64Array.from(values);
  const n = structure.size;
  const pivotInverse = new Float64Array(4 * n);
  const perturbedPivots: number[] = [];
  const { order, position, laterStart, laterNeighbours, lowerBlock, upperBlock } = structure;
  // slot[t]: index k of t among the later neighbours of the row being updated (block (s, t) is
  // then n + 2k + 1, block (t, s) n + 2k). Scattered per row instead of a stored index per
  // update, which took 4 bytes per block update (140 MB at 100,000 edges).
  const slot = new Int32Array(n);
  for (let step = 0; step < n; step++) {
    const pivot = order[step] as number;
    const p = 4 * pivot;
    let a11 = a[p] as number;
    const a12 = a[p + 1] as number;
    const a21 = a[p + 2] as number;
    let a22 = a[p + 3] as number;
    // Singularity test invariant to scaling either row: |det| against the product of the rows'
    // sizes (a network's mass and energy rows can differ by ten orders of magnitude).
    const rowOne = Math.abs(a11) + Math.abs(a12);
    const rowTwo = Math.abs(a21) + Math.abs(a22);
    const scale = Math.max(Math.abs(a11), Math.abs(a12), Math.abs(a21), Math.abs(a22), 1e-300);
    let det = a11 * a22 - a12 * a21;
    if (!(Math.abs(det) > 1e-14 * rowOne * rowTwo)) {
      // Singular pivot: shift the diagonal a little so the factorization can go on; the caller
      // sees the row in perturbedPivots and its Newton step is then only approximate.
      perturbedPivots.push(pivot);
      // Each row's shift is relative to that row's own size.
      const shiftOne = 1e-10 * (rowOne > 0 ? rowOne : scale);
      const shiftTwo = 1e-10 * (rowTwo > 0 ? rowTwo : scale);
      a11 += a11 >= 0 ? shiftOne : -shiftOne;
      a22 += a22 >= 0 ? shiftTwo : -shiftTwo;
      det = a11 * a22 - a12 * a21;
      if (det === 0) {
        a11 += shiftOne;
        a22 += shiftTwo;
        det = a11 * a22 - a12 * a21;
      }
    }
    const inv11 = a22 / det;
    const inv12 = -a12 / det;
    const inv21 = -a21 / det;
    const inv22 = a11 / det;
    pivotInverse[p] = inv11;
    pivotInverse[p + 1] = inv12;
    pivotInverse[p + 2] = inv21;
    pivotInverse[p + 3] = inv22;
    const start = laterStart[step] as number;
    const count = (laterStart[step + 1] as number) - start;
    // L_s = A_s,pivot * inv(A_pivot,pivot), stored in place of A_s,pivot.
    for (let i = 0; i < count; i++) {
      const q = 4 * (lowerBlock[start + i] as number);
      const b11 = a[q] as number;
      const b12 = a[q + 1] as number;
      const b21 = a[q + 2] as number;
      const b22 = a[q + 3] as number;
      a[q] = b11 * inv11 + b12 * inv21;
      a[q + 1] = b11 * inv12 + b12 * inv22;
      a[q + 2] = b21 * inv11 + b22 * inv21;
      a[q + 3] = b21 * inv12 + b22 * inv22;
    }
    // A_s,t -= L_s * A_pivot,t for every pair of later neighbours (s, t): each pair once, with
    // s the one eliminated first, updating (s, t) and (t, s); and (s, s).
    for (let i = 0; i < count; i++) {
      const s = laterNeighbours[start + i] as number;
      const own = position[s] as number;
      for (let k = laterStart[own] as number; k < (laterStart[own + 1] as number); k++) {
        slot[laterNeighbours[k] as number] = k;
      }
      const li = 4 * (lowerBlock[start + i] as number);
      const ui = 4 * (upperBlock[start + i] as number);
      subtractProduct(a, li, ui, 4 * s);
      // Later neighbours are in elimination order: those after s are the ones after i.
      for (let j = i + 1; j < count; j++) {
        const t = laterNeighbours[start + j] as number;
        const k = slot[t] as number;
        const lj = 4 * (lowerBlock[start + j] as number);
        const uj = 4 * (upperBlock[start + j] as number);
        subtractProduct(a, li, uj, 4 * (n + 2 * k + 1)); // (s, t)
        subtractProduct(a, lj, ui, 4 * (n + 2 * k)); // (t, s)
      }
    }
  }
  return { structure, values: a, pivotInverse, perturbedPivots };
}

/**
 * Solve A x = b with a factorization. `rhs` has 2 numbers per block row; the result is a new
 * array.
 */
export function solveFactored(
  factorization: BlockLuFactorization,
  rhs: Float64Array,
): Float64Array {
  const { structure, values: a, pivotInverse } = factorization;
  const { order, laterStart, laterNeighbours, lowerBlock, upperBlock } = structure;
  const n = structure.size;
  const x = Float64Array.from(rhs);
  // Forward: for each pivot in order, subtract L_s,pivot * y_pivot from later rows.
  for (let step = 0; step < n; step++) {
    const pivot = order[step] as number;
    const y1 = x[2 * pivot] as number;
    const y2 = x[2 * pivot + 1] as number;
    const start = laterStart[step] as number;
    const end = laterStart[step + 1] as number;
    for (let i = start; i < end; i++) {
      const s = laterNeighbours[i] as number;
      const l = 4 * (lowerBlock[i] as number);
      x[2 * s] = (x[2 * s] as number) - ((a[l] as number) * y1 + (a[l + 1] as number) * y2);
      x[2 * s + 1] =
        (x[2 * s + 1] as number) - ((a[l + 2] as number) * y1 + (a[l + 3] as number) * y2);
    }
  }
  // Backward: x_pivot = inv(U_pivot,pivot) (y_pivot - sum_t U_pivot,t x_t), in reverse order.
  for (let step = n - 1; step >= 0; step--) {
    const pivot = order[step] as number;
    let r1 = x[2 * pivot] as number;
    let r2 = x[2 * pivot + 1] as number;
    const start = laterStart[step] as number;
    const end = laterStart[step + 1] as number;
    for (let i = start; i < end; i++) {
      const t = laterNeighbours[i] as number;
      const u = 4 * (upperBlock[i] as number);
      const xt1 = x[2 * t] as number;
      const xt2 = x[2 * t + 1] as number;
      r1 -= (a[u] as number) * xt1 + (a[u + 1] as number) * xt2;
      r2 -= (a[u + 2] as number) * xt1 + (a[u + 3] as number) * xt2;
    }
    const p = 4 * pivot;
    x[2 * pivot] = (pivotInverse[p] as number) * r1 + (pivotInverse[p + 1] as number) * r2;
    x[2 * pivot + 1] = (pivotInverse[p + 2] as number) * r1 + (pivotInverse[p + 3] as number) * r2;
  }
  return x;
}

/** a[t..t+3] -= a[l..l+3] * a[u..u+3], 2 x 2 blocks stored row-major. */
function subtractProduct(a: Float64Array, l: number, u: number, t: number): void {
  const l11 = a[l] as number;
  const l12 = a[l + 1] as number;
  const l21 = a[l + 2] as number;
  const l22 = a[l + 3] as number;
  const u11 = a[u] as number;
  const u12 = a[u + 1] as number;
  const u21 = a[u + 2] as number;
  const u22 = a[u + 3] as number;
  a[t] = (a[t] as number) - (l11 * u11 + l12 * u21);
  a[t + 1] = (a[t + 1] as number) - (l11 * u12 + l12 * u22);
  a[t + 2] = (a[t + 2] as number) - (l21 * u11 + l22 * u21);
  a[t + 3] = (a[t + 3] as number) - (l21 * u12 + l22 * u22);
}

/** A binary min-heap of (key, index) pairs ordered by key, then index. */
class MinHeap {
  private keys: number[] = [];
  private items: number[] = [];

  push(key: number, item: number): void {
    const keys = this.keys;
    const items = this.items;
    let i = keys.length;
    keys.push(key);
    items.push(item);
    while (i > 0) {
      const parent = (i - 1) >> 1;
      if (!this.less(i, parent)) break;
      this.swap(i, parent);
      i = parent;
    }
  }

  pop(): [number, number] {
    const keys = this.keys;
    const items = this.items;
    if (keys.length === 0) throw new Error("MinHeap.pop on an empty heap");
    const top: [number, number] = [keys[0] as number, items[0] as number];
    const lastKey = keys.pop() as number;
    const lastItem = items.pop() as number;
    if (keys.length > 0) {
      keys[0] = lastKey;
      items[0] = lastItem;
      let i = 0;
      for (;;) {
        const left = 2 * i + 1;
        const right = left + 1;
        let smallest = i;
        if (left < keys.length && this.less(left, smallest)) smallest = left;
        if (right < keys.length && this.less(right, smallest)) smallest = right;
        if (smallest === i) break;
        this.swap(i, smallest);
        i = smallest;
      }
    }
    return top;
  }

  private less(a: number, b: number): boolean {
    const ka = this.keys[a] as number;
    const kb = this.keys[b] as number;
    return ka < kb || (ka === kb && (this.items[a] as number) < (this.items[b] as number));
  }

  private swap(a: number, b: number): void {
    const keys = this.keys;
    const items = this.items;
    const k = keys[a] as number;
    keys[a] = keys[b] as number;
    keys[b] = k;
    const t = items[a] as number;
    items[a] = items[b] as number;
    items[b] = t;
  }
}
