/**
 * Sparse LU factorization of a matrix with one number per block of a block pattern: the
 * pressure-only and temperature-only systems of the first guess (src/solve/initial-guess.ts),
 * which have the Jacobian's pattern with scalars where the Jacobian has 2 x 2 blocks.
 *
 * Hand-written for the reason src/solve/sparse-block-lu.ts gives, and built on its symbolic
 * part: the same ordering, supernodes, fronts and assembly lists (a block structure's front of
 * m block rows is a scalar front of m rows here), so a network analyses its pattern once for
 * both. The numeric part is the same multifrontal method with scalar pivots: a quarter of the
 * memory and about an eighth of the arithmetic of a 2 x 2 factorization, which is what solving
 * a scalar system in the temperature-padded block form would cost.
 *
 * Pivots are the diagonal entries in the chosen order (no row exchanges), as in the block
 * factorization; a (nearly) zero pivot is shifted a little and reported in
 * {@link ScalarLuFactorization.perturbedPivots}. The first guess's matrices are weighted graph
 * Laplacians with fixed-pressure rows eliminated (diagonally dominant) and mixing balances
 * (diagonal -1, off-diagonal shares of inflow summing to at most 1), for which pivoting is not
 * needed.
 */
import type { BlockLuStructure } from "./sparse-block-lu.js";

/** A numeric scalar factorization, ready for solves. */
export interface ScalarLuFactorization {
  structure: BlockLuStructure;
  /** L panels per supernode: the front's first w columns, column-major (leading dimension m), unit diagonal implied. */
  lower: Float64Array;
  /** U panels per supernode: the front's first w rows, row-major (leading dimension m). */
  upper: Float64Array;
  /** 1 / pivot, per row. */
  pivotInverse: Float64Array;
  /** Rows whose pivot had to be shifted because it was (nearly) zero. */
  perturbedPivots: number[];
}

/** Scalar offsets derived once per structure from its block layout, and working memory. */
export interface ScalarLayout {
  panelStart: Int32Array;
  assemblyTarget: Int32Array;
  front: Float64Array;
  stack: Float64Array;
  updateAt: Int32Array;
}

/**
 * The scalar layout of a block structure: panel offsets (m w numbers per supernode instead of
 * 4 m w), assembly targets in a front of leading dimension m (a block target 2 i (2 m) + 2 j is
 * i m + j), and working memory, made on first use and kept on the structure (as its block
 * factorization's workspace is); what it holds means nothing between factorizations.
 */
function scalarLayout(structure: BlockLuStructure): ScalarLayout {
  const known = structure.scalarLayout;
  if (known !== undefined) return known;
  const { supernodeCount, frontStart, assemblyStart } = structure;
  const panelStart = new Int32Array(supernodeCount + 1);
  for (let s = 0; s <= supernodeCount; s++) panelStart[s] = (structure.panelStart[s] as number) / 4;
  const assemblyTarget = new Int32Array(structure.assemblyTarget.length);
  for (let s = 0; s < supernodeCount; s++) {
    const m = (frontStart[s + 1] as number) - (frontStart[s] as number);
    const blockLead = 2 * m;
    for (let k = assemblyStart[s] as number; k < (assemblyStart[s + 1] as number); k++) {
      const target = structure.assemblyTarget[k] as number;
      const row = Math.floor(target / blockLead) / 2;
      const column = (target % blockLead) / 2;
      assemblyTarget[k] = row * m + column;
    }
  }
  const layout: ScalarLayout = {
    panelStart,
    assemblyTarget,
    front: new Float64Array(structure.frontCapacity / 4),
    stack: new Float64Array(structure.stackCapacity / 4),
    updateAt: new Int32Array(supernodeCount),
  };
  structure.scalarLayout = layout;
  return layout;
}

/**
 * Factor a scalar matrix on a block structure. `values` holds one number per block of the
 * original pattern, at the indices of `structure.blockIndex`; it is read, not changed.
 * `replaced`, an earlier factorization of the same structure the caller no longer needs, lends
 * its storage.
 */
