/**
 * The colour scale of the network drawing ("ember", machnet's own): nine anchor colours of
 * falling lightness, from pale straw through amber and rust to a dark wine, and the rule that
 * maps each pipe's value to a position on it.
 */

import type { EdgeResult, NetworkResult } from "../../results/result-types.js";
import { displayUnit, type UnitSetName } from "../display-units.js";
import { niceTicks, tickLabel } from "./svg-format.js";

/** What the pipes are coloured by. */
export type ColorQuantity = "mach" | "pressure" | "velocity" | "flow";

/** The quantities, in the order to list them (help text, errors). */
export const COLOR_QUANTITIES: readonly ColorQuantity[] = Object.freeze([
  "mach",
  "pressure",
  "velocity",
  "flow",
]);

/**
 * The nine anchors of the ember scale, sRGB, at positions 0, 1/8, ..., 1.
 *
 * Chosen in OKLab (B. Ottosson, "A perceptual color space for image processing", 2020) along a
 * path of falling lightness L from 0.955 to 0.340, chroma 0.05 up to 0.15 and down to 0.105, and
 * hue from 98° (straw) through 58° (amber) and 27° (rust) to 352° (wine), and spaced at equal
 * OKLab distance (0.086 between neighbours). As OKLCH (L, C, h°): (0.955, 0.050, 98.0),
 * (0.885, 0.100, 88.7), (0.810, 0.128, 75.3), (0.733, 0.147, 60.5), (0.655, 0.152, 46.4),
 * (0.576, 0.154, 32.5), (0.498, 0.144, 19.0), (0.420, 0.124, 5.7), (0.340, 0.105, 352.0).
 * Lightness falls monotonically, so the order survives grey-scale printing and colour-vision
 * deficiencies, which lose hue rather than lightness.
 */
export const EMBER_ANCHORS: readonly string[] = Object.freeze([
  "#f9f1cb",
  "#f4d68b",
  "#f1b459",
  "#ea9039",
  "#d96e34",
  "#c34f39",
  "#a53741",
  "#812843",
  "#5e1a3e",
]);

/** Colour of a pipe with no value to show (NaN): a neutral grey. */
export const NO_VALUE_COLOR = "#9aa0a6";

function channels(hex: string): [number, number, number] {
  return [
    Number.parseInt(hex.slice(1, 3), 16),
    Number.parseInt(hex.slice(3, 5), 16),
    Number.parseInt(hex.slice(5, 7), 16),
  ];
}

function hexOf(red: number, green: number, blue: number): string {
  return `#${[red, green, blue].map((value) => value.toString(16).padStart(2, "0")).join("")}`;
}

/**
 * The colour at a position on the ember scale.
 *
 * Between two neighbouring anchors each sRGB channel (0-255) is interpolated linearly and
 * rounded: with t' = 8 t, i = floor(t'), f = t' - i, c = round(c_i + f (c_{i+1} - c_i)).
 *
 * @param position - t in [0, 1]; values outside are clamped; NaN gives {@link NO_VALUE_COLOR}
 * @returns "#rrggbb"
 * @example emberColor(0.5) // "#d96e34"
 */
export function emberColor(position: number): string {
  if (Number.isNaN(position)) return NO_VALUE_COLOR;
  const t = Math.min(1, Math.max(0, position)) * (EMBER_ANCHORS.length - 1);
  const index = Math.min(EMBER_ANCHORS.length - 2, Math.floor(t));
  const fraction = t - index;
  const low = channels(EMBER_ANCHORS[index] as string);
  const high = channels(EMBER_ANCHORS[index + 1] as string);
  const mix = (channel: 0 | 1 | 2) =>
    Math.round(low[channel] + fraction * (high[channel] - low[channel]));
  return hexOf(mix(0), mix(1), mix(2));
}

/**
 * The value a pipe is coloured by, SI:
 * - mach: the larger of the inlet and outlet Mach numbers [-] (subsonic flow accelerates, so this
 *   is the largest in the pipe);
 * - pressure: the mean of the inlet and outlet static pressures [Pa absolute];
 * - velocity: the larger of the inlet and outlet velocities [m/s];
 * - flow: |mass flow| [kg/s].
 */
export function edgeColorValue(edge: EdgeResult, quantity: ColorQuantity): number {
  switch (quantity) {
    case "mach":
      return Math.max(edge.inlet.mach, edge.outlet.mach);
    case "pressure":
      return 0.5 * (edge.inlet.pressure + edge.outlet.pressure);
    case "velocity":
      return Math.max(edge.inlet.velocity, edge.outlet.velocity);
    case "flow":
      return Math.abs(edge.massFlow);
  }
}

