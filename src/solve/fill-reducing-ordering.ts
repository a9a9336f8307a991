/**
 * Fill-reducing elimination orders for the symmetric block pattern of a network Jacobian
 * (src/solve/sparse-block-lu.ts factors in the order chosen here).
 *
 * Each function returns a permutation: `order[step]` is the block row eliminated at that step.
 * Every one is deterministic (ties go to the lowest index), so a network always factors the same
 * way.
 */

/** Structure of a symmetric pattern: `neighbours[i]` lists the j != i coupled to i. */
export interface SymmetricPattern {
  /** Number of rows (and columns). */
  size: number;
  /** Off-diagonal neighbours of each row; symmetric (j in i's list iff i in j's). */
  neighbours: readonly (readonly number[])[];
}

/**
 * Greedy minimum degree with exact degrees on the elimination graph.
 *
 * Minimum degree (W. F. Tinney and J. W. Walker, "Direct solutions of sparse network equations by
 * optimally ordered triangular factorization", Proc. IEEE 55 (1967) 1801, "scheme 2") eliminates
 * at each step a row with the fewest remaining neighbours, breaking ties by the lowest index. On
 * a tree it eliminates leaves first and creates no fill at all. The elimination graph is kept
 * explicitly (fill edges are added to the neighbour lists), so its memory grows with the fill.
 */
export function minimumDegreeOrdering(pattern: SymmetricPattern): Int32Array {
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
  // skipped. Ties go to the lowest index, so the ordering is deterministic. The packed
  // degree * n + index is exact while n^2 < 2^53 (n below 9e7 rows).
  const heap = new MinHeap();
  let mark = 0;
  for (let i = 0; i < n; i++) {
    degree[i] = compact(i, mark++).length;
    heap.push((degree[i] as number) * n + i);
  }
  const order = new Int32Array(n);
  for (let step = 0; step < n; step++) {
    let pivot = -1;
    while (pivot < 0) {
      const packed = heap.pop();
      const d = Math.floor(packed / n);
      const node = packed - d * n;
      if (eliminated[node] === 0 && degree[node] === d) pivot = node;
    }
    order[step] = pivot;
    eliminated[pivot] = 1;
    // Not copied: the loop below changes the neighbours' lists, never the pivot's.
    const neighbours = compact(pivot, mark++);
    // Eliminating the pivot couples all its remaining neighbours pairwise (fill).
    for (const s of neighbours) {
      const list = compact(s, mark); // stamps s's live neighbours with `mark`
      for (const t of neighbours) {
        if (t !== s && stamp[t] !== mark) {
          stamp[t] = mark;
          list.push(t);
        }
      }
      mark++;
      degree[s] = list.length;
      heap.push((degree[s] as number) * n + s);
    }
    adjacency[pivot] = [];
  }
  return order;
}

/**
 * A binary min-heap of numbers. Minimum degree stores each (degree, row) pair as one number,
 * degree * size + row, so that the heap orders by degree, then by row, without a tuple per pop.
 */
class MinHeap {
  private values: number[] = [];

  push(value: number): void {
    const values = this.values;
    let i = values.length;
    values.push(value);
    while (i > 0) {
      const parent = (i - 1) >> 1;
      const above = values[parent] as number;
      if (above <= value) break;
      values[i] = above;
      i = parent;
    }
    values[i] = value;
  }

  pop(): number {
    const values = this.values;
    if (values.length === 0) throw new Error("MinHeap.pop on an empty heap");
    const top = values[0] as number;
    const last = values.pop() as number;
    const length = values.length;
    if (length > 0) {
      let i = 0;
      for (;;) {
        const left = 2 * i + 1;
        if (left >= length) break;
        const right = left + 1;
        let child = left;
        if (right < length && (values[right] as number) < (values[left] as number)) child = right;
        const below = values[child] as number;
        if (below >= last) break;
        values[i] = below;
        i = child;
      }
      values[i] = last;
    }
    return top;
  }
}

/** Parts of at most this many rows are not dissected further but ordered by minimum degree. */
const DISSECTION_LEAF_SIZE = 120;

/**
 * Nested dissection by level structures: a part is split by the middle level of a breadth-first
 * level structure rooted at a pseudo-peripheral row (its separator is eliminated last), and each
 * remaining piece is split again, down to DISSECTION_LEAF_SIZE rows, which are ordered by
 * minimum degree among themselves.
 *
 * Sources: A. George, "Nested dissection of a regular finite element mesh", SIAM J. Numer. Anal.
 * 10 (1973) 345-363 (the separators last); A. George and J. W. H. Liu, Computer Solution of Large
 * Sparse Positive Definite Systems, Prentice-Hall, 1981, chapter 8 (automatic nested dissection
 * by level structures) and section 4.4 (the pseudo-peripheral node finder). On a grid of k x k
 * rows the fill grows as k^2 log k and the work as k^3, against a faster growth for minimum
 * degree on large grids; on a tree minimum degree (no fill) is better, which is why the
 * factorization compares both by their symbolic counts.
 */
