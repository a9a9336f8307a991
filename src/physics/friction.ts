/**
 * Darcy friction factor of fully developed pipe flow: laminar law, Colebrook-White, and a smooth
 * blend over the transition band. The Darcy factor fD is 4 times the Fanning factor; every
 * friction factor in machnet is a Darcy factor.
 * @module
 */

import { safeguardedNewton } from "./scalar-root.js";

/**
 * Reynolds number up to which the laminar law 64/Re is used.
 *
 * Common practice, no single source: 2300 is the critical Reynolds number of pipe flow quoted in
 * most fluid-mechanics texts and handbooks; below it machnet treats flow as laminar. (fluids 1.0.22
 * uses 2040 +- 10 for the onset of sustained turbulence, citing K. Avila et al., "The onset of
 * turbulence in pipe flow", Science 333, 2011, pp. 192-196.)
 */
export const LAMINAR_LIMIT_REYNOLDS = 2300;

/**
 * Reynolds number from which Colebrook-White is used.
 *
 * Common practice, no single source: Moody-type charts in handbooks draw the transition band up to
 * about 4000 and start the turbulent curves there; of the explicit friction correlations whose
 * range fluids 1.0.22 records (friction.py, `fmethods`), most give Re = 4000 as the lower limit.
 */
export const TURBULENT_LIMIT_REYNOLDS = 4000;

const TWO_OVER_LN10 = 2 / Math.LN10;
const LOG_LAMINAR_LIMIT = Math.log(LAMINAR_LIMIT_REYNOLDS);
const LOG_TURBULENT_LIMIT = Math.log(TURBULENT_LIMIT_REYNOLDS);

function checkRoughness(relativeRoughness: number): void {
  if (!(relativeRoughness >= 0 && relativeRoughness < 1)) {
    throw new RangeError(`relative roughness must be in [0, 1) (got ${relativeRoughness})`);
  }
}

/**
 * Laminar (Hagen-Poiseuille) Darcy friction factor of fully developed flow in a round pipe.
 *
 * fD = 64 / Re
 *
 * @param reynolds - Re = rho V D / mu > 0 [-]
 * @returns fD [-] (Darcy; the Fanning factor is 16 / Re)
 * @remarks Fully developed laminar flow in a circular pipe; roughness has no effect. Source:
 *   F. M. White, Fluid Mechanics, 7th ed., McGraw-Hill, 2011, ch. 6 (Hagen-Poiseuille flow).
 * @example laminarFrictionFactor(1000) // 0.064 (checked in test/physics/friction.test.ts)
 */
export function laminarFrictionFactor(reynolds: number): number {
  return 64 / reynolds;
}

// Colebrook-White in x = 1/sqrt(fD): g(x) = x + 2 log10(a + b x), a = (eps/D)/3.7, b = 2.51/Re.
// g is increasing and concave in x.
function colebrookResidual(x: number, roughnessTerm: number, reynoldsTerm: number): number {
  return x + TWO_OVER_LN10 * Math.log(roughnessTerm + reynoldsTerm * x);
}

function colebrookSlope(x: number, roughnessTerm: number, reynoldsTerm: number): number {
  return 1 + (TWO_OVER_LN10 * reynoldsTerm) / (roughnessTerm + reynoldsTerm * x);
}

/**
 * Serghides' explicit estimate of x = 1/sqrt(fD): three fixed-point steps of Colebrook-White from
 * x = 1/sqrt(fD) at 2.51/(Re sqrt(fD)) = 12/Re, accelerated by Steffensen's (Aitken's) formula:
 *   A = -2 log10(a + 12/Re), B = -2 log10(a + b A), C = -2 log10(a + b B),
 *   x = A - (B - A)^2 / (C - 2B + A),  a = (eps/D)/3.7, b = 2.51/Re.
 * About 1e-5 relative from the root for Re >= 4000: fD within 3.1e-5 of itself from Re = 4000 to
 * 3e10 and eps/D = 0 to 0.05 (measured against python3-fluids 1.0.22 Colebrook). Source: T. K. Serghides, "Estimate friction factor accurately",
 * Chemical Engineering 91(5), 1984, pp. 63-64.
 */
