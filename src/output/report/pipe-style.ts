/**
 * How a pipe is drawn: its line width from its mass flow, the flow arrow at its middle and the
 * marks of a choked pipe (a dashed white core inside a heavy casing, and a bow-tie at its exit).
 */

import type { Point } from "./network-layout.js";
import { INK } from "./node-symbols.js";
import { coordinate as c, pointsAttribute } from "./svg-format.js";

/** Line width of a pipe with no flow, and the extra width of the largest flow [px]. */
const MIN_WIDTH = 1.5;
const EXTRA_WIDTH = 8.5;

/**
 * Line width of a pipe [px]: w = 1.5 + 8.5 sqrt(|m| / |m|max), so that the line's area, not its
 * width, follows the flow and a small branch stays visible beside the main.
 *
 * @param massFlow - the pipe's mass flow [kg/s] (sign ignored)
 * @param largest - the largest |mass flow| in the network [kg/s]
 */
export function pipeWidth(massFlow: number, largest: number): number {
  if (!(largest > 0) || !Number.isFinite(massFlow)) return MIN_WIDTH;
  return MIN_WIDTH + EXTRA_WIDTH * Math.sqrt(Math.min(1, Math.abs(massFlow) / largest));
}

/** The point at a fraction of a polyline's length, with the unit direction there. */
export function pointAlong(
  points: readonly Point[],
  fraction: number,
): { point: Point; dx: number; dy: number } {
  const lengths: number[] = [];
  let total = 0;
  for (let index = 1; index < points.length; index++) {
    const a = points[index - 1] as Point;
    const b = points[index] as Point;
    const length = Math.hypot(b.x - a.x, b.y - a.y);
    lengths.push(length);
    total += length;
  }
  let remaining = fraction * total;
  for (let index = 1; index < points.length; index++) {
    const a = points[index - 1] as Point;
    const b = points[index] as Point;
    const length = lengths[index - 1] as number;
    if ((remaining <= length || index === points.length - 1) && length > 0) {
      const share = Math.min(1, remaining / length);
      return {
        point: { x: a.x + share * (b.x - a.x), y: a.y + share * (b.y - a.y) },
        dx: (b.x - a.x) / length,
        dy: (b.y - a.y) / length,
      };
    }
    remaining -= length;
  }
  const only = points[0] ?? { x: 0, y: 0 };
  return { point: only, dx: 1, dy: 0 };
}

/** A box to keep clear, by its centre and size [px]. */
export interface Box {
  x: number;
  y: number;
  width: number;
  height: number;
}

/** Where along a pipe its arrow goes: the middle, or the nearest place off the label's box. */
const ARROW_PLACES = [0.5, 0.35, 0.65, 0.22, 0.78];

/**
 * The flow arrow: a solid triangle pointing downstream, at the middle of the pipe or, when its
 * label would cover it there, at the nearest place off the label.
 */
export function arrowHead(points: readonly Point[], width: number, avoid?: Box): string {
  const length = 7 + 0.9 * width;
  const half = 4 + 0.55 * width;
  const reach = 0.5 * length + half + 1;
  const clear = (at: Point) =>
    avoid === undefined ||
    Math.abs(at.x - avoid.x) > 0.5 * avoid.width + reach ||
    Math.abs(at.y - avoid.y) > 0.5 * avoid.height + reach;
  const place =
    ARROW_PLACES.map((fraction) => pointAlong(points, fraction)).find((candidate) =>
      clear(candidate.point),
    ) ?? pointAlong(points, 0.5);
  const { point, dx, dy } = place;
  const tip = { x: point.x + 0.5 * length * dx, y: point.y + 0.5 * length * dy };
  const baseX = point.x - 0.5 * length * dx;
  const baseY = point.y - 0.5 * length * dy;
  const left = { x: baseX - half * dy, y: baseY + half * dx };
  const right = { x: baseX + half * dy, y: baseY - half * dx };
  return `<path class="mn-arrow" d="M${c(tip.x)} ${c(tip.y)}L${c(left.x)} ${c(left.y)}L${c(right.x)} ${c(right.y)}Z" fill="${INK}" stroke="#ffffff" stroke-width="1" stroke-linejoin="round"/>`;
}

/** The dashed white core of a choked pipe. */
export function chokedOverlay(points: readonly Point[], width: number): string {
  return `<polyline class="mn-choke-core" points="${pointsAttribute(points)}" fill="none" stroke="#ffffff" stroke-width="${c(Math.max(1.4, 0.4 * width))}" stroke-dasharray="5 4" stroke-linejoin="round"/>`;
}

/** A bow-tie across the exit of a choked pipe, 16 px before its end. */
export function chokeBowtie(points: readonly Point[], width: number): string {
  const total = polylineLength(points);
  const fraction = total > 0 ? Math.max(0.55, 1 - 16 / total) : 1;
  const { point, dx, dy } = pointAlong(points, fraction);
  const half = 5 + 0.6 * width;
  const depth = 4;
  const nx = -dy;
  const ny = dx;
  const a = { x: point.x - depth * dx + half * nx, y: point.y - depth * dy + half * ny };
  const b = { x: point.x + depth * dx + half * nx, y: point.y + depth * dy + half * ny };
  const d = { x: point.x - depth * dx - half * nx, y: point.y - depth * dy - half * ny };
  const e = { x: point.x + depth * dx - half * nx, y: point.y + depth * dy - half * ny };
  return `<path class="mn-choke-mark" d="M${c(a.x)} ${c(a.y)}L${c(b.x)} ${c(b.y)}L${c(d.x)} ${c(d.y)}L${c(e.x)} ${c(e.y)}Z" fill="${INK}" stroke="#ffffff" stroke-width="1" stroke-linejoin="round"/>`;
}

/** Length of a polyline [px]. */
export function polylineLength(points: readonly Point[]): number {
  let total = 0;
  for (let index = 1; index < points.length; index++) {
    const a = points[index - 1] as Point;
    const b = points[index] as Point;
    total += Math.hypot(b.x - a.x, b.y - a.y);
  }
  return total;
}
