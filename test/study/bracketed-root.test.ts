import { describe, expect, it } from "vitest";
import { bracketedRoot } from "../../src/study/index.js";

describe("bracketedRoot", () => {
  it("finds the square root of 2 (its @example)", () => {
    const found = bracketedRoot({
      evaluate: (x) => x * x - 2,
      inside: { x: 1, value: -1 },
      beyond: { x: 2, value: 2 },
      xTolerance: 1e-12,
      valueTolerance: 0,
      maxEvaluations: 100,
    });
    // sqrt(2) = 1.41421356237309504... (closed form); 1e-12 is the requested bracket width.
    expect(found.converged).toBe(true);
    expect(Math.abs(found.inside.x - Math.SQRT2)).toBeLessThan(1e-12);
    // The Illinois method converges superlinearly: far fewer steps than bisection's 40.
    expect(found.evaluations).toBeLessThan(15);
  });

  it("closes on the edge of the region where the function can be evaluated", () => {
    // f(x) = 1 - x^2 exists only up to x = 0.8 (think: the network solves only up to there).
    const evaluate = (x: number) => (x <= 0.8 ? 1 - x * x : undefined);
    const found = bracketedRoot({
      evaluate,
      inside: { x: 0, value: 1 },
      beyond: { x: 2, value: undefined },
      xTolerance: 1e-9,
      valueTolerance: 0,
      maxEvaluations: 200,
    });
    expect(found.converged).toBe(true);
    expect(found.inside.x).toBeLessThanOrEqual(0.8);
    expect(0.8 - found.inside.x).toBeLessThan(2e-9);
    expect(found.beyond.value).toBeUndefined();
  });

  it("finds a root inside the region with the secant while the far end has no value", () => {
    // Root at 0.5, region ends at 0.9: the extrapolated secant finds the root, not the edge.
    const found = bracketedRoot({
      evaluate: (x) => (x <= 0.9 ? 0.5 - x : undefined),
      inside: { x: 0, value: 0.5 },
      beyond: { x: 1, value: undefined },
      xTolerance: 1e-12,
      valueTolerance: 1e-12,
      maxEvaluations: 100,
    });
    expect(Math.abs(found.inside.x - 0.5)).toBeLessThan(1e-9);
  });

  it("stops at the evaluation budget and says so", () => {
    const found = bracketedRoot({
      evaluate: (x) => Math.cbrt(x - 0.3),
      inside: { x: 0, value: Math.cbrt(-0.3) },
      beyond: { x: 1, value: Math.cbrt(0.7) },
      xTolerance: 0,
      valueTolerance: 0,
      maxEvaluations: 5,
    });
    expect(found.converged).toBe(false);
    expect(found.evaluations).toBe(5);
    expect(found.inside.x).toBeLessThan(0.3);
    expect(found.beyond.x).toBeGreaterThan(0.3);
  });
});
