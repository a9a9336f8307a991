/**
 * One entry for every component kind: the flow for given end states (the solver's evaluation),
 * the p-squared resistance of the first guess, and the kind-specific figures of the results.
 */
import { isPerfectGas } from "../../gas/thermo.js";
import { criticalPressureRatio } from "../isentropic.js";
import type { PipeFlowEvaluation, PipeGas } from "../pipe-flow.js";
import { type ComponentElement, LEAKAGE_FRACTION } from "./component-elements.js";
import { evaluateNozzleFlow, nozzleCriticalPressureRatio, nozzleExpansibility } from "./nozzle.js";
import { evaluateOrificeFlow, orificeExpansibility } from "./orifice.js";
import { evaluateRealGasComponent, isentropicExponent } from "./real-gas-component.js";
import {
  evaluateCheckValveFlow,
  evaluateRegulatorFlow,
  type RegulatorState,
  regulatorOpening,
  regulatorState,
} from "./regulator.js";
import { diameterRatio, pressureLossRatio } from "./restriction.js";
import {
  evaluateValveFlow,
  FLOW_AREA_PER_KV,
  valveCharacteristicRatio,
  valveExpansionFactor,
  valveTrim,
} from "./valve.js";

/**
 * Flow through a component from its upstream node (p0, T0) to its downstream node at pd <= p0,
 * into `out` (the same fields as a pipe's evaluation). With cp(T) or a real gas, the standards'
 * real-gas forms (src/physics/components/real-gas-component.ts).
 *
 * @param forward - true when the upstream node is the edge's declared `from` node
 * @param needEndStates - also the Mach numbers in the connecting pipes (results need them)
 */
export function evaluateComponentFlow(
  element: ComponentElement,
  gas: PipeGas,
  upstreamPressure: number,
  upstreamTemperature: number,
  downstreamPressure: number,
  forward: boolean,
  out: PipeFlowEvaluation,
  needEndStates: boolean,
): PipeFlowEvaluation {
  if (isPerfectGas(gas.gas)) {
    evaluatePerfectGasComponentFlow(
      element,
      gas,
      upstreamPressure,
      upstreamTemperature,
      downstreamPressure,
      forward,
      out,
      needEndStates,
    );
  } else {
    evaluateRealGasComponent(
      element,
      gas,
      upstreamPressure,
      upstreamTemperature,
      downstreamPressure,
      forward,
      out,
      needEndStates,
      evaluatePerfectGasComponentFlow,
    );
  }
  return out;
}

/** The perfect-gas forms of every kind, with R and gamma from `gas`. */
function evaluatePerfectGasComponentFlow(
  element: ComponentElement,
  gas: PipeGas,
  upstreamPressure: number,
  upstreamTemperature: number,
  downstreamPressure: number,
  forward: boolean,
  out: PipeFlowEvaluation,
  needEndStates: boolean,
): void {
  const p0 = upstreamPressure;
  const t0 = upstreamTemperature;
  const pd = downstreamPressure;
  switch (element.kind) {
    case "orifice":
      evaluateOrificeFlow(element, gas, p0, t0, pd, out, needEndStates);
      break;
    case "nozzle":
      evaluateNozzleFlow(element, gas, p0, t0, pd, out, needEndStates);
      break;
    case "valve":
      evaluateValveFlow(element, gas, p0, t0, pd, forward, out, needEndStates);
      break;
    case "regulator":
      evaluateRegulatorFlow(element, gas, p0, t0, pd, forward, out, needEndStates);
      break;
    case "check":
      evaluateCheckValveFlow(element, gas, p0, t0, pd, forward, out, needEndStates);
      break;
  }
}

/**
 * Resistance k of the p-squared law p_u^2 - p_d^2 = k m |m| for the first guess, from the
 * component's small-difference (incompressible) relation with R T = `gasConstantTimesTemperature`
 * [J/kg]: a valve m = A sqrt(rho dp) gives k = 2 R T / A^2; an orifice or nozzle
 * m = K sqrt(2 rho dp_tap) with dp = L dp_tap gives k = R T L / K^2. A regulator counts wide open.
 */
