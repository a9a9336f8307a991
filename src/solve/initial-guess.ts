/**
 * A first guess for Newton: node pressures from the p-squared law of every edge solved for the
 * whole network by Newton's method (the global gradient algorithm of network analysis), then
 * junction temperatures from the mixing balance with those flows. Both are sparse linear solves
 * on the Jacobian's own structure.
 *
 * p-squared law of an edge (isothermal ideal gas at low Mach, the logarithmic term dropped):
 *   p_u^2 - p_d^2 = k m |m|,  k = R T (fD L/D + K + 1) / A^2,
 * with fD at the Reynolds number of the edge's current flow. Each round linearises every edge at
 * its flow and solves the linear network for P = p^2 (see the rounds below). The first round
 * starts every bridge at its exact flow from the demands (demandFixedFlows).
 */
import {
  type EdgeElement,
  firstGuessPressureCeiling,
  squaredLawResistance,
} from "../physics/edge-flow.js";
import { darcyFrictionWithSlope, type FrictionWithSlope } from "../physics/friction.js";
import type { NetworkSystem } from "./network-system.js";
import { NO_FLOW_WEIGHT, pressureUnknown } from "./network-system.js";
import {
  factorScalarMatrix,
  type ScalarLuFactorization,
  solveScalarFactored,
} from "./sparse-scalar-lu.js";

/**
 * Most rounds, and the change of every edge's flow below which they stop early:
 * |change| <= ROUND_CHANGE_TOLERANCE (|m| + ROUND_CHANGE_FLOOR W), W the throughput (sum of
 * |demands|). Newton's rounds converge quadratically once the flows have their signs; the
 * demand-fixed flows below start the bridges exactly (a tree fed by one reservoir stops after
 * its first round, at the exact solution of the p-squared law) and a loop's flow starts at most
 * at LOOP_FLOW_CEILING W (a loop between reservoirs at different pressures, or to a vent, can
 * carry more than W). Measured on the generated benchmark networks
 * (benchmarks/generate-network.js, seed 1; mixed, grid, tree): Newton then takes 4, 6, 3
 * iterations at 1,000 edges and 6, 5, 3 at 10,000, where the rounds before (secant rounds with
 * the flows averaged and fD at Re = 1e6) left it 7, 7, 4 and 10, 7, 4.
 */
const ROUNDS = 8;
const ROUND_CHANGE_TOLERANCE = 1e-2;
const ROUND_CHANGE_FLOOR = 1e-2;
/**
 * Largest change of the last round (as measured for the stop) after which a round takes
 * Newton's tangent; after a larger one it takes the secant through zero again with the flow
 * magnitudes averaged with the last ones (the linear theory's damping). On large meshes the
 * flows of loops keep reversing at first, and full Newton rounds from there overshoot: on the
 * generated 100,000-edge grid (seed 1) Newton then took 20 iterations, 12 after secant rounds
 * while the changes exceed 100 % (8 with 30 %, but then one network of the hardening corpus,
 * seed 205, stalls at a residual of 2e-9; with 100 % every one converges or is diagnosed, in
 * 3,270 iterations for the converged ones against 3,345 with Newton rounds throughout).
 */
