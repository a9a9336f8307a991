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
  /** Ideal-gas heat capacity model; default "constant". */
  heatCapacity?: "constant" | "nasa7";
  /** Equation of state; default "ideal-gas". */
  equationOfState?: "ideal-gas" | "peng-robinson";
  /** Custom gas with "peng-robinson": Tc. */
  criticalTemperature?: QuantityInput;
  /** Custom gas with "peng-robinson": pc, absolute. */
  criticalPressure?: QuantityInput;
  /** Custom gas with "peng-robinson": omega [-]. */
  acentricFactor?: number;
}

/** Pipe models of the network solver. */
export type PipeModelName = "adiabatic" | "isothermal" | "heat-transfer";

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
  /** Height above a common datum. @defaultValue 0 */
  elevation?: QuantityInput;
}

/** Edge kinds: a pipe or a component. */
export type EdgeKind = "pipe" | ComponentKind;

/** Component kinds (edges other than pipes). */
export type ComponentKind = "orifice" | "nozzle" | "valve" | "regulator" | "check";

/** A fitting on a pipe, by machnet's type name (src/input/fittings.ts). */
export interface FittingInput {
  type: string;
  /** @defaultValue 1 */
  count?: number;
  /** Reducer, expander: included cone angle [degrees], 180 for a sudden step. */
  angle?: number;
  /** Reducer, expander: inside diameter of the pipe it leads into. */
  outletDiameter?: QuantityInput;
  /** Reducer, expander: nominal size of the pipe it leads into, instead of outletDiameter. */
  outletSize?: string;
  /** Reducer, expander: schedule with outletSize. @defaultValue the pipe's own schedule */
  outletSchedule?: string;
}

/** Fields every edge has. */
interface EdgeInputBase {
  id: string;
  kind: EdgeKind;
  description?: string;
  from: string;
  to: string;
}

/** A pipe as written in a document. */
export interface PipeEdgeInput extends EdgeInputBase {
  kind: "pipe";
  length: QuantityInput;
  /** Inside diameter; or give `size` and `schedule`. */
  diameter?: QuantityInput;
  /** Nominal size: "DN80", "3 in", "NPS 3", "1 1/2 in". */
  size?: string;
  /** ASME B36.10M or B36.19M schedule: "40", "STD", "XS", "10S", ... */
  schedule?: string;
  /** Wall material, setting a typical roughness. */
  material?: string;
  roughness?: QuantityInput;
  frictionFactor?: number;
  minorLoss?: number;
  fittings?: FittingInput[];
  model?: PipeModelName;
  /** Heat-transfer model: overall coefficient per inside wall area (W/(m2 K)). */
  heatTransferCoefficient?: QuantityInput;
  /** Heat-transfer model: overall coefficient per unit length (W/(m K)). */
  heatTransferPerLength?: QuantityInput;
  /** Heat-transfer model: temperature of the surroundings. @defaultValue ambient temperature */
  surroundingTemperature?: QuantityInput;
}

/** An orifice plate or restriction orifice, or a rounded nozzle. */
export interface RestrictionEdgeInput extends EdgeInputBase {
  kind: "orifice" | "nozzle";
  boreDiameter: QuantityInput;
  pipeDiameter?: QuantityInput;
  dischargeCoefficient?: number;
}

/** Fields of the valve-like components: a flow coefficient, Kv or Cv, and xT. */
interface TrimInput {
  kv?: number;
  cv?: number;
  xT?: number;
  pipeDiameter?: QuantityInput;
}

/** A control or isolation valve. */
export interface ValveEdgeInput extends EdgeInputBase, TrimInput {
  kind: "valve";
  opening?: number;
  characteristic?: "linear" | "equal-percentage";
  rangeability?: number;
  valveDiameter?: QuantityInput;
  outletPipeDiameter?: QuantityInput;
}

/** A pressure regulator. */
export interface RegulatorEdgeInput extends EdgeInputBase, TrimInput {
  kind: "regulator";
  setpoint: QuantityInput;
  proportionalBand?: QuantityInput;
}

/** A check valve. */
export interface CheckEdgeInput extends EdgeInputBase, TrimInput {
  kind: "check";
  lossCoefficient?: number;
}

/** An edge as written in a document. */
export type EdgeInput =
  | PipeEdgeInput
  | RestrictionEdgeInput
  | ValveEdgeInput
  | RegulatorEdgeInput
  | CheckEdgeInput;

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
  /** Height above the datum [m]; 0 if not given. */
  elevation: number;
}

/**
 * Fields every checked edge has. For a component (a lumped element) `length` is 0, `minorLoss` 0,
 * `model` "adiabatic", and `diameter` the inside diameter of its upstream connecting pipe, or,
 * without one, its bore (orifice, nozzle) or the diameter of a circle of its flow area Kv / 36000
 * m2 (valve, regulator, check valve).
 */
interface CheckedEdgeBase {
  id: string;
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

/** A pipe with its values in SI. */
export interface CheckedPipeEdge extends CheckedEdgeBase {
  kind: "pipe";
  /** Heat-transfer model: U' per unit length [W/(m K)] (from either coefficient); 0 if none. */
  heatTransferPerLength?: number;
  /** Heat-transfer model: surrounding temperature [K]. */
  surroundingTemperature?: number;
  /** Nominal size and schedule it was given by, if any. */
  catalog?: { nominalPipeSize: number; nominalDiameter: number; schedule: string };
}

/** A component with its values in SI; `component` is what the solver evaluates. */
export interface CheckedComponentEdge extends CheckedEdgeBase {
  kind: ComponentKind;
  component: CheckedComponent;
}

/** An edge with its values in SI. */
export type CheckedEdge = CheckedPipeEdge | CheckedComponentEdge;

/**
 * A component's parameters in SI; a diameter not given is NaN. The same fields, one for one, as
 * the solver's elements in src/physics/components/component-elements.ts (see there for each).
 */
export type CheckedComponent =
  | {
      kind: "orifice" | "nozzle";
      boreDiameter: number;
      pipeDiameter: number;
      dischargeCoefficient: number;
    }
  | {
      kind: "valve";
      /** Kv at full opening [m3/h]. */
      flowCoefficient: number;
      opening: number;
      characteristic: "linear" | "equal-percentage";
      rangeability: number;
      pressureDifferentialRatioFactor: number;
      valveDiameter: number;
      inletPipeDiameter: number;
      outletPipeDiameter: number;
    }
  | {
      kind: "regulator";
      /** [Pa absolute] */
      setpoint: number;
      /** [Pa] */
      proportionalBand: number;
      flowCoefficient: number;
      pressureDifferentialRatioFactor: number;
      pipeDiameter: number;
    }
  | {
      kind: "check";
      flowCoefficient: number;
      pressureDifferentialRatioFactor: number;
      pipeDiameter: number;
    };

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
