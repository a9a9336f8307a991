/**
 * Solving a block system with the LU factors of an earlier matrix of the same structure as the
 * preconditioner of GMRES, so that a Newton iteration whose Jacobian has changed little does not
 * pay for a new factorization.
 *
 * On a meshed network the numeric factorization costs far more than a residual evaluation (at
 * 100,000 edges about 35 million 2 x 2 block updates, against 1.4 million stored blocks touched by
 * a multiplication or a triangular solve), while successive Newton Jacobians differ by little:
 * a few preconditioned GMRES iterations then give the step to 1e-10 of its right-hand side at
 * the price of a few triangular solves. When they do not, the caller factors the new matrix.
 *
 * GMRES: Y. Saad and M. H. Schultz, "GMRES: a generalized minimal residual algorithm for solving
 * nonsymmetric linear systems", SIAM J. Sci. Stat. Comput. 7 (1986) 856-869; right
 * preconditioning and Givens rotations as in Y. Saad, Iterative Methods for Sparse Linear Systems,
 * 2nd ed., SIAM, 2003, algorithm 9.5.
 */
import {
  type BlockLuFactorization,
  type BlockLuStructure,
  solveFactored,
} from "./sparse-block-lu.js";

/**
 * Networks with at least this many junctions reuse factors through GMRES (Newton steps and the
 * rounds of the first guess); smaller ones factor every matrix, which costs less there than the
 * edge evaluations, and so solve exactly as before this module existed.
 */
export const FROZEN_FACTOR_MIN_JUNCTIONS = 1500;

/**
 * Whether reusing factors pays on this structure: at least this many junctions, and a
 * factorization that costs more than FACTOR_COST_RATIO triangular solves (counted in 2 x 2 block
 * operations). A tree eliminated leaves first has no fill and factors as cheaply as it solves,
 * so it always factors and solves exactly.
 */
export function reuseOfFactorsPays(structure: BlockLuStructure): boolean {
  const n = structure.size;
  const factorWork = structure.updateStart[n] as number;
  const solveWork = n + 2 * (structure.laterStart[n] as number);
  return n >= FROZEN_FACTOR_MIN_JUNCTIONS && factorWork > FACTOR_COST_RATIO * solveWork;
}
const FACTOR_COST_RATIO = 20;

/** y = A x for a block matrix stored as {@link factorBlockMatrix} takes it (fill blocks zero). */
export function multiplyBlockMatrix(
  structure: BlockLuStructure,
  values: Float64Array,
  x: Float64Array,
  y: Float64Array,
): void {
  const n = structure.size;
  const { order, laterStart, laterNeighbours } = structure;
  for (let i = 0; i < n; i++) {
    const d = 4 * i;
    const x1 = x[2 * i] as number;
    const x2 = x[2 * i + 1] as number;
    y[2 * i] = (values[d] as number) * x1 + (values[d + 1] as number) * x2;
    y[2 * i + 1] = (values[d + 2] as number) * x1 + (values[d + 3] as number) * x2;
  }
  for (let step = 0; step < n; step++) {
    const pivot = order[step] as number;
    const p1 = x[2 * pivot] as number;
    const p2 = x[2 * pivot + 1] as number;
    let r1 = 0;
    let r2 = 0;
    for (let k = laterStart[step] as number; k < (laterStart[step + 1] as number); k++) {
      const s = laterNeighbours[k] as number;
      const lower = 4 * (n + 2 * k); // block (s, pivot)
      const upper = lower + 4; // block (pivot, s)
      y[2 * s] =
        (y[2 * s] as number) + (values[lower] as number) * p1 + (values[lower + 1] as number) * p2;
      y[2 * s + 1] =
        (y[2 * s + 1] as number) +
        (values[lower + 2] as number) * p1 +
        (values[lower + 3] as number) * p2;
      const s1 = x[2 * s] as number;
      const s2 = x[2 * s + 1] as number;
      r1 += (values[upper] as number) * s1 + (values[upper + 1] as number) * s2;
      r2 += (values[upper + 2] as number) * s1 + (values[upper + 3] as number) * s2;
    }
    y[2 * pivot] = (y[2 * pivot] as number) + r1;
    y[2 * pivot + 1] = (y[2 * pivot + 1] as number) + r2;
  }
}

/** Result of {@link solveWithFrozenFactors}. */
export interface FrozenSolveResult {
  /** The solution, or undefined when GMRES did not reach the tolerance in its iterations. */
  x: Float64Array | undefined;
  /** GMRES iterations done (each one multiplication and one triangular solve). */
  iterations: number;
}

/**
 * Solve A x = b by GMRES, right-preconditioned with the factors of an earlier matrix of A's
 * structure. Returns x once |b - A x| <= tolerance |b| (2-norm, checked on the true residual
 * of the final x, not only on GMRES's running estimate), or no x after `maxIterations` (no
 * restart: the caller then factors A itself). Allocates its Krylov basis per call: it runs once
 * per Newton step of a large network, where that is small against one factorization.
 */
