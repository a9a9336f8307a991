/**
 * The symbol of a component on the drawing: a white rounded square on the line with the
 * component's letter (our own design, readable in black-and-white print), at the middle of the
 * edge's drawn path.
 */
import { escapeMarkup } from "./escape-markup.js";
import { INK } from "./node-symbols.js";
import { coordinate as c } from "./svg-format.js";

/** The letter of each component kind. */
export const COMPONENT_LETTERS = {
  orifice: "O",
  nozzle: "N",
  valve: "V",
  regulator: "R",
  check: "C",
} as const;

/** Component kinds that get a glyph. */
export type ComponentKindName = keyof typeof COMPONENT_LETTERS;

/** Whether an edge kind is a component (anything but a pipe). */
export function isComponentKind(kind: string): kind is ComponentKindName {
  return Object.hasOwn(COMPONENT_LETTERS, kind);
}

/** The point halfway along a polyline, by length. */
export function polylineMidpoint(points: readonly { x: number; y: number }[]): {
  x: number;
  y: number;
} {
  let total = 0;
  for (let i = 1; i < points.length; i++) {
    const a = points[i - 1] as { x: number; y: number };
    const b = points[i] as { x: number; y: number };
    total += Math.hypot(b.x - a.x, b.y - a.y);
  }
  let remaining = total / 2;
  for (let i = 1; i < points.length; i++) {
    const a = points[i - 1] as { x: number; y: number };
    const b = points[i] as { x: number; y: number };
    const length = Math.hypot(b.x - a.x, b.y - a.y);
    if (length >= remaining && length > 0) {
      const t = remaining / length;
      return { x: a.x + t * (b.x - a.x), y: a.y + t * (b.y - a.y) };
    }
    remaining -= length;
  }
  return points[0] ?? { x: 0, y: 0 };
}

/** SVG of a component's glyph centred at (x, y). */
export function componentGlyph(kind: ComponentKindName, x: number, y: number): string {
  const half = 8;
  return (
    `<g class="mn-component" data-component="${kind}">` +
    `<rect x="${c(x - half)}" y="${c(y - half)}" width="${2 * half}" height="${2 * half}" rx="3" fill="#ffffff" stroke="${INK}" stroke-width="1.6"/>` +
    `<text x="${c(x)}" y="${c(y + 4)}" text-anchor="middle" style="font:700 11px sans-serif;fill:${INK}">${escapeMarkup(COMPONENT_LETTERS[kind])}</text>` +
    "</g>"
  );
}
