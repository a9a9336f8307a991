/**
 * Rounded flow nozzles (ISO 5167-3 ISA 1932 and long-radius nozzles) as network edges: isentropic
 * acceleration to the throat, with a discharge coefficient, choked at the critical pressure ratio.
 */
import type { PipeFlowEvaluation, PipeGas } from "../pipe-flow.js";
import { safeguardedNewton } from "../scalar-root.js";
import type { NozzleElement } from "./component-elements.js";
import { evaluateRestrictionFlow, type TapFlowRelation } from "./restriction.js";
import { regularisedRoot, regularisedRootSlope } from "./small-difference.js";

/**
 * Default discharge coefficient of a nozzle [-]. ISO 5167-3:2003 gives, for beta 0.3 to 0.6 at
 * Re_D 1e5 to 1e7, 0.981 to 0.995 for long-radius nozzles and 0.959 to 0.988 for ISA 1932 nozzles
 * (python3-fluids 1.0.22 C_long_radius_nozzle and C_ISA_1932_nozzle, checked in
 * test/physics/components/nozzle.test.ts); 0.985 lies in both ranges.
 */
export const NOZZLE_DISCHARGE_COEFFICIENT = 0.985;

/**
 * Expansibility factor of a nozzle, ISO 5167-3:2003 (isentropic expansion to the throat):
 *
 * epsilon = sqrt( (kappa tau^(2/kappa) / (kappa - 1)) ((1 - beta^4) / (1 - beta^4 tau^(2/kappa)))
 *           ((1 - tau^((kappa-1)/kappa)) / (1 - tau)) ),  tau = p2 / p1
 *
 * @param beta - d / D [-]
 * @param pressureRatio - tau = p2 / p1 [-], < 1
 * @param gamma - isentropic exponent kappa [-]
 * @returns epsilon [-]
 * @remarks Source: ISO 5167-3:2003; as python3-fluids 1.0.22 nozzle_expansibility.
 * @example nozzleExpansibility(0.0222 / 0.0739, 0.99, 1.4) // 0.994570234 (fluids 1.0.22 doctest;
 *   checked in test/physics/components/nozzle.test.ts)
 */
export function nozzleExpansibility(beta: number, pressureRatio: number, gamma: number): number {
  const tau = pressureRatio;
  const beta4 = beta ** 4;
  const tau2 = tau ** (2 / gamma);
  return Math.sqrt(
    ((gamma * tau2) / (gamma - 1)) *
      ((1 - beta4) / (1 - beta4 * tau2)) *
      ((1 - tau ** ((gamma - 1) / gamma)) / (1 - tau)),
  );
}

function criticalResidual(tau: number, gamma: number, beta4: number): number {
  return (
    tau ** (-(gamma - 1) / gamma) +
    0.5 * (gamma - 1) * beta4 * tau ** (2 / gamma) -
    0.5 * (gamma + 1)
  );
}
function criticalResidualSlope(tau: number, gamma: number, beta4: number): number {
  const e = (gamma - 1) / gamma;
  return -e * tau ** (-e - 1) + e * beta4 * tau ** (2 / gamma - 1);
}

/**
 * Critical pressure ratio of a nozzle with velocity of approach: the throat-to-inlet pressure
 * ratio tau* at which the isentropic flow is largest, the root of
 *
 * tau*^((1 - kappa)/kappa) + ((kappa - 1)/2) beta^4 tau*^(2/kappa) = (kappa + 1)/2.
 *
 * @param beta - d / D [-], < 1; 0 gives (2/(kappa+1))^(kappa/(kappa-1))
 * @param gamma - isentropic exponent kappa [-]
 * @returns tau* [-]
 * @remarks Derived here by setting d/dtau of tau^(2/k) (1 - tau^((k-1)/k)) / (1 - beta^4
 *   tau^(2/k)) (the square of the mass flux from ISO 5167-3's expansibility) to zero; the test
 *   checks it against a numerical maximum of the flow from python3-fluids' nozzle_expansibility
 *   (scipy 1.10.1). The left side falls with tau on the bracket, so the root is unique.
 * @example nozzleCriticalPressureRatio(0.5, 1.4) // 0.536266 (checked in
 *   test/physics/components/nozzle.test.ts)
 */
export function nozzleCriticalPressureRatio(beta: number, gamma: number): number {
  const plenum = (2 / (gamma + 1)) ** (gamma / (gamma - 1));
  const beta4 = beta ** 4;
  if (beta4 === 0) return plenum;
  return safeguardedNewton(
    criticalResidual,
    criticalResidualSlope,
    gamma,
    beta4,
    0,
    plenum,
    1,
    plenum,
    false,
    1e-15,
    0,
  );
}

