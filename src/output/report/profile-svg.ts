/**
 * The profile charts: static and stagnation pressure, and Mach number, against distance along a
 * path, as SVG line charts with axes, ticks, units, the nodes of the path and the choke limit.
 */

import type { CheckedDocument } from "../../input/document-types.js";
import type { NetworkResult } from "../../results/result-types.js";
import { displayUnit, type UnitSetName } from "../display-units.js";
import { formatNumber } from "../format-number.js";
import { escapeMarkup } from "./escape-markup.js";
import { INK } from "./node-symbols.js";
import type { ProfilePoint } from "./profile-points.js";
import {
  coordinate as c,
  niceCeiling,
  niceTicks,
  pointsAttribute,
  tickLabel,
} from "./svg-format.js";

/** Size of one chart and its plot area [px]. */
const WIDTH = 920;
const HEIGHT = 280;
const LEFT = 76;
const RIGHT = 24;
const TOP = 74;
const BOTTOM = 46;
const PLOT_WIDTH = WIDTH - LEFT - RIGHT;
const PLOT_HEIGHT = HEIGHT - TOP - BOTTOM;

/** Colour of the choke-limit lines and notes. */
const LIMIT_COLOR = "#9b1028";
/** Colour of the stagnation-pressure line. */
const SECOND_COLOR = "#5b6570";

const CHART_STYLE = `.mn-chart text{font-family:ui-monospace,"DejaVu Sans Mono","Liberation Mono",Menlo,Consolas,monospace;font-size:10px;fill:${INK}}
.mn-chart .mn-axis-title{font-size:11px;font-weight:700}
.mn-chart .mn-limit-text{fill:${LIMIT_COLOR};font-weight:700}
.mn-chart [data-details]{cursor:pointer}`;

interface Axis {
  low: number;
  high: number;
  ticks: number[];
  step: number;
}

function axis(low: number, high: number, count: number): Axis {
  let lo = low;
  let hi = high;
  if (!(hi > lo)) {
    const pad = Math.abs(lo) > 0 ? Math.abs(lo) * 0.01 : 1;
    lo -= pad;
    hi += pad;
  }
  const ticks = niceTicks(lo, hi, count);
  const step = ticks.length > 1 ? (ticks[1] as number) - (ticks[0] as number) : hi - lo;
  return { low: lo, high: hi, ticks, step };
}

function frame(
  kind: string,
  title: string,
  xAxis: Axis,
  yAxis: Axis,
  xTitle: string,
  yTitle: string,
  standalone: boolean,
): { open: string[]; x: (value: number) => number; y: (value: number) => number } {
  const x = (value: number) => LEFT + ((value - xAxis.low) / (xAxis.high - xAxis.low)) * PLOT_WIDTH;
  const y = (value: number) =>
    TOP + PLOT_HEIGHT - ((value - yAxis.low) / (yAxis.high - yAxis.low)) * PLOT_HEIGHT;
  const namespace = standalone ? ' xmlns="http://www.w3.org/2000/svg"' : "";
  const open = [
    `<svg${namespace} class="mn-chart mn-chart-${kind}" width="${WIDTH}" height="${HEIGHT}" viewBox="0 0 ${WIDTH} ${HEIGHT}" role="img" data-chart="${kind}">`,
    `<title>${escapeMarkup(title)}</title>`,
    `<style>${CHART_STYLE}</style>`,
    `<rect width="${WIDTH}" height="${HEIGHT}" fill="#ffffff"/>`,
    `<rect x="${LEFT}" y="${TOP}" width="${PLOT_WIDTH}" height="${PLOT_HEIGHT}" fill="#fbfaf7" stroke="${INK}" stroke-width="1"/>`,
  ];
  for (const tick of xAxis.ticks) {
    const px = x(tick);
    open.push(
      `<path d="M${c(px)} ${TOP + PLOT_HEIGHT}v5" stroke="${INK}"/>`,
      `<text x="${c(px)}" y="${TOP + PLOT_HEIGHT + 17}" text-anchor="middle">${tickLabel(tick, xAxis.step)}</text>`,
    );
  }
  for (const tick of yAxis.ticks) {
    const py = y(tick);
    open.push(
      `<path d="M${LEFT} ${c(py)}h${PLOT_WIDTH}" stroke="#e4e1d8" stroke-width="1"/>`,
      `<path d="M${LEFT - 5} ${c(py)}h5" stroke="${INK}"/>`,
      `<text x="${LEFT - 8}" y="${c(py + 3.5)}" text-anchor="end">${tickLabel(tick, yAxis.step)}</text>`,
    );
  }
  open.push(
    `<text class="mn-axis-title" x="${LEFT + PLOT_WIDTH / 2}" y="${HEIGHT - 8}" text-anchor="middle">${escapeMarkup(xTitle)}</text>`,
    `<text class="mn-axis-title" x="14" y="${TOP + PLOT_HEIGHT / 2}" text-anchor="middle" transform="rotate(-90 14 ${TOP + PLOT_HEIGHT / 2})">${escapeMarkup(yTitle)}</text>`,
  );
  return { open, x, y };
}

