/**
 * A network result as JSON text: the result object exactly as `solveNetwork` returns it, SI
 * numbers, two-space indent. Browser-safe.
 */

import type { NetworkResult } from "../results/result-types.js";

/**
 * The result as JSON text, ending in a line break.
 *
 * @param result - the result of `solveNetwork`
 * @returns `JSON.stringify(result, null, 2)` and "\n"; JSON has no NaN or Infinity, so such a
 *   number (none is expected in a result) would be written as null
 * @example JSON.parse(resultJson(result)).converged // true for a converged solve
 */
export function resultJson(result: NetworkResult): string {
  return `${JSON.stringify(result, null, 2)}\n`;
}
