/**
 * The node symbols of the network drawing, machnet's own: a dark capsule for a reservoir (a
 * vessel), a small dot for a plain junction, a hollow downward triangle for a junction with a
 * demand (gas leaves the network) and a solid upward triangle for a junction with an injection
 * (gas enters). Shape and fill both differ, so the kinds stay apart in grey-scale print.
 */

import type { CheckedNode } from "../../input/document-types.js";
import { coordinate } from "./svg-format.js";

/** The kinds of node symbol. */
export type NodeSymbolKind = "reservoir" | "junction" | "demand" | "injection";

/** The ink of symbols, casings and text. */
export const INK = "#1f2630";

/** Height of the symbol box [px]; the id sits above it and the pressure below. */
export const SYMBOL_SIZE = 28;

/** The symbol of a node. */
export function nodeSymbolKind(node: Pick<CheckedNode, "kind" | "demand">): NodeSymbolKind {
  if (node.kind === "reservoir") return "reservoir";
  if (node.demand > 0) return "demand";
  if (node.demand < 0) return "injection";
  return "junction";
}

/** Words for a symbol kind, for legends and details. */
export const SYMBOL_NAMES: Readonly<Record<NodeSymbolKind, string>> = {
  reservoir: "reservoir",
  junction: "junction",
  demand: "junction with demand",
  injection: "junction with injection",
};

/** How far from the centre a pipe line stops, per symbol [px]. */
export const SYMBOL_RADIUS: Readonly<Record<NodeSymbolKind, number>> = {
  reservoir: 10,
  junction: 4,
  demand: 8,
  injection: 8,
};

/**
 * SVG markup of a symbol centred at (x, y).
 *
 * @param kind - the symbol
 * @param x - centre [px]
 * @param y - centre [px]
 */
export function nodeSymbolSvg(kind: NodeSymbolKind, x: number, y: number): string {
  const c = coordinate;
  switch (kind) {
    case "reservoir":
      return (
        `<rect class="mn-symbol" x="${c(x - 8)}" y="${c(y - 13)}" width="16" height="26" rx="8" fill="${INK}" stroke="#ffffff" stroke-width="1.5"/>` +
        `<path d="M${c(x - 8)} ${c(y - 3)}h16M${c(x - 8)} ${c(y + 3)}h16" stroke="#ffffff" stroke-width="1.2" fill="none"/>`
      );
    case "junction":
      return `<circle class="mn-symbol" cx="${c(x)}" cy="${c(y)}" r="5" fill="${INK}" stroke="#ffffff" stroke-width="1.5"/>`;
    case "demand":
      return `<path class="mn-symbol" d="M${c(x - 9)} ${c(y - 6.5)}H${c(x + 9)}L${c(x)} ${c(y + 9)}Z" fill="#ffffff" stroke="${INK}" stroke-width="2.4" stroke-linejoin="round"/>`;
    case "injection":
      return `<path class="mn-symbol" d="M${c(x - 9)} ${c(y + 6.5)}H${c(x + 9)}L${c(x)} ${c(y - 9)}Z" fill="${INK}" stroke="#ffffff" stroke-width="1.2" stroke-linejoin="round"/>`;
  }
}