function serghidesInverseRoot(
  roughnessTerm: number,
  reynoldsTerm: number,
  reynolds: number,
): number {
  const first = -TWO_OVER_LN10 * Math.log(roughnessTerm + 12 / reynolds);
  const second = -TWO_OVER_LN10 * Math.log(roughnessTerm + reynoldsTerm * first);
  const third = -TWO_OVER_LN10 * Math.log(roughnessTerm + reynoldsTerm * second);
  const change = second - first;
  return first - (change * change) / (third - 2 * second + first);
}

/** Newton steps of {@link colebrookInverseRoot} before the bracketed iteration takes over. */
const COLEBROOK_NEWTON_STEPS = 8;

/**
 * Bound on the error left after a Newton step at which the Colebrook-White solve stops, relative
 * to x: below the rounding of the residual itself (a few units of 1e-16).
 */
const COLEBROOK_TOLERANCE = 1e-16;

/**
 * 1/sqrt(fD) from Colebrook-White; inputs already checked. `guess` starts the iteration (the
 * root of a nearby Reynolds number, for a warm start); NaN or <= 0 starts from Serghides'
 * estimate.
 *
 * Newton's method on g(x) = x + (2/ln 10) ln(a + b x), a = (eps/D)/3.7, b = 2.51/Re, with a
 * proven stopping rule. g is increasing and concave, g' = 1 + c b/(a + b x) >= 1 and
 * |g''| = c b^2/(a + b x)^2 <= c/x^2 (c = 2/ln 10), so a step s from x_k to x_{k+1} leaves
 *   |g(x_{k+1})| = |g''(xi)| s^2 / 2 <= c s^2 / (2 min(x_k, x_{k+1})^2)
 * and, as g' >= 1, an error in x no larger than that: once it is below 1e-16 x_{k+1} the root is
 * found to rounding level, without one more residual to confirm it. By concavity every step
 * after the first approaches the root from below, so the iteration cannot leave x > 0 after it.
 * From Serghides' estimate (1e-5) this takes two residuals, from a warm start one or two. If a
 * step would leave x > 0, or eight steps do not converge, the bracketed safeguarded Newton
 * iteration of src/physics/scalar-root.ts takes over on 0 < x <= max(1, -2 log10 b) (and
 * <= -2 log10 a when a > 0), where g changes sign.
 */
function colebrookInverseRoot(
  reynolds: number,
  relativeRoughness: number,
  guess = Number.NaN,
): number {
  const roughnessTerm = relativeRoughness / 3.7;
  const reynoldsTerm = 2.51 / reynolds;
  let x = guess > 0 ? guess : serghidesInverseRoot(roughnessTerm, reynoldsTerm, reynolds);
  for (let step = 0; step < COLEBROOK_NEWTON_STEPS && x > 0; step++) {
    const argument = roughnessTerm + reynoldsTerm * x;
    const residual = x + TWO_OVER_LN10 * Math.log(argument);
    const change = -residual / (1 + (TWO_OVER_LN10 * reynoldsTerm) / argument);
    const next = x + change;
    if (!(next > 0)) break;
    const relativeChange = change / Math.min(x, next); // s / min(x_k, x_k+1), never underflows
    x = next;
    if (TWO_OVER_LN10 * relativeChange * relativeChange <= 2 * COLEBROOK_TOLERANCE * next) {
      return next;
    }
  }
  // g(x) >= x + 2 log10(b x) >= 0 for x >= max(1, -2 log10 b); for a > 0 also g(-2 log10 a) >= 0.
  let upper = Math.max(1, -TWO_OVER_LN10 * Math.log(reynoldsTerm));
  if (roughnessTerm > 0) upper = Math.min(upper, -TWO_OVER_LN10 * Math.log(roughnessTerm));
  const serghides = serghidesInverseRoot(roughnessTerm, reynoldsTerm, reynolds);
  return safeguardedNewton(
    colebrookResidual,
    colebrookSlope,
    roughnessTerm,
    reynoldsTerm,
    0,
    0,
    upper,
    serghides > 0 && serghides < upper ? serghides : upper,
    true,
    1e-15,
    0,
  );
}

