/**
 * The nonlinear system of a network: unknowns, residuals and their Jacobian.
 *
 * Unknowns: the pressure and the (stagnation) temperature of every junction, the pressure as an
 * offset from the junction's own reference pressure, p / p_ref,j - 1, the temperature over a
 * reference temperature. Reservoirs are fixed.
 *
 * Residuals per junction j (docs/model.md, "Network equations"):
 *   mass:   sum of edge flows into j - demand_j = 0,                     scaled by throughput W
 *   energy: sum over inflowing edges of m_e (H(T_arrive,e, p_j) - H(T_j, p_j))
 *           + injection_j (H(T_injected, p_j) - H(T_j, p_j)) + w_j (H(T_ambient, p_j) - H(T_j, p_j))
 *           = 0, H(T, p) = h(T, p) / cp_ref + 298.15 K the enthalpy expressed as a temperature
 *           (cp_ref the gas's constant cp; for a calorically perfect ideal gas H = T exactly, and
 *           the code takes T itself then, so these rows are the temperature mixing rows),
 *           scaled by (inflow_j + injection_j + w_j) T_ref, so it reads as a temperature error over
 *           T_ref; convergence also asks the enthalpy imbalance over W T_ref to meet the
 *           tolerance (src/solve/newton.ts)
 * The energy balance is written in this mixing form (the enthalpy balance minus h_j times the
 * mass balance), so a junction's temperature depends only on the gas arriving there. With cp(T)
 * (NASA polynomials) or a real gas (Peng-Robinson), h comes from src/gas/thermo.ts: the rows
 * balance stagnation enthalpy, sum m_in h0_arrive + injection h_injected = (sum m_out + demand)
 * h(T_j, p_j); an edge's arrival stagnation temperature is turned back into enthalpy at the
 * junction's pressure, the pressure at which the edge models compute it from h0. The weight
 * w_j = (eps W)^2 / (inflow_j + injection_j + eps W), eps = 1e-9 (the default tolerance), gives a junction that no
 * gas reaches the ambient temperature instead of a singular equation, even when round-off leaves
 * a flow of order eps W through it; where gas does flow (inflow_j >> eps W) it moves the
 * temperature by about (eps W / inflow_j)^2 of the difference to ambient: nothing.
 *
 * Edge flows are functions of the node states (src/physics/pipe-flow.ts): the upstream end is the
 * one at higher pressure; a choked edge's flow does not depend on its downstream pressure.
 */
import type { PengRobinsonValues } from "../gas/peng-robinson.js";
import { emptyPengRobinsonValues } from "../gas/peng-robinson.js";
import {
  ENTHALPY_REFERENCE_TEMPERATURE,
  emptyThermoState,
  gasState,
  type ThermoState,
} from "../gas/thermo.js";
import type { NetworkModel } from "../model/build-network.js";
import { type EdgeElement, evaluateEdgeFlow, flowsForward } from "../physics/edge-flow.js";
import { pipeGas } from "../physics/pipe.js";
import { isCreepingFlow, PipeFlowEvaluation, type PipeGas } from "../physics/pipe-flow.js";
import type { BlockLuFactorization, BlockLuStructure } from "./sparse-block-lu.js";
import { analyzeBlockPattern } from "./sparse-block-lu.js";

/** Relative weight eps of the ambient-temperature term that regularises junctions without flow. */
export const NO_FLOW_WEIGHT = 1e-9;

/** The weight w_j of a junction's ambient-temperature term for a given inflow [kg/s]. */
export function noFlowWeight(throughput: number, inflow: number): number {
  const floor = NO_FLOW_WEIGHT * throughput;
  return (floor * floor) / (inflow + floor);
}

/**
 * In the Jacobian only, a choked edge's flow is given a slope of this fraction of its upstream
 * slope with respect to its downstream pressure, so that a node fed only by choked edges does not
 * make the Newton matrix singular. Residuals stay exact, so the solution is unchanged.
 */
export const CHOKED_SLOPE_FRACTION = 1e-6;

/**
 * Rounding of a node pressure in units of its resolution (4 units of double rounding). A flow
 * follows from the difference of its two end pressures, so it carries a round-off of about its
 * pressure slopes times this times the resolution of the pressures: the pressure itself where
 * the relation takes the rounded pressures (where a drop is 1e-9 of the pressure, the flow is
 * known to only about 1e-7 of itself, however well Newton has converged), the pressure's
 * distance from its reference where it takes the drop from the offsets (small drops).
 */
export const FLOW_ROUNDING = 4 * Number.EPSILON;

/** Everything about a network that does not change between iterations. */
export interface NetworkSystem {
  model: NetworkModel;
  junctionCount: number;
  edgeCount: number;
  /** Every edge as the solver sees it. */
  elements: EdgeElement[];
  gas: PipeGas;
  /**
   * Reference scales of the unknowns. A junction's pressure unknown is its offset from its own
   * reference pressure, p / p_ref,j - 1 (see {@link pressureUnknown} and
   * {@link withPressureReferences}); its temperature unknown is T / temperatureScale.
   * `pressureScale` is the highest reservoir pressure [Pa].
   */
  pressureScale: number;
  temperatureScale: number;
  /**
   * Per junction (by unknown index), its reference pressure p_ref,j [Pa]: the highest reservoir
   * pressure when the system is built, the first guess's pressure once
   * {@link withPressureReferences} has moved the unknowns there. Fixed during a solve.
   */
  pressureReference: Float64Array;
  /** Fixed state of each node (NaN for junctions). */
  fixedPressure: Float64Array;
  fixedTemperature: Float64Array;
  /** Demand per node [kg/s] (0 for reservoirs); injection temperature per node (NaN if none). */
  demand: Float64Array;
  injectionTemperature: Float64Array;
  ambientTemperature: number;
  /** Sparse structure of the Jacobian (junctions only). */
  structure: BlockLuStructure;
  /** Per edge: the four block indices (from,from), (from,to), (to,from), (to,to), -1 if absent. */
  edgeBlocks: Int32Array;
  /** Per edge: the starting values of its inner iterations, kept from one evaluation to the next. */
  warmStarts: EdgeWarmStarts;
  /**
   * The one record every edge's relation is evaluated into, in turn (its results are read before
   * the next edge's evaluation; {@link evaluateEdgeWarm} moves the warm starts in and out).
   * One record instead of one per edge saves about 550 bytes per edge (55 MB at 100,000 edges).
   */
  edgeEvaluation: PipeFlowEvaluation;
  /**
   * Working records for the enthalpy of a gas with cp(T) or an equation of state; undefined for
   * a calorically perfect ideal gas, whose energy rows balance temperatures.
   */
  thermo: { state: ThermoState; equationOfState: PengRobinsonValues } | undefined;
  /**
   * Working arrays of {@link evaluateSystem} that do not outlive a call, made once per system
   * (systems derived from this one share them; evaluations run one at a time).
   */
  scratch: EvaluationScratch;
}

