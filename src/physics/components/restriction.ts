/**
 * What orifice plates and nozzles share as network edges: the node pressures are the pressures
 * well upstream and well downstream of the device, and the pressure lost between them is the
 * permanent pressure loss, a fixed fraction L of the differential pressure between the device's
 * taps (ISO 5167-2 and -3). So the tap differential ratio is x_tap = x / L with x = (p1 - p2) / p1
 * from the node pressures, and the flow is m = K p1 / sqrt(R T1) g(x_tap), choked (constant) for
 * x_tap at or above the critical tap differential ratio.
 */
import type { PipeFlowEvaluation, PipeGas } from "../pipe-flow.js";
import { connectionStates } from "./connection-states.js";

/**
 * Permanent pressure loss over the differential pressure of an orifice plate, ISO 5167-2, and of
 * ISA 1932 and long-radius nozzles, ISO 5167-3:
 *
 * dw / dp = (sqrt(1 - beta^4 (1 - C^2)) - C beta^2) / (sqrt(1 - beta^4 (1 - C^2)) + C beta^2)
 *
 * @param beta - diameter ratio d / D [-], 0 (a plate between plenums: L = 1) to 1
 * @param dischargeCoefficient - C [-]
 * @returns L = dw / dp [-], 0 to 1
 * @remarks The pressure is recovered some 6 D downstream of the plate. Source: ISO 5167-2:2003
 *   sec. 5.4 and ISO 5167-3:2003 (as in python3-fluids 1.0.22 dP_orifice, which uses it for both).
 * @example pressureLossRatio(0.05 / 0.07366, 0.61512) // 0.5335 (python3-fluids 1.0.22
 *   dP_orifice doctest over its dp of 17 kPa; checked in test/physics/components/orifice.test.ts)
 */
export function pressureLossRatio(beta: number, dischargeCoefficient: number): number {
  const beta2 = beta * beta;
  const root = Math.sqrt(1 - beta2 * beta2 * (1 - dischargeCoefficient * dischargeCoefficient));
  return (root - dischargeCoefficient * beta2) / (root + dischargeCoefficient * beta2);
}

/** beta = d / D of an orifice or nozzle element (0 between plenums). */
export function diameterRatio(element: { boreDiameter: number; pipeDiameter: number }): number {
  return Number.isNaN(element.pipeDiameter) ? 0 : element.boreDiameter / element.pipeDiameter;
}

/**
 * What makes an orifice plate or a nozzle: its flow as a function of the tap differential ratio,
 * m = scale g(x_tap), scale = K p1 / sqrt(R T1), constant from the critical tap ratio on.
 * Plain functions of numbers (no allocation), one constant object per kind.
 */
export interface TapFlowRelation {
  /** K p1 [Pa m2], the flow scale times sqrt(R T1): C (pi/4) d^2 p1 times the kind's factor. */
  flowScale(
    dischargeCoefficient: number,
    area: number,
    beta4: number,
    gamma: number,
    upstreamPressure: number,
  ): number;
  /** The tap differential ratio at which it chokes, 1 - tau* [-]. */
  criticalTapRatio(beta: number, gamma: number): number;
  /** g(x_tap) [-], for 0 <= x_tap <= the critical tap ratio. */
  flowFunction(tap: number, gamma: number, beta4: number): number;
  /** dg / dx_tap [-]. */
  flowFunctionSlope(tap: number, gamma: number, beta4: number): number;
}

/**
 * An orifice plate or a nozzle as a network edge (docs/model.md, "Components"): the tap
 * differential ratio x_tap = x / L from the node pressures (L the permanent-loss ratio), the
 * flow m = scale g(x_tap) with its derivatives, choked (m = scale g(x_tap*)) for x_tap >= x_tap*,
 * and the states in the connecting pipes.
 */
export function evaluateRestrictionFlow(
  element: { boreDiameter: number; pipeDiameter: number; dischargeCoefficient: number },
  relation: TapFlowRelation,
  gas: PipeGas,
  upstreamPressure: number,
  upstreamTemperature: number,
  downstreamPressure: number,
  out: PipeFlowEvaluation,
  needEndStates: boolean,
): void {
  const gamma = gas.heatCapacityRatio;
  const beta = diameterRatio(element);
  const beta4 = beta ** 4;
  const c = element.dischargeCoefficient;
  const area = 0.25 * Math.PI * element.boreDiameter * element.boreDiameter;
  const p1 = upstreamPressure;
  const t1 = upstreamTemperature;
  const p2 = downstreamPressure;
  const scale =
    relation.flowScale(c, area, beta4, gamma, p1) / Math.sqrt(gas.specificGasConstant * t1);
  const lossRatio = pressureLossRatio(beta, c);
  const critical = relation.criticalTapRatio(beta, gamma);
  const tap = Math.max((p1 - p2) / p1, 0) / lossRatio;
  const largest = relation.flowFunction(critical, gamma, beta4);
  if (tap >= critical) {
    fillRestrictionFlow(out, scale, largest, 0, largest, lossRatio, true, p1, t1, p2);
  } else {
    const value = relation.flowFunction(tap, gamma, beta4);
    const slope = relation.flowFunctionSlope(tap, gamma, beta4);
    fillRestrictionFlow(out, scale, value, slope, largest, lossRatio, false, p1, t1, p2);
  }
  connectionStates(
    gas,
    p1,
    t1,
    p2,
    element.pipeDiameter,
    element.pipeDiameter,
    Number.isNaN(element.pipeDiameter) ? element.boreDiameter : element.pipeDiameter,
    out,
    needEndStates,
  );
}

/**
 * Fill mass flow, derivatives, choke flag and capacity from the tap relation
 * m = scale g(x_tap) (scale = K p1 / sqrt(R T1)), given g and dg/dx_tap at x_tap and g at the
 * critical tap ratio (`largest`).
 */
function fillRestrictionFlow(
  out: PipeFlowEvaluation,
  scale: number,
  value: number,
  slope: number,
  largest: number,
  lossRatio: number,
  choked: boolean,
  p1: number,
  t1: number,
  p2: number,
): void {
  out.choked = choked;
  out.massFlow = scale * value;
  const tapSlope = choked ? 0 : (scale * slope) / lossRatio; // dm/dx
  out.dMassFlowdUpstreamPressure = out.massFlow / p1 + (tapSlope * p2) / (p1 * p1);
  out.dMassFlowdUpstreamTemperature = -out.massFlow / (2 * t1);
  out.dMassFlowdDownstreamPressure = choked ? 0 : -tapSlope / p1;
  out.capacity = scale * largest;
  out.capacityKnown = true;
}
