/**
 * The results contract of a network solve. All numbers SI: Pa absolute, K, kg/s, m/s, kg/m3.
 * Extend it; do not rename it.
 */
import type {
  CheckValveDetails,
  ComponentDetails,
  RegulatorDetails,
  RestrictionDetails,
  ValveDetails,
} from "../physics/components/component-flow.js";
import type { PipeEndState } from "../physics/pipe.js";

export type {
  CheckValveDetails,
  ComponentDetails,
  PipeEndState,
  RegulatorDetails,
  RestrictionDetails,
  ValveDetails,
};

/** Codes of the warnings a result can carry. */
export type WarningCode =
  /** A bare "bar" or "psi" was read as absolute. */
  | "bare-pressure-unit-absolute"
  /** No gas flows through this junction: its temperature is the ambient temperature. */
  | "no-flow"
  /** The edge is choked: its flow is set by its upstream state alone. */
  | "choked"
  /** A design limit is exceeded. */
  | "limit-mach"
  | "limit-velocity"
  | "limit-momentum-flux"
  | "limit-pressure"
  /** The solve did not converge or has no solution (see `status`). */
  | "not-converged"
  | "no-solution"
  /** A solution reached by ramping the demands up from a smaller case. */
  | "continuation"
  /** A check valve or regulator is closed: only its leakage passes. */
  | "closed"
  /**
   * With Peng-Robinson, a node's state or a pipe's inlet or outlet state is one where the gas
   * would condense: the single-phase gas results there do not hold.
   */
  | "condensing";

/** A warning attached to a result, naming the node or edge it is about. */
export interface SolverWarning {
  code: WarningCode;
  message: string;
  node?: string;
  edge?: string;
}

/** Result for one node. */
export interface NodeResult {
  id: string;
  kind: "reservoir" | "junction";
  /** Pressure [Pa absolute]: static = stagnation, gas at rest in the node. */
  pressure: number;
  /** Stagnation temperature of the gas in the node [K]. */
  temperature: number;
  /** External mass flow leaving the network here [kg/s]; for a reservoir, what it takes from the
   * network (negative when it supplies). */
  demand: number;
  /** Height above the datum [m] (0 when not given). */
  elevation: number;
}

/** Result for one edge. */
export interface EdgeResult {
  id: string;
  kind: "pipe" | "orifice" | "nozzle" | "valve" | "regulator" | "check";
  from: string;
  to: string;
  /** Pipe model used; "adiabatic" for every component (no heat exchange). */
  model: "adiabatic" | "isothermal" | "heat-transfer";
  /** [kg/s], positive from `from` to `to`. */
  massFlow: number;
  choked: boolean;
  /** |massFlow| / capacity for the present upstream state [-]; 1 when choked. */
  chokeRatio: number;
  /** Largest flow the edge passes for its present upstream state [kg/s]. */
  capacity: number;
  /** Reynolds number G D / mu(T0 upstream) [-]; a component's in its upstream connecting pipe
   * (or its bore; 0 for a valve given without pipe diameters). */
  reynolds: number;
  /** Darcy friction factor [-]; 0 for a component. */
  frictionFactor: number;
  /** State just inside the pipe at its upstream end (in the direction of flow); for a component,
   * in its upstream connecting pipe (at rest when no pipe diameter is given). */
  inlet: PipeEndState;
  /** State at its downstream end (in the direction of flow); for a component, in its downstream
   * connecting pipe. */
  outlet: PipeEndState;
  /** Pressure of the upstream node minus that of the downstream node [Pa]; >= 0, except on a
   * pipe that rises or falls, where the upstream end follows the hydrostatic head. */
  pressureDrop: number;
  /** Heat flow into the gas over the edge [W], negative when the gas loses heat; 0 for adiabatic
   * pipes and components. */
  heatFlow: number;
  /** A component's own figures (absent for a pipe): pressure ratio and permanent pressure loss
   * of an orifice or nozzle, opening and expansion factor of a valve, the state of a regulator
   * or check valve, leakage of a closed one. */
  component?: ComponentDetails;
  /** A pipe given by nominal size: its NPS [in], DN and schedule. */
  catalog?: { nominalPipeSize: number; nominalDiameter: number; schedule: string };
}

/** How the solve ended. */
export type SolveStatus = "converged" | "not-converged" | "no-solution";

/** Diagnosis of a network with no solution. */
export interface NoSolutionDiagnosis {
  /** Largest fraction of the stated demands for which a solution was found (0 if none). */
  largestFeasibleDemandScale: number;
  /** Edges choked at that largest solved case, with their capacity [kg/s]. */
  limitingEdges: { id: string; capacity: number; massFlow: number }[];
  /** Junction equations that did not close at the best iterate, worst first (up to 10). */
  openEquations: { node: string; equation: "mass" | "energy"; residual: number }[];
  message: string;
}

/** Balance of the whole network, from the final state. */
export interface NetworkBalance {
  /** Throughput W: half the sum of the absolute external flows [kg/s]. */
  throughput: number;
  /** Total mass flow supplied by reservoirs and injections [kg/s]. */
  massIn: number;
  /** Total mass flow delivered to demands and taken by reservoirs [kg/s]. */
  massOut: number;
  /** Stagnation enthalpy flow in and out, relative to 0 K (cp T) [W]. */
  enthalpyIn: number;
  enthalpyOut: number;
  /**
   * Heat taken up by the gas through pipe walls [W], negative when the gas loses heat: the sum of
   * the edges' heatFlow (heat-transfer and isothermal pipes; 0 when all are adiabatic).
   */
  heatIn: number;
  /** Rise of potential energy of the gas in the pipes, sum of m g (z_out - z_in) [W]. */
  potentialEnergyGain: number;
  /**
   * The first law of the whole network, (enthalpyIn + heatIn - potentialEnergyGain - enthalpyOut)
   * over the larger of enthalpyIn and enthalpyOut [-]: closes to round-off at a solution.
   */
  energyImbalance: number;
  /** Largest mass imbalance of any junction over W, and of energy over W cp T_ref. */
  largestMassImbalance: number;
  largestEnergyImbalance: number;
  /** Largest mismatch between a subsonic edge's exit pressure (recomputed from its flow) and its
   * downstream node pressure, over that pressure. */
  largestExitPressureMismatch: number;
}

/** The result of a network solve. */
export interface NetworkResult {
  converged: boolean;
  status: SolveStatus;
  iterations: number;
  /** Largest scaled residual (mass over W; energy over W T_ref). */
  residual: number;
  residuals: { mass: number; energy: number };
  warnings: SolverWarning[];
  nodes: NodeResult[];
  edges: EdgeResult[];
  balance: NetworkBalance;
  /** Present when status is "no-solution". */
  diagnosis?: NoSolutionDiagnosis;
  /** Name from the document. */
  name: string;
  /** The gas, as used. */
  gas: {
    name: string;
    molarMass: number;
    heatCapacityRatio: number;
    specificGasConstant: number;
    specificHeatCp: number;
  };
  /** Ambient state the gauge pressures were read against. */
  ambient: { pressure: number; temperature: number };
}
