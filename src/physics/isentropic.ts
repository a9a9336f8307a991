/**
 * Isentropic flow of a calorically perfect gas: static-to-stagnation ratios, the area-Mach number
 * relation, the mass-flux parameter and their inverses.
 *
 * All functions take the Mach number M [-] and the heat capacity ratio gamma = cp / cv [-]
 * (gamma > 1) as plain numbers and allocate nothing.
 * @module
 */

import { safeguardedNewton } from "./scalar-root.js";

/** Which of the two Mach numbers that share an area ratio or a friction parameter is meant. */
export type FlowBranch = "subsonic" | "supersonic";

/** Sonic-limit inputs within this relative distance beyond the limit are taken as sonic. */
const SONIC_ROUNDING = 1e-12;

/**
 * Static-to-stagnation temperature ratio of isentropic (in fact of any adiabatic) flow.
 *
 * T / T0 = 1 / (1 + (gamma - 1) / 2 * M^2)
 *
 * @param mach - M >= 0 [-]
 * @param gamma - heat capacity ratio cp / cv [-], > 1
 * @returns T / T0 [-]
 * @remarks Constant cp (calorically perfect gas); holds for any adiabatic flow, not only
 *   isentropic flow. Source: Ames Research Staff, "Equations, tables, and charts for compressible
 *   flow", NACA Report 1135, 1953, Table I; J. D. Anderson, Modern Compressible Flow, 3rd ed.,
 *   McGraw-Hill, 2003, ch. 3.
 * @example isentropicTemperatureRatio(0.5, 1.4) // 0.9523809523809523 (= 1/1.05; NACA 1135 Table I:
 *   0.95238; checked in test/physics/isentropic.test.ts)
 */
export function isentropicTemperatureRatio(mach: number, gamma: number): number {
  return 1 / (1 + 0.5 * (gamma - 1) * mach * mach);
}

/**
 * Static-to-stagnation pressure ratio of isentropic flow.
 *
 * p / p0 = (1 + (gamma - 1) / 2 * M^2) ^ (-gamma / (gamma - 1))
 *
 * @param mach - M >= 0 [-]
 * @param gamma - heat capacity ratio cp / cv [-], > 1
 * @returns p / p0 [-]
 * @remarks Calorically perfect gas, reversible and adiabatic. Source: NACA Report 1135 (Ames
 *   Research Staff, 1953), Table I; Anderson, Modern Compressible Flow, 3rd ed., 2003, ch. 3.
 * @example isentropicPressureRatio(0.5, 1.4) // 0.84301918 (NACA 1135 Table I: 0.84302; checked in
 *   test/physics/isentropic.test.ts)
 */
export function isentropicPressureRatio(mach: number, gamma: number): number {
  return (1 + 0.5 * (gamma - 1) * mach * mach) ** (-gamma / (gamma - 1));
}

/**
 * Static-to-stagnation density ratio of isentropic flow.
 *
 * rho / rho0 = (1 + (gamma - 1) / 2 * M^2) ^ (-1 / (gamma - 1))
 *
 * @param mach - M >= 0 [-]
 * @param gamma - heat capacity ratio cp / cv [-], > 1
 * @returns rho / rho0 [-]
 * @remarks Calorically perfect gas, reversible and adiabatic. Source: NACA Report 1135 (Ames
 *   Research Staff, 1953), Table I; Anderson, Modern Compressible Flow, 3rd ed., 2003, ch. 3.
 * @example isentropicDensityRatio(2, 1.4) // 0.23004815 (NACA 1135 Table I: 0.23005; checked in
 *   test/physics/isentropic.test.ts)
 */
export function isentropicDensityRatio(mach: number, gamma: number): number {
  return (1 + 0.5 * (gamma - 1) * mach * mach) ** (-1 / (gamma - 1));
}