/**
 * Per edge, where each pipe's inner iterations start in its next evaluation: the inlet Mach
 * number, the inlet Mach number at capacity and the Fanno exit offset M2 - M1 found last (a real
 * gas's pipes keep a mass flux and a pressure ratio there), and the Colebrook-White root
 * 1/sqrt(fD) found last; NaN: none yet, start from an estimate. `choked` is whether the last
 * evaluation found the edge choked (then the next solves its capacity first). See
 * PipeFlowEvaluation's `last...` and `choked` fields and `friction.colebrook.inverseRoot`, which
 * these are copied to and from.
 */
export interface EdgeWarmStarts {
  choked: Uint8Array;
  inletMach: Float64Array;
  capacityInletMach: Float64Array;
  exitOffset: Float64Array;
  frictionInverseRoot: Float64Array;
}

/** Warm starts of `edgeCount` edges that have not been evaluated yet. */
function freshWarmStarts(edgeCount: number): EdgeWarmStarts {
  return {
    choked: new Uint8Array(edgeCount),
    inletMach: new Float64Array(edgeCount).fill(Number.NaN),
    capacityInletMach: new Float64Array(edgeCount).fill(Number.NaN),
    exitOffset: new Float64Array(edgeCount).fill(Number.NaN),
    frictionInverseRoot: new Float64Array(edgeCount).fill(Number.NaN),
  };
}

/** Per-edge and per-junction working arrays of {@link evaluateSystem}. */
export interface EvaluationScratch {
  /** Per edge: the arrival as an enthalpy temperature H at the downstream node, dH/dT, dH/dp. */
  arrivalEnthalpy: Float64Array;
  arrivalEnthalpyPerT: Float64Array;
  arrivalEnthalpyPerP: Float64Array;
  /** Per edge, 4 slots (pFrom, TFrom, pTo, TTo): slopes of the signed flow and of the arrival. */
  flowSlopes: Float64Array;
  arrivalSlopes: Float64Array;
  /** Per node: inflow from the edges and the round-off of its flows [kg/s]. */
  nodeInflow: Float64Array;
  nodeFlowNoise: Float64Array;
  /** Per junction: H(T_j, p_j), its slopes, and d/dp_j of the supply terms. */
  junctionEnthalpy: Float64Array;
  junctionEnthalpyPerT: Float64Array;
  junctionEnthalpyPerP: Float64Array;
  supplyTermPerP: Float64Array;
  /** dH/dT and dH/dp of one enthalpy evaluation. */
  slopes: Float64Array;
}

function createEvaluationScratch(
  edgeCount: number,
  nodeCount: number,
  junctionCount: number,
): EvaluationScratch {
  return {
    arrivalEnthalpy: new Float64Array(edgeCount),
    arrivalEnthalpyPerT: new Float64Array(edgeCount),
    arrivalEnthalpyPerP: new Float64Array(edgeCount),
    flowSlopes: new Float64Array(4 * edgeCount),
    arrivalSlopes: new Float64Array(4 * edgeCount),
    nodeInflow: new Float64Array(nodeCount),
    nodeFlowNoise: new Float64Array(nodeCount),
    junctionEnthalpy: new Float64Array(junctionCount),
    junctionEnthalpyPerT: new Float64Array(junctionCount),
    junctionEnthalpyPerP: new Float64Array(junctionCount),
    supplyTermPerP: new Float64Array(junctionCount),
    slopes: new Float64Array(2),
  };
}

/** Per-iteration results of an evaluation of the system. */
export interface SystemEvaluation {
  /** Scaled residuals, 2 per junction: [mass, energy]. */
  residual: Float64Array;
  /** Jacobian block values (4 per stored block), with respect to the scaled unknowns. */
  jacobian: Float64Array | undefined;
  /** Signed edge mass flows [kg/s], positive from `from` to `to`. */
  massFlow: Float64Array;
  /** Per edge: 1 if choked. */
  choked: Uint8Array;
  /** Net flow each node takes from the network [kg/s] (reservoirs: from the edges). */
  nodeNetOutflow: Float64Array;
  /**
   * Per junction, the scale its energy residual was divided by: (inflow + injection + w) T_ref
   * [kg/s K]. residual * energyScale / (W T_ref) is the enthalpy imbalance over W cp T_ref.
   */
  energyScale: Float64Array;
  /**
   * Per junction, the round-off its mass residual cannot go below, over W: the sum of its edges'
   * flow round-off (see FLOW_ROUNDING).
   */
  massNoise: Float64Array;
  /** Throughput used to scale the mass residuals [kg/s]. */
  throughput: number;
}

/**
 * A holder for what consecutive solves of networks of one layout can share, kept by a caller
 * between them, such as the cases of a study (the same nodes and edges with other values):
 * - the sparse structure of the Jacobian (its ordering and symbolic factorization): a system
 *   built with the holder takes the structure held there when its pattern is the same, and
 *   otherwise analyses its own and leaves that there (and drops the rest held for the old);
 * - the edges' warm starts of the last solve that left them ({@link EdgeWarmStarts},
 *   {@link handOverEdgeStarts}): a warm-started solve whose gas and edge kinds are the same
 *   takes them over, so that its first evaluation starts each pipe's inversion
 *   from the inlet Mach number found before instead of from a low-Mach estimate (at 10,000 edges
 *   a first evaluation costs four to five times a warm one). A solve from the first guess keeps
 *   its fresh ones, so that it gives the same numbers to the bit as without the holder;
 * - on large meshed networks, the factors a converged solve's last Newton steps were solved
 *   with, with which a warm-started solve's steps are solved by preconditioned GMRES
 *   (src/solve/frozen-factor-gmres.ts) until they no longer converge in a few iterations.
 * The solution does not depend on any of it beyond the solver's tolerances: only analysis,
 * starting values of inner iterations and factorizations are saved.
 */
