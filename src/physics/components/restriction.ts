/**
 * What orifice plates and nozzles share as network edges: the node pressures are the pressures
 * well upstream and well downstream of the device, and the pressure lost between them is the
 * permanent pressure loss, a fixed fraction L of the differential pressure between the device's
 * taps (ISO 5167-2 and -3). So the tap differential ratio is x_tap = x / L with x = (p1 - p2) / p1
 * from the node pressures, and the flow is m = K p1 / sqrt(R T1) g(x_tap), choked (constant) for
 * x_tap at or above the critical tap differential ratio.
 */
import type { PipeFlowEvaluation } from "../pipe-flow.js";

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

/**
 * Fill mass flow, derivatives, choke flag and capacity from the tap relation
 * m = scale g(x_tap) (scale = K p1 / sqrt(R T1)), given g and dg/dx_tap at x_tap and g at the
 * critical tap ratio (`largest`).
 */
export function fillRestrictionFlow(
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
