/**
 * A safeguarded Newton iteration for the scalar inversions of src/physics (Mach number from a
 * friction parameter, an area ratio or a mass-flux parameter; Colebrook-White).
 *
 * Why not the `newton-raphson-method` package: these inversions run hundreds of thousands of times
 * per network solve. That package takes closures and an options object (allocations on every
 * call), keeps no bracket, and returns `false` when a step leaves the domain (a logarithm of a
 * negative number gives NaN and it iterates on NaN until its iteration cap). Every caller here
 * knows a bracket from a bound of the relation, so a Newton step that leaves the bracket, or does
 * not shrink fast enough, is replaced by a bisection step, and the iteration cannot fail.
 *
 * The algorithm is the "rtsafe" scheme: W. H. Press, S. A. Teukolsky, W. T. Vetterling,
 * B. P. Flannery, Numerical Recipes, 3rd ed., Cambridge University Press, 2007, section 9.4.
 * @module
 */

/** A function of the unknown `x` and three fixed parameters; module-level, so no closure is made. */
export type ScalarFunction = (x: number, first: number, second: number, third: number) => number;

/** Iteration cap: bisection alone halves the bracket each step, so 200 steps are never reached. */
const MAXIMUM_ITERATIONS = 200;

/**
 * Root of `value(x, first, second, third) = 0` in `[lower, upper]` by Newton steps, with a bisection step
 * whenever the Newton step leaves the bracket or does not shrink quickly enough.
 *
 * The bracket must hold the root; its end values are never evaluated, so the caller states the
 * orientation: `increasing` is true when the function is negative at `lower` and positive at
 * `upper`. Iteration stops when a step is at most `relativeTolerance * |x| + absoluteTolerance`.
 *
 * @param value - f(x, first, second, third)
 * @param slope - df/dx at (x, first, second, third)
 * @param first - first fixed parameter, passed through to `value` and `slope`
 * @param second - second fixed parameter, passed through
 * @param third - third fixed parameter, passed through
 * @param lower - lower end of a bracket of the root
 * @param upper - upper end of a bracket of the root (>= lower)
 * @param guess - starting point (clamped into the bracket)
 * @param increasing - true if f < 0 at `lower` and f > 0 at `upper`
 * @param relativeTolerance - stop when the step is at most this times |x| ...
 * @param absoluteTolerance - ... plus this
 * @returns the root, to the tolerance
 * @remarks Press et al., Numerical Recipes, 3rd ed., 2007, section 9.4 ("rtsafe").
 * @example safeguardedNewton((x, a) => x * x - a, (x) => 2 * x, 2, 0, 0, 0, 2, 1, true, 1e-15, 0)
 *   // 1.4142135623730951 (checked in test/physics/scalar-root.test.ts)
 */
export function safeguardedNewton(
  value: ScalarFunction,
  slope: ScalarFunction,
  first: number,
  second: number,
  third: number,
  lower: number,
  upper: number,
  guess: number,
  increasing: boolean,
  relativeTolerance: number,
  absoluteTolerance: number,
): number {
  let low = lower;
  let high = upper;
  let x = guess > low ? Math.min(guess, high) : low; // a NaN guess starts at `lower`
  let stepBeforeLast = high - low;
  let lastStep = stepBeforeLast;
  for (let iteration = 0; iteration < MAXIMUM_ITERATIONS; iteration++) {
    const fx = value(x, first, second, third);
    if (fx === 0) return x;
    if (fx < 0 === increasing) low = x;
    else high = x;
    const dfx = slope(x, first, second, third);
    const newtonStep = fx / dfx;
    let next = x - newtonStep;
    // A step at rounding level may land on the bracket end just set to x: accept it first.
    if (Math.abs(newtonStep) <= relativeTolerance * Math.abs(next) + absoluteTolerance) return next;
    if (
      !(next > low && next < high) ||
      Math.abs(2 * fx) > Math.abs(stepBeforeLast * dfx) // Newton is not halving the step
    ) {
      stepBeforeLast = lastStep;
      lastStep = 0.5 * (high - low);
      next = low + lastStep;
    } else {
      stepBeforeLast = lastStep;
      lastStep = newtonStep;
    }
    if (Math.abs(next - x) <= relativeTolerance * Math.abs(next) + absoluteTolerance) return next;
    if (high - low <= relativeTolerance * Math.abs(next) + absoluteTolerance) return next;
    x = next;
  }
  return x;
}