export function solveWithFrozenFactors(
  values: Float64Array,
  factors: BlockLuFactorization,
  rhs: Float64Array,
  tolerance: number,
  maxIterations: number,
): FrozenSolveResult {
  const structure = factors.structure;
  const length = rhs.length;
  const rhsNorm = norm(rhs);
  if (rhsNorm === 0) return { x: new Float64Array(length), iterations: 0 };
  // Start from the preconditioned right-hand side: x0 = M^-1 b, r0 = b - A x0.
  const x0 = solveFactored(factors, rhs);
  const work = new Float64Array(length);
  multiplyBlockMatrix(structure, values, x0, work);
  const r0 = new Float64Array(length);
  for (let i = 0; i < length; i++) r0[i] = (rhs[i] as number) - (work[i] as number);
  let beta = norm(r0);
  if (!Number.isFinite(beta)) return { x: undefined, iterations: 0 };
  if (beta <= tolerance * rhsNorm) return { x: x0, iterations: 0 };

  const m = maxIterations;
  const basis: Float64Array[] = [scaled(r0, 1 / beta)];
  const hessenberg = new Float64Array((m + 1) * m); // column-major, (m + 1) rows
  const cosines = new Float64Array(m);
  const sines = new Float64Array(m);
  const g = new Float64Array(m + 1);
  g[0] = beta;
  let done = 0;
  for (let j = 0; j < m; j++) {
    const z = solveFactored(factors, basis[j] as Float64Array);
    const w = new Float64Array(length);
    multiplyBlockMatrix(structure, values, z, w);
    // Modified Gram-Schmidt.
    for (let i = 0; i <= j; i++) {
      const v = basis[i] as Float64Array;
      let h = 0;
      for (let k = 0; k < length; k++) h += (w[k] as number) * (v[k] as number);
      hessenberg[j * (m + 1) + i] = h;
      for (let k = 0; k < length; k++) w[k] = (w[k] as number) - h * (v[k] as number);
    }
    const wNorm = norm(w);
    hessenberg[j * (m + 1) + j + 1] = wNorm;
    // Apply the earlier rotations to the new column, then one that zeroes its subdiagonal.
    for (let i = 0; i < j; i++) {
      const a = hessenberg[j * (m + 1) + i] as number;
      const b = hessenberg[j * (m + 1) + i + 1] as number;
      hessenberg[j * (m + 1) + i] = (cosines[i] as number) * a + (sines[i] as number) * b;
      hessenberg[j * (m + 1) + i + 1] = -(sines[i] as number) * a + (cosines[i] as number) * b;
    }
    const a = hessenberg[j * (m + 1) + j] as number;
    const radius = Math.hypot(a, wNorm);
    if (!(radius > 0)) return { x: undefined, iterations: j + 1 };
    cosines[j] = a / radius;
    sines[j] = wNorm / radius;
    hessenberg[j * (m + 1) + j] = radius;
    hessenberg[j * (m + 1) + j + 1] = 0;
    g[j + 1] = -(sines[j] as number) * (g[j] as number);
    g[j] = (cosines[j] as number) * (g[j] as number);
    done = j + 1;
    beta = Math.abs(g[j + 1] as number);
    if (!Number.isFinite(beta)) return { x: undefined, iterations: done };
    if (beta <= tolerance * rhsNorm || wNorm === 0) break;
    basis.push(scaled(w, 1 / wNorm));
  }
  if (beta > tolerance * rhsNorm) return { x: undefined, iterations: done };
  // y from the triangular system, then x = x0 + M^-1 (V y).
  const y = new Float64Array(done);
  for (let i = done - 1; i >= 0; i--) {
    let sum = g[i] as number;
    for (let k = i + 1; k < done; k++)
      sum -= (hessenberg[k * (m + 1) + i] as number) * (y[k] as number);
    y[i] = sum / (hessenberg[i * (m + 1) + i] as number);
  }
  work.fill(0);
  for (let i = 0; i < done; i++) {
    const v = basis[i] as Float64Array;
    const coefficient = y[i] as number;
    for (let k = 0; k < length; k++) work[k] = (work[k] as number) + coefficient * (v[k] as number);
  }
  const correction = solveFactored(factors, work);
  for (let k = 0; k < length; k++) x0[k] = (x0[k] as number) + (correction[k] as number);
  // The rotations' residual estimate can run ahead of the true one in round-off (nearly singular
  // matrices, tight tolerances): accept x only on the true residual b - A x.
  multiplyBlockMatrix(structure, values, x0, work);
  for (let k = 0; k < length; k++) work[k] = (rhs[k] as number) - (work[k] as number);
  const trueResidual = norm(work);
  if (!(trueResidual <= tolerance * rhsNorm)) return { x: undefined, iterations: done };
  return { x: x0, iterations: done };
}

function norm(v: Float64Array): number {
  let sum = 0;
  for (let i = 0; i < v.length; i++) sum += (v[i] as number) * (v[i] as number);
  return Math.sqrt(sum);
}

function scaled(v: Float64Array, factor: number): Float64Array {
  const out = new Float64Array(v.length);
  for (let i = 0; i < v.length; i++) out[i] = (v[i] as number) * factor;
  return out;
}
