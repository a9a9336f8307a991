/**
 * Fanno flow: steady adiabatic flow of a calorically perfect gas in a duct of constant area with
 * wall friction. Ratios are to the sonic (starred) state that the same flow reaches after the
 * length L*. The friction factor is always the Darcy factor fD (= 4 x Fanning factor).
 * @module
 */

import type { FlowBranch } from "./isentropic.js";
import { isentropicAreaRatio } from "./isentropic.js";
import { safeguardedNewton } from "./scalar-root.js";

/** Below this |z| the kernel is summed as a series (the closed form cancels there). */
const SERIES_LIMIT = 0.05;

/**
 * The kernel shared by the Fanno and isothermal friction parameters, atanh(z) - z / (1 + z),
 * summed as its Taylor series z^2 (1 - 2z/3 + z^2 - 4z^3/5 + ...) for |z| < 0.05, where the
 * closed form loses digits to cancellation (the result is of order z^2, its terms of order z).
 * Truncation error below 1e-20 relative. Internal helper, not part of the public entry.
 */
export function frictionKernelSeries(z: number): number {
  // Coefficient of z^(k+2): 1 for even k, -(k + 1)/(k + 2) for odd k.
  let sum = -16 / 17;
  sum = 1 + z * sum;
  sum = -14 / 15 + z * sum;
  sum = 1 + z * sum;
  sum = -12 / 13 + z * sum;
  sum = 1 + z * sum;
  sum = -10 / 11 + z * sum;
  sum = 1 + z * sum;
  sum = -8 / 9 + z * sum;
  sum = 1 + z * sum;
  sum = -6 / 7 + z * sum;
  sum = 1 + z * sum;
  sum = -4 / 5 + z * sum;
  sum = 1 + z * sum;
  sum = -2 / 3 + z * sum;
  sum = 1 + z * sum;
  return z * z * sum;
}

// fD L* / D written with s = 1 / M^2 (so that M -> infinity is s = 0):
// h(s) = (s - 1)/gamma - (gamma + 1)/(2 gamma) ln((2 s + gamma - 1)/(gamma + 1)),
// convex in s (h'' = 2 (gamma + 1) / (gamma (2 s + gamma - 1)^2) > 0) with h(1) = h'(1) = 0.
// With z = (1 - s)/(s + gamma) = (M^2 - 1)/(1 + gamma M^2) it is
// h = (gamma + 1)/gamma * (atanh(z) - z / (1 + z)).
function fannoParameterOfInverseSquare(inverseMachSquared: number, gamma: number): number {
  const s = inverseMachSquared;
  const z = (1 - s) / (s + gamma);
  if (Math.abs(z) < SERIES_LIMIT) return ((gamma + 1) / gamma) * frictionKernelSeries(z);
  const logTerm =
    s < 1e300
      ? Math.log((2 * s + gamma - 1) / (gamma + 1))
      : Math.log(s) + Math.log(2 / (gamma + 1));
  return (s - 1) / gamma - ((gamma + 1) / (2 * gamma)) * logTerm;
}

function fannoResidual(inverseMachSquared: number, gamma: number, target: number): number {
  return fannoParameterOfInverseSquare(inverseMachSquared, gamma) - target;
}

// Supersonic residual h(s) - P written as [h(s) - h(0)] + [h(0) - P] away from M = 1, with
// h(s) - h(0) = s/gamma - (gamma + 1)/(2 gamma) ln(1 + 2 s/(gamma - 1)) and h(0) - P passed in
// (exact by Sterbenz's lemma when P is near the limit h(0)): this keeps relative precision in s
// as M -> infinity, where s is small.
function fannoSupersonicResidual(
  inverseMachSquared: number,
  gamma: number,
  target: number,
  limitMinusTarget: number,
): number {
  const s = inverseMachSquared;
  const z = (1 - s) / (s + gamma);
  if (Math.abs(z) < SERIES_LIMIT) return ((gamma + 1) / gamma) * frictionKernelSeries(z) - target;
  return (
    s / gamma - ((gamma + 1) / (2 * gamma)) * Math.log1p((2 * s) / (gamma - 1)) + limitMinusTarget
  );
}

