/**
 * Pressure regulators and check valves as network edges: valve trims (IEC 60534-2-1) whose
 * opening is set by the downstream pressure (a regulator) or by the flow direction (a check
 * valve). Neither lets gas run backwards: against the declared direction they are closed and pass
 * only their leakage.
 */
import type { PipeFlowEvaluation, PipeGas } from "../pipe-flow.js";
import type { CheckValveElement, RegulatorElement } from "./component-elements.js";
import { connectionStates } from "./connection-states.js";
import { addLeakage, clearFlow, evaluateTrim } from "./valve.js";

/**
 * Opening of a regulator (its Kv over the wide-open Kv) as a function of its downstream
 * pressure: a proportional band below the setpoint.
 *
 * z = (p_set - p_d) / band; opening = 0 for z <= 0 (closed), z (2 - z) for 0 < z < 1, 1 for
 * z >= 1 (wide open).
 *
 * @param downstreamPressure - p_d [Pa]
 * @param setpoint - p_set, the downstream pressure at zero flow [Pa]
 * @param proportionalBand - band [Pa], > 0: the fall of p_d from closed to wide open
 * @returns opening [-], 0 to 1
 * @remarks A model of a proportional (droop) regulator, chosen so that the flow is continuous
 *   and monotone in p_d, with a smooth (C1) change to wide open and a finite slope where it
 *   closes: Newton then passes between the three states without switching logic. While it
 *   regulates, p_d stays within one band below the setpoint; the band is the regulation error
 *   the model allows (docs/model.md, "Regulator"). A modelling choice, no source.
 * @example regulatorOpening(4.95e5, 5e5, 1e4) // 0.75 (checked in
 *   test/physics/components/regulator.test.ts)
 */
export function regulatorOpening(
  downstreamPressure: number,
  setpoint: number,
  proportionalBand: number,
): number {
  const z = (setpoint - downstreamPressure) / proportionalBand;
  if (z <= 0) return 0;
  if (z >= 1) return 1;
  return z * (2 - z);
}

/** d(opening)/d(p_d) [1/Pa] of {@link regulatorOpening}. */
export function regulatorOpeningSlope(
  downstreamPressure: number,
  setpoint: number,
  proportionalBand: number,
): number {
  const z = (setpoint - downstreamPressure) / proportionalBand;
  if (z <= 0 || z >= 1) return 0;
  return -(2 - 2 * z) / proportionalBand;
}

/** States a regulator reports. */
export type RegulatorState = "regulating" | "wide-open" | "closed";

/** The state of a regulator at a flow direction and opening. */
export function regulatorState(forward: boolean, opening: number): RegulatorState {
  if (!forward || opening <= 0) return "closed";
  return opening >= 1 ? "wide-open" : "regulating";
}

/**
 * A regulator as a network edge: m = opening(p_d) m_trim(Kv) + leakage, where m_trim is the
 * wide-open trim's IEC 60534-2-1 flow; closed (leakage only) against the declared direction.
 * Reported as choked only when wide open with its trim at critical flow: while it regulates, its
 * flow depends on p_d through the opening even when the trim is at critical flow.
 */
export function evaluateRegulatorFlow(
  regulator: RegulatorElement,
  gas: PipeGas,
  upstreamPressure: number,
  upstreamTemperature: number,
  downstreamPressure: number,
  forward: boolean,
  out: PipeFlowEvaluation,
  needEndStates: boolean,
): void {
  const kv = regulator.flowCoefficient;
  const xT = regulator.pressureDifferentialRatioFactor;
  const p1 = upstreamPressure;
  const t1 = upstreamTemperature;
  const p2 = downstreamPressure;
  evaluateTrim(kv, xT, gas, p1, t1, p2, out);
  if (!forward) {
    clearFlow(out);
    addLeakage(kv, gas, p1, t1, p2, out);
  } else {
    const opening = regulatorOpening(p2, regulator.setpoint, regulator.proportionalBand);
    const openingSlope = regulatorOpeningSlope(p2, regulator.setpoint, regulator.proportionalBand);
    const trimFlow = out.massFlow;
    out.massFlow = opening * trimFlow;
    out.dMassFlowdUpstreamPressure *= opening;
    out.dMassFlowdUpstreamTemperature *= opening;
    out.dMassFlowdDownstreamPressure =
      opening * out.dMassFlowdDownstreamPressure + openingSlope * trimFlow;
    out.choked = out.choked && opening >= 1;
    addLeakage(kv, gas, p1, t1, p2, out);
  }
  connectionStates(
    gas,
    p1,
    t1,
    p2,
    regulator.pipeDiameter,
    regulator.pipeDiameter,
    regulator.pipeDiameter,
    out,
    needEndStates,
  );
}

/**
 * A check valve as a network edge: the IEC 60534-2-1 trim flow of its Kv in the declared
 * direction; against it, closed, passing only its leakage.
 */
export function evaluateCheckValveFlow(
  check: CheckValveElement,
  gas: PipeGas,
  upstreamPressure: number,
  upstreamTemperature: number,
  downstreamPressure: number,
  forward: boolean,
  out: PipeFlowEvaluation,
  needEndStates: boolean,
): void {
  const kv = check.flowCoefficient;
  evaluateTrim(
    kv,
    check.pressureDifferentialRatioFactor,
    gas,
    upstreamPressure,
    upstreamTemperature,
    downstreamPressure,
    out,
  );
  if (!forward) {
    clearFlow(out);
    addLeakage(kv, gas, upstreamPressure, upstreamTemperature, downstreamPressure, out);
  }
  connectionStates(
    gas,
    upstreamPressure,
    upstreamTemperature,
    downstreamPressure,
    check.pipeDiameter,
    check.pipeDiameter,
    check.pipeDiameter,
    out,
    needEndStates,
  );
}