export interface StructureHolder {
  structure?: BlockLuStructure;
  /** The edges' warm starts of the last solve, with the gas and edge kinds they were made for. */
  edgeStarts?: { gas: string; kinds: string[]; warmStarts: EdgeWarmStarts };
  /** Factors the last converged solve's last steps were solved with (in `structure`). */
  factors?: BlockLuFactorization;
}

/**
 * What an edge's evaluation holds warm starts for: its kind and pipe model, and the gas model
 * (a perfect gas's pipes keep an inlet Mach number there, a real gas's a mass flux).
 */
function edgeStartKinds(system: NetworkSystem): { gas: string; kinds: string[] } {
  const gas = system.model.document.gas;
  return {
    gas: `${gas.name} ${gas.heatCapacity ?? ""} ${gas.equationOfState ?? ""}`,
    kinds: system.elements.map((element) =>
      element.kind === "pipe" ? `pipe ${element.model}` : element.kind,
    ),
  };
}

/**
 * Hand the edges' warm starts over through the holder: a system just built for a warm start
 * (`take`) takes the held warm starts when they were made for the same gas and edge
 * kinds, and every system leaves its own there for the next solve of the layout (see
 * {@link StructureHolder}).
 */
export function handOverEdgeStarts(
  system: NetworkSystem,
  holder: StructureHolder,
  take: boolean,
): void {
  const { gas, kinds } = edgeStartKinds(system);
  const held = holder.edgeStarts;
  if (
    take &&
    held !== undefined &&
    held.gas === gas &&
    held.kinds.length === kinds.length &&
    held.kinds.every((kind, e) => kind === kinds[e])
  ) {
    system.warmStarts = held.warmStarts;
  }
  holder.edgeStarts = { gas, kinds, warmStarts: system.warmStarts };
}

/** Build the constant parts of a network's system (see {@link StructureHolder}). */
export function createNetworkSystem(model: NetworkModel, holder?: StructureHolder): NetworkSystem {
  const doc = model.document;
  const gasData = doc.gas;
  const gas = pipeGas(gasData);
  const elevations = new Map(doc.nodes.map((node) => [node.id, node.elevation]));
  const elevationOf = (id: string): number => elevations.get(id) ?? 0;
  const elements: EdgeElement[] = doc.edges.map(
    (edge): EdgeElement =>
      edge.kind === "pipe"
        ? {
            kind: "pipe",
            length: edge.length,
            diameter: edge.diameter,
            roughness: edge.roughness ?? 0,
            fixedFrictionFactor: edge.frictionFactor ?? Number.NaN,
            minorLoss: edge.minorLoss,
            model: edge.model,
            heatTransferPerLength: edge.heatTransferPerLength ?? 0,
            surroundingTemperature: edge.surroundingTemperature ?? doc.ambientTemperature,
            rise: elevationOf(edge.to) - elevationOf(edge.from),
          }
        : { ...edge.component },
  );
  const nodeCount = doc.nodes.length;
  const fixedPressure = new Float64Array(nodeCount).fill(Number.NaN);
  const fixedTemperature = new Float64Array(nodeCount).fill(Number.NaN);
  const demand = new Float64Array(nodeCount);
  const injectionTemperature = new Float64Array(nodeCount).fill(Number.NaN);
  let pressureScale = 0;
  let temperatureScale = 0;
  doc.nodes.forEach((node, index) => {
    if (node.kind === "reservoir") {
      fixedPressure[index] = node.pressure as number;
      fixedTemperature[index] = node.temperature as number;
      pressureScale = Math.max(pressureScale, node.pressure as number);
      temperatureScale = Math.max(temperatureScale, node.temperature as number);
    } else {
      demand[index] = node.demand;
      if (node.demand < 0 && node.temperature !== undefined) {
        injectionTemperature[index] = node.temperature;
        temperatureScale = Math.max(temperatureScale, node.temperature);
      }
    }
  });

  const junctionCount = model.junctionNodes.length;
  const neighbours: number[][] = Array.from({ length: junctionCount }, () => []);
  const seen = new Set<number>();
  for (let e = 0; e < model.edgeFrom.length; e++) {
    const a = model.unknownIndex[model.edgeFrom[e] as number] as number;
    const b = model.unknownIndex[model.edgeTo[e] as number] as number;
    if (a < 0 || b < 0) continue;
    const key = Math.min(a, b) * junctionCount + Math.max(a, b);
    if (seen.has(key)) continue;
    seen.add(key);
    (neighbours[a] as number[]).push(b);
    (neighbours[b] as number[]).push(a);
  }
  const held = holder?.structure;
  const structure =
    held !== undefined && hasPattern(held, neighbours)
      ? held
      : analyzeBlockPattern({ size: junctionCount, neighbours });
  if (holder !== undefined && holder.structure !== structure) {
    // Another layout: nothing of the last one's solve is of use to it.
    holder.structure = structure;
    delete holder.factors;
    delete holder.edgeStarts;
  }
  const edgeBlocks = new Int32Array(4 * model.edgeFrom.length).fill(-1);
  for (let e = 0; e < model.edgeFrom.length; e++) {
    const a = model.unknownIndex[model.edgeFrom[e] as number] as number;
    const b = model.unknownIndex[model.edgeTo[e] as number] as number;
    if (a >= 0) edgeBlocks[4 * e] = structure.blockIndex(a, a);
    if (a >= 0 && b >= 0) {
      edgeBlocks[4 * e + 1] = structure.blockIndex(a, b);
      edgeBlocks[4 * e + 2] = structure.blockIndex(b, a);
    }
    if (b >= 0) edgeBlocks[4 * e + 3] = structure.blockIndex(b, b);
  }

  return {
    model,
    junctionCount,
    edgeCount: model.edgeFrom.length,
    elements,
    gas,
    pressureScale,
    temperatureScale,
    pressureReference: new Float64Array(junctionCount).fill(pressureScale),
    fixedPressure,
    fixedTemperature,
    demand,
    injectionTemperature,
    ambientTemperature: doc.ambientTemperature,
    structure,
    edgeBlocks,
    warmStarts: freshWarmStarts(elements.length),
    edgeEvaluation: new PipeFlowEvaluation(),
    thermo:
      gasData.heatCapacity === undefined && gasData.equationOfState === undefined
        ? undefined
        : { state: emptyThermoState(), equationOfState: emptyPengRobinsonValues() },
    scratch: createEvaluationScratch(model.edgeFrom.length, nodeCount, junctionCount),
  };
}

