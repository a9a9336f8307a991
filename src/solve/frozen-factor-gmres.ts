/**
 * Solving a block system with the LU factors of an earlier matrix of the same structure as the
 * preconditioner of GMRES, so that a Newton iteration whose Jacobian has changed little does not
 * pay for a new factorization.
 *
 * On a meshed network the numeric factorization costs far more than a residual evaluation (on
 * the 40,000-edge grid 31 million 2 x 2 block updates, against 0.9 million blocks touched by a
 * triangular solve), while successive Newton Jacobians differ by little:
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
  solveFactoredInPlace,
} from "./sparse-block-lu.js";

/**
 * Networks with at least this many junctions reuse factors through GMRES in their Newton steps
 * (the first guess factors its scalar systems each round: src/solve/sparse-scalar-lu.ts);
 * smaller ones factor every matrix, which costs less there than the edge evaluations, and so
 * solve exactly as before this module existed.
 */
export const FROZEN_FACTOR_MIN_JUNCTIONS = 1500;

/**
 * Whether reusing factors pays on this structure: at least this many junctions, and a
 * factorization that costs more than FACTOR_COST_RATIO triangular solves (counted in 2 x 2 block
 * operations). A tree eliminated leaves first has no fill and factors as cheaply as it solves,
 * so it always factors and solves exactly.
 */
export function reuseOfFactorsPays(structure: BlockLuStructure): boolean {
  return factorizationCostsOver(structure, FACTOR_COST_RATIO);
}

/** At least FROZEN_FACTOR_MIN_JUNCTIONS junctions and a factorization over `ratio` solves. */
function factorizationCostsOver(structure: BlockLuStructure, ratio: number): boolean {
  return (
    structure.size >= FROZEN_FACTOR_MIN_JUNCTIONS &&
    structure.factorUpdates > ratio * structure.solveBlocks
  );
}
/**
 * Measured break-even (CPU time of cold solves, multifrontal factors): the 40,000-edge mixed
 * network (ratio 21) solved 16 % faster factoring every matrix, the 40,000-edge grid (ratio 35)
 * took the same time both ways.
 */
const FACTOR_COST_RATIO = 35;

/**
 * Whether a warm start (a case close to one solved before, src/solve/solve-network.ts) pays for
 * solving its first steps with the factors that solve left: on networks of at least
 * FROZEN_FACTOR_MIN_JUNCTIONS junctions whose factorization costs more than
 * START_FACTOR_COST_RATIO triangular solves. The bar is lower than for a cold solve's own factors
 * because a solved neighbour's Jacobian is closer to every Jacobian of the case than the first
 * Jacobians of a cold solve are to its later ones.
 */
export function reuseOfStartFactorsPays(structure: BlockLuStructure): boolean {
  return factorizationCostsOver(structure, START_FACTOR_COST_RATIO);
}
/**
 * Measured (Newton's time after every demand grew by 1 %, mean of 15 cases, factoring every
 * Jacobian against solving with the start factors): the 10,000-edge grid (ratio 20) 166 and
 * 88 ms, the 40,000-edge mixed network (ratio 21) 746 and 631 ms; no gain on the 5,000-edge grid
 * (ratio 15, 57 and 61 ms) and the 10,000-edge mixed network (ratio 11, 84 ms both ways); a loss
 * on the 10,000-edge tree (ratio 0.3, 60 and 76 ms: GMRES's loose first steps cost it an
 * iteration now and then).
 */
const START_FACTOR_COST_RATIO = 17;