/**
 * Area-Mach number relation: flow area divided by the area where the same isentropic flow would
 * be sonic.
 *
 * A / A* = (1 / M) * [(2 + (gamma - 1) M^2) / (gamma + 1)] ^ ((gamma + 1) / (2 (gamma - 1)))
 *
 * @param mach - M > 0 [-] (M = 0 gives Infinity)
 * @param gamma - heat capacity ratio cp / cv [-], > 1
 * @returns A / A* [-], >= 1, equal to 1 at M = 1
 * @remarks Quasi-one-dimensional, isentropic, calorically perfect gas. The same expression is the
 *   Fanno stagnation-pressure ratio p0 / p0*. Source: NACA Report 1135 (Ames Research Staff,
 *   1953), Table I; Anderson, Modern Compressible Flow, 3rd ed., 2003, ch. 5 (area-Mach number
 *   relation).
 * @example isentropicAreaRatio(2, 1.4) // 1.6875 (NACA 1135 Table I: 1.6875; checked in
 *   test/physics/isentropic.test.ts)
 */
export function isentropicAreaRatio(mach: number, gamma: number): number {
  const exponent = (gamma + 1) / (2 * (gamma - 1));
  return ((2 + (gamma - 1) * mach * mach) / (gamma + 1)) ** exponent / mach;
}

/**
 * Mass-flux parameter: mass flow per unit area G [kg/(m2 s)] made dimensionless with the
 * stagnation state, for isentropic flow of a perfect gas.
 *
 * G sqrt(R T0) / p0 = M sqrt(gamma) (1 + (gamma - 1) / 2 * M^2) ^ (-(gamma + 1) / (2 (gamma - 1)))
 *
 * @param mach - M >= 0 [-]
 * @param gamma - heat capacity ratio cp / cv [-], > 1
 * @returns G sqrt(R T0) / p0 [-]; R the specific gas constant [J/(kg K)], T0 [K], p0 [Pa]
 * @remarks Follows from G = rho V with the isentropic ratios; its maximum is at M = 1
 *   (see {@link maxMassFluxParameter}). It equals maxMassFluxParameter(gamma) / (A / A*).
 *   Source: Anderson, Modern Compressible Flow, 3rd ed., 2003, ch. 5; A. H. Shapiro, The Dynamics
 *   and Thermodynamics of Compressible Fluid Flow, Vol. I, Ronald Press, 1953, ch. 4.
 * @example massFluxParameter(1, 1.4) // 0.68473146 (checked in test/physics/isentropic.test.ts)
 */
export function massFluxParameter(mach: number, gamma: number): number {
  const exponent = -(gamma + 1) / (2 * (gamma - 1));
  return mach * Math.sqrt(gamma) * (1 + 0.5 * (gamma - 1) * mach * mach) ** exponent;
}

/**
 * Critical pressure ratio: static pressure where the flow reaches Mach 1, divided by the
 * stagnation pressure, for isentropic flow of a calorically perfect gas.
 *
 * p* / p0 = (2 / (gamma + 1)) ^ (gamma / (gamma - 1))
 *
 * @param gamma - heat capacity ratio cp / cv [-], > 1
 * @returns p* / p0 [-]
 * @remarks Constant cp and cv. Source: Anderson, Modern Compressible Flow, 3rd ed., 2003, ch. 3;
 *   NACA Report 1135 (Ames Research Staff, 1953), Table I at M = 1.
 * @example criticalPressureRatio(1.4) // 0.52828179 (checked in
 *   test/physics/isentropic.test.ts)
 */
export function criticalPressureRatio(gamma: number): number {
  return (2 / (gamma + 1)) ** (gamma / (gamma - 1));
}

/**
 * Critical temperature ratio: static temperature at Mach 1 divided by the stagnation temperature.
 *
 * T* / T0 = 2 / (gamma + 1)
 *
 * @param gamma - heat capacity ratio cp / cv [-], > 1
 * @returns T* / T0 [-]
 * @remarks Any adiabatic flow of a calorically perfect gas. Source: Anderson, Modern Compressible
 *   Flow, 3rd ed., 2003, ch. 3; NACA Report 1135 (Ames Research Staff, 1953), Table I at M = 1.
 * @example criticalTemperatureRatio(1.4) // 0.8333333333333334 (checked in
 *   test/physics/isentropic.test.ts)
 */
