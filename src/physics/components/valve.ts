/**
 * Gas flow through a valve by IEC 60534-2-1 (Industrial-process control valves, part 2-1: flow
 * capacity, sizing equations for fluid flow under installed conditions; the same equations as
 * ANSI/ISA-75.01.01-2007): the relations, and the evaluation of a control valve as a network edge.
 *
 * Turbulent flow only: the standard's Reynolds number factor FR (laminar and transitional flow in
 * small-flow trims) is not modelled. Flow coefficients are Kv [m3/h]; the input step converts a
 * Cv (src/input/read-components.ts).
 */
import type { PipeFlowEvaluation, PipeGas } from "../pipe-flow.js";
import {
  LEAKAGE_FRACTION,
  type ValveCharacteristic,
  type ValveElement,
} from "./component-elements.js";
import { connectionStates } from "./connection-states.js";
import { regularisedRoot, regularisedRootSlope } from "./small-difference.js";

/**
 * Flow area per unit Kv [m2 per m3/h]: a valve of flow coefficient Kv passes
 * m = (Kv / 36000) sqrt(rho dp) [kg/s] of an incompressible fluid.
 *
 * From the definition of Kv: the flow Q [m3/h] of water (rho0 = 1000 kg/m3) at dp0 = 1 bar, with
 * Q = Kv sqrt((dp / dp0) (rho0 / rho)), so m = rho Q / 3600 = Kv sqrt(rho0 / dp0) sqrt(rho dp) /
 * 3600 = Kv sqrt(rho dp) / 36000. In the standard's units (W in kg/h, p in kPa) this is its
 * constant N6 = 3600 sqrt(1000) / 36000 = 3.162, printed as 3.16 in IEC 60534-2-1 Table 1.
 */
export const FLOW_AREA_PER_KV = 1 / 36000;

/** IEC 60534-2-1 Table 1 numerical constants for Kv and diameters in mm (via fluids 1.0.22). */
const N2 = 1.6e-3;
const N5 = 1.8e-3;

/**
 * Relative flow coefficient Kv(h) / Kv(1) of a valve trim at relative travel h (its inherent
 * characteristic).
 *
 * linear: h; equal percentage: R^(h - 1), with the rangeability R = Kv(1) / Kv(0+).
 *
 * @param opening - relative travel h [-], 0 to 1
 * @param characteristic - "linear" or "equal-percentage"
 * @param rangeability - R [-], > 1 (equal percentage only)
 * @returns Kv(h) / Kv(1) [-]; 0 at h = 0 for both (a shut valve)
 * @remarks Ideal inherent characteristics, IEC 60534-2-4 (Inherent flow characteristics and
 *   rangeability). The equal-percentage curve ends at 1/R near h = 0 where a real trim leaves it;
 *   a shut valve (h = 0) passes only the leakage. Real trims deviate from these curves: give the
 *   manufacturer's Kv at the travel in question where it matters.
 * @example valveCharacteristicRatio(0.5, "equal-percentage", 50) // 0.1414213562 (checked in
 *   test/physics/components/examples.test.ts)
 */
export function valveCharacteristicRatio(
  opening: number,
  characteristic: ValveCharacteristic,
  rangeability: number,
): number {
  if (opening <= 0) return 0;
  if (characteristic === "linear") return Math.min(opening, 1);
  return rangeability ** (Math.min(opening, 1) - 1);
}

/**
 * Piping geometry factor Fp of a valve fitted between reducers, IEC 60534-2-1 eq. (for Kv, d in
 * mm):
 *
 * Fp = 1 / sqrt(1 + (sum K / N2) (C / d^2)^2), N2 = 1.6e-3,
 * sum K = K1 + K2 + KB1 - KB2, K1 = 0.5 (1 - (d/D1)^2)^2, K2 = (1 - (d/D2)^2)^2,
 * KB = 1 - (d/D)^4.
 *
 * @param flowCoefficient - C = Kv at the operating travel [m3/h]
 * @param valveDiameter - d [m]; NaN: no reducers (Fp = 1)
 * @param inletPipeDiameter - D1 [m]; NaN: no inlet reducer
 * @param outletPipeDiameter - D2 [m]; NaN: no outlet reducer
 * @returns Fp [-], <= 1 for reducers around a smaller valve
 * @remarks Source: IEC 60534-2-1:2011 (= ANSI/ISA-75.01.01-2007), sections on the piping geometry
 *   factor; constants as in python3-fluids 1.0.22 (control_valve.py, loss_coefficient_piping).
 * @example pipingGeometryFactor(70.889, 0.05, 0.08, 0.1) // 0.86688, IEC 60534-2-1 Example 3 at
 *   its converged Kv (checked against fluids' constants in test/physics/components/valve.test.ts)
 */
