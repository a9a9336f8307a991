/**
 * Sparse LU factorization of a matrix made of 2 x 2 blocks whose block pattern is symmetric,
 * such as the Jacobian of a network with a pressure and a temperature unknown per node.
 *
 * Written by hand: the npm registry carries no maintained sparse direct solver (searched for
 * "sparse" among its packages; what exists is sparse storage without factorization). Three parts:
 *
 * 1. Ordering (src/solve/fill-reducing-ordering.ts), then a symbolic factorization that fixes the
 *    fill once per pattern: the elimination tree and each column's structure (J. W. H. Liu, "The
 *    role of elimination trees in sparse factorization", SIAM J. Matrix Anal. Appl. 11 (1990)
 *    134-172), the order made a postorder of that tree (same fill, same work), and columns of
 *    identical structure grouped into supernodes.
 * 2. A multifrontal numeric factorization (I. S. Duff and J. K. Reid, "The multifrontal solution
 *    of indefinite sparse symmetric linear equations", ACM TOMS 9 (1983) 302-325; J. W. H. Liu,
 *    "The multifrontal method for sparse matrix solution: theory and practice", SIAM Review 34
 *    (1992) 82-109): per supernode a dense frontal matrix gathers the original entries and the
 *    children's update matrices through precomputed index lists, its pivots are eliminated with
 *    dense loops, and its Schur complement goes up to the parent. No index is looked up per
 *    block update.
 * 3. Triangular solves over the same dense panels.
 *
 * Pivots are the 2 x 2 diagonal blocks in the chosen order (no row exchanges between blocks).
 * This suits nodal network Jacobians, whose diagonal blocks dominate: each node's balance depends
 * most on its own pressure and temperature. A pivot block that is singular or nearly so is
 * reported through {@link BlockLuFactorization.perturbedPivots} after a tiny diagonal shift, so the
 * caller (a Newton iteration that checks its residual) can tell.
 *
 * Matrices are handed in the layout of the original pattern ({@link BlockLuStructure.blockIndex}):
 * 4 numbers per block, diagonal blocks first, then each coupled pair's two blocks; fill lives
 * only inside the factorization.
 */
import { minimumDegreeOrdering, nestedDissectionOrdering } from "./fill-reducing-ordering.js";
import type { GmresWorkspace } from "./frozen-factor-gmres.js";
import type { ScalarLayout } from "./sparse-scalar-lu.js";

/** Structure of a block matrix: `neighbours[i]` lists the blocks j != i with A_ij != 0. */
export interface BlockPattern {
  /** Number of block rows (and columns). */
  size: number;
  /** Off-diagonal neighbours of each block row; must be symmetric (j in i's list iff i in j's). */
  neighbours: readonly (readonly number[])[];
}

/** The symbolic part of a factorization: ordering, fill and supernodes, shared by every matrix of a pattern. */
export interface BlockLuStructure {
  size: number;
  /** Elimination order: `order[step]` is the block row eliminated at that step. */
  order: Int32Array;
  /** Position of each block row in the elimination order. */
  position: Int32Array;
  /**
   * Number of blocks of a matrix in the original pattern (diagonal and coupled pairs): a matrix
   * is a Float64Array of 4 * blockCount numbers.
   */
  blockCount: number;
  /** Index of block (row, column) in a matrix of this pattern, or -1 when it is not stored. */
  blockIndex: (row: number, column: number) => number;
  /** Row-wise neighbour lists of the pattern (CSR): row i's are `adjacency[adjacencyStart[i]..]`. */
  adjacencyStart: Int32Array;
  /** Neighbours of each row, ascending. */
  adjacency: Int32Array;
  /** Index of block (i, adjacency[e]) for each entry e of row i. */
  adjacencyBlock: Int32Array;
  /** Number of fill blocks the ordering created (pairs; 0 for a tree eliminated leaves first). */
  fillBlocks: number;
  /** Off-diagonal blocks of L (pattern and fill), each with its mirror in U. */
  factorOffDiagonal: number;
  /** Work of one numeric factorization in 2 x 2 block updates (sum of column counts squared). */
  factorUpdates: number;
  /** Work of one triangular solve in 2 x 2 block operations (diagonal and L and U blocks). */
  solveBlocks: number;
  /** Number of supernodes (runs of consecutive columns with identical structure). */
  supernodeCount: number;
  /** First elimination step of each supernode; `supernodeStart[count]` is the size. */
  supernodeStart: Int32Array;
  /** Offsets into `frontNodes` per supernode. */
  frontStart: Int32Array;
  /** The block rows of each supernode's front: its own columns, then the later rows, in order. */
  frontNodes: Int32Array;
  /** Offsets (in numbers) of each supernode's panels in the factor arrays. */
  panelStart: Int32Array;
  /** Offsets into `childStart`-ordered children per supernode (CSR of the supernode tree). */
  childStart: Int32Array;
  /** Children of each supernode, in postorder. */
  children: Int32Array;
  /** For each supernode, the local front index in its parent's front of each of its later rows. */
  parentMapStart: Int32Array;
  parentMap: Int32Array;
  /** Per supernode, the assembly of the original blocks: source block and front offset. */
  assemblyStart: Int32Array;
  assemblySource: Int32Array;
  assemblyTarget: Int32Array;
  /** Largest front (in numbers, (2 m)^2) and the update stack's peak (in numbers). */
  frontCapacity: number;
  stackCapacity: number;
  /**
   * Working memory of GMRES with frozen factors on this structure (src/solve/frozen-factor-gmres.ts),
   * made on its first use; not state (its contents mean nothing between solves).
   */
  gmresWorkspace?: GmresWorkspace;
  /** Working memory of the numeric factorization, made on its first use; not state either. */
  factorWorkspace?: { front: Float64Array; stack: Float64Array; updateAt: Int32Array };
  /**
   * Offsets and working memory of scalar factorizations on this structure
   * (src/solve/sparse-scalar-lu.ts), made on their first use; not state either.
   */
  scalarLayout?: ScalarLayout;
}