/**
 * Whether a structure was analysed for exactly this pattern: as many rows, and each row's
 * neighbours (deduplicated, in any order) the structure's own.
 */
function hasPattern(
  structure: BlockLuStructure,
  neighbours: readonly (readonly number[])[],
): boolean {
  if (structure.size !== neighbours.length) return false;
  for (let i = 0; i < neighbours.length; i++) {
    const row = neighbours[i] as readonly number[];
    const stored =
      (structure.adjacencyStart[i + 1] as number) - (structure.adjacencyStart[i] as number);
    if (row.length !== stored) return false;
    for (const j of row) if (structure.blockIndex(i, j) < 0) return false;
  }
  return true;
}

/**
 * The enthalpy of the gas at (p, T) expressed as a temperature [K]:
 * H = h(T, p) / cp_ref + 298.15 K, cp_ref the gas's constant cp and h from src/gas/thermo.ts
 * (zero at 298.15 K for the ideal gas), with slopes[0] = (dH/dT)_p = cp(T, p) / cp_ref [-] and
 * slopes[1] = (dH/dp)_T = (dh/dp)_T / cp_ref [K/Pa]. A calorically perfect ideal gas has
 * H = T exactly (slopes 1 and 0), which is returned as is.
 */
export function enthalpyTemperature(
  system: NetworkSystem,
  pressure: number,
  temperature: number,
  slopes: Float64Array,
): number {
  const thermo = system.thermo;
  if (thermo === undefined) {
    slopes[0] = 1;
    slopes[1] = 0;
    return temperature;
  }
  const gas = system.gas.gas;
  const state = gasState(gas, pressure, temperature, thermo.state, thermo.equationOfState);
  const perCp = 1 / gas.specificHeatCp;
  slopes[0] = state.specificHeatCp * perCp;
  slopes[1] = state.enthalpyPressureSlope * perCp;
  return state.enthalpy * perCp + ENTHALPY_REFERENCE_TEMPERATURE;
}

/**
 * The scaled unknown of junction j's pressure p [Pa]: its offset from the junction's reference
 * pressure, p / p_ref,j - 1. With the reference near the junction's pressure the unknown is
 * small, so the pressure, and above all the difference between two close pressures, keeps digits
 * that p itself cannot hold: a drop of 1e-6 Pa at 10 bar is ten thousand units in the last place
 * of p, and the flow through a wide header that it drives would be known to only 1e-4 of itself
 * (hardening defect B2). Offsets from one scale for every junction (the highest reservoir
 * pressure p_S) resolve a pressure to 1e-16 of p_S only, too coarse for junctions at 0.4 p_S
 * (defect B3); offsets from each junction's own first-guess pressure resolve it to 1e-16 of its
 * distance from that guess.
 */
export function pressureUnknown(system: NetworkSystem, junction: number, pressure: number): number {
  const reference = system.pressureReference[junction] as number;
  return (pressure - reference) / reference;
}

/**
 * Largest relative pressure difference across an edge whose two junctions share a reference
 * pressure (see {@link withPressureReferences}).
 */
export const REFERENCE_GROUP_DROP = 1e-3;

/**
 * The same state with new junction reference pressures, and x re-expressed in them. Junctions
 * joined by edges with a drop of at most REFERENCE_GROUP_DROP of the pressure in x form a group
 * that shares one reference, the highest pressure in the group: two equal pressures of a group
 * then have exactly equal unknowns and a difference of exactly 0 (a network at rest stays at
 * rest), and each pressure is resolved to 1e-16 of its distance from the group's highest (at
 * the start; later from wherever that reference is). The new offsets are
 * (p_ref,old - p_ref,new + p_ref,old x) / p_ref,new, which keeps the digits below the rounding of
 * p that the old offsets held. The returned system shares everything else with `system`.
 */
export function withPressureReferences(
  system: NetworkSystem,
  x: Float64Array,
): { system: NetworkSystem; x: Float64Array } {
  const { model, junctionCount } = system;
  const pressure = new Float64Array(junctionCount);
  for (let j = 0; j < junctionCount; j++) {
    pressure[j] = nodePressure(system, x, model.junctionNodes[j] as number);
  }
  const groups = new JunctionGroups(junctionCount);
  for (let e = 0; e < system.edgeCount; e++) {
    const a = model.unknownIndex[model.edgeFrom[e] as number] as number;
    const b = model.unknownIndex[model.edgeTo[e] as number] as number;
    if (a < 0 || b < 0) continue;
    const pa = pressure[a] as number;
    const pb = pressure[b] as number;
    if (Math.abs(pa - pb) <= REFERENCE_GROUP_DROP * Math.max(pa, pb)) groups.join(a, b);
  }
  const highest = new Float64Array(junctionCount);
  const root = new Int32Array(junctionCount);
  for (let j = 0; j < junctionCount; j++) {
    const r = groups.root(j);
    root[j] = r;
    highest[r] = Math.max(highest[r] as number, pressure[j] as number);
  }
  const pressureReference = new Float64Array(junctionCount);
  const moved = Float64Array.from(x);
  for (let j = 0; j < junctionCount; j++) {
    const old = system.pressureReference[j] as number;
    const reference = highest[root[j] as number] as number;
    if (!(reference > 0) || !Number.isFinite(reference)) {
      pressureReference[j] = old;
      continue;
    }
    pressureReference[j] = reference;
    moved[2 * j] = (old - reference + old * (x[2 * j] as number)) / reference;
  }
  return { system: { ...system, pressureReference }, x: moved };
}

