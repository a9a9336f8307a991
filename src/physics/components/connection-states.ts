/**
 * The gas in the pipes joined to a component, for its reported inlet and outlet states, and the
 * energy balance of a component (adiabatic: the stagnation temperature passes unchanged).
 */
import {
  isentropicPressureRatio,
  machFromMassFluxParameter,
  maxMassFluxParameter,
} from "../isentropic.js";
import type { PipeFlowEvaluation, PipeGas } from "../pipe-flow.js";

/**
 * Fill the end states, Reynolds number and arrival temperature of a component evaluation whose
 * mass flow is already in `out`.
 *
 * Each end is the gas in the connecting pipe: the stagnation state of the node there (gas at rest
 * in the node; the component is adiabatic, so T0 is the upstream node's at both ends) accelerated
 * isentropically to the pipe's mass flux. Without a pipe diameter (NaN) the end is a plenum: Mach
 * 0 at the node pressure. A flux above the pipe's sonic flux is reported as Mach 1 (the connecting
 * pipe itself would choke: check its size). The arrival temperature is T0.
 *
 * @param upstreamPressure - p0 of the upstream node [Pa]
 * @param upstreamTemperature - T0 of the upstream node [K]
 * @param downstreamPressure - pressure of the downstream node [Pa]
 * @param upstreamDiameter - inside diameter of the pipe upstream [m], or NaN
 * @param downstreamDiameter - inside diameter of the pipe downstream [m], or NaN
 * @param reynoldsDiameter - diameter for the reported Reynolds number 4 m / (pi D mu(T0)) [m]
 * @param needEndStates - false: skip the Mach numbers (Newton iterations do not use them)
 */
export function connectionStates(
  gas: PipeGas,
  upstreamPressure: number,
  upstreamTemperature: number,
  downstreamPressure: number,
  upstreamDiameter: number,
  downstreamDiameter: number,
  reynoldsDiameter: number,
  out: PipeFlowEvaluation,
  needEndStates: boolean,
): void {
  out.arrivalTemperature = upstreamTemperature;
  out.dArrivalTemperaturedUpstreamPressure = 0;
  out.dArrivalTemperaturedUpstreamTemperature = 1;
  out.dArrivalTemperaturedDownstreamPressure = 0;
  out.frictionFactor = 0;
  out.inletPressure = upstreamPressure;
  out.outletPressure = downstreamPressure;
  out.inletMach = 0;
  out.outletMach = 0;
  out.reynolds = 0;
  if (!needEndStates) return;
  const gamma = gas.heatCapacityRatio;
  const sqrtRT = Math.sqrt(gas.specificGasConstant * upstreamTemperature);
  const maximum = maxMassFluxParameter(gamma);
  const machAt = (diameter: number, stagnationPressure: number): number => {
    if (Number.isNaN(diameter) || out.massFlow <= 0) return 0;
    const flux = out.massFlow / (0.25 * Math.PI * diameter * diameter);
    const parameter = Math.min((flux * sqrtRT) / stagnationPressure, maximum);
    return machFromMassFluxParameter(parameter, gamma, "subsonic");
  };
  out.inletMach = machAt(upstreamDiameter, upstreamPressure);
  out.outletMach = machAt(downstreamDiameter, downstreamPressure);
  out.inletPressure = upstreamPressure * isentropicPressureRatio(out.inletMach, gamma);
  out.outletPressure = downstreamPressure * isentropicPressureRatio(out.outletMach, gamma);
  if (!Number.isNaN(reynoldsDiameter) && out.massFlow > 0) {
    out.reynolds =
      (4 * out.massFlow) / (Math.PI * reynoldsDiameter * gas.viscosity(upstreamTemperature));
  }
}