function fannoSlope(inverseMachSquared: number, gamma: number): number {
  const s = inverseMachSquared;
  return (2 * (s - 1)) / (gamma * (2 * s + gamma - 1));
}

/**
 * Fanno friction parameter: Darcy friction factor times the duct length L* (in diameters) that
 * brings adiabatic flow at Mach M to Mach 1.
 *
 * fD L* / D = (1 - M^2) / (gamma M^2) + (gamma + 1) / (2 gamma) ln[(gamma + 1) M^2 / (2 + (gamma - 1) M^2)]
 *
 * fD is the Darcy friction factor (= 4 x Fanning factor); tables that print 4 f L* / D with the
 * Fanning f give the same number.
 *
 * @param mach - M >= 0 [-] (M = 0 gives Infinity)
 * @param gamma - heat capacity ratio cp / cv [-], > 1
 * @returns fD L* / D [-], >= 0, zero at M = 1; tends to {@link maxSupersonicFannoParameter} as
 *   M -> infinity
 * @remarks Adiabatic, constant area, calorically perfect gas, friction factor constant along the
 *   duct (or its mean). Near M = 1 it is summed in the form
 *   (gamma + 1)/gamma [atanh(z) - z/(1 + z)], z = (M^2 - 1)/(1 + gamma M^2), by series, so it keeps
 *   full relative precision there. Source: A. H. Shapiro, The Dynamics and Thermodynamics of
 *   Compressible Fluid Flow, Vol. I, Ronald Press, 1953, ch. 6; J. D. Anderson, Modern Compressible
 *   Flow, 3rd ed., McGraw-Hill, 2003, ch. 3 (flow with friction; Fanning form 4 f L* / D).
 * @example fannoParameter(0.5, 1.4) // 1.06906031 (PRACTICE.md 7.1: 1.0691; checked in
 *   test/physics/fanno.test.ts)
 */
export function fannoParameter(mach: number, gamma: number): number {
  if (mach === 0) return Number.POSITIVE_INFINITY;
  const machSquared = mach * mach;
  const z = ((mach - 1) * (mach + 1)) / (1 + gamma * machSquared);
  if (Math.abs(z) < SERIES_LIMIT) return ((gamma + 1) / gamma) * frictionKernelSeries(z);
  if (mach < 1) {
    // 2 ln M rather than ln M^2, so that a tiny M (M^2 underflowing) still gives Infinity.
    const logTerm = Math.log((gamma + 1) / (2 + (gamma - 1) * machSquared)) + 2 * Math.log(mach);
    return (1 - machSquared) / (gamma * machSquared) + ((gamma + 1) / (2 * gamma)) * logTerm;
  }
  return fannoParameterOfInverseSquare(1 / machSquared, gamma);
}

/**
 * Largest Fanno friction parameter on the supersonic branch: fD L* / D in the limit M -> infinity
 * (fD the Darcy factor, = 4 x Fanning). No supersonic Fanno flow fills a longer duct.
 *
 * lim fD L* / D = (gamma + 1) / (2 gamma) ln((gamma + 1) / (gamma - 1)) - 1 / gamma
 *
 * @param gamma - heat capacity ratio cp / cv [-], > 1
 * @returns the limit of fD L* / D as M -> infinity [-]
 * @remarks Source: Shapiro, The Dynamics and Thermodynamics of Compressible Fluid Flow, Vol. I,
 *   1953, ch. 6; Anderson, Modern Compressible Flow, 3rd ed., 2003, ch. 3.
 * @example maxSupersonicFannoParameter(1.4) // 0.82150812 (checked in test/physics/fanno.test.ts)
 */
export function maxSupersonicFannoParameter(gamma: number): number {
  return fannoParameterOfInverseSquare(0, gamma);
}

