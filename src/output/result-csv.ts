/**
 * A network result as CSV text: one table per call (the edges, the nodes or the components), one
 * header row with the unit of each column in brackets, one row per edge, node or component (its
 * own figures; those of other kinds empty). Numbers are in the chosen
 * display units at full precision (the shortest text that reads back to the same double).
 * Browser-safe.
 */

import type { NetworkResult } from "../results/result-types.js";
import { componentCsvColumns, componentEdges } from "./component-columns.js";
import type { UnitSetName } from "./display-units.js";
import { edgeColumns, nodeColumns, type ResultColumn, showsHeat } from "./result-columns.js";
import { NOT_A_SOLUTION, notASolutionReason } from "./result-table.js";

/** Which table a CSV holds. */
export type CsvTableName = "edges" | "nodes" | "components";

/** The tables {@link resultCsv} can write, in the order to list them. */
export const CSV_TABLE_NAMES: readonly CsvTableName[] = Object.freeze([
  "edges",
  "nodes",
  "components",
]);

/** Options of {@link resultCsv}. */
export interface CsvOptions {
  /** @defaultValue "metric" */
  units?: UnitSetName;
  /** @defaultValue "edges" */
  table?: CsvTableName;
}

/**
 * One CSV field (RFC 4180): quoted when it holds a comma, a quote, a line break or starts with
 * "#" (so a data row is never read as the comment line), quotes doubled.
 */
export function csvField(text: string): string {
  return /[",\r\n]|^#/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

/** A number as a CSV field: shortest round-trip text; empty for NaN or infinite values. */
function csvNumber(value: number): string {
  return Number.isFinite(value) ? String(value) : "";
}

function csvRows<Row>(columns: ResultColumn<Row>[], rows: readonly Row[]): string[] {
  const header = columns
    .map((column) => csvField(column.unit === "" ? column.name : `${column.name} [${column.unit}]`))
    .join(",");
  const body = rows.map((row) =>
    columns
      .map((column) => {
        const value = column.value(row);
        return typeof value === "string" ? csvField(value) : csvNumber(value);
      })
      .join(","),
  );
  return [header, ...body];
}

/**
 * A result's edge, node or component table as CSV text, lines ending in "\n".
 *
 * When the result is not a solution the first line is a comment,
 * `# NOT A SOLUTION: <why>`; otherwise the first line is the header.
 *
 * @param result - the result of `solveNetwork`, SI
 * @param options - unit set and table
 * @returns the CSV text
 * @example resultCsv(result, { units: "si" }).split("\n")[0] // "id,from,to,mass flow [kg/s],inlet pressure [Pa],..."
 */
export function resultCsv(result: NetworkResult, options: CsvOptions = {}): string {
  const units = options.units ?? "metric";
  const table = options.table ?? "edges";
  const lines =
    table === "nodes"
      ? csvRows(nodeColumns(result, units), result.nodes)
      : table === "components"
        ? csvRows(componentCsvColumns(units), componentEdges(result.edges))
        : csvRows(edgeColumns(units, showsHeat(result.edges)), result.edges);
  const reason = notASolutionReason(result);
  if (reason !== undefined)
    lines.unshift(`# ${NOT_A_SOLUTION}: ${reason.replace(/[\r\n]+/g, " ")}`);
  return `${lines.join("\n")}\n`;
}