/**
 * Disjoint sets of junctions (union-find) with union by size and path halving, so that grouping
 * n junctions by m edges costs about m + n operations whatever the order of the edges: without
 * them a long chain joined end to end walks the whole chain on every join (quadratic; 0.8 s at
 * 40,000 edges). R. E. Tarjan, "Efficiency of a good but not linear set union algorithm",
 * J. ACM 22 (1975) 215-225.
 */
class JunctionGroups {
  private readonly parent: Int32Array;
  private readonly size: Int32Array;
  constructor(count: number) {
    this.parent = new Int32Array(count);
    this.size = new Int32Array(count).fill(1);
    for (let j = 0; j < count; j++) this.parent[j] = j;
  }
  /** The representative of j's group. */
  root(j: number): number {
    const parent = this.parent;
    let r = j;
    while (parent[r] !== r) {
      const grand = parent[parent[r] as number] as number;
      parent[r] = grand;
      r = grand;
    }
    return r;
  }
  /** Put a's and b's groups together. */
  join(a: number, b: number): void {
    let ra = this.root(a);
    let rb = this.root(b);
    if (ra === rb) return;
    if ((this.size[ra] as number) < (this.size[rb] as number)) [ra, rb] = [rb, ra];
    this.parent[rb] = ra;
    this.size[ra] = (this.size[ra] as number) + (this.size[rb] as number);
  }
}

/** Node pressure [Pa] from the scaled unknowns (reservoirs: fixed). */
export function nodePressure(system: NetworkSystem, x: Float64Array, node: number): number {
  const unknown = system.model.unknownIndex[node] as number;
  if (unknown < 0) return system.fixedPressure[node] as number;
  const reference = system.pressureReference[unknown] as number;
  return reference + (x[2 * unknown] as number) * reference;
}

/** A node's reference pressure [Pa] (a reservoir's is its fixed pressure). */
function referenceOf(system: NetworkSystem, node: number): number {
  const unknown = system.model.unknownIndex[node] as number;
  return unknown < 0
    ? (system.fixedPressure[node] as number)
    : (system.pressureReference[unknown] as number);
}

/** A node's pressure less its reference [Pa] (0 for a reservoir). */
function pressureAboveReference(system: NetworkSystem, x: Float64Array, node: number): number {
  const unknown = system.model.unknownIndex[node] as number;
  return unknown < 0
    ? 0
    : (x[2 * unknown] as number) * (system.pressureReference[unknown] as number);
}

/**
 * p(a) - p(b) [Pa] from the references and the offsets, (p_ref,a - p_ref,b) + (p_ref,a x_a -
 * p_ref,b x_b), more exact than the difference of the two rounded pressures when they are close:
 * two close references subtract exactly (Sterbenz), and the offsets' parts carry a round-off of
 * only 1e-16 of each pressure's distance from its reference. With one reference for both ends
 * it is p_ref (x_a - x_b).
 */
export function nodePressureDifference(
  system: NetworkSystem,
  x: Float64Array,
  a: number,
  b: number,
): number {
  const ua = system.model.unknownIndex[a] as number;
  const ub = system.model.unknownIndex[b] as number;
  const referenceA = referenceOf(system, a);
  const referenceB = referenceOf(system, b);
  if (ua >= 0 && ub >= 0 && referenceA === referenceB) {
    return ((x[2 * ua] as number) - (x[2 * ub] as number)) * referenceA;
  }
  return (
    referenceA -
    referenceB +
    (pressureAboveReference(system, x, a) - pressureAboveReference(system, x, b))
  );
}

/**
 * How finely a node's pressure is resolved [Pa], over a unit of rounding: the offset's own
 * rounding, plus that of the pressure itself where a relation uses the rounded pressure.
 */
function pressureResolution(
  system: NetworkSystem,
  x: Float64Array,
  node: number,
  pressure: number,
  exactDrop: boolean,
): number {
  const offset = Math.abs(pressureAboveReference(system, x, node));
  return exactDrop ? offset : offset + pressure;
}

/** Node temperature [K] from the scaled unknowns (reservoirs: fixed). */
export function nodeTemperature(system: NetworkSystem, x: Float64Array, node: number): number {
  const unknown = system.model.unknownIndex[node] as number;
  return unknown < 0
    ? (system.fixedTemperature[node] as number)
    : (x[2 * unknown + 1] as number) * system.temperatureScale;
}

/** The two ends of an edge at a state, in the direction of flow (see {@link edgeEndsAt}). */
export interface EdgeEnds {
  /** The flow runs from the edge's `from` node to its `to` node. */
  forward: boolean;
  /** Upstream and downstream node indices. */
  upstream: number;
  downstream: number;
  /** Upstream and downstream node pressures [Pa] and the upstream node temperature [K]. */
  upstreamPressure: number;
  downstreamPressure: number;
  upstreamTemperature: number;
  /**
   * p_up - p_down [Pa], from the pressure offsets (more exact than the difference of the two
   * rounded pressures); negative on a falling pipe whose gas column raises its outlet pressure.
   */
  drop: number;
}

/** A record for {@link edgeEndsAt} to fill (reuse one across edges). */
export function emptyEdgeEnds(): EdgeEnds {
  return {
    forward: true,
    upstream: 0,
    downstream: 0,
    upstreamPressure: 0,
    downstreamPressure: 0,
    upstreamTemperature: 0,
    drop: 0,
  };
}

/**
 * The ends of edge e at the scaled unknowns x, into `ends`: which way it flows (the higher
 * pressure upstream, or the hydrostatic rule of a rising pipe: flowsForward), the upstream
 * state, the downstream pressure and the drop between them. `scratch` is working space for the
 * direction test of rising pipes.
 */
