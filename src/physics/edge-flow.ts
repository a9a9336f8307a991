/**
 * Every kind of edge the network solver knows, behind one set of functions: the flow with its
 * derivatives for given end states, the p-squared resistance for the first guess, the exit
 * pressure of a given flow for the independent check, and the end states for the results.
 *
 * A new edge kind (a component) adds its element type to {@link EdgeElement} and a branch to
 * each function here; the solver itself does not change. See DEVELOPERS.md.
 */
import type { Gas } from "../gas/gas-types.js";
import type { ComponentElement } from "./components/component-elements.js";
import {
  componentSquaredLawResistance,
  evaluateComponentFlow,
} from "./components/component-flow.js";
import { zeroFlowOutletPressure } from "./heat-transfer-pipe.js";
import { endStatesOf, outletForMassFlow, type PipeEndState } from "./pipe.js";
import {
  evaluatePipeFlow,
  type PipeFlowEvaluation,
  type PipeGas,
  type PipeGeometry,
} from "./pipe-flow.js";

/** A pipe as an edge of the network. */
export interface PipeElement extends PipeGeometry {
  kind: "pipe";
}

/** Every edge kind, as the solver sees it (SI values): a pipe or a component. */
export type EdgeElement = PipeElement | ComponentElement;

/**
 * Which way an edge flows: true when from its `from` end to its `to` end. The end at the higher
 * pressure is upstream, except on a pipe that rises or falls: there the `from` end is upstream
 * when the `to` end's pressure is below the column's zero-flow pressure (the hydrostatic head;
 * see zeroFlowOutletPressure in heat-transfer-pipe.ts, taken from the `from` end's state).
 * `pressureDifference` is pFrom - pTo, passed by the caller because the network solver knows it
 * more exactly than the difference of the two rounded pressures.
 */
export function flowsForward(
  element: EdgeElement,
  gas: PipeGas,
  pressureFrom: number,
  pressureTo: number,
  pressureDifference: number,
  temperatureFrom: number,
  scratch: PipeFlowEvaluation,
): boolean {
  if (element.kind !== "pipe" || !element.rise) return pressureDifference >= 0;
  const state = scratch.thermo;
  const zeroFlow = zeroFlowOutletPressure(
    gas.gas,
    pressureFrom,
    temperatureFrom,
    element.rise,
    element.heatTransferPerLength ?? 0,
    element.surroundingTemperature ?? temperatureFrom,
    state,
  );
  return zeroFlow >= pressureTo;
}

/**
 * Flow through an edge from its upstream end (stagnation state p0, T0) to its downstream end at
 * pressure pd <= p0, with derivatives, into `out`.
 *
 * @param forward - true when the upstream end is the edge's declared `from` node (components
 *   that pass flow one way only need it, and heat-transfer pipes for the sense of their rise)
 * @param needCapacity - also compute the capacity (the largest flow) when not near choking; for
 *   a component, also the Mach numbers in its connecting pipes (results need both, Newton
 *   iterations neither)
 * @param pressureDrop - p0 - pd [Pa], if known more exactly than the difference of the two
 *   rounded pressures (see {@link evaluatePipeFlow}); components use the pressures
 */
export function evaluateEdgeFlow(
  element: EdgeElement,
  gas: PipeGas,
  upstreamPressure: number,
  upstreamTemperature: number,
  downstreamPressure: number,
  forward: boolean,
  out: PipeFlowEvaluation,
  needCapacity: boolean,
  pressureDrop = upstreamPressure - downstreamPressure,
): PipeFlowEvaluation {
  if (element.kind !== "pipe") {
    return evaluateComponentFlow(
      element,
      gas,
      upstreamPressure,
      upstreamTemperature,
      downstreamPressure,
      forward,
      out,
      needCapacity,
    );
  }
  return evaluatePipeFlow(
    element,
    gas,
    upstreamPressure,
    upstreamTemperature,
    downstreamPressure,
    out,
    needCapacity,
    pressureDrop,
    forward,
  );
}

/**
 * Resistance k of the p-squared law p_u^2 - p_d^2 = k m |m| used by the first guess, for a gas
 * with R T = `gasConstantTimesTemperature` [J/kg] and a turbulent friction factor estimate.
 */
export function squaredLawResistance(
  element: EdgeElement,
  gasConstantTimesTemperature: number,
  turbulentFrictionFactor: (relativeRoughness: number) => number,
): number {
  if (element.kind !== "pipe") {
    return componentSquaredLawResistance(element, gasConstantTimesTemperature);
  }
  const area = 0.25 * Math.PI * element.diameter * element.diameter;
  const factor = Number.isNaN(element.fixedFrictionFactor)
    ? turbulentFrictionFactor(element.roughness / element.diameter)
    : element.fixedFrictionFactor;
  const parameter = factor * (element.length / element.diameter) + element.minorLoss + 1;
  return (gasConstantTimesTemperature * parameter) / (area * area);
}

/**
 * Exit static pressure of a given flow from an upstream plenum (the inverse relation), for the
 * independent check of a solution; +Infinity when the flow cannot pass; NaN when the element has
 * no such check (components: their relation is explicit in the node pressures, so the balance
 * check covers them). `scratch` receives the intermediate state.
 */
export function exitPressureForFlow(
  element: EdgeElement,
  gas: Gas,
  upstreamPressure: number,
  upstreamTemperature: number,
  massFlow: number,
  scratch: PipeFlowEvaluation,
  forward = true,
): number {
  if (element.kind !== "pipe") return Number.NaN;
  const passes = outletForMassFlow(
    element,
    gas,
    upstreamPressure,
    upstreamTemperature,
    massFlow,
    scratch,
    forward,
  );
  return passes ? scratch.outletPressure : Number.POSITIVE_INFINITY;
}

/** Gas states just inside the edge at its upstream and downstream ends. */
export function edgeEndStates(
  element: EdgeElement,
  gas: PipeGas,
  upstreamTemperature: number,
  evaluation: PipeFlowEvaluation,
): { inlet: PipeEndState; outlet: PipeEndState } {
  // A component's evaluation holds the states in its connecting pipes (adiabatic: T0 unchanged).
  const model = element.kind === "pipe" ? element.model : "adiabatic";
  return endStatesOf(gas, model, upstreamTemperature, evaluation);
}

/**
 * Highest pressure a first guess should give the junction at an edge's declared `to` end [Pa]:
 * for a regulator, the middle of its proportional band (below the setpoint, where it regulates);
 * +Infinity for every other edge. A regulator's flow does not change with its downstream pressure
 * above the setpoint (it is closed), so Newton cannot leave a first guess there.
 */
export function firstGuessPressureCeiling(element: EdgeElement): number {
  if (element.kind !== "regulator") return Number.POSITIVE_INFINITY;
  return element.setpoint - 0.5 * element.proportionalBand;
}