export function pipingGeometryFactor(
  flowCoefficient: number,
  valveDiameter: number,
  inletPipeDiameter: number,
  outletPipeDiameter: number,
): number {
  const loss = reducerLoss(valveDiameter, inletPipeDiameter, outletPipeDiameter);
  if (loss === 0) return 1;
  const d = valveDiameter * 1000;
  const relative = flowCoefficient / (d * d);
  return 1 / Math.sqrt(1 + (loss / N2) * relative * relative);
}

/**
 * Pressure differential ratio factor xTP of a valve with reducers, IEC 60534-2-1:
 *
 * xTP = (xT / Fp^2) / (1 + xT Ki (C / d^2)^2 / N5), Ki = K1 + KB1, N5 = 1.8e-3 (Kv, d in mm).
 *
 * @param pressureDifferentialRatioFactor - xT of the valve alone [-]
 * @param flowCoefficient - C = Kv at the operating travel [m3/h]
 * @param pipingFactor - Fp [-] ({@link pipingGeometryFactor})
 * @param valveDiameter - d [m]; NaN: no reducers (xTP = xT)
 * @param inletPipeDiameter - D1 [m]; NaN: no inlet reducer
 * @returns xTP [-]
 * @remarks Source: IEC 60534-2-1:2011; as in python3-fluids 1.0.22 size_control_valve_g.
 * @example pressureDifferentialRatioFactorWithFittings(0.6, 70.889, 0.86688, 0.05, 0.08)
 *   // 0.62529 (IEC 60534-2-1 Example 3; checked in test/physics/components/valve.test.ts)
 */
export function pressureDifferentialRatioFactorWithFittings(
  pressureDifferentialRatioFactor: number,
  flowCoefficient: number,
  pipingFactor: number,
  valveDiameter: number,
  inletPipeDiameter: number,
): number {
  const upstreamLoss = reducerLoss(valveDiameter, inletPipeDiameter, Number.NaN);
  const xT = pressureDifferentialRatioFactor;
  if (Number.isNaN(valveDiameter)) return xT;
  const d = valveDiameter * 1000;
  const relative = flowCoefficient / (d * d);
  return xT / (pipingFactor * pipingFactor) / (1 + (xT * upstreamLoss * relative * relative) / N5);
}

/** Sum of the reducer loss coefficients of IEC 60534-2-1 (K1 + K2 + KB1 - KB2), 0 if none. */
function reducerLoss(valve: number, inlet: number, outlet: number): number {
  if (Number.isNaN(valve)) return 0;
  let loss = 0;
  if (!Number.isNaN(inlet)) {
    const ratio = (valve / inlet) ** 2;
    loss += 0.5 * (1 - ratio) ** 2 + (1 - ratio * ratio);
  }
  if (!Number.isNaN(outlet)) {
    const ratio = (valve / outlet) ** 2;
    loss += (1 - ratio) ** 2 - (1 - ratio * ratio);
  }
  return loss;
}

/**
 * Expansion factor Y of gas flow through a valve, IEC 60534-2-1:
 *
 * Y = 1 - x / (3 Fgamma xTP), Fgamma = gamma / 1.40, x = dp / p1, with x limited to Fgamma xTP
 * (choked flow), where Y = 2/3.
 *
 * @param pressureDifferentialRatio - x = (p1 - p2) / p1 [-]
 * @param gamma - heat capacity ratio [-]
 * @param pressureDifferentialRatioFactor - xTP (xT without reducers) [-]
 * @returns Y [-], 2/3 to 1
 * @remarks Fgamma scales the choke point from air to another gas. Source: IEC 60534-2-1:2011;
 *   fluids 1.0.22 size_control_valve_g. Y falls linearly so that W ~ Y sqrt(x) peaks with zero
 *   slope exactly at x = Fgamma xTP: the flow is smooth through the choke point.
 * @example valveExpansionFactor(0.5, 1.4, 0.7) // 0.7619047619 (checked in
 *   test/physics/components/examples.test.ts)
 */