export function componentSquaredLawResistance(
  element: ComponentElement,
  gasConstantTimesTemperature: number,
): number {
  const rt = gasConstantTimesTemperature;
  switch (element.kind) {
    case "orifice":
    case "nozzle": {
      const beta = diameterRatio(element);
      const k =
        (element.dischargeCoefficient * 0.25 * Math.PI * element.boreDiameter ** 2) /
        Math.sqrt(1 - beta ** 4);
      return (rt * pressureLossRatio(beta, element.dischargeCoefficient)) / (k * k);
    }
    case "valve": {
      const trim = valveTrim(element, true);
      const area =
        (trim.coefficient > 0 ? trim.coefficient : LEAKAGE_FRACTION * element.flowCoefficient) *
        FLOW_AREA_PER_KV;
      return (2 * rt) / (area * area);
    }
    case "regulator":
    case "check": {
      const area = element.flowCoefficient * FLOW_AREA_PER_KV;
      return (2 * rt) / (area * area);
    }
  }
}

/** Figures of an orifice plate or nozzle at its present state. */
export interface RestrictionDetails {
  kind: "orifice" | "nozzle";
  /** d / D [-] (0 between plenums). */
  diameterRatio: number;
  dischargeCoefficient: number;
  /** Downstream-to-upstream pressure ratio at the device's taps [-]. */
  pressureRatio: number;
  /** The tap pressure ratio at which it chokes [-]. */
  criticalPressureRatio: number;
  /** Differential pressure between the taps [Pa]. */
  differentialPressure: number;
  /** Pressure lost from the upstream to the downstream node [Pa] (recovered pressure). */
  permanentPressureLoss: number;
  /** Expansibility factor epsilon at the tap ratio [-]. */
  expansibility: number;
}

/** Figures of a control valve. */
export interface ValveDetails {
  kind: "valve";
  /** "shut" at opening 0 (leakage only). */
  state: "open" | "shut";
  opening: number;
  /** Kv at this opening [m3/h]. */
  flowCoefficient: number;
  /** Fp [-]. */
  pipingGeometryFactor: number;
  /** x = dp / p1 between the nodes [-]. */
  pressureDifferentialRatio: number;
  /** Fgamma xTP: x at which it chokes [-]. */
  chokedPressureDifferentialRatio: number;
  /** Y [-]. */
  expansionFactor: number;
  /** Part of the flow that is seat leakage [kg/s] (0 unless shut). */
  leakage: number;
}

/** Figures of a regulator. */
export interface RegulatorDetails {
  kind: "regulator";
  state: RegulatorState;
  /** [Pa] */
  setpoint: number;
  /** Downstream node pressure minus the setpoint [Pa]; within one proportional band below 0
   * while regulating. */
  setpointDeviation: number;
  /** Kv over the wide-open Kv [-]. */
  opening: number;
  pressureDifferentialRatio: number;
  chokedPressureDifferentialRatio: number;
  expansionFactor: number;
  /** Part of the flow that is seat leakage [kg/s]. */
  leakage: number;
}

/** Figures of a check valve. */
export interface CheckValveDetails {
  kind: "check";
  state: "open" | "closed";
  pressureDifferentialRatio: number;
  chokedPressureDifferentialRatio: number;
  expansionFactor: number;
  /** Flow through the closed valve (its leakage) [kg/s]; 0 when open. */
  leakage: number;
}

/** Kind-specific figures of a component in the results. */
export type ComponentDetails =
  | RestrictionDetails
  | ValveDetails
  | RegulatorDetails
  | CheckValveDetails;

