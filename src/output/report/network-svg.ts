/**
 * The network drawn with its results as one SVG: pipes coloured by a chosen quantity on the
 * ember scale, line width by mass flow, an arrow for the direction of flow, choked pipes marked
 * so that it shows in grey-scale print, node symbols, ids, and every element's full results in
 * its <title>.
 */

import type { CheckedDocument } from "../../input/document-types.js";
import type { NetworkResult } from "../../results/result-types.js";
import { displayUnit, type UnitSetName } from "../display-units.js";
import { formatNumber } from "../format-number.js";
import { NOT_A_SOLUTION, notASolutionReason } from "../result-table.js";
import { type ColorQuantity, colorScaleFor, edgeColorValue, emberColor } from "./color-scale.js";
import { componentGlyph, isComponentKind, polylineMidpoint } from "./component-glyph.js";
import { detailsText, edgeDetails, nodeDetails } from "./element-details.js";
import { escapeMarkup } from "./escape-markup.js";
import { type LaidOutEdge, LINE_HEIGHT, layoutNetwork } from "./network-layout.js";
import { emberGradient, LEGEND_HEIGHT, LEGEND_WIDTH, legendSvg } from "./network-legend.js";
import { INK, nodeSymbolSvg, SYMBOL_NAMES, SYMBOL_SIZE } from "./node-symbols.js";
import { arrowHead, chokeBowtie, chokedOverlay, pipeWidth } from "./pipe-style.js";
import { coordinate as c, pointsAttribute } from "./svg-format.js";

/** Options of {@link drawNetworkSvg}. */
export interface DrawOptions {
  /** What the pipes are coloured by. @defaultValue "mach" */
  colorBy?: ColorQuantity;
  /** Unit set of every number shown. @defaultValue "metric" */
  units?: UnitSetName;
}

/** Options of the markup builder behind {@link drawNetworkSvg}. */
export interface NetworkSvgOptions extends DrawOptions {
  /** A standalone file (XML declaration, namespace) or SVG inline in HTML. */
  standalone: boolean;
  /** Prefix of the ids defined in the SVG. @defaultValue "mn" */
  idPrefix?: string;
}

/** Extra width of a pipe's dark casing, plain and choked [px]. */
const CASING = 2;
const CHOKED_CASING = 7;

/** Height of the NOT A SOLUTION banner [px]. */
const BANNER_HEIGHT = 34;

/** The value shown in a pipe's label, with its unit. */
function labelValue(quantity: ColorQuantity, value: number, units: UnitSetName): string {
  if (quantity === "mach") return `Ma ${formatNumber(value, 3)}`;
  const kind =
    quantity === "pressure" ? "pressure" : quantity === "velocity" ? "velocity" : "massFlow";
  const unit = displayUnit(units, kind);
  return `${formatNumber(unit.fromSI(value), quantity === "pressure" ? 5 : 3)} ${unit.label}`;
}

/** Style rules of the drawing (classes prefixed "mn-", so the page's own styles do not clash). */
const SVG_STYLE = `.mn-network text{font-family:ui-monospace,"DejaVu Sans Mono","Liberation Mono",Menlo,Consolas,monospace;font-size:11px;fill:${INK}}
.mn-network .mn-label text,.mn-network .mn-node text{paint-order:stroke;stroke:#fff;stroke-width:3px;stroke-linejoin:round}
.mn-network .mn-id{font-weight:700}
.mn-network .mn-small{font-size:10px}
.mn-network .mn-legend-title{font-size:12px;font-weight:700}
.mn-network .mn-tick{font-size:10px}
.mn-network .mn-label .mn-choked-text{fill:#fff;font-weight:700;stroke:none}
.mn-network .mn-banner-text{fill:#fff;font-size:15px;font-weight:700}
.mn-network [data-details]{cursor:pointer}
.mn-network [data-details]:hover .mn-casing,.mn-network .mn-active .mn-casing{stroke:#0a58ca}
.mn-network [data-details]:focus{outline:none}
.mn-network .mn-node.mn-active .mn-symbol{stroke:#0a58ca;stroke-width:3px}`;

/**
 * The network drawn with its results, as a standalone SVG document.
 *
 * @param document - the checked document the result was solved from (lengths, diameters, kinds)
 * @param result - the solve result (its edges and nodes in the document's order)
 * @param options - colour quantity and unit set
 * @returns SVG text; every pipe is a `<g class="mn-edge" data-id="...">` and every node a
 *   `<g class="mn-node" data-id="...">`, each with a `<title>` of its full results
 * @remarks Pure and deterministic. A result that is not a solution carries a NOT A SOLUTION
 *   banner. Layout by dagre, left to right in the direction of flow; colour scale in
 *   {@link colorScaleFor}, line width in {@link pipeWidth}.
 * @example drawNetworkSvg(checked, solveCheckedDocument(checked), { colorBy: "velocity", units: "si" })
 */
