/**
 * Solver state -> per-node and per-edge results, the network balance recomputed independently
 * of the solver, and the design-limit warnings.
 */

import { emptyThermoState, gasState } from "../gas/thermo.js";
import type { DesignLimits } from "../input/document-types.js";
import { componentDetails } from "../physics/components/component-flow.js";
import { type EdgeElement, edgeEndStates, exitPressureForFlow } from "../physics/edge-flow.js";
import { STANDARD_GRAVITY } from "../physics/heat-transfer-pipe.js";
import { PipeFlowEvaluation } from "../physics/pipe-flow.js";
import {
  edgeEndsAt,
  emptyEdgeEnds,
  enthalpyTemperature,
  evaluateEdgeWarm,
  type NetworkSystem,
  NO_FLOW_WEIGHT,
  networkThroughput,
  nodePressure,
  nodeTemperature,
} from "../solve/network-system.js";
import type { EdgeResult, NetworkBalance, NodeResult, SolverWarning } from "./result-types.js";

/**
 * Relative accuracy of a flow from the pipe relations (their Mach iterations stop at 1e-13),
 * with a margin: the exit-pressure check allows what this moves the exit pressure by.
 */
const FLOW_ACCURACY = 1e-12;
/** Largest part of an exit-pressure mismatch that the flow's accuracy may explain, relative. */
const CONDITIONING_CEILING = 1e-3;

/** Results of the nodes and edges at a state, with the balance recomputed from scratch. */
export interface StateResults {
  nodes: NodeResult[];
  edges: EdgeResult[];
  balance: NetworkBalance;
  /** Junctions that no gas flows through, by their position in `nodes` (the file's order). */
  noFlowJunctions: number[];
}

/**
 * Evaluate every edge afresh at the final state (no warm start from the solver) and collect the
 * results, then recompute mass and energy balance at every junction and the exit pressure of every
 * subsonic edge from its flow (the inverse pipe relation): a check independent of the Newton
 * residuals.
 */