/** y = A x for a block matrix in the layout of {@link BlockLuStructure.blockIndex}. */
export function multiplyBlockMatrix(
  structure: BlockLuStructure,
  values: Float64Array,
  x: Float64Array,
  y: Float64Array,
): void {
  const n = structure.size;
  const { adjacencyStart, adjacency, adjacencyBlock } = structure;
  for (let i = 0; i < n; i++) {
    const d = 4 * i;
    const x1 = x[2 * i] as number;
    const x2 = x[2 * i + 1] as number;
    let r1 = (values[d] as number) * x1 + (values[d + 1] as number) * x2;
    let r2 = (values[d + 2] as number) * x1 + (values[d + 3] as number) * x2;
    for (let e = adjacencyStart[i] as number; e < (adjacencyStart[i + 1] as number); e++) {
      const j = adjacency[e] as number;
      const b = 4 * (adjacencyBlock[e] as number);
      const xj1 = x[2 * j] as number;
      const xj2 = x[2 * j + 1] as number;
      r1 += (values[b] as number) * xj1 + (values[b + 1] as number) * xj2;
      r2 += (values[b + 2] as number) * xj1 + (values[b + 3] as number) * xj2;
    }
    y[2 * i] = r1;
    y[2 * i + 1] = r2;
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
 * Working memory of GMRES for one structure: the Krylov basis and the small least-squares
 * problem. Made on the first frozen solve of a structure and kept on it (its contents mean
 * nothing between calls), so the Newton steps of a large network allocate only their result.
 */
export interface GmresWorkspace {
  /** Krylov basis vectors (grown to the iteration limit as needed). */
  basis: Float64Array[];
  /** Scratch vectors: the product A z and the preconditioned vector z. */
  product: Float64Array;
  preconditioned: Float64Array;
  hessenberg: Float64Array;
  cosines: Float64Array;
  sines: Float64Array;
  g: Float64Array;
  coefficients: Float64Array;
  /** Iterations the small arrays have room for. */
  capacity: number;
}

function workspaceFor(structure: BlockLuStructure, length: number, m: number): GmresWorkspace {
  const kept = structure.gmresWorkspace;
  if (kept !== undefined && kept.capacity >= m && kept.product.length === length) return kept;
  const workspace: GmresWorkspace = {
    basis: kept?.product.length === length ? kept.basis : [],
    product: new Float64Array(length),
    preconditioned: new Float64Array(length),
    hessenberg: new Float64Array((m + 1) * m),
    cosines: new Float64Array(m),
    sines: new Float64Array(m),
    g: new Float64Array(m + 1),
    coefficients: new Float64Array(m),
    capacity: m,
  };
  structure.gmresWorkspace = workspace;
  return workspace;
}

/**
 * Solve A x = b by GMRES, right-preconditioned with the factors of an earlier matrix of A's
 * structure. Returns x once |b - A x| <= tolerance |b| (2-norm, checked on the true residual
 * of the final x, not only on GMRES's running estimate), or no x after `maxIterations` (no
 * restart: the caller then factors A itself). Works in the structure's {@link GmresWorkspace};
 * allocates only the returned x.
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
  const m = maxIterations;
  const space = workspaceFor(structure, length, m);
  const { basis, product: work, preconditioned: z, hessenberg, cosines, sines, g } = space;
  const lead = space.capacity + 1; // rows of the column-major Hessenberg matrix
  const vector = (i: number): Float64Array => {
    while (basis.length <= i) basis.push(new Float64Array(length));
    return basis[i] as Float64Array;
  };
  // Start from the preconditioned right-hand side: x0 = M^-1 b, r0 = b - A x0.
  const x0 = Float64Array.from(rhs);
  solveFactoredInPlace(factors, x0);
  multiplyBlockMatrix(structure, values, x0, work);
  const r0 = vector(0);
  for (let i = 0; i < length; i++) r0[i] = (rhs[i] as number) - (work[i] as number);
  let beta = norm(r0);
  if (!Number.isFinite(beta)) return { x: undefined, iterations: 0 };
  if (beta <= tolerance * rhsNorm) return { x: x0, iterations: 0 };
  for (let i = 0; i < length; i++) r0[i] = (r0[i] as number) / beta;
  g.fill(0);
  g[0] = beta;
  let done = 0;
  for (let j = 0; j < m; j++) {
    z.set(basis[j] as Float64Array);
    solveFactoredInPlace(factors, z);
    const w = vector(j + 1);
    multiplyBlockMatrix(structure, values, z, w);
    // Modified Gram-Schmidt.
    for (let i = 0; i <= j; i++) {
      const v = basis[i] as Float64Array;
      let h = 0;
      for (let k = 0; k < length; k++) h += (w[k] as number) * (v[k] as number);
      hessenberg[j * lead + i] = h;
      for (let k = 0; k < length; k++) w[k] = (w[k] as number) - h * (v[k] as number);
    }
    const wNorm = norm(w);
    hessenberg[j * lead + j + 1] = wNorm;
    // Apply the earlier rotations to the new column, then one that zeroes its subdiagonal.
    for (let i = 0; i < j; i++) {
      const a = hessenberg[j * lead + i] as number;
      const b = hessenberg[j * lead + i + 1] as number;
      hessenberg[j * lead + i] = (cosines[i] as number) * a + (sines[i] as number) * b;
      hessenberg[j * lead + i + 1] = -(sines[i] as number) * a + (cosines[i] as number) * b;
    }
    const a = hessenberg[j * lead + j] as number;
    const radius = Math.hypot(a, wNorm);
    if (!(radius > 0)) return { x: undefined, iterations: j + 1 };
    cosines[j] = a / radius;
    sines[j] = wNorm / radius;
    hessenberg[j * lead + j] = radius;
    hessenberg[j * lead + j + 1] = 0;
    g[j + 1] = -(sines[j] as number) * (g[j] as number);
    g[j] = (cosines[j] as number) * (g[j] as number);
    done = j + 1;
    beta = Math.abs(g[j + 1] as number);
    if (!Number.isFinite(beta)) return { x: undefined, iterations: done };
    if (beta <= tolerance * rhsNorm || wNorm === 0) break;
    for (let k = 0; k < length; k++) w[k] = (w[k] as number) / wNorm;
  }
  if (beta > tolerance * rhsNorm) return { x: undefined, iterations: done };
  // y from the triangular system, then x = x0 + M^-1 (V y).
  const y = space.coefficients;
  for (let i = done - 1; i >= 0; i--) {
    let sum = g[i] as number;
    for (let k = i + 1; k < done; k++)
      sum -= (hessenberg[k * lead + i] as number) * (y[k] as number);
    y[i] = sum / (hessenberg[i * lead + i] as number);
  }
  z.fill(0);
  for (let i = 0; i < done; i++) {
    const v = basis[i] as Float64Array;
    const coefficient = y[i] as number;
    for (let k = 0; k < length; k++) z[k] = (z[k] as number) + coefficient * (v[k] as number);
  }
  solveFactoredInPlace(factors, z);
  for (let k = 0; k < length; k++) x0[k] = (x0[k] as number) + (z[k] as number);
  // The rotations' residual estimate can run ahead of the true one in round-off (nearly singular
  // matrices, tight tolerances): accept x only on the true residual b - A x.
  multiplyBlockMatrix(structure, values, x0, work);
  for (let k = 0; k < length; k++) work[k] = (rhs[k] as number) - (work[k] as number);
  const trueResidual = norm(work);
  if (!(trueResidual <= tolerance * rhsNorm)) return { x: undefined, iterations: done };
  return { x: x0, iterations: done };
}

/** The 2-norm of a vector. */
export function norm(v: Float64Array): number {
  let sum = 0;
  for (let i = 0; i < v.length; i++) sum += (v[i] as number) * (v[i] as number);
  return Math.sqrt(sum);
}