export function drawNetworkSvg(
  document: CheckedDocument,
  result: NetworkResult,
  options: DrawOptions = {},
): string {
  return networkSvgMarkup(document, result, { ...options, standalone: true });
}

/** The SVG markup of the drawing, standalone or inline. */
export function networkSvgMarkup(
  document: CheckedDocument,
  result: NetworkResult,
  options: NetworkSvgOptions,
): string {
  const quantity = options.colorBy ?? "mach";
  const units = options.units ?? "metric";
  const prefix = options.idPrefix ?? "mn";
  const pressure = displayUnit(units, "pressure");
  const scale = colorScaleFor(quantity, result, units);
  const values = result.edges.map((edge) => edgeColorValue(edge, quantity));

  const nodeLabels = result.nodes.map(
    (node) =>
      [node.id, `${formatNumber(pressure.fromSI(node.pressure), 5)} ${pressure.label}`] as const,
  );
  const edgeLabels = result.edges.map((edge, index) => {
    const lines = [edge.id, labelValue(quantity, values[index] as number, units)];
    if (edge.choked) lines.push("CHOKED");
    return lines;
  });
  const largest = Math.max(
    0,
    ...result.edges.map((edge) => Math.abs(edge.massFlow)).filter(Number.isFinite),
  );
  const lineWidths = result.edges.map((edge) => pipeWidth(edge.massFlow, largest));
  const clearances = result.edges.map(
    (edge, index) => 0.5 * ((lineWidths[index] as number) + (edge.choked ? CHOKED_CASING : CASING)),
  );
  const layout = layoutNetwork(document, result, nodeLabels, edgeLabels, clearances);

  const reason = notASolutionReason(result);
  const bannerHeight = reason === undefined ? 0 : BANNER_HEIGHT;
  const width = Math.ceil(Math.max(layout.width, LEGEND_WIDTH));
  const drawingTop = bannerHeight + LEGEND_HEIGHT;
  const height = Math.ceil(drawingTop + layout.height);
  const offsetX = Math.max(0, (width - layout.width) / 2);

  const name = result.name === "" ? "network" : `network "${result.name}"`;
  const heading = `${reason === undefined ? "" : `${NOT_A_SOLUTION}: `}${name}: ${result.edges.length} pipes, ${result.nodes.length} nodes; pipes coloured by ${scale.title}`;
  const namespace = options.standalone ? ' xmlns="http://www.w3.org/2000/svg"' : "";
  const parts: string[] = [];
  if (options.standalone) parts.push('<?xml version="1.0" encoding="UTF-8"?>\n');
  parts.push(
    `<svg${namespace} class="mn-network" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}" role="img" aria-labelledby="${prefix}-title" data-color-by="${quantity}" data-units="${units}" data-edge-count="${result.edges.length}" data-node-count="${result.nodes.length}" data-status="${result.status}">`,
    `<title id="${prefix}-title">${escapeMarkup(heading)}</title>`,
    `<style>${SVG_STYLE}</style>`,
    `<defs>${emberGradient(`${prefix}-ember`)}</defs>`,
    `<rect width="${width}" height="${height}" fill="#ffffff"/>`,
  );
  if (reason !== undefined) {
    parts.push(
      `<g class="mn-not-a-solution"><rect width="${width}" height="${BANNER_HEIGHT}" fill="#9b1028"/>`,
      `<text class="mn-banner-text" x="12" y="22">${escapeMarkup(`${NOT_A_SOLUTION}: ${reason}`)}</text></g>`,
    );
  }
  parts.push(legendSvg(scale, document, result, units, prefix, bannerHeight));
  parts.push(`<g class="mn-drawing" transform="translate(${c(offsetX)} ${c(drawingTop)})">`);

  parts.push('<g class="mn-edges">');
  for (const laid of layout.edges) {
    const edge = result.edges[laid.index];
    if (!edge) continue;
    const value = values[laid.index] as number;
    const color = emberColor(scale.position(value));
    const lineWidth = lineWidths[laid.index] as number;
    const kind = document.edges[laid.index]?.kind ?? "pipe";
    const details = detailsText(
      `${kind} ${edge.id}`,
      edgeDetails(edge, document.edges[laid.index], units),
    );
    const points = pointsAttribute(laid.points);
    parts.push(
      `<g class="mn-edge${edge.choked ? " mn-choked" : ""}" data-id="${escapeMarkup(edge.id)}" data-index="${laid.index}" data-from="${escapeMarkup(edge.from)}" data-to="${escapeMarkup(edge.to)}" data-value="${value}" data-position="${scale.position(value)}" data-color="${color}" data-width="${c(lineWidth)}" data-choked="${edge.choked}" data-details="" tabindex="0">`,
      `<title>${escapeMarkup(details)}</title>`,
      `<polyline class="mn-casing" points="${points}" fill="none" stroke="${INK}" stroke-width="${c(lineWidth + (edge.choked ? CHOKED_CASING : CASING))}" stroke-linejoin="round" stroke-linecap="butt"/>`,
      `<polyline class="mn-pipe" points="${points}" fill="none" stroke="${color}" stroke-width="${c(lineWidth)}" stroke-linejoin="round" stroke-linecap="butt"/>`,
    );
    if (edge.choked)
      parts.push(chokedOverlay(laid.points, lineWidth), chokeBowtie(laid.points, lineWidth));
    if (edge.massFlow !== 0) {
      const label = {
        x: laid.labelX,
        y: laid.labelY,
        width: laid.labelWidth,
        height: laid.labelHeight,
      };
      parts.push(arrowHead(laid.points, lineWidth, label));
    }
    if (isComponentKind(kind)) {
      const middle = polylineMidpoint(laid.points);
      parts.push(componentGlyph(kind, middle.x, middle.y));
    }
    parts.push(edgeLabelSvg(laid, edgeLabels[laid.index] ?? [edge.id]), "</g>");
  }
  parts.push("</g>");

  parts.push('<g class="mn-nodes">');
  for (const laid of layout.nodes) {
    const node = result.nodes[laid.index];
    if (!node) continue;
    const details = detailsText(
      `${SYMBOL_NAMES[laid.symbol]} ${node.id}`,
      nodeDetails(node, document.nodes[laid.index], units, result.ambient.pressure),
    );
    const [above, below] = nodeLabels[laid.index] ?? [node.id, ""];
    parts.push(
      `<g class="mn-node mn-node-${laid.symbol}" data-id="${escapeMarkup(node.id)}" data-index="${laid.index}" data-symbol="${laid.symbol}" data-details="" tabindex="0">`,
      `<title>${escapeMarkup(details)}</title>`,
      nodeSymbolSvg(laid.symbol, laid.x, laid.y),
      `<text class="mn-id" x="${c(laid.x)}" y="${c(laid.y - SYMBOL_SIZE / 2 - 4)}" text-anchor="middle">${escapeMarkup(above)}</text>`,
      `<text class="mn-small" x="${c(laid.x)}" y="${c(laid.y + SYMBOL_SIZE / 2 + 10)}" text-anchor="middle">${escapeMarkup(below)}</text>`,
      "</g>",
    );
  }
  parts.push("</g>");
  if (reason !== undefined) {
    const x = layout.width / 2;
    const y = layout.height / 2;
    parts.push(
      `<text class="mn-watermark" x="${c(x)}" y="${c(y)}" text-anchor="middle" transform="rotate(-18 ${c(x)} ${c(y)})" style="font-size:40px;font-weight:700;fill:#9b1028;opacity:0.18">${NOT_A_SOLUTION}</text>`,
    );
  }
  parts.push("</g></svg>");
  return parts.join("");
}

/** A pipe's label: its id, the coloured value and, for a choked pipe, CHOKED white on black. */
function edgeLabelSvg(laid: LaidOutEdge, lines: readonly string[]): string {
  const top = laid.labelY - laid.labelHeight / 2 + 2;
  const parts = ['<g class="mn-label">'];
  lines.forEach((line, index) => {
    const baseline = top + (index + 1) * LINE_HEIGHT - 2;
    if (line === "CHOKED" && index === 2) {
      parts.push(
        `<rect x="${c(laid.labelX - 26)}" y="${c(baseline - 10)}" width="52" height="13" rx="2" fill="${INK}"/>`,
        `<text class="mn-choked-text" x="${c(laid.labelX)}" y="${c(baseline)}" text-anchor="middle">CHOKED</text>`,
      );
    } else {
      parts.push(
        `<text class="${index === 0 ? "mn-id" : "mn-small"}" x="${c(laid.labelX)}" y="${c(baseline)}" text-anchor="middle">${escapeMarkup(line)}</text>`,
      );
    }
  });
  parts.push("</g>");
  return parts.join("");
}
