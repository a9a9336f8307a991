import { describe, expect, it } from "vitest";
import { safeguardedNewton } from "../../src/physics/scalar-root.js";

const square = (x: number, a: number) => x * x - a;
const squareSlope = (x: number) => 2 * x;
const arctangent = (x: number, shift: number) => Math.atan(x - shift);
const arctangentSlope = (x: number, shift: number) => 1 / (1 + (x - shift) * (x - shift));
const cubeRoot = (x: number) => Math.cbrt(x);
const cubeRootSlope = (x: number) => 1 / (3 * Math.cbrt(x * x));

describe("safeguardedNewton", () => {
  it("@example: finds sqrt(2) from the bracket [0, 2]", () => {
    const root = safeguardedNewton(square, squareSlope, 2, 0, 0, 0, 2, 1, true, 1e-15, 0);
    expect(Math.abs(root - Math.SQRT2)).toBeLessThanOrEqual(2 * Number.EPSILON);
  });

  it("converges where plain Newton diverges (arctan from a guess beyond |x| = 1.39)", () => {
    // Plain Newton on atan(x) diverges from any start with |x| > 1.3917 (common knowledge of
    // Newton's method; the iterates alternate and grow). The bracket forces bisection steps.
    const root = safeguardedNewton(
      arctangent,
      arctangentSlope,
      3,
      0,
      0,
      -100,
      100,
      90,
      true,
      1e-15,
      1e-300,
    );
    expect(Math.abs(root - 3)).toBeLessThan(1e-13);
  });

  it("converges on a function with an infinite slope at the root (cube root)", () => {
    // Newton on cbrt(x) doubles |x| each step; only the bisection fallback brings it in.
    const root = safeguardedNewton(cubeRoot, cubeRootSlope, 0, 0, 0, -1, 2, 1.5, true, 0, 1e-12);
    expect(Math.abs(root)).toBeLessThan(1e-11);
  });

  it("honours a decreasing orientation", () => {
    const root = safeguardedNewton(
      (x, a) => a - x * x,
      (x) => -2 * x,
      9,
      0,
      0,
      0,
      10,
      9,
      false,
      1e-15,
      0,
    );
    expect(Math.abs(root - 3)).toBeLessThanOrEqual(4 * Number.EPSILON);
  });

  it("clamps a guess outside the bracket", () => {
    const root = safeguardedNewton(square, squareSlope, 4, 0, 0, 1, 3, 50, true, 1e-15, 0);
    expect(Math.abs(root - 2)).toBeLessThanOrEqual(2 * Number.EPSILON);
  });
});