/** A numeric factorization, ready for solves. */
export interface BlockLuFactorization {
  structure: BlockLuStructure;
  /**
   * L panels per supernode: the front's first 2 w columns, column-major (leading dimension 2 m),
   * unit block diagonal implied.
   */
  lower: Float64Array;
  /** U panels per supernode: the front's first 2 w rows, row-major (leading dimension 2 m). */
  upper: Float64Array;
  /** Inverse of each pivot block, per block row. */
  pivotInverse: Float64Array;
  /** Block rows whose pivot had to be shifted because it was (nearly) singular. */
  perturbedPivots: number[];
}

/**
 * Order the blocks, fix the fill pattern and the supernodes.
 *
 * The order is greedy minimum degree or nested dissection (src/solve/fill-reducing-ordering.ts;
 * which one, see below), then made a postorder of its elimination tree: an equivalent order
 * (the same fill and work) in which each subtree is eliminated in one run, as the
 * multifrontal factorization needs.
 */
export function analyzeBlockPattern(pattern: BlockPattern): BlockLuStructure {
  const n = pattern.size;
  const { adjacencyStart, adjacency, adjacencyBlock, pairCount } = patternIndex(pattern);
  const blockCount = n + 2 * pairCount;
  const blockIndex = (row: number, column: number): number => {
    if (row === column) return row >= 0 && row < n ? row : -1;
    let lo = adjacencyStart[row] as number;
    let hi = (adjacencyStart[row + 1] as number) - 1;
    while (lo <= hi) {
      const mid = (lo + hi) >> 1;
      const value = adjacency[mid] as number;
      if (value === column) return adjacencyBlock[mid] as number;
      if (value < column) lo = mid + 1;
      else hi = mid - 1;
    }
    return -1;
  };

  // Minimum degree, and on larger meshed patterns with enough loops nested dissection too: the one whose
  // factorization costs fewer block updates (symbolic counts, a small fraction of one numeric
  // factorization). A large pattern that is mostly loops (a grid of 4,000 rows or more) takes
  // nested dissection alone: it won on every such generated grid, and minimum degree, which
  // keeps its elimination graph explicitly, took five times as long to find its worse order
  // (70 ms against 14 ms on the 10,000-edge generated grid).
  let ordering: Int32Array;
  let first: ReturnType<typeof columnStructure>;
  const loopShare = (pairCount - n + 1) / n;
  if (n >= DISSECTION_ONLY_MIN_SIZE && loopShare >= DISSECTION_ONLY_LOOP_SHARE) {
    ordering = nestedDissectionOrdering(pattern);
    first = columnStructure(n, adjacencyStart, adjacency, ordering);
  } else {
    ordering = minimumDegreeOrdering(pattern);
    first = columnStructure(n, adjacencyStart, adjacency, ordering);
    if (
      n >= DISSECTION_MIN_SIZE &&
      loopShare >= DISSECTION_MIN_LOOP_SHARE &&
      meshedEnough(first.structureStart)
    ) {
      const dissection = nestedDissectionOrdering(pattern);
      const other = columnStructure(n, adjacencyStart, adjacency, dissection);
      if (updatesOf(other.structureStart) < updatesOf(first.structureStart)) {
        ordering = dissection;
        first = other;
      }
    }
  }
  // The first pass gives the elimination tree of the ordering; its postorder is the final order.
  const order = postorder(n, first.parent, ordering);
  const { parent, structureStart, structureRows } = columnStructure(
    n,
    adjacencyStart,
    adjacency,
    order,
  );
  const position = new Int32Array(n);
  for (let step = 0; step < n; step++) position[order[step] as number] = step;

  let factorOffDiagonal = 0;
  let factorUpdates = 0;
  for (let j = 0; j < n; j++) {
    const count = (structureStart[j + 1] as number) - (structureStart[j] as number);
    factorOffDiagonal += count;
    factorUpdates += count * count;
  }

  // Supernodes: column j joins the run before it when it is the parent of the run's last
  // column and the run's columns, given j's front ({later columns of the run} and j's
  // structure), would hold few explicit zeros (relaxed supernodes: C. Ashcraft and R. Grimes,
  // "The influence of relaxed supernode partitions on the multifrontal method", ACM TOMS 15
  // (1989) 291-309). Identical structures (no zeros) always join. The zeros stay exact zeros:
  // every product that reaches them has a factor that is structurally zero.
  const starts: number[] = [];
  let runCounts = 0; // sum of the structure counts of the run's columns
  for (let j = 0; j < n; j++) {
    const count = (structureStart[j + 1] as number) - (structureStart[j] as number);
    const width = j - (starts[starts.length - 1] ?? 0) + 1; // the run's width if j joins
    let joins = j > 0 && parent[j - 1] === j;
    if (joins) {
      const entries = (width * (width - 1)) / 2 + width * count;
      const zeros = entries - (runCounts + count);
      joins = zeros <= RELAXED_ZERO_SHARE * entries;
    }
    if (joins) runCounts += count;
    else {
      starts.push(j);
      runCounts = count;
    }
  }
  const supernodeCount = starts.length;
  const supernodeStart = new Int32Array(supernodeCount + 1);
  supernodeStart.set(starts);
  supernodeStart[supernodeCount] = n;
  const supernodeOf = new Int32Array(n);
  for (let s = 0; s < supernodeCount; s++) {
    for (let j = supernodeStart[s] as number; j < (supernodeStart[s + 1] as number); j++)
      supernodeOf[j] = s;
  }

  // Fronts (in elimination steps, ascending): the supernode's columns, then its last column's
  // structure. Panels hold 4 m w numbers each (L and U alike).
  const frontStart = new Int32Array(supernodeCount + 1);
  for (let s = 0; s < supernodeCount; s++) {
    const last = (supernodeStart[s + 1] as number) - 1;
    const width = last + 1 - (supernodeStart[s] as number);
    const rows = (structureStart[last + 1] as number) - (structureStart[last] as number);
    frontStart[s + 1] = (frontStart[s] as number) + width + rows;
  }
  const frontSteps = new Int32Array(frontStart[supernodeCount] as number);
  const panelStart = new Int32Array(supernodeCount + 1);
  const supernodeParent = new Int32Array(supernodeCount).fill(-1);
  let frontCapacity = 0;
  for (let s = 0; s < supernodeCount; s++) {
    const firstStep = supernodeStart[s] as number;
    const last = (supernodeStart[s + 1] as number) - 1;
    let k = frontStart[s] as number;
    for (let j = firstStep; j <= last; j++) frontSteps[k++] = j;
    for (let e = structureStart[last] as number; e < (structureStart[last + 1] as number); e++)
      frontSteps[k++] = structureRows[e] as number;
    const m = (frontStart[s + 1] as number) - (frontStart[s] as number);
    const width = last + 1 - firstStep;
    panelStart[s + 1] = (panelStart[s] as number) + 4 * m * width;
    frontCapacity = Math.max(frontCapacity, 4 * m * m);
    const up = parent[last] as number;
    if (up >= 0) supernodeParent[s] = supernodeOf[up] as number;
  }
  const frontNodes = new Int32Array(frontSteps.length);
  for (let k = 0; k < frontSteps.length; k++)
    frontNodes[k] = order[frontSteps[k] as number] as number;

  // Local index of a step within supernode s's front (fronts are ascending: binary search).
  const localIndex = (s: number, step: number): number => {
    let lo = frontStart[s] as number;
    let hi = (frontStart[s + 1] as number) - 1;
    while (lo <= hi) {
      const mid = (lo + hi) >> 1;
      const value = frontSteps[mid] as number;
      if (value === step) return mid - (frontStart[s] as number);
      if (value < step) lo = mid + 1;
      else hi = mid - 1;
    }
    throw new Error("sparse-block-lu: a front misses a row of its child (defect)");
  };

  // Supernode tree as CSR (children in postorder) and each child's rows in its parent's front.
  const childStart = new Int32Array(supernodeCount + 1);
  for (let s = 0; s < supernodeCount; s++) {
    const up = supernodeParent[s] as number;
    if (up >= 0) childStart[up + 1] = (childStart[up + 1] as number) + 1;
  }
  for (let s = 0; s < supernodeCount; s++)
    childStart[s + 1] = (childStart[s + 1] as number) + (childStart[s] as number);
  const children = new Int32Array(childStart[supernodeCount] as number);
  const filled = childStart.slice(0, supernodeCount);
  const parentMapStart = new Int32Array(supernodeCount + 1);
  for (let s = 0; s < supernodeCount; s++) {
    const width = (supernodeStart[s + 1] as number) - (supernodeStart[s] as number);
    const m = (frontStart[s + 1] as number) - (frontStart[s] as number);
    parentMapStart[s + 1] = (parentMapStart[s] as number) + m - width;
    const up = supernodeParent[s] as number;
    if (up >= 0) {
      children[filled[up] as number] = s;
      filled[up] = (filled[up] as number) + 1;
    }
  }
  const parentMap = new Int32Array(parentMapStart[supernodeCount] as number);
  for (let s = 0; s < supernodeCount; s++) {
    const up = supernodeParent[s] as number;
    if (up < 0) continue;
    const width = (supernodeStart[s + 1] as number) - (supernodeStart[s] as number);
    const base = (frontStart[s] as number) + width;
    for (let k = parentMapStart[s] as number; k < (parentMapStart[s + 1] as number); k++) {
      parentMap[k] = localIndex(up, frontSteps[base + k - (parentMapStart[s] as number)] as number);
    }
  }

  // Update stack's peak: walk the postorder, pushing each supernode's (2 r)^2 update and popping
  // its children's.
  let stack = 0;
  let stackCapacity = 0;
  const updateSize = new Float64Array(supernodeCount);
  for (let s = 0; s < supernodeCount; s++) {
    for (let c = childStart[s] as number; c < (childStart[s + 1] as number); c++)
      stack -= updateSize[children[c] as number] as number;
    const rows = (parentMapStart[s + 1] as number) - (parentMapStart[s] as number);
    updateSize[s] = 4 * rows * rows;
    stack += updateSize[s] as number;
    stackCapacity = Math.max(stackCapacity, stack);
  }

  // Assembly lists: for each column, its diagonal block and its blocks with later rows, into
  // the front of its supernode (scalar offset of the block's top-left number, row-major 2 m).
  const assemblyStart = new Int32Array(supernodeCount + 1);
  const sources: number[] = [];
  const targets: number[] = [];
  for (let s = 0; s < supernodeCount; s++) {
    const m = (frontStart[s + 1] as number) - (frontStart[s] as number);
    const lead = 2 * m;
    const firstStep = supernodeStart[s] as number;
    for (let j = firstStep; j < (supernodeStart[s + 1] as number); j++) {
      const node = order[j] as number;
      const own = j - firstStep;
      sources.push(node);
      targets.push(2 * own * lead + 2 * own);
      for (let e = adjacencyStart[node] as number; e < (adjacencyStart[node + 1] as number); e++) {
        const other = adjacency[e] as number;
        const otherStep = position[other] as number;
        if (otherStep < j) continue;
        const local = localIndex(s, otherStep);
        const pairBlock = adjacencyBlock[e] as number; // block (node, other)
        const mirror = pairBlock - n - 2 * Math.floor((pairBlock - n) / 2); // 0 or 1
        const otherBlock = pairBlock + (mirror === 0 ? 1 : -1); // block (other, node)
        sources.push(pairBlock);
        targets.push(2 * own * lead + 2 * local);
        sources.push(otherBlock);
        targets.push(2 * local * lead + 2 * own);
      }
    }
    assemblyStart[s + 1] = sources.length;
  }

  return {
    size: n,
    order,
    position,
    blockCount,
    blockIndex,
    adjacencyStart,
    adjacency,
    adjacencyBlock,
    fillBlocks: factorOffDiagonal - pairCount,
    factorOffDiagonal,
    factorUpdates,
    solveBlocks: n + 2 * factorOffDiagonal,
    supernodeCount,
    supernodeStart,
    frontStart,
    frontNodes,
    panelStart,
    childStart,
    children,
    parentMapStart,
    parentMap,
    assemblyStart,
    assemblySource: Int32Array.from(sources),
    assemblyTarget: Int32Array.from(targets),
    frontCapacity,
    stackCapacity,
    // Made on first use, but present from the start, so that a structure keeps one hidden
    // class whatever has been solved on it (see canonicalOrder in build-network.ts).
    gmresWorkspace: undefined,
    factorWorkspace: undefined,
    scalarLayout: undefined,
  };
}