export function nestedDissectionOrdering(pattern: SymmetricPattern): Int32Array {
  const n = pattern.size;
  const neighbours = pattern.neighbours;
  const order = new Int32Array(n);
  // Rows are numbered from the end: separators take the last free positions, leaves the first.
  let firstFree = 0;
  let lastFree = n - 1;
  // part[i]: the id of the part row i belongs to now (-1 once ordered).
  const part = new Int32Array(n);
  const level = new Int32Array(n).fill(-1);
  const queue = new Int32Array(n);
  let nextPart = 1;
  const pending: number[][] = [];
  // The connected pieces of the whole graph are the first parts.
  pending.push(
    ...piecesOf(
      Int32Array.from({ length: n }, (_, i) => i),
      0,
    ),
  );

  function piecesOf(rows: Int32Array, id: number): number[][] {
    // Mark the rows as part `id`, then split them into connected pieces, each a new part.
    for (const r of rows) part[r] = id;
    const pieces: number[][] = [];
    for (const start of rows) {
      if (part[start] !== id) continue;
      const piece: number[] = [start];
      const pieceId = nextPart++;
      part[start] = pieceId;
      for (let head = 0; head < piece.length; head++) {
        for (const other of neighbours[piece[head] as number] ?? []) {
          if (part[other] === id) {
            part[other] = pieceId;
            piece.push(other);
          }
        }
      }
      pieces.push(piece);
    }
    return pieces;
  }

  /** Breadth-first levels from `root` within part `id`; returns [row count, depth, last row]. */
  function levels(root: number, id: number): { depth: number; count: number } {
    let head = 0;
    let tail = 0;
    queue[tail++] = root;
    level[root] = 0;
    let depth = 0;
    while (head < tail) {
      const row = queue[head++] as number;
      const next = (level[row] as number) + 1;
      for (const other of neighbours[row] ?? []) {
        if (part[other] === id && level[other] === -1) {
          level[other] = next;
          depth = Math.max(depth, next);
          queue[tail++] = other;
        }
      }
    }
    return { depth, count: tail };
  }
  function clearLevels(count: number): void {
    for (let k = 0; k < count; k++) level[queue[k] as number] = -1;
  }

  while (pending.length > 0) {
    const rows = pending.pop() as number[];
    const id = part[rows[0] as number] as number;
    if (rows.length <= DISSECTION_LEAF_SIZE) {
      const leafOrder = minimumDegreeOfPart(rows, id);
      for (const row of leafOrder) {
        order[firstFree++] = row;
        part[row] = -1;
      }
      continue;
    }
    // Pseudo-peripheral root: from the row of least degree, move to a row of least degree in the
    // last level while the depth grows (George and Liu 1981, section 4.4).
    let root = rows[0] as number;
    for (const row of rows) {
      if ((neighbours[row]?.length ?? 0) < (neighbours[root]?.length ?? 0)) root = row;
    }
    let structure = levels(root, id);
    for (let attempt = 0; attempt < 8; attempt++) {
      let candidate = -1;
      for (let k = structure.count - 1; k >= 0; k--) {
        const row = queue[k] as number;
        if (level[row] !== structure.depth) break;
        if (candidate < 0 || (neighbours[row]?.length ?? 0) < (neighbours[candidate]?.length ?? 0))
          candidate = row;
      }
      clearLevels(structure.count);
      const next = levels(candidate, id);
      if (next.depth <= structure.depth) {
        clearLevels(next.count);
        structure = levels(root, id);
        break;
      }
      root = candidate;
      structure = next;
    }
    const middle = Math.floor(structure.depth / 2);
    if (structure.depth < 2) {
      // A near-clique: no level separates it.
      clearLevels(structure.count);
      for (const row of minimumDegreeOfPart(rows, id)) {
        order[firstFree++] = row;
        part[row] = -1;
      }
      continue;
    }
    // Separator: the rows of the middle level that touch the next level (the others are not
    // needed to cut the part), ordered last, in reverse so their relative order is kept.
    const separator: number[] = [];
    for (let k = 0; k < structure.count; k++) {
      const row = queue[k] as number;
      if (level[row] !== middle) continue;
      let touches = false;
      for (const other of neighbours[row] ?? [])
        if (part[other] === id && level[other] === middle + 1) touches = true;
      if (touches) separator.push(row);
    }
    clearLevels(structure.count);
    for (let k = separator.length - 1; k >= 0; k--) {
      const row = separator[k] as number;
      order[lastFree--] = row;
      part[row] = -1;
    }
    const rest = Int32Array.from(rows.filter((row) => part[row] === id));
    // Pieces pushed largest first so the smallest is ordered first (a deterministic choice).
    const pieces = piecesOf(rest, id).sort(
      (a, b) => b.length - a.length || (a[0] as number) - (b[0] as number),
    );
    pending.push(...pieces);
  }
  return order;

  /** Minimum degree on the rows of one part (their pattern among themselves). */
  function minimumDegreeOfPart(rows: readonly number[], id: number): number[] {
    const local = new Map<number, number>();
    for (let k = 0; k < rows.length; k++) local.set(rows[k] as number, k);
    const sub: number[][] = rows.map((row) =>
      (neighbours[row] ?? [])
        .filter((other) => part[other] === id)
        .map((other) => local.get(other) as number),
    );
    const subOrder = minimumDegreeOrdering({ size: rows.length, neighbours: sub });
    return Array.from(subOrder, (k) => rows[k] as number);
  }
}