export function valveExpansionFactor(
  pressureDifferentialRatio: number,
  gamma: number,
  pressureDifferentialRatioFactor: number,
): number {
  const chokedRatio = (gamma / 1.4) * pressureDifferentialRatioFactor;
  return 1 - Math.min(pressureDifferentialRatio, chokedRatio) / (3 * chokedRatio);
}

/**
 * Mass flow of a gas through a valve, IEC 60534-2-1 (turbulent):
 *
 * W = N6 Fp C Y sqrt(x p1 rho1), x limited to Fgamma xTP (choked flow),
 * here in SI as m = Fp Kv / 36000 Y sqrt(x p1 rho1) [kg/s] ({@link FLOW_AREA_PER_KV}).
 *
 * @param flowCoefficient - Kv at the operating travel [m3/h]
 * @param pipingFactor - Fp [-] (1 without reducers)
 * @param pressureDifferentialRatioFactor - xTP (xT without reducers) [-]
 * @param gamma - heat capacity ratio of the gas [-]
 * @param inletPressure - p1, absolute [Pa]
 * @param inletDensity - rho1 at p1 and T1 [kg/m3] (p1 M / (Z R T1) for a real gas)
 * @param outletPressure - p2, absolute [Pa], <= p1
 * @returns m [kg/s]
 * @remarks Source: IEC 60534-2-1:2011 (= ANSI/ISA-75.01.01-2007), the gas sizing equations
 *   without (Fp = 1) and with attached fittings; the standard's Example 3 is reproduced in the
 *   test, against python3-fluids 1.0.22 size_control_valve_g.
 * @example valveGasMassFlow(100, 1, 0.7, 1.4, 7e5, 8.3, 5e5) // 3.0920 kg/s (checked in
 *   test/physics/components/examples.test.ts)
 */
export function valveGasMassFlow(
  flowCoefficient: number,
  pipingFactor: number,
  pressureDifferentialRatioFactor: number,
  gamma: number,
  inletPressure: number,
  inletDensity: number,
  outletPressure: number,
): number {
  const chokedRatio = (gamma / 1.4) * pressureDifferentialRatioFactor;
  const ratio = Math.min((inletPressure - outletPressure) / inletPressure, chokedRatio);
  const expansion = 1 - ratio / (3 * chokedRatio);
  return (
    pipingFactor *
    flowCoefficient *
    FLOW_AREA_PER_KV *
    expansion *
    Math.sqrt(ratio * inletPressure * inletDensity)
  );
}

/**
 * The trim relation of a valve-like element between node states, into `out`: mass flow and its
 * derivatives, choke flag and capacity, for the effective coefficient Fp Kv [m3/h] and xTP.
 * m = Fp Kv / 36000 p1 / sqrt(R T1) Y(x) s(x), with s the regularised square root.
 */
export function evaluateTrim(
  coefficient: number,
  pressureDifferentialRatioFactor: number,
  gas: PipeGas,
  p1: number,
  t1: number,
  p2: number,
  out: PipeFlowEvaluation,
): void {
  const gamma = gas.heatCapacityRatio;
  const scale = (coefficient * FLOW_AREA_PER_KV * p1) / Math.sqrt(gas.specificGasConstant * t1);
  const choke = (gamma / 1.4) * pressureDifferentialRatioFactor; // Fgamma xTP
  const reachable = Math.min(choke, 1); // x cannot exceed 1 (p2 = 0)
  const largest = (1 - reachable / (3 * choke)) * regularisedRoot(reachable);
  const ratio = Math.max((p1 - p2) / p1, 0);
  let value: number;
  let slope: number;
  if (ratio >= choke) {
    value = largest;
    slope = 0;
    out.choked = true;
  } else {
    const expansion = 1 - ratio / (3 * choke);
    const root = regularisedRoot(ratio);
    value = expansion * root;
    slope = expansion * regularisedRootSlope(ratio) - root / (3 * choke);
    out.choked = false;
  }
  out.massFlow = scale * value;
  out.dMassFlowdUpstreamPressure = out.massFlow / p1 + (scale * slope * p2) / (p1 * p1);
  out.dMassFlowdUpstreamTemperature = -out.massFlow / (2 * t1);
  out.dMassFlowdDownstreamPressure = out.choked ? 0 : (-scale * slope) / p1;
  out.capacity = scale * largest;
  out.capacityKnown = true;
}

