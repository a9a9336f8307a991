/**
 * The component tables: each component edge with the figures of its own kind (the `component`
 * field of its result), one table per group of kinds for a terminal, and all of them in one CSV
 * table with the figures another kind does not have left empty. Browser-safe.
 */

import type { ComponentDetails, EdgeResult, RestrictionDetails } from "../results/result-types.js";
import type { UnitSetName } from "./display-units.js";
import {
  CHOKED_MARKER,
  numberColumn,
  PRESSURE_DIGITS,
  type ResultColumn,
  textColumn,
} from "./result-columns.js";

/** An edge result that is a component. */
export type ComponentEdgeResult = EdgeResult & { component: ComponentDetails };

/** The groups of component kinds that share a table, in the order they are printed. */
export const COMPONENT_GROUPS = [
  { title: "Orifices and nozzles", kinds: ["orifice", "nozzle"] },
  { title: "Control valves", kinds: ["valve"] },
  { title: "Regulators", kinds: ["regulator"] },
  { title: "Check valves", kinds: ["check"] },
] as const satisfies readonly { title: string; kinds: readonly ComponentDetails["kind"][] }[];

/** The component edges of a result, in result order. */
export function componentEdges(edges: readonly EdgeResult[]): ComponentEdgeResult[] {
  return edges.filter((edge): edge is ComponentEdgeResult => edge.component !== undefined);
}

/** A figure that only some kinds have: the value, or undefined for the others. */
type Figure = (details: ComponentDetails) => number | undefined;

/** Every component figure: label, CSV name, display kind, digits, and how to read it. */
function figureColumns(units: UnitSetName) {
  const figure = (
    label: string,
    name: string,
    kind: Parameters<typeof numberColumn>[3],
    read: Figure,
    digits?: number,
  ): ResultColumn<ComponentEdgeResult> & { applies(details: ComponentDetails): boolean } => {
    const column = numberColumn<ComponentEdgeResult>(
      label,
      name,
      units,
      kind,
      (edge) => read(edge.component) ?? Number.NaN,
      digits,
    );
    return {
      ...column,
      value: (edge) => (read(edge.component) === undefined ? "" : column.value(edge)),
      applies: (details) => read(details) !== undefined,
    };
  };
  const restriction = (details: ComponentDetails) =>
    details.kind === "orifice" || details.kind === "nozzle" ? details : undefined;
  const valve = (details: ComponentDetails) => (details.kind === "valve" ? details : undefined);
  const regulator = (details: ComponentDetails) =>
    details.kind === "regulator" ? details : undefined;
  const trim = (details: ComponentDetails) =>
    details.kind === "orifice" || details.kind === "nozzle"
      ? undefined
      : (details as Exclude<ComponentDetails, RestrictionDetails>);
  return [
    figure("d/D", "diameter ratio", null, (d) => restriction(d)?.diameterRatio, 4),
    figure("C", "discharge coefficient", null, (d) => restriction(d)?.dischargeCoefficient, 4),
    figure("p ratio", "tap pressure ratio", null, (d) => restriction(d)?.pressureRatio, 4),
    figure(
      "critical",
      "critical pressure ratio",
      null,
      (d) => restriction(d)?.criticalPressureRatio,
      4,
    ),
    figure(
      "Δp taps",
      "tap differential pressure",
      "pressureDifference",
      (d) => restriction(d)?.differentialPressure,
    ),
    figure(
      "loss",
      "permanent pressure loss",
      "pressureDifference",
      (d) => restriction(d)?.permanentPressureLoss,
    ),
    figure("ε", "expansibility", null, (d) => restriction(d)?.expansibility, 4),
    figure("setpoint", "setpoint", "pressure", (d) => regulator(d)?.setpoint, PRESSURE_DIGITS),
    figure(
      "deviation",
      "setpoint deviation",
      "pressureDifference",
      (d) => regulator(d)?.setpointDeviation,
    ),
    figure(
      "opening",
      "opening",
      null,
      (d) => (d.kind === "valve" || d.kind === "regulator" ? d.opening : undefined),
      4,
    ),
    {
      ...figure("Kv", "flow coefficient Kv", null, (d) => valve(d)?.flowCoefficient),
      unit: "m3/h",
    },
    figure("Fp", "piping geometry factor", null, (d) => valve(d)?.pipingGeometryFactor, 4),
    figure("x", "pressure differential ratio", null, (d) => trim(d)?.pressureDifferentialRatio, 4),
    figure(
      "x choked",
      "choked pressure differential ratio",
      null,
      (d) => trim(d)?.chokedPressureDifferentialRatio,
      4,
    ),
    figure("Y", "expansion factor", null, (d) => trim(d)?.expansionFactor, 4),
    figure("leakage", "leakage", "massFlow", (d) => trim(d)?.leakage),
  ];
}

/** The text columns that open every component table: id, kind, from, to, state. */
function leadingColumns(): ResultColumn<ComponentEdgeResult>[] {
  return [
    textColumn("id", "id", (edge) => edge.id),
    textColumn("kind", "kind", (edge) => edge.kind),
    textColumn("from", "from", (edge) => edge.from),
    textColumn("to", "to", (edge) => edge.to),
    textColumn("state", "state", (edge) => ("state" in edge.component ? edge.component.state : "")),
  ];
}

function statusColumn(): ResultColumn<ComponentEdgeResult> {
  return textColumn("status", "status", (edge) => (edge.choked ? CHOKED_MARKER : ""));
}

/**
 * Columns of one group's table: id (and kind when the group has two), from, to, state where the
 * kind has one, the figures its rows have, and the choke status.
 *
 * @param rows - the component edges of the group
 * @param kinds - the component kinds of the group (COMPONENT_GROUPS)
 * @param units - the unit set to show values in
 */
export function componentGroupColumns(
  rows: readonly ComponentEdgeResult[],
  kinds: readonly ComponentDetails["kind"][],
  units: UnitSetName,
): ResultColumn<ComponentEdgeResult>[] {
  const leading = leadingColumns().filter(
    (column) =>
      (column.name !== "kind" || kinds.length > 1) &&
      (column.name !== "state" || rows.some((row) => "state" in row.component)),
  );
  const figures = figureColumns(units).filter((column) =>
    rows.some((row) => column.applies(row.component)),
  );
  return [...leading, ...figures, statusColumn()];
}

/**
 * Columns of the one CSV table of all components: every figure of every kind, empty where the
 * component's kind does not have it.
 *
 * @param units - the unit set to show values in
 */
export function componentCsvColumns(units: UnitSetName): ResultColumn<ComponentEdgeResult>[] {
  return [...leadingColumns(), ...figureColumns(units), statusColumn()];
}