const NEWTON_ROUND_CHANGE = 1;
/** Smallest starting flow magnitude of a bridge, over W (a branch without demand). */
const TREE_FLOW_FLOOR = 1e-6;
/** Largest starting flow magnitude of an edge in a loop, over W. */
const LOOP_FLOW_CEILING = 1;
/** Reynolds number below which the first guess takes the friction factor at this one. */
const SMALLEST_GUESS_REYNOLDS = 1;

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
  // d ln(dP) / d ln|m| of each edge's law: 2 for a fixed resistance, less where friction falls
  // with the Reynolds number (1 in laminar flow).
  const lawExponent = new Float64Array(edgeCount).fill(2);
  const flow = new Float64Array(edgeCount); // signed, from -> to
  const treeFlow = demandFixedFlows(system);
  let throughput = 0;
  for (let node = 0; node < nodeCount; node++)
    throughput += Math.abs(system.demand[node] as number);
  const viscosity = gas.viscosity(supplyTemperature);
  const friction: FrictionWithSlope = { factor: 0, logSlope: 0, inverseRoot: Number.NaN };
  /** The edge's p-squared resistance and law exponent at a flow magnitude (friction at its Re). */
  const setResistance = (e: number, magnitude: number) => {
    const element = system.elements[e] as EdgeElement;
    if (element.kind !== "pipe" || !Number.isNaN(element.fixedFrictionFactor)) {
      // A component's resistance, or a pipe's with its fixed friction factor: no Re in it.
      resistance[e] = squaredLawResistance(element, rt, () => Number.NaN);
      return;
    }
    const reynolds = (4 * magnitude) / (Math.PI * element.diameter * viscosity);
    darcyFrictionWithSlope(
      Math.max(reynolds, SMALLEST_GUESS_REYNOLDS),
      element.roughness / element.diameter,
      friction,
    );
    const frictionPart = friction.factor * (element.length / element.diameter);
    const parameter = frictionPart + element.minorLoss + 1;
    const area = 0.25 * Math.PI * element.diameter * element.diameter;
    resistance[e] = (rt * parameter) / (area * area);
    lawExponent[e] = 2 + (friction.logSlope * frictionPart) / parameter;
  };
  let largestOwnScale = 0;
  for (let e = 0; e < edgeCount; e++) {
    if (system.elements[e] === undefined) continue;
    // Flow that a 10 % drop of p^2 across this edge alone would carry: the edge's own scale.
    setResistance(e, throughput > 0 ? throughput : 1);
    const ownScale = Math.sqrt((0.1 * squaredScale) / (resistance[e] as number));
    largestOwnScale = Math.max(largestOwnScale, ownScale);
    const tree = treeFlow[e] as number;
    // Without demands (a network at rest, the start of the continuation) every edge its own.
    const magnitude = !(throughput > 0)
      ? ownScale
      : Number.isNaN(tree)
        ? Math.min(ownScale, LOOP_FLOW_CEILING * throughput)
        : Math.max(Math.abs(tree), TREE_FLOW_FLOOR * throughput);
    flow[e] = magnitude;
  }
  // The network's flow scale: its throughput, or at rest (where only reservoirs at different
  // pressures drive flows) the largest own scale. Floors of the flow magnitudes and of the
  // change test are relative to it, so that an edge without flow (a dead end at rest) does not
  // get a conductance many orders above the rest, which would spoil the linear solves.
  const flowScale = throughput > 0 ? throughput : largestOwnScale;
  const flowFloor = TREE_FLOW_FLOOR * flowScale;
  const changeFloor = ROUND_CHANGE_FLOOR * flowScale;

  const squared = new Float64Array(nodeCount);
  for (let node = 0; node < nodeCount; node++) {
    if (model.isReservoir[node] === 1) squared[node] = (system.fixedPressure[node] as number) ** 2;
  }

  const conductance = new Float64Array(edgeCount);
  const offset = new Float64Array(edgeCount);
  // One number per block of the Jacobian's pattern and per junction: scalar systems.
  const values = new Float64Array(structure.blockCount);
  const rhs = new Float64Array(junctionCount);
  let kept: ScalarLuFactorization | undefined;
  let previousChange = Number.POSITIVE_INFINITY;
  for (let round = 0; round < ROUNDS; round++) {
    const secant = round === 0 || previousChange > NEWTON_ROUND_CHANGE;
    // Each edge linearised at its flow m0 as m = c (P_from - P_to) + o. The first round, whose
    // flows have no signs yet, takes the secant through zero (c = 1/(k |m0|), o = 0, the linear
    // theory), and so does a round after one that changed the flows by more than
    // NEWTON_ROUND_CHANGE; the others the tangent (Newton: c = 1/(n k |m0|), o = m0 (1 - 1/n), n
    // the law's exponent), the global gradient algorithm of E. Todini and S. Pilati, "A gradient
    // algorithm for the analysis of pipe networks" (1988), with the friction factor at each
    // round's flows.
    for (let e = 0; e < edgeCount; e++) {
      if (system.elements[e] === undefined) continue;
      const magnitude = Math.max(Math.abs(flow[e] as number), flowFloor, 1e-12);
      setResistance(e, magnitude);
      const exponent = secant ? 1 : (lawExponent[e] as number);
      conductance[e] = squaredScale / (exponent * (resistance[e] as number) * magnitude);
      offset[e] = secant ? 0 : (flow[e] as number) * (1 - 1 / exponent);
    }
    values.fill(0);
    for (let j = 0; j < junctionCount; j++) {
      const node = model.junctionNodes[j] as number;
      rhs[j] = system.demand[node] as number;
    }
    for (let e = 0; e < edgeCount; e++) {
      const from = model.edgeFrom[e] as number;
      const to = model.edgeTo[e] as number;
      const c = conductance[e] as number;
      const o = offset[e] as number;
      const a = model.unknownIndex[from] as number;
      const b = model.unknownIndex[to] as number;
      // Row of each junction end: inflow = demand, the inflow of an edge being
      // +-(c (P_from - P_to) + o).
      if (a >= 0) {
        addAt(values, system.edgeBlocks[4 * e] as number, -c);
        if (b >= 0) addAt(values, system.edgeBlocks[4 * e + 1] as number, c);
        else rhs[a] = (rhs[a] as number) - (c * (squared[to] as number)) / squaredScale;
        rhs[a] = (rhs[a] as number) + o;
      }
      if (b >= 0) {
        addAt(values, system.edgeBlocks[4 * e + 3] as number, -c);
        if (a >= 0) addAt(values, system.edgeBlocks[4 * e + 2] as number, c);
        else rhs[b] = (rhs[b] as number) - (c * (squared[from] as number)) / squaredScale;
        rhs[b] = (rhs[b] as number) - o;
      }
    }
    kept = factorScalarMatrix(structure, values, kept);
    const solution = solveScalarFactored(kept, rhs);
    const floor = (0.05 * pMin) ** 2;
    for (let j = 0; j < junctionCount; j++) {
      const node = model.junctionNodes[j] as number;
      const value = (solution[j] as number) * squaredScale;
      squared[node] = Number.isFinite(value) ? Math.max(value, floor) : floor;
    }
    let largestChange = 0;
    for (let e = 0; e < edgeCount; e++) {
      if (system.elements[e] === undefined) continue;
      const from = model.edgeFrom[e] as number;
      const to = model.edgeTo[e] as number;
      const difference = (squared[from] as number) - (squared[to] as number);
      const next = ((conductance[e] as number) * difference) / squaredScale + (offset[e] as number);
      const previous = flow[e] as number;
      // A secant round compares magnitudes (the first round's flows have no sign yet).
      const change = secant ? Math.abs(next) - Math.abs(previous) : next - previous;
      largestChange = Math.max(
        largestChange,
        Math.abs(change) / (Math.abs(previous) + changeFloor),
      );
      flow[e] =
        secant && round > 0
          ? (next >= 0 ? 0.5 : -0.5) * (Math.abs(previous) + Math.abs(next))
          : next;
    }
    if (largestChange <= ROUND_CHANGE_TOLERANCE) break;
    previousChange = largestChange;
  }
  const signedFlow = flow;

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
  values.fill(0);
  rhs.fill(0);
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
    values[j] = -1;
    rhs[j] =
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
      values[block] = (values[block] as number) + share;
    } else {
      rhs[d] = (rhs[d] as number) - share * (system.fixedTemperature[upstream] as number);
    }
  }
  const temperatures = solveScalarFactored(factorScalarMatrix(structure, values, kept), rhs);

  const x = new Float64Array(2 * junctionCount);
  for (let j = 0; j < junctionCount; j++) {
    const node = model.junctionNodes[j] as number;
    x[2 * j] = pressureUnknown(system, j, Math.sqrt(squared[node] as number));
    const t = temperatures[j] as number;
    x[2 * j + 1] = (Number.isFinite(t) && t > 0 ? t : supplyTemperature) / system.temperatureScale;
  }
  return x;
}

