import type { Gas } from "../gas/gas-types.js";

/**
 * TypeScript types of a network document as the user writes it (schemas/network.schema.json),
 * and of the checked document in SI units that the rest of machnet works on.
 */

/** A plain number in SI base units, or a string "<number> <unit>". */
export type QuantityInput = number | string;

/** Sutherland constants as written in a document. */
export interface SutherlandInput {
  referenceViscosity: QuantityInput;
  referenceTemperature: QuantityInput;
  sutherlandConstant: QuantityInput;
}

/** The `gas` member: a preset, a custom ideal gas, or a mixture of presets. */
export interface GasInput {
  preset?: string;
  name?: string;
  molarMass?: QuantityInput;
  gamma?: number;
  viscosity?: QuantityInput | SutherlandInput;
  components?: { preset: string; moleFraction: number }[];
}

/** Pipe models of the network solver. */
export type PipeModelName = "adiabatic" | "isothermal";

/** The `settings.limits` member. */
export interface LimitsInput {
  maxMach?: number;
  maxVelocity?: QuantityInput;
  maxMomentumFlux?: QuantityInput;
  minPressure?: QuantityInput;
}

/** The `settings` member. */
export interface SettingsInput {
  pipeModel?: PipeModelName;
  tolerance?: number;
  maxIterations?: number;
  /** Wall-time budget of one solve [s]. */
  timeLimit?: number;
  limits?: LimitsInput;
}

/** A node as written in a document. */
export interface NodeInput {
  id: string;
  kind: "reservoir" | "junction";
  description?: string;
  pressure?: QuantityInput;
  temperature?: QuantityInput;
  demand?: QuantityInput;
}

/** An edge as written in a document. */
export interface EdgeInput {
  id: string;
  kind: "pipe";
  description?: string;
  from: string;
  to: string;
  length: QuantityInput;
  diameter: QuantityInput;
  roughness?: QuantityInput;
  frictionFactor?: number;
  minorLoss?: number;
  model?: PipeModelName;
}

/** A whole network document. */
export interface NetworkDocument {
  $schema?: string;
  name?: string;
  description?: string;
  gas?: GasInput;
  ambient?: { pressure?: QuantityInput; temperature?: QuantityInput };
  settings?: SettingsInput;
  nodes: NodeInput[];
  edges: EdgeInput[];
}

/** Design limits in SI; a missing limit is not checked. */
export interface DesignLimits {
  /** Largest Mach number at any pipe end [-]. */
  maxMach?: number;
  /** Largest velocity at any pipe end [m/s]. */
  maxVelocity?: number;
  /** Largest rho v^2 at any pipe end [Pa]. */
  maxMomentumFlux?: number;
  /** Smallest junction pressure [Pa absolute]. */
  minPressure?: number;
}

/** Solver settings with every default filled in. */
export interface SolverSettings {
  /** @defaultValue "adiabatic" */
  pipeModel: PipeModelName;
  /** Largest scaled residual accepted as converged. @defaultValue 1e-9 */
  tolerance: number;
  /** @defaultValue 100 */
  maxIterations: number;
  /** Wall-time budget of one solve [s]; a solve that runs out is a not-converged result. */
  timeLimit?: number;
  limits: DesignLimits;
}

/** A node with its values in SI. */
export interface CheckedNode {
  id: string;
  kind: "reservoir" | "junction";
  /** Reservoir stagnation pressure [Pa absolute]; undefined for a junction. */
  pressure?: number;
  /** Reservoir stagnation temperature, or temperature of a junction's injection [K]. */
  temperature?: number;
  /** External mass flow leaving the network here [kg/s]; negative is an injection. 0 if none. */
  demand: number;
}

/** An edge with its values in SI. */
export interface CheckedEdge {
  id: string;
  kind: "pipe";
  from: string;
  to: string;
  /** [m] */
  length: number;
  /** Inside diameter [m]. */
  diameter: number;
  /** Absolute roughness [m], used with Colebrook-White; undefined when frictionFactor is set. */
  roughness?: number;
  /** Fixed Darcy friction factor [-], or undefined. */
  frictionFactor?: number;
  /** Sum of minor-loss coefficients [-]. */
  minorLoss: number;
  model: PipeModelName;
}

/** A warning found while reading the document (not an error): for example a bare "bar". */
export interface InputNote {
  code: string;
  path: string;
  message: string;
}

/** A network document after every check, with every value in SI and every default applied. */
export interface CheckedDocument {
  name: string;
  gas: Gas;
  /** Barometric pressure that gauge pressures were taken relative to [Pa]. */
  ambientPressure: number;
  /** [K] */
  ambientTemperature: number;
  settings: SolverSettings;
  nodes: CheckedNode[];
  edges: CheckedEdge[];
  /** Warnings from reading the values, passed on to the results. */
  notes: InputNote[];
}