/** Rows of node names above a chart, and the width of one character at 10 px [px]. */
const NAME_ROWS = 3;
const NAME_CHARACTER_WIDTH = 6.2;

/**
 * Vertical lines at the path's nodes, with their ids above the plot: each id goes in the lowest
 * of three rows where it does not overlap the one before; an id with no room is left out (its
 * node keeps its line, and its points their tooltips).
 */
function nodeGuides(
  points: readonly ProfilePoint[],
  x: (value: number) => number,
  distance: (m: number) => number,
): string[] {
  const parts: string[] = [];
  const rowEnds: number[] = new Array(NAME_ROWS).fill(Number.NEGATIVE_INFINITY);
  for (const point of points) {
    if (point.place !== "node") continue;
    const px = x(distance(point.distance));
    parts.push(
      `<path class="mn-node-guide" d="M${c(px)} ${TOP}v${PLOT_HEIGHT}" stroke="#b8b3a6" stroke-width="1" stroke-dasharray="2 3"/>`,
    );
    const half = 0.5 * [...point.id].length * NAME_CHARACTER_WIDTH;
    // Keep the name inside the chart's width.
    const centre = Math.min(WIDTH - 2 - half, Math.max(2 + half, px));
    const row = rowEnds.findIndex((end) => centre - half > end + 4);
    if (row < 0) continue;
    rowEnds[row] = centre + half;
    const y = TOP - 6 - 14 * row;
    parts.push(
      row > 0 ? `<path d="M${c(px)} ${c(y + 2)}V${TOP}" stroke="#b8b3a6" stroke-width="1"/>` : "",
      `<text class="mn-node-name" x="${c(centre)}" y="${c(y)}" text-anchor="middle">${escapeMarkup(point.id)}</text>`,
    );
  }
  return parts;
}

function pointTitle(point: ProfilePoint, units: UnitSetName): string {
  const pressure = displayUnit(units, "pressure");
  const length = displayUnit(units, "length");
  const where =
    point.place === "node"
      ? `node ${point.id}`
      : `pipe ${point.id}, ${point.place === "entry" ? "entry" : point.place === "exit" ? "exit" : "inside"}`;
  const lines = [
    where,
    `distance: ${formatNumber(length.fromSI(point.distance))} ${length.label}`,
    `pressure: ${formatNumber(pressure.fromSI(point.pressure), 6)} ${pressure.label}`,
    `stagnation pressure: ${formatNumber(pressure.fromSI(point.stagnationPressure), 6)} ${pressure.label}`,
  ];
  if (!Number.isNaN(point.mach)) lines.push(`Mach: ${formatNumber(point.mach, 4)}`);
  return lines.join("\n");
}

function markers(
  points: readonly ProfilePoint[],
  x: (value: number) => number,
  y: (point: ProfilePoint) => number,
  distance: (m: number) => number,
  units: UnitSetName,
  filled: (point: ProfilePoint) => boolean,
): string[] {
  return points.map((point) => {
    const fill = filled(point) ? INK : "#ffffff";
    return `<g class="mn-point" data-place="${point.place}" data-id="${escapeMarkup(point.id)}" data-details=""><title>${escapeMarkup(pointTitle(point, units))}</title><circle cx="${c(x(distance(point.distance)))}" cy="${c(y(point))}" r="3.2" fill="${fill}" stroke="${INK}" stroke-width="1.3"/></g>`;
  });
}