/**
 * Share of explicit zeros (blocks of L per column, counted in a supernode's front) that a
 * relaxed supernode may hold: merging a chain of small fronts into one saves their assembly,
 * extend-add and copies, at the price of some arithmetic on zeros.
 */
const RELAXED_ZERO_SHARE = 0.1;

/**
 * Patterns of at least this many block rows are ordered both ways (below it minimum degree
 * alone: small networks factor as they always did, and nested dissection does not pay there).
 */
const DISSECTION_MIN_SIZE = 1000;

/**
 * Whether minimum degree's factorization costs over 15 of its triangular solves (in block
 * operations): a meshed core, where dissection may do better. Below that (trees, tree-heavy
 * networks) it cannot gain much and its analysis is not worth running.
 */
function meshedEnough(structureStart: Int32Array): boolean {
  const n = structureStart.length - 1;
  const solveBlocks = n + 2 * (structureStart[n] as number);
  return updatesOf(structureStart) > 15 * solveBlocks;
}

/**
 * Independent loops (coupled pairs - rows + 1) as a share of the rows from which a large
 * pattern is ordered by nested dissection alone. The generated benchmark networks have about
 * 0.0004 (tree), 0.2 (mixed, where minimum degree wins: 0.77 M block updates against 4.4 M at
 * 10,000 edges) and 0.86 (grid, where dissection wins: 3.5 M against 4.2 M at 10,000 edges,
 * 31 M against 37 M at 40,000).
 */