export function factorScalarMatrix(
  structure: BlockLuStructure,
  values: Float64Array,
  replaced?: ScalarLuFactorization,
): ScalarLuFactorization {
  const n = structure.size;
  const {
    order,
    supernodeCount,
    supernodeStart,
    frontStart,
    childStart,
    children,
    parentMapStart,
    parentMap,
    assemblyStart,
    assemblySource,
  } = structure;
  const layout = scalarLayout(structure);
  const { panelStart, assemblyTarget, front, stack, updateAt } = layout;
  const reuse = replaced !== undefined && replaced.structure === structure;
  const size = panelStart[supernodeCount] as number;
  const lower = reuse ? replaced.lower : new Float64Array(size);
  const upper = reuse ? replaced.upper : new Float64Array(size);
  const pivotInverse = reuse ? replaced.pivotInverse : new Float64Array(n);
  const perturbedPivots: number[] = [];
  let top = 0;
  for (let s = 0; s < supernodeCount; s++) {
    const firstStep = supernodeStart[s] as number;
    const width = (supernodeStart[s + 1] as number) - firstStep;
    const m = (frontStart[s + 1] as number) - (frontStart[s] as number);
    front.fill(0, 0, m * m);
    for (let k = assemblyStart[s] as number; k < (assemblyStart[s + 1] as number); k++) {
      const target = assemblyTarget[k] as number;
      front[target] = (front[target] as number) + (values[assemblySource[k] as number] as number);
    }
    // Extend-add each child's update matrix (r x r, row-major) through its parent map.
    for (let c = childStart[s] as number; c < (childStart[s + 1] as number); c++) {
      const child = children[c] as number;
      const mapStart = parentMapStart[child] as number;
      const rows = (parentMapStart[child + 1] as number) - mapStart;
      const base = updateAt[child] as number;
      for (let i = 0; i < rows; i++) {
        const targetRow = (parentMap[mapStart + i] as number) * m;
        const sourceRow = base + i * rows;
        for (let j = 0; j < rows; j++) {
          const to = targetRow + (parentMap[mapStart + j] as number);
          front[to] = (front[to] as number) + (stack[sourceRow + j] as number);
        }
      }
    }
    if ((childStart[s + 1] as number) > (childStart[s] as number))
      top = updateAt[children[childStart[s] as number] as number] as number;

    eliminateScalarPivots(front, m, width, firstStep, order, pivotInverse, perturbedPivots);
    const panel = panelStart[s] as number;
    for (let column = 0; column < width; column++) {
      const to = panel + column * m;
      for (let row = 0; row < m; row++) lower[to + row] = front[row * m + column] as number;
    }
    const upperLength = width * m;
    for (let k = 0; k < upperLength; k++) upper[panel + k] = front[k] as number;
    // Push the Schur complement (the trailing r x r) for the parent.
    const rows = m - width;
    updateAt[s] = top;
    for (let row = 0; row < rows; row++) {
      const from = (width + row) * m + width;
      const to = top + row * rows;
      for (let k = 0; k < rows; k++) stack[to + k] = front[from + k] as number;
    }
    top += rows * rows;
  }
  return { structure, lower, upper, pivotInverse, perturbedPivots };
}

/**
 * Eliminate the first `width` pivots of a dense front (row-major, leading dimension m):
 * L_ik = F_ik / F_kk and F_ij -= L_ik F_kj for i, j > k (right-looking LU without exchanges),
 * two pivots at a time, so that each trailing row is read and written once per pair (measured
 * 1.6 times faster on a 106-row front than one pivot at a time; the same operations but for the
 * order of two additions). Leaves L below the diagonal, U on and above it, the Schur complement
 * in the trailing part.
 */
