/**
 * The legend of the network drawing: the colour bar with ticks and unit, the line widths with
 * their mass flows, the node symbols, a choked pipe and the flow arrow.
 */

import type { CheckedDocument } from "../../input/document-types.js";
import type { NetworkResult } from "../../results/result-types.js";
import { displayUnit, type UnitSetName } from "../display-units.js";
import { formatNumber } from "../format-number.js";
import { type ColorScale, EMBER_ANCHORS } from "./color-scale.js";
import { componentGlyph, isComponentKind } from "./component-glyph.js";
import { escapeMarkup } from "./escape-markup.js";
import { INK, type NodeSymbolKind, nodeSymbolSvg, SYMBOL_NAMES } from "./node-symbols.js";
import { arrowHead, chokedOverlay, pipeWidth } from "./pipe-style.js";
import { coordinate as c } from "./svg-format.js";

/** Width and height of the legend [px]. */
export const LEGEND_WIDTH = 840;
export const LEGEND_HEIGHT = 140;

const BAR_X = 16;
const BAR_WIDTH = 320;
const BAR_Y = 36;
const BAR_HEIGHT = 12;

/** The colour bar's gradient, in scale positions (the same for every mapping). */
export function emberGradient(id: string): string {
  const stops = EMBER_ANCHORS.map(
    (color, index) =>
      `<stop offset="${c((100 * index) / (EMBER_ANCHORS.length - 1))}%" stop-color="${color}"/>`,
  ).join("");
  return `<linearGradient id="${id}" x1="0" x2="1" y1="0" y2="0">${stops}</linearGradient>`;
}

/** A mark above the colour bar (a design or choke limit). */
interface BarMark {
  position: number;
  label: string;
}

function limitMarks(
  scale: ColorScale,
  document: CheckedDocument,
  result: NetworkResult,
): BarMark[] {
  const marks: BarMark[] = [];
  const limits = document.settings.limits;
  if (scale.quantity === "mach") {
    if (limits.maxMach !== undefined && limits.maxMach < 1) {
      marks.push({
        position: scale.position(limits.maxMach),
        label: `limit ${formatNumber(limits.maxMach, 3)}`,
      });
    }
    if (result.edges.some((edge) => edge.model === "isothermal")) {
      const limit = 1 / Math.sqrt(result.gas.heatCapacityRatio);
      marks.push({
        position: scale.position(limit),
        label: `isothermal choke ${formatNumber(limit, 3)}`,
      });
    }
  } else if (scale.quantity === "velocity" && limits.maxVelocity !== undefined) {
    const position = scale.position(limits.maxVelocity);
    if (scale.high >= limits.maxVelocity) {
      marks.push({
        position,
        label: `limit ${formatNumber(scale.display(limits.maxVelocity), 3)}`,
      });
    }
  }
  return marks;
}

/**
 * The legend's markup, drawn from (0, top).
 *
 * @param scale - the colour scale
 * @param document - the checked document (design limits)
 * @param result - the result (largest flow, pipe models)
 * @param units - the unit set
 * @param idPrefix - prefix of the ids defined here (gradient), unique in the page
 * @param top - y of the legend's top [px]
 */