export function resultsAtState(system: NetworkSystem, x: Float64Array): StateResults {
  const { model } = system;
  const doc = model.document;
  const gas = doc.gas;
  const cp = gas.specificHeatCp;
  // Enthalpy per kilogram is cp H(T, p), on a scale with zero at 0 K for the perfect gas: cp T
  // for a calorically perfect ideal gas, h(T, p) + cp 298.15 K with cp(T) or a real gas.
  const slopes = new Float64Array(2);
  const enthalpyTemperatureAt = (pressure: number, temperature: number): number =>
    enthalpyTemperature(system, pressure, temperature, slopes);
  const nodeCount = doc.nodes.length;
  const netOutflow = new Float64Array(nodeCount);
  const inflowMagnitude = new Float64Array(nodeCount);
  const enthalpyArriving = new Float64Array(nodeCount);
  const edges: EdgeResult[] = [];
  let heatIn = 0;
  let potentialEnergyGain = 0;
  const inverse = new PipeFlowEvaluation();
  const edgeEnds = emptyEdgeEnds();
  let largestExitPressureMismatch = 0;

  doc.edges.forEach((edge, e) => {
    const from = model.edgeFrom[e] as number;
    const to = model.edgeTo[e] as number;
    const element = system.elements[e] as EdgeElement;
    edgeEndsAt(system, x, e, inverse, edgeEnds);
    const { forward, downstream, drop } = edgeEnds;
    const pUp = edgeEnds.upstreamPressure;
    const pDown = edgeEnds.downstreamPressure;
    const tUp = edgeEnds.upstreamTemperature;
    // Evaluated afresh from the final node states, with the capacity (warm-started from the
    // solver's last evaluation of this edge for speed: the root does not depend on the start).
    const evaluation = evaluateEdgeWarm(system, e, edgeEnds, true);
    const flow = evaluation.massFlow;
    const signed = forward ? flow : -flow;
    netOutflow[from] = (netOutflow[from] as number) + signed;
    netOutflow[to] = (netOutflow[to] as number) - signed;
    inflowMagnitude[downstream] = (inflowMagnitude[downstream] as number) + flow;
    enthalpyArriving[downstream] =
      (enthalpyArriving[downstream] as number) +
      flow * cp * enthalpyTemperatureAt(pDown, evaluation.arrivalTemperature);
    // Heat into the gas: the heat-transfer model's own integral; for an isothermal pipe what the
    // arrival implies, m (h0 arriving - h0 upstream) (with cp(T) and the departure enthalpy);
    // none for adiabatic pipes and components, which pass their stagnation enthalpy (a perfect
    // gas's arrival is then T0 itself). Lift: m g dz.
    const rise = element.kind === "pipe" ? (element.rise ?? 0) * (forward ? 1 : -1) : 0;
    const lift = flow * STANDARD_GRAVITY * rise;
    const heat =
      element.kind === "pipe" && element.model === "heat-transfer"
        ? evaluation.heatFlow
        : element.kind === "pipe" && element.model === "isothermal"
          ? flow *
              cp *
              (enthalpyTemperatureAt(pDown, evaluation.arrivalTemperature) -
                enthalpyTemperatureAt(pUp, tUp)) +
            lift
          : lift;
    heatIn += heat;
    potentialEnergyGain += lift;

    if (!evaluation.choked && flow > 0) {
      // Independent check: the inverse relation must put this flow's exit at the node pressure.
      const exitPressure = exitPressureForFlow(element, gas, pUp, tUp, flow, inverse, forward);
      if (!Number.isNaN(exitPressure)) {
        // Less what the flow's own accuracy explains: near choke the exit pressure moves by a
        // large amount for a tiny change of flow (its slope dm/dpd goes to zero).
        // Capped at 1e-3 of the pressure, so that a vanishing slope cannot switch the check off.
        const conditioning = Math.min(
          (FLOW_ACCURACY * flow) / Math.abs(evaluation.dMassFlowdDownstreamPressure),
          CONDITIONING_CEILING * pDown,
        );
        const mismatch = Math.max(Math.abs(exitPressure - pDown) - conditioning, 0) / pDown;
        largestExitPressureMismatch = Math.max(largestExitPressureMismatch, mismatch);
      }
    }

    const ends = edgeEndStates(element, system.gas, tUp, evaluation);
    const result: EdgeResult = {
      id: edge.id,
      kind: edge.kind,
      from: edge.from,
      to: edge.to,
      model: element.kind === "pipe" ? element.model : "adiabatic",
      massFlow: signed === 0 ? 0 : signed,
      choked: evaluation.choked,
      chokeRatio: evaluation.choked ? 1 : evaluation.capacity > 0 ? flow / evaluation.capacity : 0,
      capacity: evaluation.capacity,
      reynolds: evaluation.reynolds,
      frictionFactor: evaluation.frictionFactor,
      inlet: ends.inlet,
      outlet: ends.outlet,
      pressureDrop: drop,
      heatFlow: heat === 0 ? 0 : heat,
    };
    if (element.kind !== "pipe") {
      result.component = componentDetails(
        element,
        system.gas,
        pUp,
        pDown,
        forward,
        evaluation,
        tUp,
      );
    } else if (edge.kind === "pipe" && edge.catalog !== undefined) {
      result.catalog = { ...edge.catalog };
    }
    edges.push(result);
  });

  const throughput = networkThroughput(system, netOutflow);
  const temperatureReference = system.temperatureScale;
  let massIn = 0;
  let massOut = 0;
  let enthalpyIn = 0;
  let enthalpyOut = 0;
  let largestMassImbalance = 0;
  let largestEnergyImbalance = 0;
  const nodes: NodeResult[] = [];
  const noFlowJunctions: number[] = [];
  doc.nodes.forEach((node, index) => {
    const pressure = nodePressure(system, x, index);
    const temperature = nodeTemperature(system, x, index);
    if (node.kind === "reservoir") {
      const supplied = netOutflow[index] as number; // into the edges
      if (supplied > 0) {
        massIn += supplied;
        enthalpyIn += supplied * cp * enthalpyTemperatureAt(pressure, temperature);
      } else {
        massOut += -supplied;
        enthalpyOut += enthalpyArriving[index] as number;
      }
      nodes.push({
        id: node.id,
        kind: node.kind,
        pressure,
        temperature,
        demand: supplied === 0 ? 0 : -supplied,
        elevation: node.elevation,
      });
      return;
    }
    const demand = node.demand;
    const injection = demand < 0 ? -demand : 0;
    const delivered = Math.max(demand, 0);
    massIn += injection;
    massOut += delivered;
    const injectedEnthalpy =
      injection > 0
        ? injection *
          cp *
          enthalpyTemperatureAt(pressure, system.injectionTemperature[index] as number)
        : 0;
    const own = enthalpyTemperatureAt(pressure, temperature);
    enthalpyIn += injectedEnthalpy;
    enthalpyOut += delivered * cp * own;
    const massImbalance = -(netOutflow[index] as number) - demand;
    largestMassImbalance = Math.max(largestMassImbalance, Math.abs(massImbalance) / throughput);
    // Enthalpy balance at the junction: arriving + injected = leaving through edges + delivered.
    const leaving = (netOutflow[index] as number) + (inflowMagnitude[index] as number) + delivered;
    const energyImbalance =
      (enthalpyArriving[index] as number) + injectedEnthalpy - leaving * cp * own;
    largestEnergyImbalance = Math.max(
      largestEnergyImbalance,
      Math.abs(energyImbalance) / (throughput * cp * temperatureReference),
    );
    // No flow: below the solver's resolution of flows (the no-flow weight's scale).
    if ((inflowMagnitude[index] as number) <= NO_FLOW_WEIGHT * throughput && injection === 0) {
      noFlowJunctions.push(index);
    }
    nodes.push({
      id: node.id,
      kind: node.kind,
      pressure,
      temperature,
      demand,
      elevation: node.elevation,
    });
  });

  // Listed in the file's order (the model's is canonical, by id).
  const { nodes: nodeInFile, edges: edgeInFile } = model.filePosition;
  // The first law of the whole network: enthalpy in + heat in - lift = enthalpy out.
  const energyScale = Math.max(enthalpyIn, enthalpyOut, Number.MIN_VALUE);
  const energyImbalance = (enthalpyIn + heatIn - potentialEnergyGain - enthalpyOut) / energyScale;
  return {
    nodes: inFileOrder(nodes, nodeInFile),
    edges: inFileOrder(edges, edgeInFile),
    noFlowJunctions: noFlowJunctions
      .map((index) => nodeInFile[index] as number)
      .sort((a, b) => a - b),
    balance: {
      throughput,
      massIn,
      massOut,
      enthalpyIn,
      enthalpyOut,
      heatIn,
      potentialEnergyGain,
      energyImbalance,
      largestMassImbalance,
      largestEnergyImbalance,
      largestExitPressureMismatch,
    },
  };
}

