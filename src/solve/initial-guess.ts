/**
 * A first guess for Newton: node pressures from a few rounds of the linearised p-squared law
 * (the "linear theory" of network analysis), then junction temperatures from the mixing balance
 * with those flows. Both are sparse linear solves on the Jacobian's own structure.
 *
 * p-squared law of an edge (isothermal ideal gas at low Mach, the logarithmic term dropped):
 *   p_u^2 - p_d^2 = k m |m|,  k = R T (fD L/D + K) / A^2.
 * Each round freezes |m| and solves the resulting linear network for P = p^2; |m| is then
 * averaged with the new flows (damping that keeps the rounds from oscillating).
 */
import {
  type EdgeElement,
  firstGuessPressureCeiling,
  squaredLawResistance,
} from "../physics/edge-flow.js";
import { darcyFrictionFactor } from "../physics/friction.js";
import { reuseOfFactorsPays, solveWithFrozenFactors } from "./frozen-factor-gmres.js";
import type { NetworkSystem } from "./network-system.js";
import { NO_FLOW_WEIGHT, pressureUnknown } from "./network-system.js";
import { type BlockLuFactorization, factorBlockMatrix, solveFactored } from "./sparse-block-lu.js";

/** Number of linear-theory rounds. */
const ROUNDS = 8;
/**
 * Where reusing factors pays (src/solve/frozen-factor-gmres.ts) the rounds after the first solve by GMRES
 * with the first round's factors, to this relative residual (a first guess needs no more), and
 * factor again only when 12 GMRES iterations do not reach it.
 */
const FROZEN_ROUND_TOLERANCE = 1e-6;
const FROZEN_ROUND_ITERATIONS = 12;

