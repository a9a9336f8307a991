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
  // skipped. Ties go to the lowest index, so the ordering is deterministic.
  const heap = new MinHeap();
  let mark = 0;
  for (let i = 0; i < n; i++) {
    degree[i] = compact(i, mark++).length;
    heap.push(degree[i] as number, i);
  }
  const order = new Int32Array(n);
  for (let step = 0; step < n; step++) {
    let pivot = -1;
    while (pivot < 0) {
      const [d, node] = heap.pop();
      if (eliminated[node] === 0 && degree[node] === d) pivot = node;
    }
    order[step] = pivot;
    eliminated[pivot] = 1;
    const neighbours = compact(pivot, mark++).slice();
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
      heap.push(degree[s] as number, s);
    }
    adjacency[pivot] = [];
  }
  return order;
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