const DISSECTION_ONLY_LOOP_SHARE = 0.5;
/**
 * Loop share below which nested dissection is not tried at all: on the generated mixed networks
 * (0.21) minimum degree needed 6 to 8 times fewer block updates (7.4 M against 48 to 57 M at
 * 40,000 edges, three seeds; 35 M against 224 M at 100,000), and dissection's own analysis cost
 * 0.3 s there.
 */
const DISSECTION_MIN_LOOP_SHARE = 0.3;
/**
 * Rows from which such a pattern takes dissection alone: on smaller grids minimum degree can
 * still win (a 40 x 40 grid: 0.51 M block updates against 0.56 M, test/solve/fill-reducing-ordering.test.ts).
 */
const DISSECTION_ONLY_MIN_SIZE = 4000;

/** Block updates of a factorization with these column structures (sum of counts squared). */
function updatesOf(structureStart: Int32Array): number {
  let updates = 0;
  for (let j = 0; j + 1 < structureStart.length; j++) {
    const count = (structureStart[j + 1] as number) - (structureStart[j] as number);
    updates += count * count;
  }
  return updates;
}

/**
 * The pattern as sorted CSR rows, each coupled pair {i, j} (i < j) numbered k in order of i then
 * j: block (i, j) at n + 2 k, block (j, i) at n + 2 k + 1.
 */
