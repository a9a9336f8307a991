/**
 * The tables of the HTML report: nodes, edges, pipe input, profile points, warnings, solver
 * summary and provenance, every number in the display units with the unit in the header.
 */

import type { CheckedDocument } from "../../input/document-types.js";
import type { NetworkResult } from "../../results/result-types.js";
import { displayUnit, type UnitSetName } from "../display-units.js";
import { formatNumber } from "../format-number.js";
import { edgeTable, nodeTable, type TextTable } from "../result-table.js";
import { escapeMarkup } from "./escape-markup.js";
import { nodeSymbolKind, SYMBOL_NAMES } from "./node-symbols.js";
import type { ProfilePoint } from "./profile-points.js";

/** A text table as HTML; `rowClass` may give a row a class. */
export function tableHtml(
  table: TextTable,
  className: string,
  rowClass: (rowIndex: number) => string = () => "",
): string {
  const header = table.columns
    .map((column) => {
      const unit =
        column.unit === "" ? "" : `<span class="mn-unit">[${escapeMarkup(column.unit)}]</span>`;
      return `<th scope="col" class="mn-${column.align}">${escapeMarkup(column.label)}${unit === "" ? "" : ` ${unit}`}</th>`;
    })
    .join("");
  const rows = table.rows
    .map((row, rowIndex) => {
      const extra = rowClass(rowIndex);
      const cells = row
        .map((cell, cellIndex) => {
          const align = table.columns[cellIndex]?.align ?? "left";
          return cellIndex === 0
            ? `<th scope="row" class="mn-${align}">${escapeMarkup(cell)}</th>`
            : `<td class="mn-${align}">${escapeMarkup(cell)}</td>`;
        })
        .join("");
      return `<tr${extra === "" ? "" : ` class="${extra}"`}>${cells}</tr>`;
    })
    .join("\n");
  return `<div class="mn-table-wrap"><table class="${className}"><caption>${escapeMarkup(table.title)}</caption><thead><tr>${header}</tr></thead><tbody>\n${rows}\n</tbody></table></div>`;
}

/** The node table with a column naming each node's symbol. */
export function nodesTableHtml(
  document: CheckedDocument,
  result: NetworkResult,
  units: UnitSetName,
): string {
  const table = nodeTable(result, units);
  const withSymbol: TextTable = {
    title: "Nodes",
    columns: [
      ...table.columns.slice(0, 1),
      { label: "symbol", unit: "", align: "left" },
      ...table.columns.slice(1),
    ],
    rows: table.rows.map((row, index) => {
      const input = document.nodes[index];
      const symbol = input ? SYMBOL_NAMES[nodeSymbolKind(input)] : "";
      return [...row.slice(0, 1), symbol, ...row.slice(1)];
    }),
  };
  return tableHtml(withSymbol, "mn-nodes-table");
}

/** The edge table; choked rows are marked. */
export function edgesTableHtml(result: NetworkResult, units: UnitSetName): string {
  return tableHtml(edgeTable(result, units), "mn-edges-table", (index) =>
    result.edges[index]?.choked ? "mn-row-choked" : "",
  );
}

/** The pipes as given: model, length, diameter, roughness or fixed friction factor, losses. */
export function pipeInputTableHtml(document: CheckedDocument, units: UnitSetName): string {
  const length = displayUnit(units, "length");
  const diameter = displayUnit(units, "diameter");
  const roughness = displayUnit(units, "diameter");
  const table: TextTable = {
    title: "Pipes as given",
    columns: [
      { label: "id", unit: "", align: "left" },
      { label: "from", unit: "", align: "left" },
      { label: "to", unit: "", align: "left" },
      { label: "model", unit: "", align: "left" },
      { label: "length", unit: length.label, align: "right" },
      { label: "diameter", unit: diameter.label, align: "right" },
      { label: "roughness", unit: roughness.label, align: "right" },
      { label: "fixed fD", unit: "", align: "right" },
      { label: "K", unit: "", align: "right" },
    ],
    rows: document.edges.map((edge) => [
      edge.id,
      edge.from,
      edge.to,
      edge.model,
      formatNumber(length.fromSI(edge.length)),
      formatNumber(diameter.fromSI(edge.diameter)),
      edge.roughness === undefined ? "" : formatNumber(roughness.fromSI(edge.roughness), 3),
      edge.frictionFactor === undefined ? "" : formatNumber(edge.frictionFactor, 4),
      formatNumber(edge.minorLoss, 4),
    ]),
  };
  return tableHtml(table, "mn-pipes-table");
}