/**
 * The flow [kg/s] of every edge whose flow the demands alone fix, signed from `from` to `to`;
 * NaN for the others. With the reservoirs taken as one node (they balance any flow), an edge
 * that is a bridge cuts off a part without a reservoir, and the flow through it is the sum of
 * that part's demands: the headers and branches hanging off a meshed core, every edge of a tree
 * fed by one reservoir. Bridges from a depth-first tree (iterative): the tree edge above node v
 * is a bridge when no other edge joins v's subtree, which is the preorder interval
 * [pre(v), pre(v) + size(v)), to a node outside it (R. E. Tarjan, "A note on finding the bridges
 * of a graph", Inform. Process. Lett. 2 (1974) 160-161).
 */
function demandFixedFlows(system: NetworkSystem): Float64Array {
  const { model, edgeCount } = system;
  const nodeCount = model.isReservoir.length;
  const flow = new Float64Array(edgeCount).fill(Number.NaN);
  // Preorder number of each node; every reservoir is the root, number 0.
  const pre = new Int32Array(nodeCount).fill(-1);
  const parentEdge = new Int32Array(nodeCount).fill(-1);
  const order = new Int32Array(nodeCount + 1); // nodes in preorder; -1 stands for the root
  const next = new Int32Array(nodeCount); // per node on the stack: next incidence to look at
  const stack = new Int32Array(nodeCount + 1);
  for (let node = 0; node < nodeCount; node++) if (model.isReservoir[node] === 1) pre[node] = 0;
  let count = 1;
  order[0] = -1;
  for (let start = 0; start < nodeCount; start++) {
    if (model.isReservoir[start] !== 1) continue;
    // The root's children: the junctions next to any reservoir, each grown depth first.
    for (
      let k = model.incidentStart[start] as number;
      k < (model.incidentStart[start + 1] as number);
      k++
    ) {
      const e = model.incidentEdges[k] as number;
      const first = otherEnd(model, e, start);
      if (pre[first] !== -1) continue;
      pre[first] = count;
      order[count++] = first;
      parentEdge[first] = e;
      let top = 0;
      stack[0] = first;
      next[first] = model.incidentStart[first] as number;
      while (top >= 0) {
        const node = stack[top] as number;
        const at = next[node] as number;
        if (at === (model.incidentStart[node + 1] as number)) {
          top--;
          continue;
        }
        next[node] = at + 1;
        const e2 = model.incidentEdges[at] as number;
        const other = otherEnd(model, e2, node);
        if (pre[other] !== -1) continue;
        pre[other] = count;
        order[count++] = other;
        parentEdge[other] = e2;
        next[other] = model.incidentStart[other] as number;
        stack[++top] = other;
      }
    }
  }
  // Per node, over its subtree: the lowest and highest preorder number its edges reach (the
  // edge to its parent left out) and its size; children come after their parent in preorder.
  const low = new Int32Array(nodeCount);
  const high = new Int32Array(nodeCount);
  const size = new Int32Array(nodeCount).fill(1);
  for (let node = 0; node < nodeCount; node++) {
    if (model.isReservoir[node] === 1) continue;
    let lo = pre[node] as number;
    let hi = lo;
    for (
      let k = model.incidentStart[node] as number;
      k < (model.incidentStart[node + 1] as number);
      k++
    ) {
      const e = model.incidentEdges[k] as number;
      if (e === parentEdge[node]) continue;
      const reached = pre[otherEnd(model, e, node)] as number;
      lo = Math.min(lo, reached);
      hi = Math.max(hi, reached);
    }
    low[node] = lo;
    high[node] = hi;
  }
  const subtreeDemand = Float64Array.from(system.demand);
  for (let k = count - 1; k >= 1; k--) {
    const node = order[k] as number;
    const e = parentEdge[node] as number;
    const from = model.edgeFrom[e] as number;
    const parent = otherEnd(model, e, node);
    const demand = subtreeDemand[node] as number;
    const start = pre[node] as number;
    if ((low[node] as number) >= start && (high[node] as number) < start + (size[node] as number)) {
      flow[e] = from === parent ? demand : -demand;
    }
    if (model.isReservoir[parent] === 1) continue;
    subtreeDemand[parent] = (subtreeDemand[parent] as number) + demand;
    low[parent] = Math.min(low[parent] as number, low[node] as number);
    high[parent] = Math.max(high[parent] as number, high[node] as number);
    size[parent] = (size[parent] as number) + (size[node] as number);
  }
  return flow;
}

function otherEnd(model: NetworkSystem["model"], edge: number, node: number): number {
  const from = model.edgeFrom[edge] as number;
  return from === node ? (model.edgeTo[edge] as number) : from;
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