export function criticalTemperatureRatio(gamma: number): number {
  return 2 / (gamma + 1);
}

/**
 * Largest mass-flux parameter of isentropic flow, reached at Mach 1 (choked flow).
 *
 * G* sqrt(R T0) / p0 = sqrt(gamma) (2 / (gamma + 1)) ^ ((gamma + 1) / (2 (gamma - 1)))
 *
 * @param gamma - heat capacity ratio cp / cv [-], > 1
 * @returns G* sqrt(R T0) / p0 [-]
 * @remarks Equals massFluxParameter(1, gamma). Source: Anderson, Modern Compressible Flow, 3rd ed.,
 *   2003, ch. 5 (choked mass flow through a nozzle throat).
 * @example maxMassFluxParameter(1.4) // 0.68473146 (checked in test/physics/isentropic.test.ts)
 */
export function maxMassFluxParameter(gamma: number): number {
  return Math.sqrt(gamma) * (2 / (gamma + 1)) ** ((gamma + 1) / (2 * (gamma - 1)));
}

/**
 * Mach number from the static-to-stagnation pressure ratio of isentropic flow (closed form).
 *
 * M = sqrt( 2 / (gamma - 1) * ((p / p0) ^ (-(gamma - 1) / gamma) - 1) )
 *
 * @param pressureRatio - p / p0 in (0, 1] [-]; 0 gives Infinity
 * @param gamma - heat capacity ratio cp / cv [-], > 1
 * @returns M [-]
 * @throws RangeError if the ratio is not in [0, 1]
 * @remarks Inverse of {@link isentropicPressureRatio}; evaluated with expm1 so that ratios near 1
 *   (M near 0) keep full precision. Source: NACA Report 1135 (Ames Research Staff, 1953),
 *   Table I; Anderson, Modern Compressible Flow, 3rd ed., 2003, ch. 3.
 * @example machFromPressureRatio(0.5282817877171742, 1.4) // 1 (to 1e-15; checked in
 *   test/physics/isentropic.test.ts)
 */
export function machFromPressureRatio(pressureRatio: number, gamma: number): number {
  if (!(pressureRatio >= 0 && pressureRatio <= 1)) {
    throw new RangeError(`pressure ratio p/p0 must be in [0, 1] (got ${pressureRatio})`);
  }
  const excess = Math.expm1((-(gamma - 1) / gamma) * Math.log(pressureRatio));
  return Math.sqrt(Math.max(0, (2 / (gamma - 1)) * excess)); // max: +0, not -0, at p/p0 = 1
}

/**
 * Mach number from the static-to-stagnation temperature ratio of adiabatic flow (closed form).
 *
 * M = sqrt( 2 / (gamma - 1) * (1 - T / T0) / (T / T0) )
 *
 * @param temperatureRatio - T / T0 in (0, 1] [-]
 * @param gamma - heat capacity ratio cp / cv [-], > 1
 * @returns M [-]
 * @throws RangeError if the ratio is not in (0, 1]
 * @remarks Inverse of {@link isentropicTemperatureRatio}. Source: NACA Report 1135 (Ames Research
 *   Staff, 1953), Table I; Anderson, Modern Compressible Flow, 3rd ed., 2003, ch. 3.
 * @example machFromTemperatureRatio(0.8333333333333334, 1.4) // 1 (to 1e-15; checked in
 *   test/physics/isentropic.test.ts)
 */
export function machFromTemperatureRatio(temperatureRatio: number, gamma: number): number {
  if (!(temperatureRatio > 0 && temperatureRatio <= 1)) {
    throw new RangeError(`temperature ratio T/T0 must be in (0, 1] (got ${temperatureRatio})`);
  }
  return Math.sqrt(((2 / (gamma - 1)) * (1 - temperatureRatio)) / temperatureRatio);
}