function patternIndex(pattern: BlockPattern) {
  const n = pattern.size;
  const adjacencyStart = new Int32Array(n + 1);
  let listed = 0;
  for (let i = 0; i < n; i++) listed += pattern.neighbours[i]?.length ?? 0;
  // Each row sorted in place (insertion sort: network rows are short) and deduplicated, written
  // straight into one array: a typed array per row costs more than sorting it.
  const sorted = new Int32Array(listed);
  let used = 0;
  for (let i = 0; i < n; i++) {
    const begin = used;
    for (const value of pattern.neighbours[i] ?? []) {
      if (value === i) continue;
      let at = used;
      while (at > begin && (sorted[at - 1] as number) > value) {
        sorted[at] = sorted[at - 1] as number;
        at--;
      }
      if (at > begin && sorted[at - 1] === value) {
        // A repeat: undo the shift.
        for (let k = at; k < used; k++) sorted[k] = sorted[k + 1] as number;
        continue;
      }
      sorted[at] = value;
      used++;
    }
    adjacencyStart[i + 1] = used;
  }
  const adjacency = sorted.slice(0, used);
  const adjacencyBlock = new Int32Array(adjacency.length);
  let pairCount = 0;
  for (let i = 0; i < n; i++) {
    for (let e = adjacencyStart[i] as number; e < (adjacencyStart[i + 1] as number); e++) {
      const j = adjacency[e] as number;
      if (j < i) continue;
      adjacencyBlock[e] = n + 2 * pairCount;
      // The mirror entry (j, i): found in j's sorted row.
      let lo = adjacencyStart[j] as number;
      let hi = (adjacencyStart[j + 1] as number) - 1;
      while (lo <= hi) {
        const mid = (lo + hi) >> 1;
        const value = adjacency[mid] as number;
        if (value === i) {
          adjacencyBlock[mid] = n + 2 * pairCount + 1;
          break;
        }
        if (value < i) lo = mid + 1;
        else hi = mid - 1;
      }
      if (lo > hi) throw new Error(`sparse-block-lu: pattern not symmetric at (${i}, ${j})`);
      pairCount++;
    }
  }
  return { adjacencyStart, adjacency, adjacencyBlock, pairCount };
}

/**
 * Column structures of the factor for an order (in elimination steps): the later rows coupled to
 * step j after fill are its later original neighbours and its children's structures less j
 * (Liu 1990, section 3); its parent in the elimination tree is the first of them.
 */
function columnStructure(
  n: number,
  adjacencyStart: Int32Array,
  adjacency: Int32Array,
  order: Int32Array,
) {
  const position = new Int32Array(n);
  for (let step = 0; step < n; step++) position[order[step] as number] = step;
  const parent = new Int32Array(n).fill(-1);
  const firstChild = new Int32Array(n).fill(-1);
  const nextSibling = new Int32Array(n).fill(-1);
  const mark = new Int32Array(n).fill(-1);
  const structureStart = new Int32Array(n + 1);
  let rows = new Int32Array(Math.max(16, 2 * adjacency.length));
  let used = 0;
  const push = (value: number) => {
    if (used === rows.length) {
      const grown = new Int32Array(2 * rows.length);
      grown.set(rows);
      rows = grown;
    }
    rows[used++] = value;
  };
  for (let j = 0; j < n; j++) {
    mark[j] = j;
    const node = order[j] as number;
    for (let e = adjacencyStart[node] as number; e < (adjacencyStart[node + 1] as number); e++) {
      const step = position[adjacency[e] as number] as number;
      if (step > j && mark[step] !== j) {
        mark[step] = j;
        push(step);
      }
    }
    for (let c = firstChild[j] as number; c >= 0; c = nextSibling[c] as number) {
      for (let e = structureStart[c] as number; e < (structureStart[c + 1] as number); e++) {
        const step = rows[e] as number;
        if (step > j && mark[step] !== j) {
          mark[step] = j;
          push(step);
        }
      }
    }
    const begin = structureStart[j] as number;
    rows.subarray(begin, used).sort();
    structureStart[j + 1] = used;
    if (used > begin) {
      const up = rows[begin] as number;
      parent[j] = up;
      nextSibling[j] = firstChild[up] as number;
      firstChild[up] = j;
    }
  }
  return { parent, structureStart, structureRows: rows.subarray(0, used) };
}

