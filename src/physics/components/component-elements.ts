/**
 * Components as the network solver sees them: edges other than pipes, each a lumped element whose
 * mass flow is a function of its upstream stagnation state (p0, T0) and its downstream pressure.
 * All values SI. A diameter that is not given is NaN (the element then sits between plenums).
 *
 * The same records, field for field, are the `component` member of a checked document's edge
 * (src/input/document-types.ts), so the solver passes them on unchanged.
 */

/** Sharp-edged orifice plate (ISO 5167-2) or restriction orifice. */
export interface OrificeElement {
  kind: "orifice";
  /** Bore diameter d [m]. */
  boreDiameter: number;
  /** Inside diameter D of the pipe the plate sits in [m]; NaN between plenums (beta = 0). */
  pipeDiameter: number;
  /** Discharge coefficient C [-]. */
  dischargeCoefficient: number;
}

/** Rounded (flow or long-radius) nozzle: near-isentropic acceleration to its throat. */
export interface NozzleElement {
  kind: "nozzle";
  /** Throat diameter d [m]. */
  boreDiameter: number;
  /** Inside diameter D of the pipe upstream [m]; NaN when fed from a plenum (beta = 0). */
  pipeDiameter: number;
  /** Discharge coefficient C [-]. */
  dischargeCoefficient: number;
}

/** Inherent flow characteristic of a valve trim. */
export type ValveCharacteristic = "linear" | "equal-percentage";

/** Control or isolation valve, sized by IEC 60534-2-1. */
export interface ValveElement {
  kind: "valve";
  /** Kv at full opening [m3/h of water at 1 bar]. */
  flowCoefficient: number;
  /** Relative travel h [-], 0 (shut) to 1 (fully open). */
  opening: number;
  characteristic: ValveCharacteristic;
  /** Rangeability R of an equal-percentage trim [-]. */
  rangeability: number;
  /** Pressure differential ratio factor xT of the valve alone [-]. */
  pressureDifferentialRatioFactor: number;
  /** Valve (end connection) inside diameter d [m]; NaN: no reducers. */
  valveDiameter: number;
  /** Inside diameter of the pipe at the declared `from` end [m], or NaN. */
  inletPipeDiameter: number;
  /** Inside diameter of the pipe at the declared `to` end [m], or NaN. */
  outletPipeDiameter: number;
}

/** Pressure regulator (pressure-reducing valve) holding its downstream pressure. */
export interface RegulatorElement {
  kind: "regulator";
  /** Downstream pressure it holds at zero flow [Pa absolute]. */
  setpoint: number;
  /** Proportional band: the fall of downstream pressure from closed to wide open [Pa]. */
  proportionalBand: number;
  /** Kv wide open [m3/h]. */
  flowCoefficient: number;
  /** xT of its trim [-]. */
  pressureDifferentialRatioFactor: number;
  /** Inside diameter of the connecting pipes [m], or NaN (for the reported end states only). */
  pipeDiameter: number;
}

/** Check (non-return) valve. */
export interface CheckValveElement {
  kind: "check";
  /** Kv when open [m3/h]. */
  flowCoefficient: number;
  /** xT [-]. */
  pressureDifferentialRatioFactor: number;
  /** Inside diameter of the connecting pipes [m], or NaN (for the reported end states only). */
  pipeDiameter: number;
}

/** Every component kind. */
export type ComponentElement =
  | OrificeElement
  | NozzleElement
  | ValveElement
  | RegulatorElement
  | CheckValveElement;

/**
 * Leakage of a closed element (a check valve or regulator against reverse flow, a regulator at
 * or above its setpoint, a shut valve) [-]: its seat passes m = LEAKAGE_FRACTION (Kv / 36000)
 * (p1 - p2) / sqrt(R T1), linear in the pressure difference. This keeps the Newton matrix regular
 * where a closed element is a junction's only link. At 1e-12 it stays far below the solver's
 * resolution of flows (1e-9 of the throughput), so a junction reached only by leakage counts as
 * one without flow. The leakage is the flow reported (docs/model.md, "Components").
 */
export const LEAKAGE_FRACTION = 1e-12;

/**
 * Below this pressure differential ratio x = dp / p1 the square-root law of a restriction is
 * replaced by a cubic with the same value and slope at x = SMALL_DIFFERENCE_RATIO and a finite
 * slope at zero flow (docs/model.md, "Components"): 1e-6 is 0.1 Pa at 1 bar.
 */
export const SMALL_DIFFERENCE_RATIO = 1e-6;