// ln(A/A*) as a function of y = ln M, minus the target ln(A/A*):
// L(y) = -y + e ln(1 + (gamma - 1)/(gamma + 1) (M^2 - 1)),  e = (gamma + 1)/(2 (gamma - 1)).
// L is convex in y (L'' = 4 (gamma + 1) M^2 / (2 + (gamma - 1) M^2)^2 > 0), decreasing for M < 1
// and increasing for M > 1, with L(0) = L'(0) = 0 and L''(0) = 4 / (gamma + 1).
function logAreaRatioResidual(logMach: number, gamma: number, logTarget: number): number {
  const exponent = (gamma + 1) / (2 * (gamma - 1));
  const machSquaredMinusOne = Math.expm1(2 * logMach);
  return (
    -logMach + exponent * Math.log1p(((gamma - 1) / (gamma + 1)) * machSquaredMinusOne) - logTarget
  );
}

function logAreaRatioSlope(logMach: number, gamma: number): number {
  const machSquared = Math.exp(2 * logMach);
  return (2 * (machSquared - 1)) / (2 + (gamma - 1) * machSquared);
}

/**
 * Mach number from the isentropic area ratio A / A* on the chosen branch.
 *
 * Solves A / A*(M) = areaRatio (see {@link isentropicAreaRatio}) for M.
 *
 * @param areaRatio - A / A* >= 1 [-]; values within 1e-12 below 1 (rounding) are taken as 1
 * @param gamma - heat capacity ratio cp / cv [-], > 1
 * @param branch - "subsonic" (M <= 1) or "supersonic" (M >= 1)
 * @returns M [-]
 * @throws RangeError if areaRatio < 1 or is not finite
 * @remarks Safeguarded Newton iteration on ln(A/A*) against y = ln M, where the relation is convex;
 *   the bracket comes from the small-M and large-M asymptotes and from the curvature bound
 *   ln(A/A*) <= max(L'') y^2 / 2; the first guess near M = 1 from the series
 *   y = +-r - (3 - gamma) r^2 / (3 (gamma + 1)), r = sqrt((gamma + 1) ln(A/A*) / 2). The result is
 *   converged to about 1e-15 relative; near M = 1 the problem itself is ill-conditioned
 *   (A/A* - 1 ~ (M - 1)^2), so M is only as precise as the square root of the rounding in A/A*.
 *   Source: Anderson, Modern Compressible Flow, 3rd ed., 2003, ch. 5.
 * @example machFromAreaRatio(1.6875, 1.4, "supersonic") // 2 (to 1e-15; checked in
 *   test/physics/isentropic.test.ts)
 */
export function machFromAreaRatio(areaRatio: number, gamma: number, branch: FlowBranch): number {
  if (!(areaRatio >= 1 - SONIC_ROUNDING && areaRatio < Number.POSITIVE_INFINITY)) {
    throw new RangeError(`area ratio A/A* must be a finite number >= 1 (got ${areaRatio})`);
  }
  if (areaRatio <= 1) return 1;
  return machFromLogAreaRatio(Math.log(areaRatio), gamma, branch);
}