/** Options of {@link profileChartsSvg}. */
export interface ProfileChartOptions {
  units: UnitSetName;
  /** A standalone file (namespace) or SVG inline in HTML. */
  standalone: boolean;
}

/**
 * The pressure chart and the Mach chart of a profile.
 *
 * @param points - from {@link profilePoints}
 * @param document - the checked document (the Mach design limit)
 * @param result - the result (heat capacity ratio)
 * @param options - unit set; standalone or inline
 * @returns two SVG strings: pressure (static solid, stagnation dashed; nodes as hollow circles,
 *   pipe ends solid) and Mach number (with a choke-limit line per pipe: Mach 1 adiabatic,
 *   1/sqrt(gamma) isothermal; when the limit is far above the largest Mach on the path the axis
 *   stops below it and a note at the top gives the limit)
 */
export function profileChartsSvg(
  points: readonly ProfilePoint[],
  document: CheckedDocument,
  result: NetworkResult,
  options: ProfileChartOptions,
): { pressure: string; mach: string } {
  const units = options.units;
  const length = displayUnit(units, "length");
  const pressure = displayUnit(units, "pressure");
  const distance = (m: number) => length.fromSI(m);
  const total = points.length > 0 ? (points[points.length - 1] as ProfilePoint).distance : 0;
  const xAxis = axis(0, distance(total), 8);
  xAxis.low = 0;
  const xTitle = `distance along the path [${length.label}]`;

  // Pressure chart.
  const pressures = points
    .flatMap((point) => [point.pressure, point.stagnationPressure])
    .filter(Number.isFinite);
  const pLow = pressures.length > 0 ? pressure.fromSI(Math.min(...pressures)) : 0;
  const pHigh = pressures.length > 0 ? pressure.fromSI(Math.max(...pressures)) : 1;
  const pPad = (pHigh - pLow) * 0.06;
  const pAxis = axis(pLow - pPad, pHigh + pPad, 6);
  const p = frame(
    "pressure",
    "pressure along the path",
    xAxis,
    pAxis,
    xTitle,
    `pressure [${pressure.label}]`,
    options.standalone,
  );
  const py = (value: number) => p.y(pressure.fromSI(value));
  const pressureParts = [...p.open, ...nodeGuides(points, p.x, distance)];
  const finite = points.filter((point) => Number.isFinite(point.pressure));
  pressureParts.push(
    `<polyline class="mn-series" data-series="stagnation-pressure" points="${pointsAttribute(finite.map((point) => ({ x: p.x(distance(point.distance)), y: py(point.stagnationPressure) })))}" fill="none" stroke="${SECOND_COLOR}" stroke-width="1.4" stroke-dasharray="6 4"/>`,
    `<polyline class="mn-series" data-series="static-pressure" points="${pointsAttribute(finite.map((point) => ({ x: p.x(distance(point.distance)), y: py(point.pressure) })))}" fill="none" stroke="${INK}" stroke-width="2" stroke-linejoin="round"/>`,
    ...markers(
      finite.filter((point) => point.place !== "interior"),
      p.x,
      (point) => py(point.pressure),
      distance,
      units,
      (point) => point.place !== "node",
    ),
    `<g class="mn-chart-key"><path d="M${LEFT} 14h26" stroke="${INK}" stroke-width="2"/><text x="${LEFT + 32}" y="18">static pressure</text>`,
    `<path d="M${LEFT + 170} 14h26" stroke="${SECOND_COLOR}" stroke-width="1.4" stroke-dasharray="6 4"/><text x="${LEFT + 202}" y="18">stagnation pressure</text>`,
    `<circle cx="${LEFT + 370}" cy="14" r="3.2" fill="#fff" stroke="${INK}" stroke-width="1.3"/><text x="${LEFT + 380}" y="18">node</text>`,
    `<circle cx="${LEFT + 440}" cy="14" r="3.2" fill="${INK}" stroke="${INK}" stroke-width="1.3"/><text x="${LEFT + 450}" y="18">pipe end</text></g>`,
    "</svg>",
  );

  // Mach chart.
  const pipePoints = points.filter(
    (point) => point.place !== "node" && Number.isFinite(point.mach),
  );
  const largestMach = Math.max(0, ...pipePoints.map((point) => point.mach));
  const limits = [...new Set(pipePoints.map((point) => point.chokeLimit))].sort((a, b) => a - b);
  const smallestLimit = limits[0] ?? 1;
  const largestLimit = limits[limits.length - 1] ?? 1;
  const maxMach = document.settings.limits.maxMach;
  const limitOnScale = largestMach > 0.25 * smallestLimit;
  const top = limitOnScale
    ? Math.max(1.05 * largestLimit, largestMach * 1.05)
    : niceCeiling(Math.max(1.3 * largestMach, 1e-3));
  const mAxis = axis(0, top, 6);
  mAxis.low = 0;
  const m = frame(
    "mach",
    "Mach number along the path",
    xAxis,
    mAxis,
    xTitle,
    "Mach number [-]",
    options.standalone,
  );
  const machParts = [...m.open, ...nodeGuides(points, m.x, distance)];
  const gamma = result.gas.heatCapacityRatio;
  const limitName = (limit: number) =>
    limit === 1
      ? "Mach 1 (adiabatic)"
      : `1/√γ = ${formatNumber(limit, 3)} (isothermal, γ ${formatNumber(gamma, 4)})`;
  if (limitOnScale) {
    // One dashed segment per pipe, at that pipe's limit.
    for (const point of pipePoints) {
      if (point.place !== "entry") continue;
      const exit = pipePoints.find(
        (other) =>
          other.place === "exit" && other.id === point.id && other.distance >= point.distance,
      );
      const x0 = m.x(distance(point.distance));
      const x1 = m.x(distance(exit?.distance ?? point.distance));
      machParts.push(
        `<path class="mn-choke-limit" data-choke-limit="${point.chokeLimit}" d="M${c(x0)} ${c(m.y(point.chokeLimit))}H${c(x1)}" stroke="${LIMIT_COLOR}" stroke-width="2" stroke-dasharray="8 4"/>`,
      );
    }
    machParts.push(
      `<text class="mn-limit-text" x="${LEFT + PLOT_WIDTH - 4}" y="${c(m.y(largestLimit) + 14)}" text-anchor="end">choke limit: ${escapeMarkup(limits.map(limitName).join("; "))}</text>`,
    );
  } else {
    machParts.push(
      `<g class="mn-choke-limit-note" data-choke-limit="${limits.join(" ")}"><path d="M${LEFT + PLOT_WIDTH - 12} ${TOP + 16}v-12m-4 4l4-4l4 4" stroke="${LIMIT_COLOR}" stroke-width="1.6" fill="none"/>`,
      `<text class="mn-limit-text" x="${LEFT + PLOT_WIDTH - 20}" y="${TOP + 14}" text-anchor="end">choke limit above this scale: ${escapeMarkup(limits.map(limitName).join("; "))}; largest Mach on the path ${formatNumber(largestMach, 3)}</text></g>`,
    );
  }
  if (maxMach !== undefined && maxMach <= top) {
    machParts.push(
      `<path class="mn-design-limit" data-design-limit="${maxMach}" d="M${LEFT} ${c(m.y(maxMach))}h${PLOT_WIDTH}" stroke="${INK}" stroke-width="1" stroke-dasharray="1 3"/>`,
      `<text x="${LEFT + 6}" y="${c(m.y(maxMach) - 4)}">design limit Mach ${formatNumber(maxMach, 3)}</text>`,
    );
  }
  machParts.push(
    `<polyline class="mn-series" data-series="mach" points="${pointsAttribute(pipePoints.map((point) => ({ x: m.x(distance(point.distance)), y: m.y(point.mach) })))}" fill="none" stroke="${INK}" stroke-width="2" stroke-linejoin="round"/>`,
    ...markers(
      pipePoints.filter((point) => point.place !== "interior"),
      m.x,
      (point) => m.y(point.mach),
      distance,
      units,
      () => true,
    ),
    `<g class="mn-chart-key"><path d="M${LEFT} 14h26" stroke="${INK}" stroke-width="2"/><text x="${LEFT + 32}" y="18">Mach number</text>`,
    `<path d="M${LEFT + 150} 14h26" stroke="${LIMIT_COLOR}" stroke-width="2" stroke-dasharray="8 4"/><text x="${LEFT + 182}" y="18">choke limit</text></g>`,
    "</svg>",
  );
  return { pressure: pressureParts.join(""), mach: machParts.join("") };
}
