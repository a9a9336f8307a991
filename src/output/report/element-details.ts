/**
 * The full results of one pipe or one node as lines "label: value unit", in the display units.
 * The drawing puts them in each element's SVG <title> (a tooltip in any viewer, no script
 * needed); the report's script shows the same lines in its details panel.
 */

import type { CheckedEdge, CheckedNode } from "../../input/document-types.js";
import type { EdgeResult, NodeResult } from "../../results/result-types.js";
import { displayGaugePressure, displayUnit, type UnitSetName } from "../display-units.js";
import { formatNumber } from "../format-number.js";
import { edgeMomentumFlux } from "../result-columns.js";
import { nodeSymbolKind, SYMBOL_NAMES } from "./node-symbols.js";

/** One line of details. */
export interface DetailLine {
  label: string;
  value: string;
}

/** Digits of absolute pressures (as in the tables: 10 Pa at 7 bar(a)). */
const PRESSURE_DIGITS = 6;

/** Details lines as the text of a <title>: a heading, then "label: value" lines. */
export function detailsText(heading: string, lines: readonly DetailLine[]): string {
  return [heading, ...lines.map((line) => `${line.label}: ${line.value}`)].join("\n");
}

/**
 * Details of a pipe.
 *
 * @param edge - its result
 * @param input - its checked input (length, diameter, losses)
 * @param units - the unit set
 */
export function edgeDetails(
  edge: EdgeResult,
  input: CheckedEdge | undefined,
  units: UnitSetName,
): DetailLine[] {
  const pressure = displayUnit(units, "pressure");
  const difference = displayUnit(units, "pressureDifference");
  const flow = displayUnit(units, "massFlow");
  const velocity = displayUnit(units, "velocity");
  const temperature = displayUnit(units, "temperature");
  const length = displayUnit(units, "length");
  const diameter = displayUnit(units, "diameter");
  const momentum = displayUnit(units, "momentumFlux");
  const density = displayUnit(units, "density");
  const upstream = edge.massFlow < 0 ? edge.to : edge.from;
  const downstream = edge.massFlow < 0 ? edge.from : edge.to;
  const value = (number: number, unit: string, digits = 5) =>
    unit === "-" ? formatNumber(number, digits) : `${formatNumber(number, digits)} ${unit}`;
  const lines: DetailLine[] = [
    { label: "status", value: edge.choked ? "CHOKED" : "subsonic" },
    { label: "declared", value: `${edge.from} → ${edge.to}` },
    {
      label: "flow",
      value:
        edge.massFlow === 0
          ? "none"
          : `${upstream} → ${downstream}${edge.massFlow < 0 ? " (against the declared direction)" : ""}`,
    },
    { label: "mass flow", value: value(flow.fromSI(edge.massFlow), flow.label) },
    { label: "model", value: edge.model },
    {
      label: "inlet pressure",
      value: value(pressure.fromSI(edge.inlet.pressure), pressure.label, PRESSURE_DIGITS),
    },
    {
      label: "outlet pressure",
      value: value(pressure.fromSI(edge.outlet.pressure), pressure.label, PRESSURE_DIGITS),
    },
    {
      label: "pressure drop",
      value: value(difference.fromSI(edge.pressureDrop), difference.label),
    },
    { label: "inlet Mach", value: formatNumber(edge.inlet.mach, 4) },
    { label: "outlet Mach", value: formatNumber(edge.outlet.mach, 4) },
    { label: "inlet velocity", value: value(velocity.fromSI(edge.inlet.velocity), velocity.label) },
    {
      label: "outlet velocity",
      value: value(velocity.fromSI(edge.outlet.velocity), velocity.label),
    },
    {
      label: "outlet temperature",
      value: value(temperature.fromSI(edge.outlet.temperature), temperature.label),
    },
    { label: "outlet density", value: value(density.fromSI(edge.outlet.density), density.label) },
    {
      label: "ρv² (largest)",
      value: value(momentum.fromSI(edgeMomentumFlux(edge)), momentum.label),
    },
    { label: "choke ratio", value: formatNumber(edge.chokeRatio, 4) },
    { label: "capacity", value: value(flow.fromSI(edge.capacity), flow.label) },
    { label: "Reynolds", value: formatNumber(edge.reynolds, 4) },
    { label: "Darcy friction factor", value: formatNumber(edge.frictionFactor, 4) },
  ];
  if (input) {
    lines.push(
      { label: "length", value: value(length.fromSI(input.length), length.label) },
      { label: "inside diameter", value: value(diameter.fromSI(input.diameter), diameter.label) },
      { label: "minor-loss K", value: formatNumber(input.minorLoss, 4) },
    );
  }
  return lines;
}

/**
 * Details of a node.
 *
 * @param node - its result
 * @param input - its checked input (kind and demand decide the symbol)
 * @param units - the unit set
 * @param ambientPressure - the gauge reference [Pa]
 */
export function nodeDetails(
  node: NodeResult,
  input: CheckedNode | undefined,
  units: UnitSetName,
  ambientPressure: number,
): DetailLine[] {
  const pressure = displayUnit(units, "pressure");
  const temperature = displayUnit(units, "temperature");
  const flow = displayUnit(units, "massFlow");
  const gauge = displayGaugePressure(units, node.pressure, ambientPressure);
  const symbol = nodeSymbolKind(input ?? { kind: node.kind, demand: node.demand });
  const lines: DetailLine[] = [
    { label: "kind", value: SYMBOL_NAMES[symbol] },
    {
      label: "pressure",
      value: `${formatNumber(pressure.fromSI(node.pressure), PRESSURE_DIGITS)} ${pressure.label}`,
    },
    {
      label: "gauge pressure",
      value: `${formatNumber(gauge.value, PRESSURE_DIGITS)} ${gauge.label}`,
    },
    {
      label: "temperature",
      value: `${formatNumber(temperature.fromSI(node.temperature))} ${temperature.label}`,
    },
  ];
  if (node.demand !== 0 || node.kind === "junction") {
    const words =
      node.kind === "reservoir"
        ? node.demand < 0
          ? "supplies"
          : "takes in"
        : node.demand < 0
          ? "injection"
          : "demand";
    lines.push({
      label: words,
      value: `${formatNumber(flow.fromSI(Math.abs(node.demand)))} ${flow.label}`,
    });
  }
  return lines;
}