/**
 * Mass flow through a nozzle from its tap pressures, ISO 5167-1 eq. (1) with ISO 5167-3's
 * expansibility, limited at the critical pressure ratio (choked flow):
 *
 * qm = C / sqrt(1 - beta^4) epsilon (pi / 4) d^2 sqrt(2 dp rho1), tau = max(p2 / p1, tau*)
 *
 * @param dischargeCoefficient - C [-]
 * @param throatDiameter - d [m]
 * @param beta - d / D [-] (0 from a plenum)
 * @param inletPressure - p1 [Pa]
 * @param inletDensity - rho1 [kg/m3]
 * @param outletPressure - p2 [Pa]
 * @param gamma - isentropic exponent [-]
 * @returns qm [kg/s]
 * @remarks With beta = 0 and C = 1 this is the isentropic nozzle from a plenum, whose choked flux
 *   is G* = p0 sqrt(gamma / (R T0)) (2/(gamma+1))^((gamma+1)/(2(gamma-1))) (PRACTICE.md 7.2).
 * @example nozzleMassFlow(1, 0.01, 0, 7e5, 7e5 / (287.05 * 293.15), 1e5, 1.4) // 0.12977 kg/s
 *   (1652.3 kg/(s m2) x the throat area, PRACTICE.md 7.2; checked in
 *   test/physics/components/nozzle.test.ts)
 */
export function nozzleMassFlow(
  dischargeCoefficient: number,
  throatDiameter: number,
  beta: number,
  inletPressure: number,
  inletDensity: number,
  outletPressure: number,
  gamma: number,
): number {
  const tau = Math.max(outletPressure / inletPressure, nozzleCriticalPressureRatio(beta, gamma));
  return (
    (dischargeCoefficient / Math.sqrt(1 - beta ** 4)) *
    nozzleExpansibility(beta, tau, gamma) *
    0.25 *
    Math.PI *
    throatDiameter *
    throatDiameter *
    Math.sqrt(2 * (1 - tau) * inletPressure * inletDensity)
  );
}

/**
 * h(x) = tau^(2/k) (1 - tau^((k-1)/k)) / (x (1 - beta^4 tau^(2/k))), tau = 1 - x, finite at
 * x = 0, and d ln h / dx: the smooth factor of the nozzle's mass flux sqrt(2k/(k-1)) sqrt(h x).
 */
function fluxFactor(x: number, gamma: number, beta4: number): { value: number; logSlope: number } {
  const e = (gamma - 1) / gamma;
  const c = 2 / gamma;
  const tau = 1 - x;
  const tauC = tau ** c;
  let q: number; // (1 - tau^e) / x
  let logQSlope: number;
  if (x < 1e-8) {
    q = e * (1 + 0.5 * (1 - e) * x);
    logQSlope = 0.5 * (1 - e);
  } else {
    const drop = -Math.expm1(e * Math.log1p(-x)); // 1 - tau^e
    q = drop / x;
    logQSlope = (e * tau ** (e - 1)) / drop - 1 / x;
  }
  const approach = 1 - beta4 * tauC;
  return {
    value: (tauC * q) / approach,
    logSlope: -c / tau + logQSlope - (beta4 * c * tau ** (c - 1)) / approach,
  };
}

/**
 * The nozzle's tap relation (docs/model.md, "Components"): m = C (pi/4) d^2 p1 / sqrt(R T1)
 * sqrt(2 gamma / (gamma - 1)) sqrt(h(x_tap)) s(x_tap), s the regularised square root; choked
 * for x_tap >= 1 - tau*(beta).
 */
const NOZZLE_TAP_FLOW: TapFlowRelation = {
  flowScale: (dischargeCoefficient, area, _beta4, gamma, upstreamPressure) =>
    dischargeCoefficient * area * upstreamPressure * Math.sqrt((2 * gamma) / (gamma - 1)),
  criticalTapRatio: (beta, gamma) => 1 - nozzleCriticalPressureRatio(beta, gamma),
  flowFunction: (tap, gamma, beta4) =>
    Math.sqrt(fluxFactor(tap, gamma, beta4).value) * regularisedRoot(tap),
  flowFunctionSlope(tap, gamma, beta4) {
    const factor = fluxFactor(tap, gamma, beta4);
    const root = regularisedRoot(tap);
    return Math.sqrt(factor.value) * (regularisedRootSlope(tap) + 0.5 * root * factor.logSlope);
  },
};

/** A nozzle as a network edge: evaluateRestrictionFlow with the nozzle's tap relation. */
export function evaluateNozzleFlow(
  nozzle: NozzleElement,
  gas: PipeGas,
  upstreamPressure: number,
  upstreamTemperature: number,
  downstreamPressure: number,
  out: PipeFlowEvaluation,
  needEndStates: boolean,
): void {
  evaluateRestrictionFlow(
    nozzle,
    NOZZLE_TAP_FLOW,
    gas,
    upstreamPressure,
    upstreamTemperature,
    downstreamPressure,
    out,
    needEndStates,
  );
}