/**
 * Fanno static temperature ratio T / T* (T* the static temperature at Mach 1 of the same flow).
 *
 * T / T* = (gamma + 1) / (2 + (gamma - 1) M^2)
 *
 * Friction enters through fD L* / D with the Darcy factor fD (= 4 x Fanning); this ratio follows
 * from constant stagnation temperature alone.
 *
 * @param mach - M >= 0 [-]
 * @param gamma - heat capacity ratio cp / cv [-], > 1
 * @returns T / T* [-]
 * @remarks Adiabatic, constant area, calorically perfect gas. Source: Shapiro, Vol. I, 1953,
 *   ch. 6; Anderson, Modern Compressible Flow, 3rd ed., 2003, ch. 3.
 * @example fannoTemperatureRatio(0.5, 1.4) // 1.1428571428571428 (= 8/7; PRACTICE.md 7.1: 1.1429;
 *   checked in test/physics/fanno.test.ts)
 */
export function fannoTemperatureRatio(mach: number, gamma: number): number {
  return (gamma + 1) / (2 + (gamma - 1) * mach * mach);
}

/**
 * Fanno static pressure ratio p / p*.
 *
 * p / p* = (1 / M) sqrt((gamma + 1) / (2 + (gamma - 1) M^2))
 *
 * Friction enters through fD L* / D with the Darcy factor fD (= 4 x Fanning).
 *
 * @param mach - M > 0 [-]
 * @param gamma - heat capacity ratio cp / cv [-], > 1
 * @returns p / p* [-]
 * @remarks Adiabatic, constant area, calorically perfect gas. Source: Shapiro, Vol. I, 1953,
 *   ch. 6; Anderson, Modern Compressible Flow, 3rd ed., 2003, ch. 3.
 * @example fannoPressureRatio(0.5, 1.4) // 2.13808994 (PRACTICE.md 7.1: 2.1381; checked in
 *   test/physics/fanno.test.ts)
 */
export function fannoPressureRatio(mach: number, gamma: number): number {
  return Math.sqrt((gamma + 1) / (2 + (gamma - 1) * mach * mach)) / mach;
}

/**
 * Fanno density ratio rho / rho*, equal to the velocity ratio V* / V (constant mass flux).
 *
 * rho / rho* = (1 / M) sqrt((2 + (gamma - 1) M^2) / (gamma + 1))
 *
 * Friction enters through fD L* / D with the Darcy factor fD (= 4 x Fanning).
 *
 * @param mach - M > 0 [-]
 * @param gamma - heat capacity ratio cp / cv [-], > 1
 * @returns rho / rho* = V* / V [-]
 * @remarks Adiabatic, constant area, calorically perfect gas. Source: Shapiro, Vol. I, 1953,
 *   ch. 6; Anderson, Modern Compressible Flow, 3rd ed., 2003, ch. 3.
 * @example fannoDensityRatio(2, 1.4) // 0.6123724356957946 (= sqrt(3/8); checked in
 *   test/physics/fanno.test.ts)
 */
export function fannoDensityRatio(mach: number, gamma: number): number {
  return Math.sqrt((2 + (gamma - 1) * mach * mach) / (gamma + 1)) / mach;
}

/**
 * Fanno stagnation pressure ratio p0 / p0*: the stagnation pressure lost to friction between
 * Mach M and Mach 1.
 *
 * p0 / p0* = (1 / M) [(2 + (gamma - 1) M^2) / (gamma + 1)] ^ ((gamma + 1) / (2 (gamma - 1)))
 *
 * Friction enters through fD L* / D with the Darcy factor fD (= 4 x Fanning). The expression is the
 * same as the isentropic area ratio A / A*.
 *
 * @param mach - M > 0 [-]
 * @param gamma - heat capacity ratio cp / cv [-], > 1
 * @returns p0 / p0* [-], >= 1
 * @remarks Adiabatic, constant area, calorically perfect gas. Source: Shapiro, Vol. I, 1953,
 *   ch. 6; Anderson, Modern Compressible Flow, 3rd ed., 2003, ch. 3.
 * @example fannoStagnationPressureRatio(0.5, 1.4) // 1.33984375 (= 2 x 0.875^3; PRACTICE.md 7.1: 1.3398;
 *   checked in test/physics/fanno.test.ts)
 */
