/**
 * Components (orifice, nozzle, valve, regulator, check valve) with cp(T) or a real gas: the
 * standards' own real-gas forms, around the perfect-gas evaluation of each kind
 * (docs/model.md, "Components with cp(T) and a real gas").
 * @module
 */
import { gasState, type ThermoState, temperatureFromEnthalpy } from "../../gas/thermo.js";
import { PipeFlowEvaluation, type PipeGas } from "../pipe-flow.js";
import { realGasScratchOf } from "../real-gas-pipe.js";
import type { ComponentElement } from "./component-elements.js";

/** A component's evaluation in its perfect-gas form (R and gamma from `gas`). */
export type PerfectGasComponentFlow = (
  element: ComponentElement,
  gas: PipeGas,
  upstreamPressure: number,
  upstreamTemperature: number,
  downstreamPressure: number,
  forward: boolean,
  out: PipeFlowEvaluation,
  needEndStates: boolean,
) => void;

/** Relative step of the central differences in the isentropic exponent and the state. */
const EXPONENT_STEP = 1e-6;

/** Work space of a component with a real gas: the gas record of the perfect-gas forms, a probe. */
class ComponentGasScratch {
  readonly gas: PipeGas;
  readonly probe = new PipeFlowEvaluation();
  constructor(gas: PipeGas) {
    this.gas = { ...gas };
  }
}

/**
 * The isentropic exponent kappa = rho a^2 / p = -(v/p) (dp/dv)_s of the gas at (p, T) [-]:
 * gamma for a perfect gas, cp/cv(T) for an ideal gas with cp(T), and for a real gas the
 * exponent of the isentrope p v^kappa = const through the state.
 */
export function isentropicExponent(gas: PipeGas, pressure: number, temperature: number): number {
  return exponentOf(gasState(gas.gas, pressure, temperature), pressure);
}

/** kappa = rho a^2 / p of a state at pressure p [-]. */
function exponentOf(state: ThermoState, pressure: number): number {
  return (state.density * state.soundSpeed * state.soundSpeed) / pressure;
}

/**
 * A component with cp(T) or a real gas, from its upstream node (p1, T1) to pd, into `out`.
 *
 * ISO 5167-1:2003 writes the flow with the upstream density rho1 and the isentropic exponent
 * kappa of the gas at the upstream tap, and IEC 60534-2-1:2011 its gas equations with
 * rho1 = p1 M / (Z Ru T1) (or Z in the p1/(Z T1) forms) and Fgamma = kappa / 1.40. So each
 * perfect-gas form is evaluated with R replaced by Z R = p1 / (rho1 T1) and gamma by
 * kappa = rho1 a1^2 / p1, both at the upstream state from src/gas/thermo.ts: the flow scale
 * p1 / (Z R T1)^0.5 = (p1 rho1)^0.5, the expansibility, expansion factor and critical ratios
 * with kappa. Derivatives: those of the perfect form at fixed Z R and kappa, plus
 * -m/2 d ln(Z R) (exact: every form is proportional to (Z R T1)^-0.5) and dm/d kappa d kappa
 * (dm/d kappa and d kappa/dp1, d kappa/dT1 by central differences, relative step 1e-6).
 *
 * Energy: the component is adiabatic and does no work, so the stagnation enthalpy passes,
 * h(pd, T_arrive) = h(p1, T1) with the departure enthalpy: a throttle in a dense gas cools it
 * (Joule-Thomson). dT_arrive = ((dh/dp)_T,1 dp1 + cp1 dT1 - (dh/dp)_T,d dpd) / cp_d. With an
 * ideal gas (no equation of state) h does not depend on p and T_arrive = T1 exactly.
 * The static temperatures in the connecting pipes (reported end states) are T0 / (1 +
 * (kappa - 1)/2 M^2) with the upstream kappa.
 *
 * @remarks Sources: ISO 5167-1:2003 sec. 5 (rho1 and kappa at the upstream tap), ISO 5167-2
 *   and -3 (expansibility with kappa); IEC 60534-2-1:2011 (gas equations with Z and
 *   Fgamma = gamma/1.40, gamma the isentropic exponent); the isenthalpic throttle, e.g. Y. A.
 *   Cengel and M. A. Boles, Thermodynamics: An Engineering Approach, ch. "Throttling valves"
 *   and "The Joule-Thomson coefficient". Range: the standards' (kappa of real gases between
 *   about 1.1 and 1.7); the gas must stay a gas (the results warn of a condensing state).
 */