/** The order permuted to a postorder of its elimination tree (children by ascending step). */
function postorder(n: number, parent: Int32Array, order: Int32Array): Int32Array {
  const childStart = new Int32Array(n + 1);
  for (let j = 0; j < n; j++) {
    const up = parent[j] as number;
    if (up >= 0) childStart[up + 1] = (childStart[up + 1] as number) + 1;
  }
  for (let j = 0; j < n; j++)
    childStart[j + 1] = (childStart[j + 1] as number) + (childStart[j] as number);
  const children = new Int32Array(n);
  const filled = childStart.slice(0, n);
  for (let j = 0; j < n; j++) {
    const up = parent[j] as number;
    if (up >= 0) {
      children[filled[up] as number] = j;
      filled[up] = (filled[up] as number) + 1;
    }
  }
  const result = new Int32Array(n);
  const stackNode = new Int32Array(n);
  const stackNext = new Int32Array(n);
  let count = 0;
  for (let root = 0; root < n; root++) {
    if (parent[root] !== -1) continue;
    let depth = 0;
    stackNode[0] = root;
    stackNext[0] = childStart[root] as number;
    while (depth >= 0) {
      const node = stackNode[depth] as number;
      const next = stackNext[depth] as number;
      if (next < (childStart[node + 1] as number)) {
        stackNext[depth] = next + 1;
        depth++;
        const child = children[next] as number;
        stackNode[depth] = child;
        stackNext[depth] = childStart[child] as number;
      } else {
        result[count++] = order[node] as number;
        depth--;
      }
    }
  }
  return result;
}

/**
 * Factor a block matrix with the given structure. `values` holds 4 numbers per block of the
 * original pattern, row-major within the block ([a11, a12, a21, a22]), at the indices of
 * `structure.blockIndex`. The array is read, not changed.
 *
 * `replaced`, an earlier factorization of the same structure that the caller no longer needs,
 * lends its storage (the panels are the bulk of a large network's memory: 90 MB on the
 * 100,000-edge grid); it must not be used afterwards.
 */
export function factorBlockMatrix(
  structure: BlockLuStructure,
  values: Float64Array,
  replaced?: BlockLuFactorization,
): BlockLuFactorization {
  const n = structure.size;
  const {
    order,
    supernodeCount,
    supernodeStart,
    frontStart,
    panelStart,
    childStart,
    children,
    parentMapStart,
    parentMap,
    assemblyStart,
    assemblySource,
    assemblyTarget,
  } = structure;
  const reuse = replaced !== undefined && replaced.structure === structure;
  const lower = reuse ? replaced.lower : new Float64Array(panelStart[supernodeCount] as number);
  const upper = reuse ? replaced.upper : new Float64Array(panelStart[supernodeCount] as number);
  const pivotInverse = reuse ? replaced.pivotInverse : new Float64Array(4 * n);
  const perturbedPivots: number[] = [];
  if (structure.factorWorkspace === undefined) {
    structure.factorWorkspace = {
      front: new Float64Array(structure.frontCapacity),
      stack: new Float64Array(structure.stackCapacity),
      updateAt: new Int32Array(supernodeCount),
    };
  }
  // The front, the stack of children's Schur complements, and the start of each pending one on
  // it (children are on top, the last child last).
  const { front, stack, updateAt } = structure.factorWorkspace;
  let top = 0;
  for (let s = 0; s < supernodeCount; s++) {
    const firstStep = supernodeStart[s] as number;
    const width = (supernodeStart[s + 1] as number) - firstStep;
    const m = (frontStart[s + 1] as number) - (frontStart[s] as number);
    const lead = 2 * m;
    front.fill(0, 0, lead * lead);
    for (let k = assemblyStart[s] as number; k < (assemblyStart[s + 1] as number); k++) {
      const source = 4 * (assemblySource[k] as number);
      const target = assemblyTarget[k] as number;
      front[target] = (front[target] as number) + (values[source] as number);
      front[target + 1] = (front[target + 1] as number) + (values[source + 1] as number);
      front[target + lead] = (front[target + lead] as number) + (values[source + 2] as number);
      front[target + lead + 1] =
        (front[target + lead + 1] as number) + (values[source + 3] as number);
    }
    // Extend-add each child's update matrix (2 r x 2 r, row-major) through its parent map.
    for (let c = childStart[s] as number; c < (childStart[s + 1] as number); c++) {
      const child = children[c] as number;
      const mapStart = parentMapStart[child] as number;
      const rows = (parentMapStart[child + 1] as number) - mapStart;
      const childLead = 2 * rows;
      const base = updateAt[child] as number;
      for (let i = 0; i < rows; i++) {
        const li = 2 * (parentMap[mapStart + i] as number);
        const sourceRow = base + 2 * i * childLead;
        const targetRow = li * lead;
        for (let j = 0; j < rows; j++) {
          const lj = 2 * (parentMap[mapStart + j] as number);
          const from = sourceRow + 2 * j;
          const to = targetRow + lj;
          front[to] = (front[to] as number) + (stack[from] as number);
          front[to + 1] = (front[to + 1] as number) + (stack[from + 1] as number);
          front[to + lead] = (front[to + lead] as number) + (stack[from + childLead] as number);
          front[to + lead + 1] =
            (front[to + lead + 1] as number) + (stack[from + childLead + 1] as number);
        }
      }
    }
    if ((childStart[s + 1] as number) > (childStart[s] as number))
      top = updateAt[children[childStart[s] as number] as number] as number;

    eliminatePivots(front, lead, width, firstStep, order, pivotInverse, perturbedPivots);
    // Keep the panels: L's first 2 w columns (column-major), U's first 2 w rows (row-major).
    const panel = panelStart[s] as number;
    for (let column = 0; column < 2 * width; column++) {
      const to = panel + column * lead;
      for (let row = 0; row < lead; row++) lower[to + row] = front[row * lead + column] as number;
    }
    // Copied by plain loops: a subarray view per row is an object to allocate and collect, and
    // most fronts of a network are small (a tree's have 2 to 4 rows).
    const upperLength = 2 * width * lead;
    for (let k = 0; k < upperLength; k++) upper[panel + k] = front[k] as number;
    // Push the Schur complement (the trailing 2 r x 2 r) for the parent.
    const rows = m - width;
    updateAt[s] = top;
    const updateLead = 2 * rows;
    for (let row = 0; row < updateLead; row++) {
      const from = (2 * width + row) * lead + 2 * width;
      const to = top + row * updateLead;
      for (let k = 0; k < updateLead; k++) stack[to + k] = front[from + k] as number;
    }
    top += updateLead * updateLead;
  }
  return { structure, lower, upper, pivotInverse, perturbedPivots };
}

