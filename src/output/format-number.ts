/**
 * Numbers as table cells: a fixed count of significant digits, exponent form only where a fixed
 * form would be unreadable. Browser-safe; no locale (a decimal point everywhere).
 */

/** Significant digits of a table cell unless a column asks for others. */
export const DEFAULT_SIGNIFICANT_DIGITS = 5;

/** Below this magnitude (and above {@link LARGE}) a cell is written with an exponent. */
const SMALL = 1e-3;
const LARGE = 1e7;

/**
 * A number for a table cell.
 *
 * @param value - the number, in the unit of its column
 * @param digits - significant digits (1 to 21)
 * @returns "0" for zero; fixed notation with `digits` significant digits for magnitudes in
 *   [1e-3, 1e7); otherwise exponent notation ("1.2346e+7"); "n/a" for NaN, "inf" / "-inf"
 * @example formatNumber(7.013254, 6) // "7.01325"; formatNumber(165004.7, 4) // "165000"
 */
export function formatNumber(value: number, digits: number = DEFAULT_SIGNIFICANT_DIGITS): string {
  if (Number.isNaN(value)) return "n/a";
  if (value === Number.POSITIVE_INFINITY) return "inf";
  if (value === Number.NEGATIVE_INFINITY) return "-inf";
  if (value === 0) return "0";
  const magnitude = Math.abs(value);
  if (magnitude >= SMALL && magnitude < LARGE) {
    const fixed = value.toPrecision(digits);
    if (!fixed.includes("e")) return fixed;
    // toPrecision writes an exponent when the integer part has more digits than asked for:
    // round to that many significant digits and write the integer out instead.
    const step = 10 ** (Math.floor(Math.log10(magnitude)) - digits + 1);
    return (Math.round(value / step) * step).toFixed(0);
  }
  return value.toExponential(digits - 1);
}