/** The profile's node and pipe-end points. */
export function profileTableHtml(points: readonly ProfilePoint[], units: UnitSetName): string {
  const length = displayUnit(units, "length");
  const pressure = displayUnit(units, "pressure");
  const table: TextTable = {
    title: "Profile points (nodes and pipe ends)",
    columns: [
      { label: "distance", unit: length.label, align: "right" },
      { label: "where", unit: "", align: "left" },
      { label: "p", unit: pressure.label, align: "right" },
      { label: "p0", unit: pressure.label, align: "right" },
      { label: "Mach", unit: "", align: "right" },
      { label: "choke limit", unit: "", align: "right" },
    ],
    rows: points
      .filter((point) => point.place !== "interior")
      .map((point) => [
        formatNumber(length.fromSI(point.distance)),
        point.place === "node" ? `node ${point.id}` : `${point.id} ${point.place}`,
        formatNumber(pressure.fromSI(point.pressure), 6),
        formatNumber(pressure.fromSI(point.stagnationPressure), 6),
        Number.isNaN(point.mach) ? "" : formatNumber(point.mach, 4),
        Number.isNaN(point.chokeLimit) ? "" : formatNumber(point.chokeLimit, 4),
      ]),
  };
  return tableHtml(table, "mn-profile-table");
}

/** The result's warnings: code, element and message. */
export function warningsHtml(result: NetworkResult): string {
  if (result.warnings.length === 0) {
    return '<p class="mn-none">No warnings: no design limit is exceeded and no pipe is choked.</p>';
  }
  const table: TextTable = {
    title: "Warnings",
    columns: [
      { label: "code", unit: "", align: "left" },
      { label: "element", unit: "", align: "left" },
      { label: "message", unit: "", align: "left" },
    ],
    rows: result.warnings.map((warning) => [
      warning.code,
      warning.edge !== undefined
        ? `pipe ${warning.edge}`
        : warning.node !== undefined
          ? `node ${warning.node}`
          : "",
      warning.message,
    ]),
  };
  return tableHtml(table, "mn-warnings-table");
}

/** A definition list of label and value pairs. */
export function definitionListHtml(
  className: string,
  entries: readonly (readonly [string, string])[],
): string {
  const items = entries
    .map(([label, value]) => `<dt>${escapeMarkup(label)}</dt><dd>${escapeMarkup(value)}</dd>`)
    .join("");
  return `<dl class="${className}">${items}</dl>`;
}

/** Status, iterations, residuals and the balance of the solve. */
export function solverEntries(result: NetworkResult, units: UnitSetName): [string, string][] {
  const flow = displayUnit(units, "massFlow");
  const heat = displayUnit(units, "heatFlow");
  const b = result.balance;
  return [
    ["status", result.status],
    ["iterations", String(result.iterations)],
    ["largest scaled residual", result.residual.toExponential(2)],
    ["mass residual (over throughput)", result.residuals.mass.toExponential(2)],
    ["energy residual (over throughput × cp T)", result.residuals.energy.toExponential(2)],
    ["throughput", `${formatNumber(flow.fromSI(b.throughput))} ${flow.label}`],
    [
      "mass in / out",
      `${formatNumber(flow.fromSI(b.massIn))} / ${formatNumber(flow.fromSI(b.massOut))} ${flow.label}`,
    ],
    ["heat taken up in pipes", `${formatNumber(heat.fromSI(b.heatIn))} ${heat.label}`],
    ["largest junction mass imbalance", b.largestMassImbalance.toExponential(2)],
    ["largest junction energy imbalance", b.largestEnergyImbalance.toExponential(2)],
    ["largest exit-pressure mismatch", b.largestExitPressureMismatch.toExponential(2)],
  ];
}