/** Scaled unknowns of a first guess, 2 per junction [p / pScale - 1, T / TScale]. */
export function initialGuess(system: NetworkSystem): Float64Array {
  const { model, edgeCount, junctionCount, structure } = system;
  const gas = system.gas;
  const nodeCount = model.document.nodes.length;
  const supplyTemperature = meanSupplyTemperature(system);
  const rt = gas.specificGasConstant * supplyTemperature;

  // P = p^2 at reservoirs; range of the fixed levels.
  let pMax = 0;
  let pMin = Number.POSITIVE_INFINITY;
  for (let node = 0; node < nodeCount; node++) {
    if (model.isReservoir[node] === 1) {
      const p = system.fixedPressure[node] as number;
      pMax = Math.max(pMax, p);
      pMin = Math.min(pMin, p);
    }
  }
  const squaredScale = pMax * pMax;

  const resistance = new Float64Array(edgeCount);
  const flowMagnitude = new Float64Array(edgeCount);
  const signedFlow = new Float64Array(edgeCount);
  for (let e = 0; e < edgeCount; e++) {
    const element = system.elements[e];
    if (element === undefined) continue;
    resistance[e] = squaredLawResistance(element, rt, (relativeRoughness) =>
      darcyFrictionFactor(1e6, relativeRoughness),
    );
    // Flow that a 10 % drop of p^2 across this edge alone would carry: the edge's own scale.
    flowMagnitude[e] = Math.sqrt((0.1 * squaredScale) / (resistance[e] as number));
  }

  const squared = new Float64Array(nodeCount);
  for (let node = 0; node < nodeCount; node++) {
    if (model.isReservoir[node] === 1) squared[node] = (system.fixedPressure[node] as number) ** 2;
  }

  let kept: BlockLuFactorization | undefined;
  for (let round = 0; round < ROUNDS; round++) {
    const values = new Float64Array(4 * structure.blockCount);
    const rhs = new Float64Array(2 * junctionCount);
    for (let j = 0; j < junctionCount; j++) {
      values[4 * j + 3] = 1; // temperature slot unused here
      const node = model.junctionNodes[j] as number;
      rhs[2 * j] = system.demand[node] as number;
    }
    for (let e = 0; e < edgeCount; e++) {
      const conductance =
        squaredScale / ((resistance[e] as number) * Math.max(flowMagnitude[e] as number, 1e-12));
      const from = model.edgeFrom[e] as number;
      const to = model.edgeTo[e] as number;
      const a = model.unknownIndex[from] as number;
      const b = model.unknownIndex[to] as number;
      // Row of each junction end: sum c (P_other - P_self) = demand.
      if (a >= 0) {
        addAt(values, 4 * (system.edgeBlocks[4 * e] as number), -conductance);
        if (b >= 0) addAt(values, 4 * (system.edgeBlocks[4 * e + 1] as number), conductance);
        else
          rhs[2 * a] =
            (rhs[2 * a] as number) - (conductance * (squared[to] as number)) / squaredScale;
      }
      if (b >= 0) {
        addAt(values, 4 * (system.edgeBlocks[4 * e + 3] as number), -conductance);
        if (a >= 0) addAt(values, 4 * (system.edgeBlocks[4 * e + 2] as number), conductance);
        else
          rhs[2 * b] =
            (rhs[2 * b] as number) - (conductance * (squared[from] as number)) / squaredScale;
      }
    }
    let solution =
      kept === undefined
        ? undefined
        : solveWithFrozenFactors(values, kept, rhs, FROZEN_ROUND_TOLERANCE, FROZEN_ROUND_ITERATIONS)
            .x;
    if (solution === undefined) {
      const factors = factorBlockMatrix(structure, values, kept);
      if (reuseOfFactorsPays(structure)) kept = factors;
      solution = solveFactored(factors, rhs);
    }
    const floor = (0.05 * pMin) ** 2;
    for (let j = 0; j < junctionCount; j++) {
      const node = model.junctionNodes[j] as number;
      const value = (solution[2 * j] as number) * squaredScale;
      squared[node] = Number.isFinite(value) ? Math.max(value, floor) : floor;
    }
    for (let e = 0; e < edgeCount; e++) {
      const from = model.edgeFrom[e] as number;
      const to = model.edgeTo[e] as number;
      const difference = (squared[from] as number) - (squared[to] as number);
      const flow =
        difference / ((resistance[e] as number) * Math.max(flowMagnitude[e] as number, 1e-12));
      signedFlow[e] = flow;
      flowMagnitude[e] = 0.5 * ((flowMagnitude[e] as number) + Math.abs(flow));
    }
  }

  // A regulator's downstream junction no higher than its band: above it the regulator is closed
  // and its flow does not respond to pressure, so Newton could not leave such a guess.
  for (let e = 0; e < edgeCount; e++) {
    const ceiling = firstGuessPressureCeiling(system.elements[e] as EdgeElement);
    const to = model.edgeTo[e] as number;
    if (model.isReservoir[to] !== 1 && (squared[to] as number) > ceiling * ceiling) {
      squared[to] = ceiling * ceiling;
    }
  }

  // Temperatures: mixing balance with the guessed flows (adiabatic edges carry T upstream). Each
  // row is divided by its diagonal (inflow + injection + weight) so the rows are of order 1.
  const values = new Float64Array(4 * structure.blockCount);
  const rhs = new Float64Array(2 * junctionCount);
  let throughput = 0;
  for (let node = 0; node < nodeCount; node++)
    throughput += Math.abs(system.demand[node] as number);
  const weight = NO_FLOW_WEIGHT * Math.max(throughput, 1e-9);
  const diagonal = new Float64Array(junctionCount);
  for (let j = 0; j < junctionCount; j++) {
    const node = model.junctionNodes[j] as number;
    const demand = system.demand[node] as number;
    diagonal[j] = weight + (demand < 0 ? -demand : 0);
  }
  for (let e = 0; e < edgeCount; e++) {
    const flow = signedFlow[e] as number;
    const downstream = flow > 0 ? (model.edgeTo[e] as number) : (model.edgeFrom[e] as number);
    const d = model.unknownIndex[downstream] as number;
    if (flow !== 0 && d >= 0) diagonal[d] = (diagonal[d] as number) + Math.abs(flow);
  }
  for (let j = 0; j < junctionCount; j++) {
    const node = model.junctionNodes[j] as number;
    const demand = system.demand[node] as number;
    const scale = diagonal[j] as number;
    values[4 * j] = 1; // pressure slot unused here
    values[4 * j + 3] = -1;
    rhs[2 * j + 1] =
      -(weight * supplyTemperature) / scale -
      (demand < 0 ? (-demand * (system.injectionTemperature[node] as number)) / scale : 0);
  }
  for (let e = 0; e < edgeCount; e++) {
    const flow = signedFlow[e] as number;
    if (flow === 0) continue;
    const from = model.edgeFrom[e] as number;
    const to = model.edgeTo[e] as number;
    const upstream = flow > 0 ? from : to;
    const downstream = flow > 0 ? to : from;
    const d = model.unknownIndex[downstream] as number;
    if (d < 0) continue;
    const u = model.unknownIndex[upstream] as number;
    const share = Math.abs(flow) / (diagonal[d] as number);
    if (u >= 0) {
      const block = system.edgeBlocks[4 * e + (flow > 0 ? 2 : 1)] as number;
      values[4 * block + 3] = (values[4 * block + 3] as number) + share;
    } else {
      rhs[2 * d + 1] =
        (rhs[2 * d + 1] as number) - share * (system.fixedTemperature[upstream] as number);
    }
  }
  const temperatures = solveFactored(factorBlockMatrix(structure, values), rhs);

  const x = new Float64Array(2 * junctionCount);
  for (let j = 0; j < junctionCount; j++) {
    const node = model.junctionNodes[j] as number;
    x[2 * j] = pressureUnknown(system, j, Math.sqrt(squared[node] as number));
    const t = temperatures[2 * j + 1] as number;
    x[2 * j + 1] = (Number.isFinite(t) && t > 0 ? t : supplyTemperature) / system.temperatureScale;
  }
  return x;
}

/** Mean of the reservoir and injection temperatures [K]. */
function meanSupplyTemperature(system: NetworkSystem): number {
  let sum = 0;
  let count = 0;
  const nodes = system.model.document.nodes.length;
  for (let node = 0; node < nodes; node++) {
    const t = system.fixedTemperature[node] as number;
    if (!Number.isNaN(t)) {
      sum += t;
      count++;
    }
    const injected = system.injectionTemperature[node] as number;
    if (!Number.isNaN(injected)) {
      sum += injected;
      count++;
    }
  }
  return count > 0 ? sum / count : system.ambientTemperature;
}

function addAt(values: Float64Array, index: number, amount: number): void {
  values[index] = (values[index] as number) + amount;
}