export function edgeEndsAt(
  system: NetworkSystem,
  x: Float64Array,
  e: number,
  scratch: PipeFlowEvaluation,
  ends: EdgeEnds,
): EdgeEnds {
  const from = system.model.edgeFrom[e] as number;
  const to = system.model.edgeTo[e] as number;
  const pFrom = nodePressure(system, x, from);
  const pTo = nodePressure(system, x, to);
  const difference = nodePressureDifference(system, x, from, to);
  const forward = flowsForward(
    system.elements[e] as EdgeElement,
    system.gas,
    pFrom,
    pTo,
    difference,
    nodeTemperature(system, x, from),
    scratch,
  );
  ends.forward = forward;
  ends.upstream = forward ? from : to;
  ends.downstream = forward ? to : from;
  ends.upstreamPressure = forward ? pFrom : pTo;
  ends.downstreamPressure = forward ? pTo : pFrom;
  ends.upstreamTemperature = nodeTemperature(system, x, ends.upstream);
  ends.drop = forward ? difference : -difference;
  return ends;
}

/**
 * Flow through edge e between the ends found by {@link edgeEndsAt}, into `out` (see
 * evaluateEdgeFlow; `needCapacity` as there).
 */
export function evaluateEdgeAt(
  system: NetworkSystem,
  e: number,
  ends: EdgeEnds,
  out: PipeFlowEvaluation,
  needCapacity: boolean,
): PipeFlowEvaluation {
  return evaluateEdgeFlow(
    system.elements[e] as EdgeElement,
    system.gas,
    ends.upstreamPressure,
    ends.upstreamTemperature,
    ends.downstreamPressure,
    ends.forward,
    out,
    needCapacity,
    ends.drop,
  );
}

/**
 * Flow through edge e between the ends found by {@link edgeEndsAt}, evaluated into the system's
 * one edge record from the edge's own warm starts, which it then updates. The record is
 * overwritten by the next edge's evaluation: read what you need first.
 */
export function evaluateEdgeWarm(
  system: NetworkSystem,
  e: number,
  ends: EdgeEnds,
  needCapacity: boolean,
): PipeFlowEvaluation {
  const out = system.edgeEvaluation;
  const starts = system.warmStarts;
  out.choked = starts.choked[e] === 1;
  out.lastInletMach = starts.inletMach[e] as number;
  out.lastCapacityInletMach = starts.capacityInletMach[e] as number;
  out.lastExitOffset = starts.exitOffset[e] as number;
  const colebrook = out.friction.colebrook;
  colebrook.inverseRoot = starts.frictionInverseRoot[e] as number;
  evaluateEdgeAt(system, e, ends, out, needCapacity);
  starts.choked[e] = out.choked ? 1 : 0;
  starts.inletMach[e] = out.lastInletMach;
  starts.capacityInletMach[e] = out.lastCapacityInletMach;
  starts.exitOffset[e] = out.lastExitOffset;
  starts.frictionInverseRoot[e] = colebrook.inverseRoot as number;
  return out;
}

/**
 * Evaluate residuals (and, if asked, the Jacobian) at the scaled unknowns x.
 * `throughput` fixes the mass scale; pass undefined to take it from this state.
 *
 * `retired`, an earlier evaluation of this system that the caller no longer needs, lends its
 * arrays, which are overwritten (Newton's line search keeps a few and passes them round: on a
 * 100,000-edge network each evaluation is 13 MB, and fresh ones every trial made the garbage
 * collector run a full collection per iteration). It must not be used afterwards.
 */
