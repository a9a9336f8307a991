/**
 * Small formatting helpers shared by the drawings: coordinates with a fixed number of decimals
 * (so that the same layout gives the same text) and "nice" axis ticks.
 */

/** A coordinate or length for SVG markup: one decimal, no "-0". */
export function coordinate(value: number): string {
  const rounded = Math.round(value * 10) / 10;
  return (rounded === 0 ? 0 : rounded).toString();
}

/** A polyline's `points` attribute. */
export function pointsAttribute(points: readonly { x: number; y: number }[]): string {
  return points.map((point) => `${coordinate(point.x)},${coordinate(point.y)}`).join(" ");
}

/**
 * Tick values for an axis from `low` to `high`: steps of 1, 2 or 5 times a power of ten, about
 * `count` of them, every tick inside [low, high] (within a rounding margin).
 *
 * @param low - axis start, in the unit shown
 * @param high - axis end, >= low
 * @param count - the number of ticks wanted (about)
 * @returns increasing tick values; [low] when low = high
 */
export function niceTicks(low: number, high: number, count: number): number[] {
  if (!(Number.isFinite(low) && Number.isFinite(high)) || high <= low) return [low];
  const step = niceStep((high - low) / Math.max(1, count));
  const first = Math.ceil(low / step - 1e-9);
  const last = Math.floor(high / step + 1e-9);
  const ticks: number[] = [];
  for (let index = first; index <= last; index++) {
    // Multiply rather than accumulate so that 0.1 + 0.2 drift does not appear in the labels.
    ticks.push(Number((index * step).toPrecision(12)));
  }
  return ticks;
}

/** The step of {@link niceTicks}: 1, 2 or 5 times a power of ten, at least `rough`. */
export function niceStep(rough: number): number {
  if (!(rough > 0) || !Number.isFinite(rough)) return 1;
  const power = 10 ** Math.floor(Math.log10(rough));
  const fraction = rough / power;
  const nice = fraction <= 1 ? 1 : fraction <= 2 ? 2 : fraction <= 5 ? 5 : 10;
  return nice * power;
}

/** The smallest nice number (1, 2, 2.5 or 5 times a power of ten) at or above `value` > 0. */
export function niceCeiling(value: number): number {
  if (!(value > 0) || !Number.isFinite(value)) return 1;
  const power = 10 ** Math.floor(Math.log10(value));
  for (const factor of [1, 2, 2.5, 5, 10]) {
    const candidate = Number((factor * power).toPrecision(12));
    if (candidate >= value * (1 - 1e-12)) return candidate;
  }
  return 10 * power;
}

/**
 * A tick label: as few digits as tell the ticks apart (the step sets them), no exponent for
 * everyday magnitudes.
 *
 * @param value - the tick value
 * @param step - the spacing of the ticks
 */
export function tickLabel(value: number, step: number): string {
  if (value === 0) return "0";
  const magnitude = Math.abs(value);
  if (magnitude >= 1e7 || magnitude < 1e-4) return value.toExponential(2);
  const decimals = step > 0 ? Math.max(0, Math.min(8, -Math.floor(Math.log10(step) + 1e-9))) : 3;
  // A step of 2.5 x 10^k needs one more decimal than 10^k.
  const extra =
    step > 0 && Math.abs(step / 10 ** Math.floor(Math.log10(step)) - 2.5) < 1e-9 ? 1 : 0;
  return value.toFixed(decimals + extra);
}