/**
 * Pivots eliminated together in one panel of a front: the trailing part is then updated once per
 * panel (a product of the panel's L and U parts) instead of once per pivot, so that a large
 * front streams through the cache PANEL_PIVOTS times less often.
 */
const PANEL_PIVOTS = 12;

/**
 * Eliminate the first `width` 2 x 2 pivots of a dense front (row-major, leading dimension
 * `lead`): L_ik = F_ik inv(F_kk) and F_ij -= L_ik F_kj for i, j > k, in panels of
 * PANEL_PIVOTS pivots (right-looking blocked LU without exchanges: the same operations as one
 * pivot at a time, in another order). Leaves L below the diagonal, U on and above it, the
 * Schur complement in the trailing part.
 */
function eliminatePivots(
  front: Float64Array,
  lead: number,
  width: number,
  firstStep: number,
  order: Int32Array,
  pivotInverse: Float64Array,
  perturbedPivots: number[],
): void {
  for (let panelFirst = 0; panelFirst < width; panelFirst += PANEL_PIVOTS) {
    const panelEnd = Math.min(width, panelFirst + PANEL_PIVOTS);
    const panelColumns = 2 * panelEnd; // first column after the panel
    // 1. The panel's columns, every row: pivot inverses, L, and updates inside the panel.
    for (let k = panelFirst; k < panelEnd; k++) {
      const pivot = order[firstStep + k] as number;
      const q = 4 * pivot;
      invertPivot(front, 2 * k * lead + 2 * k, lead, pivot, pivotInverse, perturbedPivots);
      const inv11 = pivotInverse[q] as number;
      const inv12 = pivotInverse[q + 1] as number;
      const inv21 = pivotInverse[q + 2] as number;
      const inv22 = pivotInverse[q + 3] as number;
      const pivotRowOne = 2 * k * lead;
      const pivotRowTwo = pivotRowOne + lead;
      for (let row = 2 * k + 2; row < lead; row++) {
        const at = row * lead;
        const b1 = front[at + 2 * k] as number;
        const b2 = front[at + 2 * k + 1] as number;
        const l1 = b1 * inv11 + b2 * inv21;
        const l2 = b1 * inv12 + b2 * inv22;
        front[at + 2 * k] = l1;
        front[at + 2 * k + 1] = l2;
        for (let column = 2 * k + 2; column < panelColumns; column++) {
          front[at + column] =
            (front[at + column] as number) -
            (l1 * (front[pivotRowOne + column] as number) +
              l2 * (front[pivotRowTwo + column] as number));
        }
      }
    }
    if (panelColumns >= lead) continue;
    // 2. The panel's rows right of it: U = inv(L_panel) F (unit block lower triangular solve).
    for (let k = panelFirst; k < panelEnd; k++) {
      const pivotRowOne = 2 * k * lead;
      const pivotRowTwo = pivotRowOne + lead;
      for (let row = 2 * k + 2; row < panelColumns; row++) {
        const at = row * lead;
        const l1 = front[at + 2 * k] as number;
        const l2 = front[at + 2 * k + 1] as number;
        for (let column = panelColumns; column < lead; column++) {
          front[at + column] =
            (front[at + column] as number) -
            (l1 * (front[pivotRowOne + column] as number) +
              l2 * (front[pivotRowTwo + column] as number));
        }
      }
    }
    // 3. The trailing part: F22 -= L21 U12, four of the panel's columns at a time.
    const panelFirstColumn = 2 * panelFirst;
    for (let row = panelColumns; row < lead; row++) {
      const at = row * lead;
      let t = panelFirstColumn;
      for (; t + 3 < panelColumns; t += 4) {
        const l1 = front[at + t] as number;
        const l2 = front[at + t + 1] as number;
        const l3 = front[at + t + 2] as number;
        const l4 = front[at + t + 3] as number;
        if (l1 === 0 && l2 === 0 && l3 === 0 && l4 === 0) continue;
        const u1 = t * lead;
        const u2 = u1 + lead;
        const u3 = u2 + lead;
        const u4 = u3 + lead;
        for (let column = panelColumns; column < lead; column++) {
          front[at + column] =
            (front[at + column] as number) -
            (l1 * (front[u1 + column] as number) +
              l2 * (front[u2 + column] as number) +
              l3 * (front[u3 + column] as number) +
              l4 * (front[u4 + column] as number));
        }
      }
      for (; t < panelColumns; t += 2) {
        const l1 = front[at + t] as number;
        const l2 = front[at + t + 1] as number;
        if (l1 === 0 && l2 === 0) continue;
        const u1 = t * lead;
        const u2 = u1 + lead;
        for (let column = panelColumns; column < lead; column++) {
          front[at + column] =
            (front[at + column] as number) -
            (l1 * (front[u1 + column] as number) + l2 * (front[u2 + column] as number));
        }
      }
    }
  }
}

