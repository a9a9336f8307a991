/**
 * Isothermal pipe flow: steady flow of a perfect gas at constant static temperature through a
 * duct of constant area with wall friction (long uninsulated lines, where the wall holds the gas
 * at the ambient temperature). The friction factor is always the Darcy factor fD
 * (= 4 x Fanning factor).
 *
 * Along such a line p M is constant (continuity at constant temperature), and the flow is choked
 * when the exit reaches the limiting Mach number 1 / sqrt(gamma), where V = sqrt(R T). Starred
 * quantities with a "t" (p*t) refer to that limiting state.
 * @module
 */

import { frictionKernelSeries } from "./fanno.js";
import { safeguardedNewton } from "./scalar-root.js";

/** Below this |z| the friction parameter is summed as a series (see fanno.ts). */
const SERIES_LIMIT = 0.05;

// fD L* / D written with q = 1 / (gamma M^2) = (p1 / p*t)^2:
// F(q) = q - 1 - ln q, convex (F'' = 1/q^2), F(1) = F'(1) = 0; with z = (1 - q)/(1 + q) it is
// F = 2 (atanh(z) - z / (1 + z)), summed by series for small |z|.
function isothermalParameterOfSquaredPressureRatio(q: number): number {
  const z = (1 - q) / (1 + q);
  if (Math.abs(z) < SERIES_LIMIT) return 2 * frictionKernelSeries(z);
  return q - 1 - Math.log(q);
}

function isothermalResidual(q: number, target: number): number {
  return isothermalParameterOfSquaredPressureRatio(q) - target;
}

function isothermalSlope(q: number): number {
  return (q - 1) / q;
}

/**
 * Solve q - 1 - ln q = P for q >= 1 (the subsonic root). Bracket: q >= 1 + max(P, sqrt(2 P))
 * since ln q >= 0 and F'' <= 1 for q >= 1; by convexity one Newton step from that bound lands
 * above the root.
 */
function squaredPressureRatioFromParameter(parameter: number): number {
  if (parameter === 0) return 1;
  const lower = 1 + Math.max(parameter, Math.sqrt(2 * parameter));
  const residualAtLower = isothermalResidual(lower, parameter);
  if (residualAtLower >= 0) return lower;
  const upper = lower - residualAtLower / isothermalSlope(lower);
  return safeguardedNewton(
    isothermalResidual,
    isothermalSlope,
    parameter,
    0,
    0,
    lower,
    upper,
    upper,
    true,
    1e-15,
    0,
  );
}

/** Veltkamp's splitting constant 2^27 + 1 for error-free products in double precision. */
const SPLITTER = 134217729;

/**
 * gamma M^2 - 1 without the rounding of gamma M^2 (error-free products after Dekker and
 * Veltkamp), so that the friction parameter near the limiting Mach number, which is of order
 * (gamma M^2 - 1)^2, keeps full relative precision.
 */
function gammaMachSquaredMinusOne(mach: number, gamma: number): number {
  // mach^2 = square + squareError exactly
  const square = mach * mach;
  const machSplit = SPLITTER * mach;
  const machHigh = machSplit - (machSplit - mach);
  const machLow = mach - machHigh;
  const squareError = machHigh * machHigh - square + 2 * machHigh * machLow + machLow * machLow;
  // gamma * square = product + productError exactly
  const product = gamma * square;
  const gammaSplit = SPLITTER * gamma;
  const gammaHigh = gammaSplit - (gammaSplit - gamma);
  const gammaLow = gamma - gammaHigh;
  const squareSplit = SPLITTER * square;
  const squareHigh = squareSplit - (squareSplit - square);
  const squareLow = square - squareHigh;
  const productError =
    gammaHigh * squareHigh -
    product +
    gammaHigh * squareLow +
    gammaLow * squareHigh +
    gammaLow * squareLow;
  // product - 1 is exact (Sterbenz) where this is used, 0.9 < gamma M^2 < 1.1.
  return product - 1 + (productError + gamma * squareError);
}

function checkFrictionParameter(frictionParameter: number): void {
  if (!(frictionParameter >= 0)) {
    throw new RangeError(`friction parameter fD L/D must be >= 0 (got ${frictionParameter})`);
  }
}

/**
 * Limiting Mach number of isothermal pipe flow: the exit Mach number at which the flow chokes.
 *
 * M*t = 1 / sqrt(gamma)   (exit velocity sqrt(R T), the isothermal speed of sound)
 *
 * The friction that leads there is measured with the Darcy factor fD (= 4 x Fanning).
 *
 * @param gamma - heat capacity ratio cp / cv [-], > 0
 * @returns M*t [-]
 * @remarks Perfect gas at constant static temperature. Source: A. H. Shapiro, The Dynamics and
 *   Thermodynamics of Compressible Fluid Flow, Vol. I, Ronald Press, 1953, ch. 6 (isothermal flow
 *   in long ducts).
 * @example isothermalLimitingMach(1.4) // 0.8451542547285166 (PRACTICE.md 7.3: 0.8452; checked in
 *   test/physics/isothermal.test.ts)
 */