/** Items in model order moved to the positions `filePosition` gives them. */
function inFileOrder<T>(items: readonly T[], filePosition: Int32Array): T[] {
  const ordered = new Array<T>(items.length);
  items.forEach((item, index) => {
    ordered[filePosition[index] as number] = item;
  });
  return ordered;
}

/** Warnings for choked edges, junctions without flow and exceeded design limits. */
export function designWarnings(
  results: StateResults,
  limits: DesignLimits,
  system: NetworkSystem,
): SolverWarning[] {
  const warnings: SolverWarning[] = [];
  for (const edge of results.edges) {
    if (edge.choked) {
      warnings.push({
        code: "choked",
        edge: edge.id,
        message:
          edge.component === undefined
            ? `edge ${edge.id} is choked: exit Mach ${edge.outlet.mach.toFixed(3)}, flow ${Math.abs(edge.massFlow).toPrecision(4)} kg/s set by its upstream state; exit pressure ${edge.outlet.pressure.toPrecision(6)} Pa is above the downstream node's`
            : `${edge.kind} ${edge.id} is choked (critical flow): flow ${Math.abs(edge.massFlow).toPrecision(4)} kg/s set by its upstream state alone; a lower downstream pressure does not raise it`,
      });
    }
    const closed = closedComponentMessage(edge);
    if (closed !== undefined) warnings.push({ code: "closed", edge: edge.id, message: closed });
    const mach = Math.max(edge.inlet.mach, edge.outlet.mach);
    if (limits.maxMach !== undefined && mach > limits.maxMach) {
      warnings.push({
        code: "limit-mach",
        edge: edge.id,
        message: `edge ${edge.id}: Mach ${mach.toFixed(3)} exceeds the limit ${limits.maxMach}`,
      });
    }
    const velocity = Math.max(edge.inlet.velocity, edge.outlet.velocity);
    if (limits.maxVelocity !== undefined && velocity > limits.maxVelocity) {
      warnings.push({
        code: "limit-velocity",
        edge: edge.id,
        message: `edge ${edge.id}: velocity ${velocity.toPrecision(4)} m/s exceeds the limit ${limits.maxVelocity} m/s`,
      });
    }
    const momentumFlux = Math.max(
      edge.inlet.density * edge.inlet.velocity ** 2,
      edge.outlet.density * edge.outlet.velocity ** 2,
    );
    if (limits.maxMomentumFlux !== undefined && momentumFlux > limits.maxMomentumFlux) {
      warnings.push({
        code: "limit-momentum-flux",
        edge: edge.id,
        message: `edge ${edge.id}: rho v^2 ${momentumFlux.toPrecision(4)} Pa exceeds the limit ${limits.maxMomentumFlux} Pa`,
      });
    }
  }
  for (const node of results.nodes) {
    if (
      node.kind === "junction" &&
      limits.minPressure !== undefined &&
      node.pressure < limits.minPressure
    ) {
      warnings.push({
        code: "limit-pressure",
        node: node.id,
        message: `node ${node.id}: pressure ${node.pressure.toPrecision(6)} Pa is below the limit ${limits.minPressure} Pa`,
      });
    }
  }
  if (system.gas.gas.equationOfState !== undefined) condensingWarnings(results, system, warnings);
  for (const index of results.noFlowJunctions) {
    const node = results.nodes[index] as NodeResult;
    warnings.push({
      code: "no-flow",
      node: node.id,
      message: `no gas flows through junction ${node.id}; its temperature is reported as the ambient ${system.ambientTemperature.toFixed(2)} K`,
    });
  }
  return warnings;
}