/**
 * Adds the leakage of a closed element to `out`: a linear (laminar-like) seat leakage
 * m = LEAKAGE_FRACTION (Kv / 36000) (p1 - p2) / sqrt(R T1), i.e. 1e-12 of the flow the open
 * trim would pass at x = 1, scaled by x. Linear, so its slope never vanishes and a junction that only a
 * closed element joins to the network settles in one Newton step.
 */
export function addLeakage(
  coefficient: number,
  gas: PipeGas,
  p1: number,
  t1: number,
  p2: number,
  out: PipeFlowEvaluation,
): void {
  const conductance =
    (LEAKAGE_FRACTION * coefficient * FLOW_AREA_PER_KV) / Math.sqrt(gas.specificGasConstant * t1);
  const value = conductance * Math.max(p1 - p2, 0);
  out.massFlow += value;
  out.dMassFlowdUpstreamPressure += conductance;
  out.dMassFlowdUpstreamTemperature += -value / (2 * t1);
  out.dMassFlowdDownstreamPressure += -conductance;
}

/** Zero flow, to which a leakage is added. */
export function clearFlow(out: PipeFlowEvaluation): void {
  out.massFlow = 0;
  out.dMassFlowdUpstreamPressure = 0;
  out.dMassFlowdUpstreamTemperature = 0;
  out.dMassFlowdDownstreamPressure = 0;
  out.choked = false;
}

/** Effective Fp Kv and xTP of a valve at its travel, for flow in the given direction. */
export function valveTrim(
  valve: ValveElement,
  forward: boolean,
): { coefficient: number; pipingFactor: number; pressureDifferentialRatioFactor: number } {
  const flowCoefficient =
    valve.flowCoefficient *
    valveCharacteristicRatio(valve.opening, valve.characteristic, valve.rangeability);
  const inlet = forward ? valve.inletPipeDiameter : valve.outletPipeDiameter;
  const outlet = forward ? valve.outletPipeDiameter : valve.inletPipeDiameter;
  const pipingFactor =
    flowCoefficient > 0
      ? pipingGeometryFactor(flowCoefficient, valve.valveDiameter, inlet, outlet)
      : 1;
  const pressureDifferentialRatioFactor =
    flowCoefficient > 0
      ? pressureDifferentialRatioFactorWithFittings(
          valve.pressureDifferentialRatioFactor,
          flowCoefficient,
          pipingFactor,
          valve.valveDiameter,
          inlet,
        )
      : valve.pressureDifferentialRatioFactor;
  return {
    coefficient: pipingFactor * flowCoefficient,
    pipingFactor,
    pressureDifferentialRatioFactor,
  };
}

/**
 * A control valve as a network edge: flow from the upstream node (p1 = p0, T1 = T0: gas at rest
 * in the node) to the downstream node at p2 = pd, either way through the valve. A shut valve
 * (opening 0) passes only its leakage.
 */
export function evaluateValveFlow(
  valve: ValveElement,
  gas: PipeGas,
  upstreamPressure: number,
  upstreamTemperature: number,
  downstreamPressure: number,
  forward: boolean,
  out: PipeFlowEvaluation,
  needEndStates: boolean,
): void {
  const trim = valveTrim(valve, forward);
  if (trim.coefficient > 0) {
    evaluateTrim(
      trim.coefficient,
      trim.pressureDifferentialRatioFactor,
      gas,
      upstreamPressure,
      upstreamTemperature,
      downstreamPressure,
      out,
    );
  } else {
    clearFlow(out);
    addLeakage(
      valve.flowCoefficient,
      gas,
      upstreamPressure,
      upstreamTemperature,
      downstreamPressure,
      out,
    );
    // Its largest flow: the leakage into a vacuum (x = 1).
    out.capacity =
      (LEAKAGE_FRACTION * valve.flowCoefficient * FLOW_AREA_PER_KV * upstreamPressure) /
      Math.sqrt(gas.specificGasConstant * upstreamTemperature);
    out.capacityKnown = true;
  }
  connectionStates(
    gas,
    upstreamPressure,
    upstreamTemperature,
    downstreamPressure,
    forward ? valve.inletPipeDiameter : valve.outletPipeDiameter,
    forward ? valve.outletPipeDiameter : valve.inletPipeDiameter,
    forward ? valve.inletPipeDiameter : valve.outletPipeDiameter,
    out,
    needEndStates,
  );
}
