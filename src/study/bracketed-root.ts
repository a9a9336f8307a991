/**
 * Root of a scalar function known only by evaluation (here: one network solve per evaluation)
 * inside a bracket, by the Illinois variant of regula falsi with a bisection safeguard; an
 * evaluation that fails (no solution) counts as lying beyond the failing end. Browser-safe.
 */

/** A point of the search: the function's value, or undefined when the evaluation failed. */
export interface RootPoint {
  x: number;
  value: number | undefined;
}

/** What {@link bracketedRoot} is asked to do. */
export interface RootProblem {
  /** The function; undefined when it cannot be evaluated there (the solve failed). */
  evaluate: (x: number) => number | undefined;
  /** One end of the bracket, with a value. */
  inside: { x: number; value: number };
  /**
   * The other end: a value of the opposite sign, or undefined (the function cannot be evaluated
   * there; the root lies between the last point that can be and the first that cannot).
   */
  beyond: RootPoint;
  /** Stop when the bracket is at most this wide (absolute, in x). */
  xTolerance: number;
  /** Stop when |f| at the inside end is at most this. */
  valueTolerance: number;
  /** Largest number of evaluations. */
  maxEvaluations: number;
}

/** What {@link bracketedRoot} found. */
export interface RootOutcome {
  /** The end of the final bracket on the side of `inside` (same sign, or evaluable). */
  inside: { x: number; value: number };
  /** The other end of the final bracket. */
  beyond: RootPoint;
  /** Evaluations made. */
  evaluations: number;
  /** True when a tolerance was met (false: the evaluation budget ran out). */
  converged: boolean;
}

/**
 * Shrink a bracket [inside, beyond] around a sign change of f (or around the edge of the region
 * where f can be evaluated) until it is narrower than `xTolerance` or |f(inside)| is at most
 * `valueTolerance`.
 *
 * Each step is a regula falsi step when both ends have values, with the Illinois modification
 * (the value kept at an end that is retained twice in a row is halved). When `beyond` has no
 * value, the step extrapolates the secant through the last two inside points to the root (the
 * edge of the region that solves is usually just past it); a bisection step replaces either when
 * two steps in a row did not halve the bracket, so the bracket always closes.
 *
 * @remarks M. Dowell and P. Jarratt, "A modified regula falsi method for computing the root of an
 *   equation", BIT 11 (1971) 168-174 (the Illinois method, order 1.442).
 * @example bracketedRoot({ evaluate: (x) => x * x - 2, inside: { x: 1, value: -1 },
 *   beyond: { x: 2, value: 2 }, xTolerance: 1e-12, valueTolerance: 0, maxEvaluations: 100 })
 *   .inside.x // 1.41421356237... (checked in test/study/bracketed-root.test.ts)
 */
export function bracketedRoot(problem: RootProblem): RootOutcome {
  let inside = { ...problem.inside };
  let beyond: RootPoint = { ...problem.beyond };
  // Working values for the Illinois step (halved at a retained end); true values are kept above.
  let insideWork = inside.value;
  let beyondWork = beyond.value;
  let retained: "inside" | "beyond" | undefined;
  let previousInside: { x: number; value: number } | undefined;
  let evaluations = 0;
  let slowSteps = 0;
  const insideSign = Math.sign(inside.value);
  for (;;) {
    const width = Math.abs(beyond.x - inside.x);
    if (Math.abs(inside.value) <= problem.valueTolerance || width <= problem.xTolerance) {
      return { inside, beyond, evaluations, converged: true };
    }
    if (evaluations >= problem.maxEvaluations) {
      return { inside, beyond, evaluations, converged: false };
    }
    let x = 0.5 * (inside.x + beyond.x);
    let estimate = Number.NaN;
    if (slowSteps < 2) {
      if (beyond.value !== undefined && beyondWork !== undefined) {
        estimate = (inside.x * beyondWork - beyond.x * insideWork) / (beyondWork - insideWork);
      } else if (previousInside !== undefined && previousInside.value !== inside.value) {
        // No value beyond: extrapolate the secant through the last two inside points.
        estimate =
          inside.x -
          (inside.value * (inside.x - previousInside.x)) / (inside.value - previousInside.value);
      }
    }
    if (Number.isFinite(estimate)) {
      // Keep the trial strictly inside, away from the ends by a small part of the width.
      const low = Math.min(inside.x, beyond.x) + 1e-3 * width;
      const high = Math.max(inside.x, beyond.x) - 1e-3 * width;
      x = Math.min(high, Math.max(low, estimate));
    }
    const value = problem.evaluate(x);
    evaluations++;
    if (value !== undefined && (value === 0 || Math.sign(value) === insideSign)) {
      previousInside = inside;
      inside = { x, value };
      insideWork = value;
      if (retained === "beyond" && beyondWork !== undefined) beyondWork /= 2;
      retained = "beyond";
    } else {
      beyond = { x, value };
      beyondWork = value;
      if (retained === "inside") insideWork /= 2;
      retained = "inside";
    }
    slowSteps = Math.abs(beyond.x - inside.x) > 0.5 * width ? slowSteps + 1 : 0;
  }
}