/**
 * The figures a component reports, at the node states of an evaluation already made (`evaluation`
 * holds its mass flow). `upstreamTemperature` [K] is needed with cp(T) or a real gas (the
 * isentropic exponent at the upstream state).
 */
export function componentDetails(
  element: ComponentElement,
  gas: PipeGas,
  upstreamPressure: number,
  downstreamPressure: number,
  forward: boolean,
  evaluation: PipeFlowEvaluation,
  upstreamTemperature = Number.NaN,
): ComponentDetails {
  // The isentropic exponent at the upstream state (gamma of a perfect gas), as the flow used;
  // with cp(T) or a real gas it needs the upstream temperature.
  const gamma =
    isPerfectGas(gas.gas) || Number.isNaN(upstreamTemperature)
      ? gas.heatCapacityRatio
      : isentropicExponent(gas, upstreamPressure, upstreamTemperature);
  const p1 = upstreamPressure;
  const x = Math.max((p1 - downstreamPressure) / p1, 0);
  switch (element.kind) {
    case "orifice":
    case "nozzle": {
      const beta = diameterRatio(element);
      const lossRatio = pressureLossRatio(beta, element.dischargeCoefficient);
      const critical =
        element.kind === "orifice"
          ? criticalPressureRatio(gamma)
          : nozzleCriticalPressureRatio(beta, gamma);
      const ratio = Math.max(1 - x / lossRatio, critical);
      const expansibility =
        ratio >= 1
          ? 1
          : element.kind === "orifice"
            ? orificeExpansibility(beta, ratio, gamma)
            : nozzleExpansibility(beta, ratio, gamma);
      return {
        kind: element.kind,
        diameterRatio: beta,
        dischargeCoefficient: element.dischargeCoefficient,
        pressureRatio: ratio,
        criticalPressureRatio: critical,
        differentialPressure: (1 - ratio) * p1,
        permanentPressureLoss: p1 - downstreamPressure,
        expansibility,
      };
    }
    case "valve": {
      const trim = valveTrim(element, forward);
      const choke = (gamma / 1.4) * trim.pressureDifferentialRatioFactor;
      const ratio =
        element.flowCoefficient *
        valveCharacteristicRatio(element.opening, element.characteristic, element.rangeability);
      const shut = !(trim.coefficient > 0);
      return {
        kind: "valve",
        state: shut ? "shut" : "open",
        opening: element.opening,
        flowCoefficient: ratio,
        pipingGeometryFactor: trim.pipingFactor,
        pressureDifferentialRatio: x,
        chokedPressureDifferentialRatio: choke,
        expansionFactor: valveExpansionFactor(x, gamma, trim.pressureDifferentialRatioFactor),
        leakage: shut ? evaluation.massFlow : 0,
      };
    }
    case "regulator": {
      const opening = forward
        ? regulatorOpening(downstreamPressure, element.setpoint, element.proportionalBand)
        : 0;
      const state = regulatorState(forward, opening);
      const xT = element.pressureDifferentialRatioFactor;
      // Open, the seat leakage (1e-12 of the flow scale) is not split off; closed, it is all the flow.
      const leakage = state === "closed" ? evaluation.massFlow : 0;
      return {
        kind: "regulator",
        state,
        setpoint: element.setpoint,
        setpointDeviation: (forward ? downstreamPressure : p1) - element.setpoint,
        opening,
        pressureDifferentialRatio: x,
        chokedPressureDifferentialRatio: (gamma / 1.4) * xT,
        expansionFactor: valveExpansionFactor(x, gamma, xT),
        leakage,
      };
    }
    case "check": {
      const xT = element.pressureDifferentialRatioFactor;
      return {
        kind: "check",
        state: forward ? "open" : "closed",
        pressureDifferentialRatio: x,
        chokedPressureDifferentialRatio: (gamma / 1.4) * xT,
        expansionFactor: valveExpansionFactor(x, gamma, xT),
        leakage: forward ? 0 : evaluation.massFlow,
      };
    }
  }
}