/**
 * A `condensing` warning for each node, and each pipe end, whose state the Peng-Robinson
 * equation of state finds inside the gas's two-phase region (`ThermoState.condensing`): the
 * solver treats the gas as a single vapour-like phase, which does not hold there.
 */
function condensingWarnings(
  results: StateResults,
  system: NetworkSystem,
  warnings: SolverWarning[],
): void {
  const gas = system.gas.gas;
  const state = emptyThermoState();
  const condenses = (pressure: number, temperature: number): boolean =>
    gasState(gas, pressure, temperature, state).condensing;
  for (const node of results.nodes) {
    if (condenses(node.pressure, node.temperature)) {
      warnings.push({
        code: "condensing",
        node: node.id,
        message: `node ${node.id}: the gas would condense at ${node.pressure.toPrecision(6)} Pa and ${node.temperature.toFixed(2)} K (Peng-Robinson); the single-phase results do not hold there`,
      });
    }
  }
  for (const edge of results.edges) {
    if (edge.kind !== "pipe") continue;
    const end = [edge.inlet, edge.outlet].find((s) => condenses(s.pressure, s.temperature));
    if (end !== undefined) {
      warnings.push({
        code: "condensing",
        edge: edge.id,
        message: `edge ${edge.id}: the gas would condense at ${end.pressure.toPrecision(6)} Pa and ${end.temperature.toFixed(2)} K (Peng-Robinson); the single-phase results do not hold there`,
      });
    }
  }
}

/** The warning text of a closed check valve or regulator, or undefined. */
function closedComponentMessage(edge: EdgeResult): string | undefined {
  const details = edge.component;
  if (details === undefined) return undefined;
  const leakage = `${Math.abs(edge.massFlow).toPrecision(3)} kg/s`;
  if (details.kind === "check" && details.state === "closed") {
    return `check valve ${edge.id} is closed: the pressure at ${edge.to} is above that at ${edge.from} by ${edge.pressureDrop.toPrecision(4)} Pa, so only its leakage of ${leakage} passes back`;
  }
  if (details.kind === "regulator" && details.state === "closed") {
    return edge.massFlow < 0
      ? `regulator ${edge.id} is closed against reverse flow: the pressure at ${edge.to} is above that at ${edge.from}; only its leakage of ${leakage} passes back`
      : `regulator ${edge.id} is closed: the pressure at ${edge.to} is at or above its setpoint (by ${details.setpointDeviation.toPrecision(4)} Pa); only its seat leakage of ${leakage} passes, and with no consumption downstream that leakage alone sets the pressure there`;
  }
  return undefined;
}