export function fannoStagnationPressureRatio(mach: number, gamma: number): number {
  return isentropicAreaRatio(mach, gamma);
}

/**
 * Mach number at the entry of a Fanno duct from its friction parameter fD L* / D (fD the Darcy
 * factor, = 4 x Fanning), on the chosen branch.
 *
 * Solves fannoParameter(M) = parameter for M (see {@link fannoParameter}).
 *
 * @param parameter - fD L* / D >= 0 [-]; Infinity gives M = 0 on the subsonic branch
 * @param gamma - heat capacity ratio cp / cv [-], > 1
 * @param branch - "subsonic" (M <= 1) or "supersonic" (M >= 1)
 * @returns M [-]; 1 for parameter 0
 * @throws RangeError if the parameter is negative or NaN, or, on the supersonic branch, not
 *   below {@link maxSupersonicFannoParameter}(gamma)
 * @remarks Safeguarded Newton iteration in s = 1/M^2, where fD L* / D is convex. Subsonic: start
 *   from the lower bound s >= 1 + max(gamma P, sqrt(gamma (gamma + 1) P)) (P the parameter; the
 *   log term is negative and the curvature is at most 2/(gamma (gamma + 1))); by convexity one
 *   Newton step from there lands above the root, which closes the bracket. Supersonic: the bracket
 *   is max(1 - sqrt(gamma (gamma + 1) P), (Pmax - P) gamma (gamma - 1)/2) <= s <= 1 - P/Pmax from
 *   the curvature, the tangent at s = 0 and the chord. Converged to about 1e-15 relative in s;
 *   near M = 1 the problem is ill-conditioned (P ~ (M - 1)^2). Source of the relation: Shapiro,
 *   Vol. I, 1953, ch. 6; Anderson, Modern Compressible Flow, 3rd ed., 2003, ch. 3.
 * @example machFromFannoParameter(1.06906031, 1.4, "subsonic") // 0.50000000 (checked in
 *   test/physics/fanno.test.ts)
 */
export function machFromFannoParameter(
  parameter: number,
  gamma: number,
  branch: FlowBranch,
): number {
  if (!(parameter >= 0)) {
    throw new RangeError(`Fanno parameter fD L* / D must be >= 0 (got ${parameter})`);
  }
  if (parameter === 0) return 1;
  if (branch === "subsonic") {
    if (parameter === Number.POSITIVE_INFINITY) return 0;
    const lower = 1 + Math.max(gamma * parameter, Math.sqrt(gamma * (gamma + 1) * parameter));
    const residualAtLower = fannoResidual(lower, gamma, parameter);
    if (residualAtLower >= 0) return 1 / Math.sqrt(lower);
    const upper = lower - residualAtLower / fannoSlope(lower, gamma);
    const s = safeguardedNewton(
      fannoResidual,
      fannoSlope,
      gamma,
      parameter,
      0,
      lower,
      upper,
      upper,
      true,
      1e-15,
      0,
    );
    return 1 / Math.sqrt(s);
  }
  const limit = maxSupersonicFannoParameter(gamma);
  if (!(parameter < limit)) {
    throw new RangeError(
      `supersonic Fanno parameter fD L* / D must be below ${limit} (its limit as M -> infinity for gamma ${gamma}; got ${parameter})`,
    );
  }
  const lower = Math.max(
    0,
    1 - Math.sqrt(gamma * (gamma + 1) * parameter),
    0.5 * (limit - parameter) * gamma * (gamma - 1),
  );
  const upper = Math.min(1, 1 - parameter / limit);
  const s = safeguardedNewton(
    fannoSupersonicResidual,
    fannoSlope,
    gamma,
    parameter,
    limit - parameter,
    lower,
    upper,
    lower,
    false,
    1e-15,
    0,
  );
  return 1 / Math.sqrt(s);
}