export function isothermalLimitingMach(gamma: number): number {
  return 1 / Math.sqrt(gamma);
}

/**
 * Isothermal friction parameter: Darcy friction factor times the duct length (in diameters) that
 * takes isothermal flow from Mach M to the limiting Mach number 1 / sqrt(gamma).
 *
 * fD L*t / D = (1 - gamma M^2) / (gamma M^2) + ln(gamma M^2)
 *
 * fD is the Darcy friction factor (= 4 x Fanning factor).
 *
 * @param mach - M >= 0 [-] (M = 0 gives Infinity)
 * @param gamma - heat capacity ratio cp / cv [-], > 0
 * @returns fD L*t / D [-], >= 0, zero at M = 1/sqrt(gamma)
 * @remarks Perfect gas, constant static temperature and area, kinetic energy included (the
 *   ln term). Near the limiting Mach number it is summed as 2 [atanh(z) - z/(1 + z)],
 *   z = (gamma M^2 - 1)/(gamma M^2 + 1), by series, keeping full relative precision. Source:
 *   Shapiro, Vol. I, 1953, ch. 6 (isothermal flow in long ducts).
 * @example isothermalFrictionParameter(0.3, 1.4) // 4.86503456 (checked in
 *   test/physics/isothermal.test.ts)
 */
export function isothermalFrictionParameter(mach: number, gamma: number): number {
  if (mach === 0) return Number.POSITIVE_INFINITY;
  const w = gamma * mach * mach;
  const z = (w - 1) / (w + 1);
  if (Math.abs(z) < SERIES_LIMIT) {
    return 2 * frictionKernelSeries(gammaMachSquaredMinusOne(mach, gamma) / (w + 1));
  }
  // ln(gamma) + 2 ln(M) rather than ln(gamma M^2), so that a tiny M still gives Infinity.
  return (1 - w) / w + Math.log(gamma) + 2 * Math.log(mach);
}

/**
 * Isothermal static pressure ratio p / p*t, p*t the pressure where the same flow reaches the
 * limiting Mach number 1 / sqrt(gamma).
 *
 * p / p*t = 1 / (M sqrt(gamma))    (p M is constant along the pipe)
 *
 * Friction enters through fD L/D with the Darcy factor fD (= 4 x Fanning).
 *
 * @param mach - M > 0 [-]
 * @param gamma - heat capacity ratio cp / cv [-], > 0
 * @returns p / p*t [-]
 * @remarks Perfect gas at constant static temperature, constant area. Source: Shapiro, Vol. I,
 *   1953, ch. 6.
 * @example isothermalPressureRatio(0.5, 1.4) // 1.69030851 (checked in
 *   test/physics/isothermal.test.ts)
 */
export function isothermalPressureRatio(mach: number, gamma: number): number {
  return 1 / (mach * Math.sqrt(gamma));
}

/**
 * Mach number at the entry of an isothermal duct from its friction parameter fD L*t / D (fD the
 * Darcy factor, = 4 x Fanning), on the subsonic branch M <= 1/sqrt(gamma).
 *
 * Solves isothermalFrictionParameter(M) = parameter for M.
 *
 * @param parameter - fD L*t / D >= 0 [-]; Infinity gives 0
 * @param gamma - heat capacity ratio cp / cv [-], > 0
 * @returns M [-], in [0, 1/sqrt(gamma)]
 * @throws RangeError if the parameter is negative or NaN
 * @remarks Safeguarded Newton iteration on q - 1 - ln q = parameter, q = 1/(gamma M^2), bracketed
 *   by q >= 1 + max(P, sqrt(2 P)) and one Newton step from there (convexity). Converged to about
 *   1e-15 relative in q. Source: Shapiro, Vol. I, 1953, ch. 6.
 * @example machFromIsothermalFrictionParameter(3.7, 1.4) // 0.32935639 (checked in
 *   test/physics/isothermal.test.ts)
 */
export function machFromIsothermalFrictionParameter(parameter: number, gamma: number): number {
  checkFrictionParameter(parameter);
  if (parameter === Number.POSITIVE_INFINITY) return 0;
  return 1 / Math.sqrt(gamma * squaredPressureRatioFromParameter(parameter));
}

