/**
 * TypeScript types of a study document as the user writes it (schemas/study.schema.json), and of
 * the prepared study that the runners work on: every value in SI, every reference resolved to
 * positions in the checked network. Browser-safe, plain data (a prepared study can be copied
 * into a worker thread).
 */

import type { CheckedDocument, NetworkDocument, QuantityInput } from "../input/document-types.js";
import type { DisplayKind, UnitSetName } from "../output/display-units.js";

/** Named groups of values scaled together. */
export type StudyGroupName = "demands" | "injections";

/** A group of values scaled together by one factor. */
export type StudyGroupInput =
  | StudyGroupName
  | { nodes: string[]; field?: "demand" }
  | { edges: string[] | "all"; field: "diameter" | "length" | "roughness" | "minorLoss" };

/** Equal steps between two values, both included (steps + 1 values). */
export interface StudyRangeInput {
  from: QuantityInput;
  to: QuantityInput;
  steps: number;
  /** @defaultValue "linear" */
  spacing?: "linear" | "log";
}

/**
 * One input that a study varies (a JSON Pointer into the network whose value is set, or a group
 * scaled by a factor), with its values; or the input of a design question.
 */
export interface StudyParameterInput {
  /** Column name. @defaultValue the path, or the group's name */
  name?: string;
  /** JSON Pointer into the network document: `/nodes/3/demand`, `/edges/M1/diameter`. */
  path?: string;
  /** A group scaled together. */
  group?: StudyGroupInput;
  values?: QuantityInput[];
  range?: StudyRangeInput;
  /** Target search: the two ends of the search interval. */
  bracket?: [QuantityInput, QuantityInput];
}

/** The questions a study document can ask. */
export type StudyQuestion = "sweep" | "target" | "capacity" | "sensitivities" | "sizing";

/** The `target` block. */
export interface TargetInput {
  input: StudyParameterInput;
  output: string;
  value: QuantityInput;
  relativeTolerance?: number;
  maxSolves?: number;
}

/** Limits of a capacity search, as written. */
export interface CapacityLimitsInput {
  minPressure?: QuantityInput;
  maxPressure?: QuantityInput;
  maxMach?: number;
  maxVelocity?: QuantityInput;
}

/** The `capacity` block. */
export interface CapacityInput {
  group?: StudyGroupInput;
  limits?: CapacityLimitsInput;
  relativeTolerance?: number;
  maxScale?: number;
  maxSolves?: number;
}

/** The `sensitivities` block. */
export interface SensitivitiesInput {
  inputs: StudyParameterInput[];
  outputs?: string | string[];
}

/** Limits of pipe sizing, as written. */
export interface SizingLimitsInput {
  maxMach?: number;
  maxVelocity?: QuantityInput;
  maxPressureDrop?: QuantityInput;
  minDeliveryPressure?: QuantityInput;
}

/** The `sizing` block. */
export interface SizingInput {
  edges?: string | string[];
  diameters?: QuantityInput[];
  /** A schedule of ASME B36.10M or B36.19M: "40", "STD", "10S"... */
  schedule?: string;
  /** Nominal sizes in that schedule: "DN 50", "3 in". @defaultValue DN 15 to DN 600 */
  sizes?: string[];
  limits?: SizingLimitsInput;
  maxSolves?: number;
}

/** A whole study document. */
export interface StudyDocument {
  $schema?: string;
  name?: string;
  description?: string;
  /** A file name (relative to the study file) or the network document itself. */
  network: string | NetworkDocument;
  /** @defaultValue "sweep" */
  question?: StudyQuestion;
  /** @defaultValue "si" */
  units?: UnitSetName;
  inputs?: StudyParameterInput[];
  /** @defaultValue "grid" */
  combine?: "grid" | "zip";
  /** @defaultValue "all" */
  outputs?: string | string[];
  /** @defaultValue true */
  warmStart?: boolean;
  /** @defaultValue 32 */
  blockSize?: number;
  target?: TargetInput;
  capacity?: CapacityInput;
  sensitivities?: SensitivitiesInput;
  sizing?: SizingInput;
}

// ---------------------------------------------------------------------------------------------
// Prepared forms

/** A field of the checked network that an input can set or scale. */
export interface ParameterTarget {
  collection: "nodes" | "edges" | "ambient";
  /** Index in `nodes` or `edges` (0 for ambient). */
  index: number;
  /** A network field, or a numeric parameter of a component (`component` true). */
  field: string;
  /** The value in the base network [SI]. */
  base: number;
  /** A parameter of a component (`edge.component[field]`), not a field of the edge. */
  component?: boolean;
}

/** An input resolved against the network. */
export interface ResolvedParameter {
  /** Column name. */
  label: string;
  /** `set`: the value replaces the field (SI); `scale`: the value multiplies every target's base. */
  mode: "set" | "scale";
  /** What the value measures (a scale factor is dimensionless). */
  kind: DisplayKind;
  /** The fields it changes (one for a path, several for a group). */
  targets: ParameterTarget[];
  /** The value in the base network: the field's value, or 1 for a scale. */
  base: number;
}

/** A varied input of a sweep with its values in SI. */
export interface SweepInput extends ResolvedParameter {
  values: number[];
}

/** A result to record, resolved against the network. */
export interface ResolvedOutput {
  /** As written: `edges/FEED/mach`. */
  label: string;
  scope: "nodes" | "edges" | "network";
  /** Index of the node or edge (-1 for the network). */
  index: number;
  field: string;
  kind: DisplayKind;
  /** Gauge pressure: shown relative to the ambient pressure. */
  gauge?: boolean;
  /** A true/false value (written as such, not as a number). */
  boolean?: boolean;
}

/** Design limits of a capacity search [SI]. */
export interface CapacityLimits {
  minPressure?: number;
  maxPressure?: number;
  maxMach?: number;
  maxVelocity?: number;
}

/** Design limits of pipe sizing [SI]. */
export interface SizingLimits {
  maxMach?: number;
  maxVelocity?: number;
  maxPressureDrop?: number;
  minDeliveryPressure?: number;
}

/** A study read and checked against its network: everything the runners need, SI. */
export interface PreparedStudy {
  name: string;
  question: StudyQuestion;
  units: UnitSetName;
  /** The base network, checked, SI. */
  network: CheckedDocument;
  inputs: SweepInput[];
  combine: "grid" | "zip";
  outputs: ResolvedOutput[];
  warmStart: boolean;
  blockSize: number;
  target?: {
    input: ResolvedParameter;
    bracket?: [number, number];
    output: ResolvedOutput;
    value: number;
    relativeTolerance: number;
    maxSolves: number;
  };
  capacity?: {
    group: ResolvedParameter;
    limits: CapacityLimits;
    relativeTolerance: number;
    maxScale: number;
    maxSolves: number;
  };
  sensitivities?: { inputs: ResolvedParameter[]; outputs: ResolvedOutput[] };
  sizing?: {
    edges: number[];
    /** Allowed inside diameters [m], smallest first, and a label for each ("DN 50"). */
    diameters: number[];
    labels: string[];
    limits: SizingLimits;
    maxSolves: number;
  };
}
