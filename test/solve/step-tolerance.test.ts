// The tolerance of a Newton step's linear solve (inexact Newton with frozen factors on large
// meshed networks, src/solve/newton.ts).
import { describe, expect, it } from "vitest";
import { stepTolerance } from "../../src/solve/newton.js";

describe("the step tolerance of inexact Newton", () => {
  it("follows Eisenstat and Walker's choice 2 while far from the tolerance", () => {
    // eta = 0.9 (|R_k| / |R_k-1|)^2: S. C. Eisenstat and H. F. Walker, SIAM J. Sci. Comput. 17
    // (1996) 16-32, choice 2 with alpha = 2, gamma = 0.9.
    expect(stepTolerance(1e-4, 1e-2, 1e-4, 1e-9)).toBeCloseTo(0.9e-4, 15);
  });

  it("stays within its ceiling (a poor Newton model far from the solution) and floor", () => {
    expect(stepTolerance(1, 1, 1, 1e-9)).toBe(1e-3);
    expect(stepTolerance(1e-8, 1, 1, 1e-20)).toBe(1e-10);
  });

  it("asks no more than half the tolerance of the linear residual near the end", () => {
    // Quadratic convergence makes eta tiny (0.9 (6e-9 / 2e-6)^2 = 8e-6), but a linear residual
    // of 0.5 x 1e-9 in 2-norm, 0.5e-9 / 6e-9 = 0.083 of the right-hand side, converges: the
    // safeguard against oversolving in C. T. Kelley, Iterative Methods for Linear and Nonlinear
    // Equations, SIAM, 1995, section 6.3 (from memory); then the ceiling.
    expect(stepTolerance(6e-9, 2e-6, 6e-9, 1e-9)).toBe(1e-3);
    expect(stepTolerance(6e-7, 2e-4, 6e-7, 1e-9)).toBeCloseTo(0.5e-9 / 6e-7, 15);
  });

  it("keeps the linear residual below the merit norm when that is already under the tolerance", () => {
    // A merit norm of 2e-10 (weighted rows) whose right-hand side is 5e-7 in 2-norm (a trickle
    // junction's raw temperature row): half the merit norm, 1e-10 / 5e-7 = 2e-4, not
    // 0.5e-9 / 5e-7 = 1e-3, so that the step still lowers the merit.
    expect(stepTolerance(2e-10, 1e-6, 5e-7, 1e-9)).toBeCloseTo(2e-4, 15);
  });
});