/**
 * Mass flux of isothermal flow of a perfect gas through a pipe from the two end pressures.
 *
 * G = sqrt( (p1^2 - p2^2) / (R T (fD L/D + 2 ln(p1 / p2))) )
 *
 * fD is the Darcy friction factor (= 4 x Fanning factor).
 *
 * @param inletPressure - p1 [Pa], absolute, >= outletPressure
 * @param outletPressure - p2 [Pa], absolute, > 0
 * @param specificGasConstant - R [J/(kg K)]
 * @param temperature - T [K], the constant static temperature
 * @param frictionParameter - fD L/D >= 0 [-]
 * @returns G = mass flow / area [kg/(m2 s)]; 0 when p1 = p2
 * @throws RangeError unless p1 >= p2 > 0 and fD L/D >= 0
 * @remarks Perfect gas, constant temperature and area, constant friction factor, kinetic energy
 *   included (the 2 ln term), no elevation change. Valid only while p2 is at or above
 *   {@link isothermalChokedOutletPressure}(p1, fD L/D): below it the expression falls again and
 *   is not physical (the pipe is choked and carries the flow at p2*). This function does not
 *   check that (it would cost a root solve); callers do. Source: Shapiro, Vol. I, 1953, ch. 6;
 *   checked against fluids.compressible.isothermal_gas in the tests.
 * @example isothermalMassFlux(1e6, 9e5, 287.05, 308.29, 3.7) // 740.95 [kg/(m2 s)]; times the area
 *   of a 0.5 m pipe, 145.48 kg/s (checked in test/physics/isothermal.test.ts)
 */
export function isothermalMassFlux(
  inletPressure: number,
  outletPressure: number,
  specificGasConstant: number,
  temperature: number,
  frictionParameter: number,
): number {
  if (!(outletPressure > 0 && inletPressure >= outletPressure)) {
    throw new RangeError(
      `isothermal mass flux needs inlet pressure >= outlet pressure > 0 (got ${inletPressure} Pa and ${outletPressure} Pa)`,
    );
  }
  checkFrictionParameter(frictionParameter);
  if (inletPressure === outletPressure) return 0;
  const difference = inletPressure - outletPressure;
  const logRatio = Math.log1p(difference / outletPressure);
  return Math.sqrt(
    (difference * (inletPressure + outletPressure)) /
      (specificGasConstant * temperature * (frictionParameter + 2 * logRatio)),
  );
}

/**
 * Outlet-to-inlet pressure ratio at which isothermal pipe flow chokes (largest flow for the given
 * inlet pressure), from the pipe's friction parameter fD L/D (fD the Darcy factor,
 * = 4 x Fanning).
 *
 * r = p2* / p1 solves r^2 (fD L/D + 1 - 2 ln r) = 1; equivalently q = 1/r^2 solves
 * q - 1 - ln q = fD L/D, i.e. r = 1 / sqrt(-W_-1(-exp(-(1 + fD L/D)))) with the lower real branch
 * of the Lambert W function.
 *
 * @param frictionParameter - fD L/D >= 0 [-]
 * @returns p2* / p1 [-], in (0, 1]; 1 for fD L/D = 0
 * @throws RangeError if fD L/D is negative or NaN
 * @remarks Found by setting d G / d p2 = 0 in {@link isothermalMassFlux}; at that point the exit
 *   Mach number is 1/sqrt(gamma). Solved by the same safeguarded Newton iteration as
 *   {@link machFromIsothermalFrictionParameter} (no Lambert W in JavaScript). Source: Shapiro,
 *   Vol. I, 1953, ch. 6; the W_-1 form is that of fluids.compressible.P_isothermal_critical_flow.
 * @example isothermalChokedPressureRatio(3.7) // 0.38969973 (checked in
 *   test/physics/isothermal.test.ts)
 */
export function isothermalChokedPressureRatio(frictionParameter: number): number {
  checkFrictionParameter(frictionParameter);
  if (frictionParameter === Number.POSITIVE_INFINITY) return 0;
  return 1 / Math.sqrt(squaredPressureRatioFromParameter(frictionParameter));
}

/**
 * Outlet pressure at which isothermal pipe flow chokes for a given inlet pressure, from the
 * friction parameter fD L/D (fD the Darcy factor, = 4 x Fanning).
 *
 * p2* = p1 r, with r^2 (fD L/D + 1 - 2 ln r) = 1 (see {@link isothermalChokedPressureRatio})
 *
 * @param inletPressure - p1 [Pa], absolute
 * @param frictionParameter - fD L/D >= 0 [-]
 * @returns p2* [Pa]; a lower outlet pressure does not raise the flow
 * @throws RangeError if fD L/D is negative or NaN
 * @remarks Perfect gas, constant temperature and area. Source: Shapiro, Vol. I, 1953, ch. 6;
 *   fluids.compressible.P_isothermal_critical_flow (fluids documentation example: p1 = 1 MPa,
 *   fD = 0.00185, L = 1000 m, D = 0.5 m gives 389.6997 kPa).
 * @example isothermalChokedOutletPressure(1e6, 3.7) // 389699.73... [Pa] (PRACTICE.md 7.3:
 *   389.6997 kPa; checked in test/physics/isothermal.test.ts)
 */
export function isothermalChokedOutletPressure(
  inletPressure: number,
  frictionParameter: number,
): number {
  return inletPressure * isothermalChokedPressureRatio(frictionParameter);
}
