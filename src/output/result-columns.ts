/**
 * The columns of the node and edge tables, shared by the terminal table and the CSV writer: a
 * short label for a terminal, a longer one for a CSV header, the display unit and how to read
 * the value from a result. Browser-safe: plain data and functions, no Node imports.
 */

import type { EdgeResult, NetworkResult, NodeResult } from "../results/result-types.js";
import {
  type DisplayKind,
  displayGaugePressure,
  displayUnit,
  type UnitSetName,
} from "./display-units.js";

/** Text written in the status column of a choked edge. */
export const CHOKED_MARKER = "CHOKED";

/** One column of a result table. */
export interface ResultColumn<Row> {
  /** Short label for a terminal table ("p in"). */
  label: string;
  /** Longer label for a CSV header ("inlet pressure"). */
  name: string;
  /** Unit label ("bar(a)"), or "" for a dimensionless number or a text column. */
  unit: string;
  /** Text columns are left-aligned, numbers right-aligned. */
  align: "left" | "right";
  /** Significant digits in a terminal table. */
  digits: number;
  /** The cell: text, or a number already in the display unit. */
  value(row: Row): string | number;
}

/** Digits of absolute pressures: resolution 10 Pa at 7 bar(a), finer than a gauge reading. */
export const PRESSURE_DIGITS = 6;
/** Digits of other numbers. */
export const DIGITS = 5;

/** A left-aligned text column. */
export function textColumn<Row>(
  label: string,
  name: string,
  value: (row: Row) => string,
): ResultColumn<Row> {
  return { label, name, unit: "", align: "left", digits: 0, value };
}

/** A right-aligned number column, converted to the unit set's unit of `kind` (null: none). */
export function numberColumn<Row>(
  label: string,
  name: string,
  units: UnitSetName,
  kind: DisplayKind | null,
  value: (row: Row) => number,
  digits: number = DIGITS,
): ResultColumn<Row> {
  if (kind === null) return { label, name, unit: "", align: "right", digits, value };
  const unit = displayUnit(units, kind);
  return {
    label,
    name,
    unit: unit.label,
    align: "right",
    digits,
    value: (row) => unit.fromSI(value(row)),
  };
}

/**
 * Columns of the node table: id, kind, absolute and gauge pressure, temperature, demand.
 *
 * @param result - the solve result (its ambient pressure is the gauge reference)
 * @param units - the unit set to show values in
 */
export function nodeColumns(result: NetworkResult, units: UnitSetName): ResultColumn<NodeResult>[] {
  const ambient = result.ambient.pressure;
  return [
    textColumn("id", "id", (node) => node.id),
    textColumn("kind", "kind", (node) => node.kind),
    numberColumn("p", "pressure", units, "pressure", (node) => node.pressure, PRESSURE_DIGITS),
    {
      label: "p gauge",
      name: "gauge pressure",
      unit: displayGaugePressure(units, ambient, ambient).label,
      align: "right",
      digits: PRESSURE_DIGITS,
      value: (node) => displayGaugePressure(units, node.pressure, ambient).value,
    },
    numberColumn("T", "temperature", units, "temperature", (node) => node.temperature),
    numberColumn("demand", "demand", units, "massFlow", (node) => node.demand),
  ];
}

/** Largest momentum flux rho v^2 of an edge, at either end [Pa]. */
export function edgeMomentumFlux(edge: EdgeResult): number {
  return Math.max(
    edge.inlet.density * edge.inlet.velocity ** 2,
    edge.outlet.density * edge.outlet.velocity ** 2,
  );
}

/**
 * Whether the edge table shows the heat columns (outlet temperature, heat flow): when any edge
 * exchanges heat (heat-transfer or isothermal pipes).
 */
export function showsHeat(edges: readonly EdgeResult[]): boolean {
  return edges.some((edge) => edge.heatFlow !== 0 || edge.model === "heat-transfer");
}

/**
 * Columns of the edge table. Inlet and outlet are the ends in the direction of flow; the mass
 * flow is signed (negative: from `to` to `from`). With `heat`, two more before the status: the
 * outlet (static) temperature and the heat flow into the gas (negative: the gas loses heat).
 *
 * @param units - the unit set to show values in
 * @param heat - add the heat columns (see {@link showsHeat})
 */
export function edgeColumns(units: UnitSetName, heat = false): ResultColumn<EdgeResult>[] {
  const heatColumns = heat
    ? [
        numberColumn(
          "T out",
          "outlet temperature",
          units,
          "temperature",
          (edge: EdgeResult) => edge.outlet.temperature,
        ),
        numberColumn("Q", "heat flow", units, "heatFlow", (edge: EdgeResult) => edge.heatFlow),
      ]
    : [];
  return [
    textColumn("id", "id", (edge) => edge.id),
    textColumn("from", "from", (edge) => edge.from),
    textColumn("to", "to", (edge) => edge.to),
    numberColumn("mass flow", "mass flow", units, "massFlow", (edge) => edge.massFlow),
    numberColumn(
      "p in",
      "inlet pressure",
      units,
      "pressure",
      (e) => e.inlet.pressure,
      PRESSURE_DIGITS,
    ),
    numberColumn(
      "p out",
      "outlet pressure",
      units,
      "pressure",
      (e) => e.outlet.pressure,
      PRESSURE_DIGITS,
    ),
    numberColumn("Δp", "pressure drop", units, "pressureDifference", (edge) => edge.pressureDrop),
    numberColumn("v in", "inlet velocity", units, "velocity", (edge) => edge.inlet.velocity),
    numberColumn("v out", "outlet velocity", units, "velocity", (edge) => edge.outlet.velocity),
    numberColumn("Mach in", "inlet Mach", units, null, (edge) => edge.inlet.mach, 4),
    numberColumn("Mach out", "outlet Mach", units, null, (edge) => edge.outlet.mach, 4),
    numberColumn("ρv²", "rho v2", units, "momentumFlux", edgeMomentumFlux),
    numberColumn("Re", "Reynolds", units, null, (edge) => edge.reynolds, 4),
    numberColumn("fD", "Darcy friction factor", units, null, (edge) => edge.frictionFactor, 4),
    numberColumn("choke ratio", "choke ratio", units, null, (edge) => edge.chokeRatio, 4),
    ...heatColumns,
    textColumn("status", "status", (edge) => (edge.choked ? CHOKED_MARKER : "")),
  ];
}