/** Mach number from ln(A/A*) > 0 on the chosen branch; see {@link machFromAreaRatio}. */
function machFromLogAreaRatio(logTarget: number, gamma: number, branch: FlowBranch): number {
  const exponent = (gamma + 1) / (2 * (gamma - 1));
  // Largest curvature of L on M <= 1 (at M = 1 when gamma <= 3) and on M >= 1 (at
  // M^2 = 2 / (gamma - 1) when gamma <= 3).
  const curvatureSubsonic = gamma <= 3 ? 4 / (gamma + 1) : (gamma + 1) / (2 * (gamma - 1));
  const curvatureSupersonic = gamma <= 3 ? (gamma + 1) / (2 * (gamma - 1)) : 4 / (gamma + 1);
  const sonicSeries = Math.sqrt(0.5 * (gamma + 1) * logTarget);
  const cubicShift = ((3 - gamma) / (3 * (gamma + 1))) * sonicSeries * sonicSeries;
  let lower: number;
  let upper: number;
  let guess: number;
  if (branch === "subsonic") {
    // A/A* >= (2 / (gamma + 1))^e / M, so M >= (2 / (gamma + 1))^e / (A/A*); and
    // ln(A/A*) <= max(L'') y^2 / 2.
    lower = exponent * Math.log(2 / (gamma + 1)) - logTarget;
    upper = -Math.sqrt((2 * logTarget) / curvatureSubsonic);
    guess = logTarget < 0.5 ? -sonicSeries - cubicShift : lower;
  } else {
    // Lower bound from ln(A/A*) <= 2 y / (gamma - 1) and from the curvature bound; upper bound
    // from A/A* >= (1/M) ((gamma - 1) M^2 / (gamma + 1))^e, the large-M asymptote.
    lower = Math.max(
      0.5 * (gamma - 1) * logTarget,
      Math.sqrt((2 * logTarget) / curvatureSupersonic),
    );
    upper = 0.5 * (gamma - 1) * (logTarget + exponent * Math.log((gamma + 1) / (gamma - 1)));
    guess = logTarget < 0.5 ? sonicSeries - cubicShift : upper;
  }
  const logMach = safeguardedNewton(
    logAreaRatioResidual,
    logAreaRatioSlope,
    gamma,
    logTarget,
    0,
    lower,
    upper,
    guess,
    branch === "supersonic",
    1e-15,
    1e-15,
  );
  return Math.exp(logMach);
}

/**
 * Mach number from the isentropic mass-flux parameter G sqrt(R T0) / p0 on the chosen branch.
 *
 * Solves massFluxParameter(M) = parameter, through ln(A / A*) = -ln(parameter / maxMassFluxParameter).
 *
 * @param parameter - G sqrt(R T0) / p0 in [0, maxMassFluxParameter(gamma)] [-]; values within
 *   1e-12 relative above the maximum (rounding) are taken as the maximum
 * @param gamma - heat capacity ratio cp / cv [-], > 1
 * @param branch - "subsonic" (M <= 1) or "supersonic" (M >= 1)
 * @returns M [-]; 0 for parameter 0 on the subsonic branch
 * @throws RangeError if the parameter is negative, above the maximum, or 0 on the supersonic
 *   branch (no finite Mach number)
 * @remarks See {@link machFromAreaRatio} for the method and its precision. Source: Anderson,
 *   Modern Compressible Flow, 3rd ed., 2003, ch. 5.
 * @example machFromMassFluxParameter(0.5, 1.4, "subsonic") // 0.48509219; with "supersonic":
 *   1.73299072 (checked in test/physics/isentropic.test.ts)
 */
export function machFromMassFluxParameter(
  parameter: number,
  gamma: number,
  branch: FlowBranch,
): number {
  const maximum = maxMassFluxParameter(gamma);
  if (!(parameter >= 0 && parameter <= maximum * (1 + SONIC_ROUNDING))) {
    throw new RangeError(
      `mass-flux parameter G sqrt(R T0)/p0 must be in [0, ${maximum}] for gamma ${gamma} (got ${parameter})`,
    );
  }
  if (parameter === 0) {
    if (branch === "subsonic") return 0;
    throw new RangeError("mass-flux parameter 0 has no finite supersonic Mach number");
  }
  if (parameter >= maximum) return 1;
  // ln(A/A*) = -ln(parameter / maximum); near the maximum through log1p, since
  // parameter - maximum is exact there (Sterbenz's lemma).
  const logAreaRatio =
    parameter > 0.5 * maximum
      ? -Math.log1p((parameter - maximum) / maximum)
      : Math.log(maximum) - Math.log(parameter); // no overflow for a subnormal parameter
  return machFromLogAreaRatio(logAreaRatio, gamma, branch);
}