/**
 * Darcy friction factor of turbulent pipe flow by the Colebrook-White equation, solved to
 * rounding level (about 1e-15 relative).
 *
 * 1 / sqrt(fD) = -2 log10( (eps/D) / 3.7 + 2.51 / (Re sqrt(fD)) )
 *
 * @param reynolds - Re = rho V D / mu > 0 [-]; the equation is meant for turbulent flow,
 *   Re >= 4000, but is solved for any Re > 0
 * @param relativeRoughness - eps/D, absolute roughness over inner diameter, in [0, 1) [-];
 *   published for about 0 to 0.05
 * @returns fD [-] (Darcy = 4 x Fanning)
 * @throws RangeError if Re <= 0 or the roughness is out of range
 * @remarks Solved in x = 1/sqrt(fD), where the equation is concave and increasing, by safeguarded
 *   Newton iteration from Serghides' explicit estimate (T. K. Serghides, "Estimate friction factor
 *   accurately", Chemical Engineering 91(5), 1984, pp. 63-64), bracketed by
 *   0 < x <= max(1, 2 log10(Re/2.51)). Source: C. F. Colebrook, "Turbulent flow in pipes, with
 *   particular reference to the transition region between the smooth and rough pipe laws",
 *   Journal of the Institution of Civil Engineers 11(4), 1939, pp. 133-156.
 * @example colebrookWhite(1e5, 1e-4) // 0.018513866077471... (fluids 1.0.22 Colebrook(1E5, 1E-4):
 *   0.018513866077471; checked in test/physics/friction.test.ts)
 */
export function colebrookWhite(reynolds: number, relativeRoughness: number): number {
  if (!(reynolds > 0 && reynolds < Number.POSITIVE_INFINITY)) {
    throw new RangeError(`Reynolds number must be a finite number > 0 (got ${reynolds})`);
  }
  checkRoughness(relativeRoughness);
  const x = colebrookInverseRoot(reynolds, relativeRoughness);
  return 1 / (x * x);
}

/**
 * d ln fD / d ln Re of Colebrook-White at its solution x = 1/sqrt(fD), by implicit
 * differentiation: -2c / (1 + c), c = (2/ln 10) (2.51/Re) / ((eps/D)/3.7 + 2.51 x/Re).
 */
function colebrookLogSlope(reynolds: number, relativeRoughness: number, x: number): number {
  const reynoldsTerm = 2.51 / reynolds;
  const c = (TWO_OVER_LN10 * reynoldsTerm) / (relativeRoughness / 3.7 + reynoldsTerm * x);
  return (-2 * c) / (1 + c);
}

/**
 * ln fD in the transition band as a cubic Hermite polynomial in ln Re, matching value and slope of
 * the laminar law at 2300 and of Colebrook-White at 4000. Returns ln fD, or with `slope` true
 * d ln fD / d ln Re. `x` is 1/sqrt(fD) of Colebrook-White at Re = 4000 (solved when not given).
 */
function transitionLogFriction(
  reynolds: number,
  relativeRoughness: number,
  slope: boolean,
  x = colebrookInverseRoot(TURBULENT_LIMIT_REYNOLDS, relativeRoughness),
): number {
  const width = LOG_TURBULENT_LIMIT - LOG_LAMINAR_LIMIT;
  const t = (Math.log(reynolds) - LOG_LAMINAR_LIMIT) / width;
  const startValue = Math.log(64) - LOG_LAMINAR_LIMIT;
  const startSlope = -1;
  const endValue = -2 * Math.log(x);
  const endSlope = colebrookLogSlope(TURBULENT_LIMIT_REYNOLDS, relativeRoughness, x);
  const t2 = t * t;
  const t3 = t2 * t;
  if (!slope) {
    return (
      (2 * t3 - 3 * t2 + 1) * startValue +
      (t3 - 2 * t2 + t) * width * startSlope +
      (-2 * t3 + 3 * t2) * endValue +
      (t3 - t2) * width * endSlope
    );
  }
  return (
    ((6 * t2 - 6 * t) * startValue +
      (3 * t2 - 4 * t + 1) * width * startSlope +
      (-6 * t2 + 6 * t) * endValue +
      (3 * t2 - 2 * t) * width * endSlope) /
    width
  );
}