export function evaluateRealGasComponent(
  element: ComponentElement,
  gas: PipeGas,
  upstreamPressure: number,
  upstreamTemperature: number,
  downstreamPressure: number,
  forward: boolean,
  out: PipeFlowEvaluation,
  needEndStates: boolean,
  perfectFlow: PerfectGasComponentFlow,
): void {
  const p1 = upstreamPressure;
  const t1 = upstreamTemperature;
  const pd = downstreamPressure;
  const thermoGas = gas.gas;
  const scratch = realGasScratchOf(out);
  if (scratch.component === undefined) scratch.component = new ComponentGasScratch(gas);
  const work = scratch.component as ComponentGasScratch;
  const eos = scratch.equationOfState;
  const s = gasState(thermoGas, p1, t1, scratch.inlet, eos);
  const rho = s.density;
  const gasConstant = p1 / (rho * t1); // Z R
  const kappa = exponentOf(s, p1);
  const logGasConstantP = 1 / p1 - s.densityPressureSlope / rho;
  const logGasConstantT = -1 / t1 - s.densityTemperatureSlope / rho;
  const enthalpy = s.enthalpy;
  const enthalpyP = s.enthalpyPressureSlope;
  const cp1 = s.specificHeatCp;
  const node = scratch.node;
  const dp = EXPONENT_STEP * p1;
  const dt = EXPONENT_STEP * t1;
  const kappaP =
    (exponentOf(gasState(thermoGas, p1 + dp, t1, node, eos), p1 + dp) -
      exponentOf(gasState(thermoGas, p1 - dp, t1, node, eos), p1 - dp)) /
    (2 * dp);
  const kappaT =
    (exponentOf(gasState(thermoGas, p1, t1 + dt, node, eos), p1) -
      exponentOf(gasState(thermoGas, p1, t1 - dt, node, eos), p1)) /
    (2 * dt);

  const local = work.gas;
  local.specificGasConstant = gasConstant;
  local.viscosity = gas.viscosity;
  local.gas = thermoGas;
  const dk = EXPONENT_STEP * kappa;
  local.heatCapacityRatio = kappa + dk;
  perfectFlow(element, local, p1, t1, pd, forward, work.probe, false);
  const flowPlus = work.probe.massFlow;
  local.heatCapacityRatio = kappa - dk;
  perfectFlow(element, local, p1, t1, pd, forward, work.probe, false);
  const flowMinus = work.probe.massFlow;
  local.heatCapacityRatio = kappa;
  perfectFlow(element, local, p1, t1, pd, forward, out, needEndStates);
  const flowPerKappa = (flowPlus - flowMinus) / (2 * dk);
  const m = out.massFlow;
  out.dMassFlowdUpstreamPressure += -0.5 * m * logGasConstantP + flowPerKappa * kappaP;
  out.dMassFlowdUpstreamTemperature += -0.5 * m * logGasConstantT + flowPerKappa * kappaT;

  if (thermoGas.equationOfState !== undefined) {
    const arrival = temperatureFromEnthalpy(thermoGas, enthalpy, pd, scratch.exit, eos);
    const d = gasState(thermoGas, pd, arrival, scratch.exit, eos);
    out.arrivalTemperature = arrival;
    out.dArrivalTemperaturedUpstreamPressure = enthalpyP / d.specificHeatCp;
    out.dArrivalTemperaturedUpstreamTemperature = cp1 / d.specificHeatCp;
    out.dArrivalTemperaturedDownstreamPressure = -d.enthalpyPressureSlope / d.specificHeatCp;
  }
  const half = 0.5 * (kappa - 1);
  out.inletTemperature = t1 / (1 + half * out.inletMach * out.inletMach);
  out.outletTemperature = out.arrivalTemperature / (1 + half * out.outletMach * out.outletMach);
}