export function evaluateSystem(
  system: NetworkSystem,
  x: Float64Array,
  withJacobian: boolean,
  throughput?: number,
  retired?: SystemEvaluation,
): SystemEvaluation {
  const { model, edgeCount, junctionCount } = system;
  const reuse = retired !== undefined && retired.massFlow.length === edgeCount;
  // Every entry of the lent arrays is written below before it is read, or zeroed here.
  const massFlow = reuse ? retired.massFlow : new Float64Array(edgeCount);
  const choked = reuse ? retired.choked : new Uint8Array(edgeCount);
  // Working arrays, reused across calls (the system's scratch): every entry read below is
  // written first in this call, or zeroed here.
  const scratch = system.scratch;
  // Per edge: the arrival as an enthalpy temperature H at the downstream node's pressure, with
  // its slopes dH/dT and dH/dp there (1 and 0 for a perfect gas: H is the arrival temperature).
  const { arrivalEnthalpy, arrivalEnthalpyPerT, arrivalEnthalpyPerP, slopes } = scratch;
  // Per edge: derivatives of the signed flow and of the arrival temperature with respect to the
  // unscaled states (pFrom, TFrom, pTo, TTo); the downstream temperature's slot stays 0.
  const flowSlopes = scratch.flowSlopes.fill(0);
  const arrivalSlopes = scratch.arrivalSlopes.fill(0);
  const nodeCount = model.document.nodes.length;
  const nodeNetOutflow = reuse ? retired.nodeNetOutflow.fill(0) : new Float64Array(nodeCount);
  const nodeInflow = scratch.nodeInflow.fill(0);
  // Round-off of each flow: its change for a few units of rounding in its end pressures [kg/s].
  const nodeFlowNoise = scratch.nodeFlowNoise.fill(0);

  const ends = emptyEdgeEnds();
  for (let e = 0; e < edgeCount; e++) {
    const from = model.edgeFrom[e] as number;
    const to = model.edgeTo[e] as number;
    const element = system.elements[e] as EdgeElement;
    edgeEndsAt(system, x, e, system.edgeEvaluation, ends);
    const { forward, upstream, downstreamPressure: pDown, upstreamPressure: pUp } = ends;
    const result = evaluateEdgeWarm(system, e, ends, false);
    const sign = forward ? 1 : -1;
    massFlow[e] = sign * result.massFlow;
    choked[e] = result.choked ? 1 : 0;
    arrivalEnthalpy[e] = enthalpyTemperature(system, pDown, result.arrivalTemperature, slopes);
    arrivalEnthalpyPerT[e] = slopes[0] as number;
    arrivalEnthalpyPerP[e] = slopes[1] as number;
    let dDown = result.dMassFlowdDownstreamPressure;
    if (result.choked) dDown = -CHOKED_SLOPE_FRACTION * result.dMassFlowdUpstreamPressure;
    // Slot order: 0 pFrom, 1 TFrom, 2 pTo, 3 TTo.
    const upP = forward ? 0 : 2;
    const upT = forward ? 1 : 3;
    const downP = forward ? 2 : 0;
    flowSlopes[4 * e + upP] = sign * result.dMassFlowdUpstreamPressure;
    flowSlopes[4 * e + upT] = sign * result.dMassFlowdUpstreamTemperature;
    flowSlopes[4 * e + downP] = sign * dDown;
    arrivalSlopes[4 * e + upP] = result.dArrivalTemperaturedUpstreamPressure;
    arrivalSlopes[4 * e + upT] = result.dArrivalTemperaturedUpstreamTemperature;
    arrivalSlopes[4 * e + downP] = result.dArrivalTemperaturedDownstreamPressure;
    const downstreamNode = forward ? to : from;
    nodeInflow[downstreamNode] = (nodeInflow[downstreamNode] as number) + result.massFlow;
    const exactDrop = element.kind === "pipe" && isCreepingFlow(Math.abs(ends.drop), pUp);
    const noise =
      FLOW_ROUNDING *
      (Math.abs(result.dMassFlowdUpstreamPressure) *
        pressureResolution(system, x, upstream, pUp, exactDrop) +
        Math.abs(result.dMassFlowdDownstreamPressure) *
          pressureResolution(system, x, forward ? to : from, pDown, exactDrop));
    nodeFlowNoise[from] = (nodeFlowNoise[from] as number) + noise;
    nodeFlowNoise[to] = (nodeFlowNoise[to] as number) + noise;
    nodeNetOutflow[from] = (nodeNetOutflow[from] as number) + (massFlow[e] as number);
    nodeNetOutflow[to] = (nodeNetOutflow[to] as number) - (massFlow[e] as number);
  }

  let scale = throughput;
  if (scale === undefined) scale = networkThroughput(system, nodeNetOutflow);
  const temperatureScale = system.temperatureScale;
  // Energy rows are scaled per junction by (inflow + injection + w) T_ref: the residual is then the
  // junction's temperature error relative to T_ref, enforced alike at busy and quiet junctions.
  const energyScale = reuse ? retired.energyScale : new Float64Array(junctionCount);
  for (let j = 0; j < junctionCount; j++) {
    const node = model.junctionNodes[j] as number;
    const demand = system.demand[node] as number;
    const supplied = (nodeInflow[node] as number) + (demand < 0 ? -demand : 0);
    energyScale[j] = (supplied + noFlowWeight(scale, supplied)) * temperatureScale;
  }
  const residual = reuse ? retired.residual : new Float64Array(2 * junctionCount);
  // Per junction: its own enthalpy temperature H(T_j, p_j) and slopes, and d/dp_j of the ambient
  // and injection terms' w (H_ambient - H_j) + injection (H_injected - H_j) (0 for a perfect gas).
  const { junctionEnthalpy, junctionEnthalpyPerT, junctionEnthalpyPerP, supplyTermPerP } = scratch;
  for (let j = 0; j < junctionCount; j++) {
    const node = model.junctionNodes[j] as number;
    const t = (x[2 * j + 1] as number) * temperatureScale;
    const p = nodePressure(system, x, node);
    const demand = system.demand[node] as number;
    // mass: inflow - demand = -(net outflow to edges) - demand
    residual[2 * j] = (-(nodeNetOutflow[node] as number) - demand) / scale;
    const supplied = (nodeInflow[node] as number) + (demand < 0 ? -demand : 0);
    const own = enthalpyTemperature(system, p, t, slopes);
    junctionEnthalpy[j] = own;
    junctionEnthalpyPerT[j] = slopes[0] as number;
    const ownPerP = slopes[1] as number;
    junctionEnthalpyPerP[j] = ownPerP;
    const weight = noFlowWeight(scale, supplied);
    const ambient = enthalpyTemperature(system, p, system.ambientTemperature, slopes);
    let energy = weight * (ambient - own);
    let energyPerP = weight * ((slopes[1] as number) - ownPerP);
    if (demand < 0) {
      const injected = system.injectionTemperature[node] as number;
      energy += -demand * (enthalpyTemperature(system, p, injected, slopes) - own);
      energyPerP += -demand * ((slopes[1] as number) - ownPerP);
    }
    residual[2 * j + 1] = energy;
    supplyTermPerP[j] = energyPerP;
  }
  for (let e = 0; e < edgeCount; e++) {
    const flow = massFlow[e] as number;
    if (flow === 0) continue;
    const downstream = flow > 0 ? (model.edgeTo[e] as number) : (model.edgeFrom[e] as number);
    const unknown = model.unknownIndex[downstream] as number;
    if (unknown < 0) continue;
    residual[2 * unknown + 1] =
      (residual[2 * unknown + 1] as number) +
      Math.abs(flow) * ((arrivalEnthalpy[e] as number) - (junctionEnthalpy[unknown] as number));
  }
  for (let j = 0; j < junctionCount; j++) {
    residual[2 * j + 1] = (residual[2 * j + 1] as number) / (energyScale[j] as number);
  }

  let jacobian: Float64Array | undefined;
  if (withJacobian) {
    const blockValues = 4 * system.structure.blockCount;
    jacobian =
      reuse && retired.jacobian?.length === blockValues
        ? retired.jacobian.fill(0)
        : new Float64Array(blockValues);
    const tS = temperatureScale;
    // Regularisation of the energy rows.
    for (let j = 0; j < junctionCount; j++) {
      const node = model.junctionNodes[j] as number;
      const demand = system.demand[node] as number;
      const weight = noFlowWeight(scale, (nodeInflow[node] as number) + (demand < 0 ? -demand : 0));
      const diagonal = -(weight + (demand < 0 ? -demand : 0)) * (junctionEnthalpyPerT[j] as number);
      const rowScale = energyScale[j] as number;
      jacobian[4 * j + 3] = (jacobian[4 * j + 3] as number) + (diagonal * tS) / rowScale;
      if (system.thermo !== undefined) {
        jacobian[4 * j + 2] =
          (jacobian[4 * j + 2] as number) +
          ((supplyTermPerP[j] as number) * (system.pressureReference[j] as number)) / rowScale;
      }
    }
    for (let e = 0; e < edgeCount; e++) {
      const from = model.edgeFrom[e] as number;
      const to = model.edgeTo[e] as number;
      const flow = massFlow[e] as number;
      // Column scales of the two ends' pressure unknowns: their reference pressures.
      const referenceFrom = referenceOf(system, from);
      const referenceTo = referenceOf(system, to);
      // Mass rows: node `to` gains +flow, node `from` loses it.
      for (let row = 0; row < 2; row++) {
        const rowNode = row === 0 ? from : to;
        const rowUnknown = model.unknownIndex[rowNode] as number;
        if (rowUnknown < 0) continue;
        const sign = row === 0 ? -1 : 1;
        for (let column = 0; column < 2; column++) {
          const block = system.edgeBlocks[4 * e + 2 * row + column] as number;
          if (block < 0) continue;
          const b = 4 * block;
          jacobian[b] =
            (jacobian[b] as number) +
            (sign *
              (flowSlopes[4 * e + 2 * column] as number) *
              (column === 0 ? referenceFrom : referenceTo)) /
              scale;
          jacobian[b + 1] =
            (jacobian[b + 1] as number) +
            (sign * (flowSlopes[4 * e + 2 * column + 1] as number) * tS) / scale;
        }
      }
      if (Math.abs(flow) <= NO_FLOW_WEIGHT * scale) {
        // At zero flow the energy terms vanish with their derivatives except through the flow:
        // m (T_arrive - T_d) has slope (T_arrive - T_d) dm, which is counted below for the
        // downstream end the flow would go to. With no flow both ends are candidates; the
        // product is 0 at the solution, so the term is left out (it is of order eps). So for a
        // flow below the no-flow floor: the junction pressures, held as offsets, resolve
        // round-off flows of 1e-30 kg/s where the pressures themselves would be equal, and
        // their slope over the tiny no-flow weight would swamp the junction's temperature row.
        continue;
      }
      // Energy row of the downstream node d: |m| (H(T_arrive, p_d) - H(T_d, p_d)).
      const downstreamRow = flow > 0 ? 1 : 0;
      const downstream = downstreamRow === 0 ? from : to;
      const rowUnknown = model.unknownIndex[downstream] as number;
      if (rowUnknown < 0) continue;
      const difference = (arrivalEnthalpy[e] as number) - (junctionEnthalpy[rowUnknown] as number);
      const arrivalPerT = arrivalEnthalpyPerT[e] as number;
      const magnitudeSign = flow > 0 ? 1 : -1; // d|m| = magnitudeSign dm
      const magnitude = Math.abs(flow);
      for (let column = 0; column < 2; column++) {
        const block = system.edgeBlocks[4 * e + 2 * downstreamRow + column] as number;
        if (block < 0) continue;
        const b = 4 * block;
        let dP =
          magnitudeSign * (flowSlopes[4 * e + 2 * column] as number) * difference +
          magnitude * (arrivalSlopes[4 * e + 2 * column] as number) * arrivalPerT;
        let dT =
          magnitudeSign * (flowSlopes[4 * e + 2 * column + 1] as number) * difference +
          magnitude * (arrivalSlopes[4 * e + 2 * column + 1] as number) * arrivalPerT;
        if (column === downstreamRow) {
          dT -= magnitude * (junctionEnthalpyPerT[rowUnknown] as number);
          // Both enthalpies are taken at p_d (0 for a perfect gas).
          if (system.thermo !== undefined) {
            dP +=
              magnitude *
              ((arrivalEnthalpyPerP[e] as number) - (junctionEnthalpyPerP[rowUnknown] as number));
          }
        }
        // The row is divided by a scale that grows with the inflow: d(E/s) = (dE - (E/s) ds)/s,
        // ds = T_ref d|m| (the no-flow weight's own change is negligible).
        const scaledResidual = residual[2 * rowUnknown + 1] as number;
        const dInflowP = magnitudeSign * (flowSlopes[4 * e + 2 * column] as number);
        const dInflowT = magnitudeSign * (flowSlopes[4 * e + 2 * column + 1] as number);
        dP -= scaledResidual * temperatureScale * dInflowP;
        dT -= scaledResidual * temperatureScale * dInflowT;
        const rowScale = energyScale[rowUnknown] as number;
        const columnReference = column === 0 ? referenceFrom : referenceTo;
        jacobian[b + 2] = (jacobian[b + 2] as number) + (dP * columnReference) / rowScale;
        jacobian[b + 3] = (jacobian[b + 3] as number) + (dT * tS) / rowScale;
      }
    }
  }
  const massNoise = reuse ? retired.massNoise : new Float64Array(junctionCount);
  for (let j = 0; j < junctionCount; j++) {
    massNoise[j] = (nodeFlowNoise[model.junctionNodes[j] as number] as number) / scale;
  }
  return {
    residual,
    jacobian,
    massFlow,
    choked,
    nodeNetOutflow,
    energyScale,
    massNoise,
    throughput: scale,
  };
}

/**
 * Throughput W = half the sum of the absolute external flows (demands, injections and reservoir
 * flows) [kg/s], the scale of the mass residuals. Never below a floor of 1e-9 kg/s, so a network
 * at rest still has a finite scale.
 */
export function networkThroughput(system: NetworkSystem, nodeNetOutflow: Float64Array): number {
  let sum = 0;
  const model = system.model;
  for (let node = 0; node < model.document.nodes.length; node++) {
    if (model.isReservoir[node] === 1) sum += Math.abs(nodeNetOutflow[node] as number);
    else sum += Math.abs(system.demand[node] as number);
  }
  return Math.max(0.5 * sum, 1e-9);
}