/**
 * Darcy friction factor of pipe flow at any Reynolds number > 0: laminar law 64/Re up to
 * Re = 2300, Colebrook-White from Re = 4000, and in between a blend that is continuous with a
 * continuous first derivative (C1) at both ends.
 *
 * Re <= 2300:        fD = 64 / Re
 * 2300 < Re < 4000:  ln fD = cubic Hermite polynomial in ln Re through (ln 2300, ln(64/2300),
 *                    slope -1) and (ln 4000, ln fCW(4000), slope d ln fCW / d ln Re at 4000)
 * Re >= 4000:        fD = fCW(Re) (Colebrook-White)
 *
 * @param reynolds - Re = rho V D / mu > 0 [-]
 * @param relativeRoughness - eps/D in [0, 1) [-]
 * @returns fD [-] (Darcy = 4 x Fanning), finite and positive
 * @throws RangeError if Re <= 0 (use {@link darcyFrictionProduct} at zero flow) or the roughness
 *   is out of range
 * @remarks Flow in the transition band is intermittent and no correlation predicts it; the blend
 *   is machnet's modelling choice (documented in docs/model.md), made so that a Newton solver sees
 *   a smooth friction law. Interpolating ln fD against ln Re keeps fD positive; the cubic dips up
 *   to about 4 % below 64/2300 just above Re = 2300 and overshoots fCW by about 0.1 % just below
 *   4000, since both end curves fall with Re while the blend rises from 0.0278 to fCW(4000).
 *   The limits 2300 and 4000 are common practice (see {@link LAMINAR_LIMIT_REYNOLDS},
 *   {@link TURBULENT_LIMIT_REYNOLDS}). Below Re of about 3.6e-307, where 64/Re overflows, the
 *   largest double is returned.
 *   Sources: laminar, White, Fluid Mechanics, 7th ed., 2011, ch. 6; turbulent, Colebrook, J. ICE
 *   11(4), 1939 (see {@link colebrookWhite}).
 * @example darcyFrictionFactor(3000, 0) // 0.03129108 (between 64/2300 = 0.0278 and
 *   fCW(4000) = 0.0399; checked in test/physics/friction.test.ts)
 */
export function darcyFrictionFactor(reynolds: number, relativeRoughness: number): number {
  if (!(reynolds > 0 && reynolds < Number.POSITIVE_INFINITY)) {
    throw new RangeError(
      `Reynolds number must be a finite number > 0 (got ${reynolds}); at zero flow use darcyFrictionProduct`,
    );
  }
  checkRoughness(relativeRoughness);
  // min: 64/Re overflows for Re below about 3.6e-307; the largest double stands in for it.
  if (reynolds <= LAMINAR_LIMIT_REYNOLDS) return Math.min(64 / reynolds, Number.MAX_VALUE);
  if (reynolds >= TURBULENT_LIMIT_REYNOLDS) {
    const x = colebrookInverseRoot(reynolds, relativeRoughness);
    return 1 / (x * x);
  }
  return Math.exp(transitionLogFriction(reynolds, relativeRoughness, false));
}

/**
 * Darcy friction factor times Reynolds number, fD Re, which stays finite as the flow goes to zero
 * (fD itself grows as 64/Re). For callers that form the pressure gradient from fD Re mu V, and for
 * zero flow.
 *
 * fD Re = 64 for Re <= 2300; darcyFrictionFactor(Re, eps/D) * Re above
 *
 * @param reynolds - Re >= 0 [-]
 * @param relativeRoughness - eps/D in [0, 1) [-]
 * @returns fD Re [-]; 64 at Re = 0
 * @throws RangeError if Re < 0 or not finite, or the roughness is out of range
 * @remarks Same laws and blend as {@link darcyFrictionFactor}.
 * @example darcyFrictionProduct(0, 1e-3) // 64 (checked in test/physics/friction.test.ts)
 */
export function darcyFrictionProduct(reynolds: number, relativeRoughness: number): number {
  if (!(reynolds >= 0 && reynolds < Number.POSITIVE_INFINITY)) {
    throw new RangeError(`Reynolds number must be a finite number >= 0 (got ${reynolds})`);
  }
  checkRoughness(relativeRoughness);
  if (reynolds <= LAMINAR_LIMIT_REYNOLDS) return 64;
  return darcyFrictionFactor(reynolds, relativeRoughness) * reynolds;
}