/** A tick of the colour legend. */
export interface ColorTick {
  /** Position on the scale [0, 1]. */
  position: number;
  label: string;
}

/** The colour scale of one drawing. */
export interface ColorScale {
  quantity: ColorQuantity;
  /** Legend title, e.g. "largest Mach number in the pipe". */
  title: string;
  /** Display unit label ("-" for Mach). */
  unit: string;
  /** "sqrt" for Mach, "linear" otherwise. */
  mapping: "sqrt" | "linear";
  /** Domain in SI. */
  low: number;
  high: number;
  /** Position of an SI value on the scale, [0, 1]; NaN for a value that is not a number. */
  position(valueSI: number): number;
  /** The value in the display unit. */
  display(valueSI: number): number;
  ticks: ColorTick[];
}

/** Ticks of the Mach legend, on its square-root scale. */
const MACH_TICKS = [0, 0.05, 0.1, 0.2, 0.3, 0.5, 0.7, 1];

/**
 * The colour scale for a result.
 *
 * | quantity | value of a pipe | domain | position t |
 * |---|---|---|---|
 * | mach | max(M in, M out) | 0 to 1, fixed | sqrt(M), clamped to [0, 1] |
 * | pressure | (p in + p out) / 2 | min to max over the pipes | (v - min) / (max - min) |
 * | velocity | max(v in, v out) | 0 to max over the pipes | v / max |
 * | flow | abs(mass flow) | 0 to max over the pipes | v / max |
 *
 * A degenerate domain (max = min) puts every pipe at t = 0. Mach uses a square-root scale so that
 * the usual 0.01 to 0.3 of plant piping spreads over most of the colours while Mach 1, the
 * adiabatic choke, stays the darkest; its domain is fixed so that two reports compare.
 *
 * @param quantity - what to colour by
 * @param result - the solve result (its pipes set the domain of the linear scales)
 * @param units - the unit set of the legend
 */
export function colorScaleFor(
  quantity: ColorQuantity,
  result: NetworkResult,
  units: UnitSetName,
): ColorScale {
  if (quantity === "mach") {
    return {
      quantity,
      title: "largest Mach number in the pipe (square-root scale)",
      unit: "-",
      mapping: "sqrt",
      low: 0,
      high: 1,
      position: (value) => (Number.isNaN(value) ? Number.NaN : Math.sqrt(clamp01(value))),
      display: (value) => value,
      ticks: MACH_TICKS.map((tick) => ({ position: Math.sqrt(tick), label: String(tick) })),
    };
  }
  const values = result.edges
    .map((edge) => edgeColorValue(edge, quantity))
    .filter((value) => Number.isFinite(value));
  const high = values.length > 0 ? Math.max(...values) : 0;
  const low = quantity === "pressure" ? (values.length > 0 ? Math.min(...values) : 0) : 0;
  const kind =
    quantity === "pressure" ? "pressure" : quantity === "velocity" ? "velocity" : "massFlow";
  const unit = displayUnit(units, kind);
  const title =
    quantity === "pressure"
      ? "mean static pressure in the pipe"
      : quantity === "velocity"
        ? "largest velocity in the pipe"
        : "mass flow";
  const span = high - low;
  const position = (value: number) =>
    Number.isNaN(value) ? Number.NaN : span > 0 ? clamp01((value - low) / span) : 0;
  const lowDisplay = unit.fromSI(low);
  const highDisplay = unit.fromSI(high);
  const tickValues = niceTicks(lowDisplay, highDisplay, 5);
  const step = tickValues.length > 1 ? (tickValues[1] as number) - (tickValues[0] as number) : 0;
  const ticks =
    highDisplay > lowDisplay
      ? tickValues.map((tick) => ({
          position: (tick - lowDisplay) / (highDisplay - lowDisplay),
          label: tickLabel(tick, step),
        }))
      : [{ position: 0, label: tickLabel(lowDisplay, Math.abs(lowDisplay) / 1000) }];
  return {
    quantity,
    title,
    unit: unit.label,
    mapping: "linear",
    low,
    high,
    position,
    display: (value) => unit.fromSI(value),
    ticks,
  };
}

function clamp01(value: number): number {
  return Math.min(1, Math.max(0, value));
}
