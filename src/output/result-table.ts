/**
 * A network result as the parts of a readable report: a marker when it is not a solution, a
 * heading, the node and edge tables as plain cell strings with units in the headers, warnings, a
 * solver summary and the engineering caution. Browser-safe: the caller draws the tables (the
 * command line uses cli-table3).
 */

import type { NetworkResult } from "../results/result-types.js";
import { COMPONENT_GROUPS, componentEdges, componentGroupColumns } from "./component-columns.js";
import { displayUnit, type UnitSetName } from "./display-units.js";
import { formatNumber } from "./format-number.js";
import { edgeColumns, nodeColumns, type ResultColumn, showsHeat } from "./result-columns.js";

/** The one-line caution printed under every report. */
export const ENGINEERING_CAUTION =
  "Results are engineering estimates; pressure and relief systems are designed and checked to the applicable codes by qualified engineers.";

/** Start of the first line of a report whose numbers are not a solution. */
export const NOT_A_SOLUTION = "NOT A SOLUTION";

/** A table as text: one header per column (label and unit) and rows of cell strings. */
export interface TextTable {
  title: string;
  columns: { label: string; unit: string; align: "left" | "right" }[];
  rows: string[][];
}

/** The parts of a report on a network result, in the order they are printed. */
export interface ResultReport {
  /** `NOT A SOLUTION: <why>` when the result is not converged or has no solution. */
  marker?: string;
  /** Network name, gas, ambient state and unit set. */
  heading: string;
  nodes: TextTable;
  edges: TextTable;
  /** One table per group of component kinds present (orifices and nozzles, control valves,
   * regulators, check valves), with each component's own figures; none without components. */
  components: TextTable[];
  /** `warning: ...` lines: the result's warnings except input notes and the status message. */
  warnings: string[];
  /** The input notes (code "bare-pressure-unit-absolute"), without a prefix. */
  notes: string[];
  /** Status, iterations, residual and throughput. */
  summary: string;
  caution: string;
}

/** "1 node", "3 nodes". */
function count(howMany: number, noun: string): string {
  return `${howMany} ${noun}${howMany === 1 ? "" : "s"}`;
}

/** Warning codes carried by the marker or the notes rather than the warning list. */
const NOT_LISTED = new Set(["bare-pressure-unit-absolute", "not-converged", "no-solution"]);

/**
 * Why a result is not a solution, or undefined when it is one.
 *
 * @returns the diagnosis message of a network with no solution, else the not-converged warning
 */
export function notASolutionReason(result: NetworkResult): string | undefined {
  if (result.status === "converged" && result.converged) return undefined;
  if (result.diagnosis) return result.diagnosis.message;
  const warning = result.warnings.find(
    (entry) => entry.code === "not-converged" || entry.code === "no-solution",
  );
  return (
    warning?.message ??
    `the solve ended with status "${result.status}" after ${result.iterations} iterations`
  );
}

/** The input notes of a result (bare "bar" or "psi" read as absolute). */
export function resultNotes(result: NetworkResult): string[] {
  return result.warnings
    .filter((warning) => warning.code === "bare-pressure-unit-absolute")
    .map((warning) => warning.message);
}

/** The result's warnings other than notes and the status message, as `warning: ...` lines. */
export function resultWarnings(result: NetworkResult): string[] {
  return result.warnings
    .filter((warning) => !NOT_LISTED.has(warning.code))
    .map((warning) => `warning: ${warning.message}`);
}

function textTable<Row>(
  title: string,
  columns: ResultColumn<Row>[],
  rows: readonly Row[],
): TextTable {
  return {
    title,
    columns: columns.map(({ label, unit, align }) => ({ label, unit, align })),
    rows: rows.map((row) =>
      columns.map((column) => {
        const value = column.value(row);
        return typeof value === "string" ? value : formatNumber(value, column.digits);
      }),
    ),
  };
}

/** The node table of a result in a unit set. */
export function nodeTable(result: NetworkResult, units: UnitSetName): TextTable {
  return textTable("Nodes", nodeColumns(result, units), result.nodes);
}

/** The edge table of a result in a unit set. */
export function edgeTable(result: NetworkResult, units: UnitSetName): TextTable {
  return textTable("Edges", edgeColumns(units, showsHeat(result.edges)), result.edges);
}

/**
 * The component tables of a result: for each group of kinds present, its components with their
 * own figures (state, ratios, choke limits, expansion factors, setpoint deviation, leakage).
 */
export function componentTables(result: NetworkResult, units: UnitSetName): TextTable[] {
  const components = componentEdges(result.edges);
  return COMPONENT_GROUPS.flatMap(({ title, kinds }) => {
    const rows = components.filter((edge) =>
      (kinds as readonly string[]).includes(edge.component.kind),
    );
    if (rows.length === 0) return [];
    return [textTable(title, componentGroupColumns(rows, kinds, units), rows)];
  });
}

/** `solver: converged in 3 iterations; largest scaled residual 9.0e-15; throughput 450 kg/h`. */
export function solverSummary(result: NetworkResult, units: UnitSetName): string {
  const flow = displayUnit(units, "massFlow");
  const ending =
    result.status === "converged"
      ? `converged in ${result.iterations} iterations`
      : result.status === "no-solution"
        ? `no solution (gave up after ${result.iterations} iterations)`
        : `NOT converged after ${result.iterations} iterations`;
  return `solver: ${ending}; largest scaled residual ${result.residual.toExponential(1)}; throughput ${formatNumber(flow.fromSI(result.balance.throughput))} ${flow.label}`;
}

/**
 * A network result as the parts of a report.
 *
 * @param result - the result of `solveNetwork`, SI
 * @param units - the unit set of the tables
 * @returns marker (only when not a solution), heading, node, edge and component tables,
 *   warnings, notes, summary, caution
 * @example resultReport(solveNetwork(doc), "metric").edges.columns[3] // { label: "mass flow", unit: "kg/h", align: "right" }
 */
export function resultReport(result: NetworkResult, units: UnitSetName): ResultReport {
  const pressure = displayUnit(units, "pressure");
  const temperature = displayUnit(units, "temperature");
  const name = result.name === "" ? "network" : `network "${result.name}"`;
  const heading = `${name}: gas ${result.gas.name}; ambient ${formatNumber(pressure.fromSI(result.ambient.pressure), 6)} ${pressure.label}, ${formatNumber(temperature.fromSI(result.ambient.temperature))} ${temperature.label}; ${count(result.nodes.length, "node")}, ${count(result.edges.length, "edge")}`;
  const reason = notASolutionReason(result);
  const report: ResultReport = {
    heading,
    nodes: nodeTable(result, units),
    edges: edgeTable(result, units),
    components: componentTables(result, units),
    warnings: resultWarnings(result),
    notes: resultNotes(result),
    summary: solverSummary(result, units),
    caution: ENGINEERING_CAUTION,
  };
  if (reason !== undefined) report.marker = `${NOT_A_SOLUTION}: ${reason}`;
  return report;
}