function eliminateScalarPivots(
  front: Float64Array,
  m: number,
  width: number,
  firstStep: number,
  order: Int32Array,
  pivotInverse: Float64Array,
  perturbedPivots: number[],
): void {
  let k = 0;
  for (; k + 1 < width; k += 2) {
    const rowOne = k * m;
    const rowTwo = rowOne + m;
    const inverseOne = invertPivot(
      front,
      rowOne,
      k,
      m,
      order[firstStep + k] as number,
      pivotInverse,
      perturbedPivots,
    );
    // The pair's second row by the first pivot, then the second pivot.
    const l21 = (front[rowTwo + k] as number) * inverseOne;
    front[rowTwo + k] = l21;
    for (let column = k + 1; column < m; column++) {
      front[rowTwo + column] =
        (front[rowTwo + column] as number) - l21 * (front[rowOne + column] as number);
    }
    const inverseTwo = invertPivot(
      front,
      rowTwo,
      k + 1,
      m,
      order[firstStep + k + 1] as number,
      pivotInverse,
      perturbedPivots,
    );
    const u12 = front[rowOne + k + 1] as number;
    for (let row = k + 2; row < m; row++) {
      const at = row * m;
      const l1 = (front[at + k] as number) * inverseOne;
      const l2 = ((front[at + k + 1] as number) - l1 * u12) * inverseTwo;
      front[at + k] = l1;
      front[at + k + 1] = l2;
      if (l1 === 0 && l2 === 0) continue;
      for (let column = k + 2; column < m; column++) {
        front[at + column] =
          (front[at + column] as number) -
          (l1 * (front[rowOne + column] as number) + l2 * (front[rowTwo + column] as number));
      }
    }
  }
  if (k < width) {
    const pivotRow = k * m;
    const inverse = invertPivot(
      front,
      pivotRow,
      k,
      m,
      order[firstStep + k] as number,
      pivotInverse,
      perturbedPivots,
    );
    for (let row = k + 1; row < m; row++) {
      const at = row * m;
      const l = (front[at + k] as number) * inverse;
      front[at + k] = l;
      if (l === 0) continue;
      for (let column = k + 1; column < m; column++) {
        front[at + column] =
          (front[at + column] as number) - l * (front[pivotRow + column] as number);
      }
    }
  }
}

/**
 * 1 / the pivot F_kk of row `pivot` (front row starting at `rowStart`), stored in
 * pivotInverse. A pivot that is zero or below 1e-14 of its row's size is shifted by 1e-10 of
 * that size first and its row listed in perturbedPivots.
 */
function invertPivot(
  front: Float64Array,
  rowStart: number,
  k: number,
  m: number,
  pivot: number,
  pivotInverse: Float64Array,
  perturbedPivots: number[],
): number {
  let a = front[rowStart + k] as number;
  let rowSize = 0;
  for (let j = k; j < m; j++) rowSize += Math.abs(front[rowStart + j] as number);
  if (!(Math.abs(a) > 1e-14 * rowSize)) {
    perturbedPivots.push(pivot);
    const shift = 1e-10 * (rowSize > 0 ? rowSize : 1);
    a += a >= 0 ? shift : -shift;
    front[rowStart + k] = a;
  }
  const inverse = 1 / a;
  pivotInverse[pivot] = inverse;
  return inverse;
}

/** Solve A x = b with a scalar factorization; the result is a new array (one number per row). */
export function solveScalarFactored(
  factorization: ScalarLuFactorization,
  rhs: Float64Array,
): Float64Array {
  const { structure, lower, upper, pivotInverse } = factorization;
  const { supernodeCount, supernodeStart, frontStart, frontNodes } = structure;
  const { panelStart } = scalarLayout(structure);
  const x = Float64Array.from(rhs);
  // Forward: L y = b, column by column of each supernode's panel.
  for (let s = 0; s < supernodeCount; s++) {
    const width = (supernodeStart[s + 1] as number) - (supernodeStart[s] as number);
    const nodes = frontStart[s] as number;
    const m = (frontStart[s + 1] as number) - nodes;
    const panel = panelStart[s] as number;
    for (let k = 0; k < width; k++) {
      const y = x[frontNodes[nodes + k] as number] as number;
      if (y === 0) continue;
      const column = panel + k * m;
      for (let i = k + 1; i < m; i++) {
        const row = frontNodes[nodes + i] as number;
        x[row] = (x[row] as number) - (lower[column + i] as number) * y;
      }
    }
  }
  // Backward: x_k = (y_k - sum_j U_kj x_j) / U_kk, supernodes and pivots in reverse.
  for (let s = supernodeCount - 1; s >= 0; s--) {
    const width = (supernodeStart[s + 1] as number) - (supernodeStart[s] as number);
    const nodes = frontStart[s] as number;
    const m = (frontStart[s + 1] as number) - nodes;
    const panel = panelStart[s] as number;
    for (let k = width - 1; k >= 0; k--) {
      const pivot = frontNodes[nodes + k] as number;
      let r = x[pivot] as number;
      const row = panel + k * m;
      for (let j = k + 1; j < m; j++) {
        r -= (upper[row + j] as number) * (x[frontNodes[nodes + j] as number] as number);
      }
      x[pivot] = r * (pivotInverse[pivot] as number);
    }
  }
  return x;
}