export function legendSvg(
  scale: ColorScale,
  document: CheckedDocument,
  result: NetworkResult,
  units: UnitSetName,
  idPrefix: string,
  top: number,
): string {
  const parts: string[] = [`<g class="mn-legend" transform="translate(0 ${c(top)})">`];
  const unit = scale.unit === "-" ? "[-]" : `[${escapeMarkup(scale.unit)}]`;
  parts.push(
    `<text class="mn-legend-title" x="${BAR_X}" y="16">Pipe colour: ${escapeMarkup(scale.title)} ${unit}</text>`,
    `<rect class="mn-color-bar" x="${BAR_X}" y="${BAR_Y}" width="${BAR_WIDTH}" height="${BAR_HEIGHT}" fill="url(#${idPrefix}-ember)" stroke="${INK}" stroke-width="0.8"/>`,
  );
  for (const tick of scale.ticks) {
    const x = BAR_X + tick.position * BAR_WIDTH;
    parts.push(
      `<path d="M${c(x)} ${BAR_Y + BAR_HEIGHT}v5" stroke="${INK}" stroke-width="1"/>`,
      `<text class="mn-tick" x="${c(x)}" y="${BAR_Y + BAR_HEIGHT + 16}" text-anchor="middle">${escapeMarkup(tick.label)}</text>`,
    );
  }
  for (const mark of limitMarks(scale, document, result)) {
    const x = BAR_X + mark.position * BAR_WIDTH;
    parts.push(
      `<path class="mn-limit-mark" d="M${c(x - 4)} ${BAR_Y - 7}h8l-4 7z" fill="${INK}"/>`,
      `<text class="mn-tick" x="${c(x + 6)}" y="${BAR_Y - 2}">${escapeMarkup(mark.label)}</text>`,
    );
  }

  // Line widths.
  const flow = displayUnit(units, "massFlow");
  const largest = Math.max(
    0,
    ...result.edges.map((edge) => Math.abs(edge.massFlow)).filter(Number.isFinite),
  );
  const widthY = 92;
  parts.push(
    `<text class="mn-legend-title" x="${BAR_X}" y="${widthY + 4}">Line width by mass flow [${escapeMarkup(flow.label)}]:</text>`,
  );
  const samples = largest > 0 ? [1, 0.25, 0.04] : [0];
  samples.forEach((fraction, index) => {
    const x = 290 + index * 130;
    const width = pipeWidth(fraction * largest, largest);
    parts.push(
      `<path d="M${x} ${widthY}h44" stroke="${INK}" stroke-width="${c(width + 2)}" stroke-linecap="butt"/>`,
      `<path d="M${x + 1} ${widthY}h42" stroke="${EMBER_ANCHORS[4]}" stroke-width="${c(width)}" stroke-linecap="butt"/>`,
      `<text class="mn-tick" x="${x + 50}" y="${widthY + 4}">${escapeMarkup(formatNumber(flow.fromSI(fraction * largest), 3))}</text>`,
    );
  });

  // Symbols, a choked pipe and the flow arrow.
  const rowY = 124;
  const kinds: NodeSymbolKind[] = ["reservoir", "junction", "demand", "injection"];
  const symbolX = [26, 126, 226, 410];
  kinds.forEach((kind, index) => {
    const x = symbolX[index] as number;
    parts.push(
      nodeSymbolSvg(kind, x, rowY),
      `<text class="mn-tick" x="${x + 16}" y="${rowY + 4}">${escapeMarkup(SYMBOL_NAMES[kind])}</text>`,
    );
  });
  const chokedX = 600;
  const sample = [
    { x: chokedX, y: rowY },
    { x: chokedX + 60, y: rowY },
  ];
  parts.push(
    `<g class="mn-legend-choked">`,
    `<path d="M${chokedX} ${rowY}h60" stroke="${INK}" stroke-width="13" stroke-linecap="butt"/>`,
    `<path d="M${chokedX} ${rowY}h60" stroke="${EMBER_ANCHORS[8]}" stroke-width="6" stroke-linecap="butt"/>`,
    chokedOverlay(sample, 6),
    arrowHead(sample, 6),
    `</g>`,
    `<text class="mn-tick" x="${chokedX + 68}" y="${rowY + 4}">CHOKED pipe; arrow: flow</text>`,
  );
  if (document.edges.some((edge) => isComponentKind(edge.kind))) {
    const glyphX = chokedX + 250;
    parts.push(
      componentGlyph("valve", glyphX, rowY),
      `<text class="mn-tick" x="${glyphX + 14}" y="${rowY + 4}">component: O orifice, N nozzle, V valve, R regulator, C check valve</text>`,
    );
  }
  parts.push(`</g>`);
  return parts.join("");
}
