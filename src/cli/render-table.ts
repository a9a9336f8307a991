/**
 * Draw a plain-text table from src/output with cli-table3: no colours, a rule under the header,
 * units on a second header line, numbers right-aligned.
 */

import Table from "cli-table3";
import type { TextTable } from "../output/result-table.js";

/** Light borders: a rule under the header and columns separated by two spaces. */
const CHARS = {
  top: "",
  "top-mid": "",
  "top-left": "",
  "top-right": "",
  bottom: "",
  "bottom-mid": "",
  "bottom-left": "",
  "bottom-right": "",
  left: "",
  "left-mid": "",
  mid: "-",
  "mid-mid": "-",
  right: "",
  "right-mid": "",
  middle: " ",
};

/**
 * The table as text lines (no trailing line break), the title first when it is not empty.
 *
 * @param table - cells and headers from src/output
 */
export function renderTable(table: TextTable): string {
  const hasUnits = table.columns.some((column) => column.unit !== "");
  const drawn = new Table({
    head: table.columns.map((column) =>
      hasUnits ? `${column.label}\n${column.unit === "" ? "" : `[${column.unit}]`}` : column.label,
    ),
    colAligns: table.columns.map((column) => column.align),
    chars: CHARS,
    style: { head: [], border: [], compact: true, "padding-left": 0, "padding-right": 1 },
  });
  for (const row of table.rows) drawn.push(row);
  const body = drawn
    .toString()
    .split("\n")
    .map((line) => line.trimEnd())
    .join("\n");
  return table.title === "" ? body : `${table.title}\n${body}`;
}