/**
 * Invert the 2 x 2 pivot block at `p` of a front (leading dimension `lead`) into
 * pivotInverse[4 pivot..]. A (nearly) singular block is shifted a little first and its row
 * listed in perturbedPivots.
 */
function invertPivot(
  front: Float64Array,
  p: number,
  lead: number,
  pivot: number,
  pivotInverse: Float64Array,
  perturbedPivots: number[],
): void {
  let a11 = front[p] as number;
  const a12 = front[p + 1] as number;
  const a21 = front[p + lead] as number;
  let a22 = front[p + lead + 1] as number;
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
    front[p] = a11;
    front[p + lead + 1] = a22;
  }
  const q = 4 * pivot;
  pivotInverse[q] = a22 / det;
  pivotInverse[q + 1] = -a12 / det;
  pivotInverse[q + 2] = -a21 / det;
  pivotInverse[q + 3] = a11 / det;
}

/**
 * Solve A x = b with a factorization. `rhs` has 2 numbers per block row; the result is a new
 * array.
 */
export function solveFactored(
  factorization: BlockLuFactorization,
  rhs: Float64Array,
): Float64Array {
  const x = Float64Array.from(rhs);
  solveFactoredInPlace(factorization, x);
  return x;
}

/** Solve A x = b in place: `x` holds b on entry and the solution on return. */
export function solveFactoredInPlace(factorization: BlockLuFactorization, x: Float64Array): void {
  const { structure, lower, upper, pivotInverse } = factorization;
  const { supernodeCount, supernodeStart, frontStart, frontNodes, panelStart } = structure;
  // Forward: L y = b, column by column of each supernode's panel.
  for (let s = 0; s < supernodeCount; s++) {
    const width = (supernodeStart[s + 1] as number) - (supernodeStart[s] as number);
    const nodes = frontStart[s] as number;
    const m = (frontStart[s + 1] as number) - nodes;
    const lead = 2 * m;
    const panel = panelStart[s] as number;
    for (let k = 0; k < width; k++) {
      const pivot = frontNodes[nodes + k] as number;
      const y1 = x[2 * pivot] as number;
      const y2 = x[2 * pivot + 1] as number;
      if (y1 === 0 && y2 === 0) continue;
      const columnOne = panel + 2 * k * lead;
      const columnTwo = columnOne + lead;
      for (let i = k + 1; i < m; i++) {
        const row = frontNodes[nodes + i] as number;
        x[2 * row] =
          (x[2 * row] as number) -
          ((lower[columnOne + 2 * i] as number) * y1 + (lower[columnTwo + 2 * i] as number) * y2);
        x[2 * row + 1] =
          (x[2 * row + 1] as number) -
          ((lower[columnOne + 2 * i + 1] as number) * y1 +
            (lower[columnTwo + 2 * i + 1] as number) * y2);
      }
    }
  }
  // Backward: x_k = inv(U_kk) (y_k - sum_j U_kj x_j), supernodes and pivots in reverse.
  for (let s = supernodeCount - 1; s >= 0; s--) {
    const width = (supernodeStart[s + 1] as number) - (supernodeStart[s] as number);
    const nodes = frontStart[s] as number;
    const m = (frontStart[s + 1] as number) - nodes;
    const lead = 2 * m;
    const panel = panelStart[s] as number;
    for (let k = width - 1; k >= 0; k--) {
      const pivot = frontNodes[nodes + k] as number;
      let r1 = x[2 * pivot] as number;
      let r2 = x[2 * pivot + 1] as number;
      const rowOne = panel + 2 * k * lead;
      const rowTwo = rowOne + lead;
      for (let j = k + 1; j < m; j++) {
        const column = frontNodes[nodes + j] as number;
        const x1 = x[2 * column] as number;
        const x2 = x[2 * column + 1] as number;
        r1 -= (upper[rowOne + 2 * j] as number) * x1 + (upper[rowOne + 2 * j + 1] as number) * x2;
        r2 -= (upper[rowTwo + 2 * j] as number) * x1 + (upper[rowTwo + 2 * j + 1] as number) * x2;
      }
      const p = 4 * pivot;
      x[2 * pivot] = (pivotInverse[p] as number) * r1 + (pivotInverse[p + 1] as number) * r2;
      x[2 * pivot + 1] =
        (pivotInverse[p + 2] as number) * r1 + (pivotInverse[p + 3] as number) * r2;
    }
  }
}
