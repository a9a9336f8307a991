/**
 * The square root of a pressure differential ratio, made linear at vanishing differences so that a
 * restriction's flow has a finite, nonzero slope at zero flow (docs/model.md, "Components").
 */
import { SMALL_DIFFERENCE_RATIO } from "./component-elements.js";

const THRESHOLD = SMALL_DIFFERENCE_RATIO;
const THRESHOLD_POWER = 2 * THRESHOLD ** 1.5;

/**
 * sqrt(x) for x >= x_t; below it the cubic x (3 x_t - x) / (2 x_t^1.5), which has the same value
 * and slope at x_t and the slope 3 / (2 sqrt(x_t)) at x = 0. x_t = SMALL_DIFFERENCE_RATIO.
 *
 * @param ratio - pressure differential ratio x = dp / p1 [-], >= 0
 * @returns s(x) [-]
 * @remarks A regularisation, not a flow law: the square-root law of turbulent flow through a
 *   restriction has an infinite slope at zero flow, which a nodal Newton method cannot use. Below
 *   x_t the cubic lies under sqrt(x) by at most 0.174 sqrt(x_t), i.e. 1.7e-4 of the flow the same
 *   restriction passes at x = 1; above x_t nothing changes. A smooth regularisation of the
 *   square law in a tiny band around zero flow is a common remedy in network solvers (no
 *   source).
 * @example regularisedRoot(0.25) // 0.5; regularisedRoot(0) // 0 (checked in
 *   test/physics/components/valve.test.ts)
 */
export function regularisedRoot(ratio: number): number {
  if (ratio >= THRESHOLD) return Math.sqrt(ratio);
  if (ratio <= 0) return 0;
  return (ratio * (3 * THRESHOLD - ratio)) / THRESHOLD_POWER;
}

/** ds/dx of {@link regularisedRoot} [-]; finite at x = 0. */
export function regularisedRootSlope(ratio: number): number {
  if (ratio >= THRESHOLD) return 0.5 / Math.sqrt(ratio);
  const clamped = Math.max(ratio, 0);
  return (3 * THRESHOLD - 2 * clamped) / THRESHOLD_POWER;
}
