/**
 * Sharp-edged orifice plates (ISO 5167-2) and restriction orifices as network edges.
 */
import { criticalPressureRatio } from "../isentropic.js";
import type { PipeFlowEvaluation, PipeGas } from "../pipe-flow.js";
import type { OrificeElement } from "./component-elements.js";
import { evaluateRestrictionFlow, type TapFlowRelation } from "./restriction.js";
import { regularisedRoot, regularisedRootSlope } from "./small-difference.js";

/**
 * Default discharge coefficient of a sharp-edged orifice [-]. The Reader-Harris/Gallagher
 * equation of ISO 5167-2:2003 gives 0.596 to 0.617 for beta 0.2 to 0.7 at Re_D 1e5 to 1e7 with
 * corner, flange or D and D/2 taps (python3-fluids 1.0.22 C_Reader_Harris_Gallagher, checked in
 * test/physics/components/orifice.test.ts); 0.60 lies in that range, near its lower end where
 * most plates of beta 0.2 to 0.5 at high Re_D are.
 */
export const ORIFICE_DISCHARGE_COEFFICIENT = 0.6;

/**
 * Expansibility factor of an orifice plate, ISO 5167-2:2003:
 *
 * epsilon = 1 - (0.351 + 0.256 beta^4 + 0.93 beta^8) (1 - (p2 / p1)^(1 / kappa))
 *
 * @param beta - d / D [-]
 * @param pressureRatio - p2 / p1 at the taps [-]
 * @param gamma - isentropic exponent kappa [-] (gamma of an ideal gas)
 * @returns epsilon [-]
 * @remarks Determined for p2 / p1 >= 0.75 (air, steam, natural gas); machnet applies it down to
 *   the critical pressure ratio, where a restriction orifice is taken as choked. Source:
 *   ISO 5167-2:2003, eq. for epsilon; python3-fluids 1.0.22 orifice_expansibility.
 * @example orificeExpansibility(0.0222 / 0.0739, 0.99, 1.4) // 0.997474 (fluids 1.0.22 doctest;
 *   checked in test/physics/components/orifice.test.ts)
 */
export function orificeExpansibility(beta: number, pressureRatio: number, gamma: number): number {
  const beta4 = beta ** 4;
  return 1 - (0.351 + 0.256 * beta4 + 0.93 * beta4 * beta4) * (1 - pressureRatio ** (1 / gamma));
}

/**
 * Mass flow through an orifice plate from its tap pressures, ISO 5167-2:2003 / ISO 5167-1 eq. 1:
 *
 * qm = C / sqrt(1 - beta^4) epsilon (pi / 4) d^2 sqrt(2 dp rho1)
 *
 * @param dischargeCoefficient - C [-]
 * @param boreDiameter - d [m]
 * @param beta - d / D [-]
 * @param inletPressure - p1 at the upstream tap [Pa]
 * @param inletDensity - rho1 at the upstream tap [kg/m3]
 * @param outletPressure - p2 at the downstream tap [Pa]
 * @param gamma - isentropic exponent [-]
 * @returns qm [kg/s]
 * @remarks Source: ISO 5167-1:2003 eq. (1) with ISO 5167-2's epsilon; as python3-fluids 1.0.22
 *   flow_meter_discharge. No choke here (the network edge adds it).
 * @example orificeMassFlow(0.61512, 0.05, 0.05 / 0.07366, 2e5, 2.27, 1.83e5, 1.4)
 *   // 0.36767 kg/s (fluids' flow_meter_discharge gives the same for this epsilon; checked in
 *   test/physics/components/examples.test.ts and orifice.test.ts)
 */
export function orificeMassFlow(
  dischargeCoefficient: number,
  boreDiameter: number,
  beta: number,
  inletPressure: number,
  inletDensity: number,
  outletPressure: number,
  gamma: number,
): number {
  const expansibility = orificeExpansibility(beta, outletPressure / inletPressure, gamma);
  return (
    (dischargeCoefficient / Math.sqrt(1 - beta ** 4)) *
    expansibility *
    0.25 *
    Math.PI *
    boreDiameter *
    boreDiameter *
    Math.sqrt(2 * (inletPressure - outletPressure) * inletDensity)
  );
}

/**
 * The orifice's tap relation (docs/model.md, "Components"): m = K p1 / sqrt(R T1) sqrt(2)
 * epsilon(1 - x_tap) s(x_tap), K = C (pi/4) d^2 / sqrt(1 - beta^4), s the regularised square
 * root; choked for x_tap >= 1 - p* / p0 (the critical pressure ratio of the gas).
 */
const ORIFICE_TAP_FLOW: TapFlowRelation = {
  flowScale: (dischargeCoefficient, area, beta4, _gamma, upstreamPressure) =>
    (dischargeCoefficient / Math.sqrt(1 - beta4)) * area * upstreamPressure,
  criticalTapRatio: (_beta, gamma) => 1 - criticalPressureRatio(gamma),
  flowFunction(tap, gamma, beta4) {
    const a = 0.351 + 0.256 * beta4 + 0.93 * beta4 * beta4;
    return Math.SQRT2 * (1 - a * (1 - (1 - tap) ** (1 / gamma))) * regularisedRoot(tap);
  },
  flowFunctionSlope(tap, gamma, beta4) {
    const a = 0.351 + 0.256 * beta4 + 0.93 * beta4 * beta4;
    const tau = 1 - tap;
    const expansibility = 1 - a * (1 - tau ** (1 / gamma));
    const expansibilitySlope = (-a / gamma) * tau ** (1 / gamma - 1);
    return (
      Math.SQRT2 *
      (expansibilitySlope * regularisedRoot(tap) + expansibility * regularisedRootSlope(tap))
    );
  },
};

/** An orifice as a network edge: evaluateRestrictionFlow with the orifice's tap relation. */
export function evaluateOrificeFlow(
  orifice: OrificeElement,
  gas: PipeGas,
  upstreamPressure: number,
  upstreamTemperature: number,
  downstreamPressure: number,
  out: PipeFlowEvaluation,
  needEndStates: boolean,
): void {
  evaluateRestrictionFlow(
    orifice,
    ORIFICE_TAP_FLOW,
    gas,
    upstreamPressure,
    upstreamTemperature,
    downstreamPressure,
    out,
    needEndStates,
  );
}