/**
 * Logarithmic slope d ln fD / d ln Re of {@link darcyFrictionFactor}, for analytic Jacobians:
 * -1 in the laminar range, the derivative of the Hermite blend in the transition band, and
 * -2c/(1 + c), c = (2/ln 10)(2.51/Re)/((eps/D)/3.7 + 2.51/(Re sqrt(fD))), for Colebrook-White
 * (implicit differentiation). Continuous at 2300 and 4000 by construction.
 *
 * @param reynolds - Re > 0 [-]
 * @param relativeRoughness - eps/D in [0, 1) [-]
 * @returns d ln fD / d ln Re [-]
 * @throws RangeError if Re <= 0 or the roughness is out of range
 * @remarks Source: derivative of the laws in {@link darcyFrictionFactor}.
 * @example darcyFrictionFactorLogSlope(1000, 0) // -1 (checked in test/physics/friction.test.ts)
 */
export function darcyFrictionFactorLogSlope(reynolds: number, relativeRoughness: number): number {
  if (!(reynolds > 0 && reynolds < Number.POSITIVE_INFINITY)) {
    throw new RangeError(`Reynolds number must be a finite number > 0 (got ${reynolds})`);
  }
  checkRoughness(relativeRoughness);
  if (reynolds <= LAMINAR_LIMIT_REYNOLDS) return -1;
  if (reynolds >= TURBULENT_LIMIT_REYNOLDS) {
    const x = colebrookInverseRoot(reynolds, relativeRoughness);
    return colebrookLogSlope(reynolds, relativeRoughness, x);
  }
  return transitionLogFriction(reynolds, relativeRoughness, true);
}

/** Output of {@link darcyFrictionWithSlope}: reused by the caller, so no allocation per call. */
export interface FrictionWithSlope {
  /** Darcy friction factor fD [-]. */
  factor: number;
  /** d ln fD / d ln Re [-]. */
  logSlope: number;
  /**
   * Warm start, for a record that has this field: 1/sqrt(fD) of the last Colebrook-White root
   * solved into it, where the next solve starts (NaN: from Serghides' estimate). Any start
   * converges to the same root to rounding level; a near one (the same pipe at a nearby Reynolds
   * number) saves work. A record without the field is never warm-started.
   */
  inverseRoot?: number;
}

/**
 * {@link darcyFrictionFactor} and {@link darcyFrictionFactorLogSlope} from one solve of
 * Colebrook-White, written into `out`: the form the network solver's hot path uses.
 *
 * @param reynolds - Re > 0 [-]
 * @param relativeRoughness - eps/D in [0, 1) [-]
 * @param out - receives fD and d ln fD / d ln Re
 * @returns out
 * @remarks Same laws and blend as {@link darcyFrictionFactor}. Colebrook-White is solved from
 *   `out.inverseRoot` when `out` has that field (see {@link FrictionWithSlope}) and leaves its
 *   root there, so a record reused for one pipe warm-starts each solve from the last; the result
 *   is the same root to rounding level (about 1e-16 relative in 1/sqrt(fD)) whatever the start.
 * @example darcyFrictionWithSlope(1e5, 1e-4, { factor: 0, logSlope: 0 }).factor // = colebrookWhite(1e5, 1e-4)
 */
export function darcyFrictionWithSlope(
  reynolds: number,
  relativeRoughness: number,
  out: FrictionWithSlope,
): FrictionWithSlope {
  if (!(reynolds > 0 && reynolds < Number.POSITIVE_INFINITY)) {
    throw new RangeError(
      `Reynolds number must be a finite number > 0 (got ${reynolds}); at zero flow use darcyFrictionProduct`,
    );
  }
  checkRoughness(relativeRoughness);
  if (reynolds <= LAMINAR_LIMIT_REYNOLDS) {
    out.factor = 64 / reynolds;
    out.logSlope = -1;
  } else if (reynolds >= TURBULENT_LIMIT_REYNOLDS) {
    const x = colebrookInverseRoot(reynolds, relativeRoughness, out.inverseRoot);
    if (out.inverseRoot !== undefined) out.inverseRoot = x;
    out.factor = 1 / (x * x);
    out.logSlope = colebrookLogSlope(reynolds, relativeRoughness, x);
  } else {
    const x = colebrookInverseRoot(TURBULENT_LIMIT_REYNOLDS, relativeRoughness, out.inverseRoot);
    if (out.inverseRoot !== undefined) out.inverseRoot = x;
    out.factor = Math.exp(transitionLogFriction(reynolds, relativeRoughness, false, x));
    out.logSlope = transitionLogFriction(reynolds, relativeRoughness, true, x);
  }
  return out;
}
