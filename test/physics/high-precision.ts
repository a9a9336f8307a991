/**
 * Test helpers for the physics relations: an independent 40-digit evaluation of closed forms
 * (mathjs 15 BigNumber) and tolerances derived from printed precision. The closed forms are
 * written in the tests from the published equations, never taken from the code under test.
 */
import { all, create, type FactoryFunctionMap } from "mathjs";
import { expect } from "vitest";

// mathjs types `all` as possibly undefined; it is always defined in mathjs 15.
const math = create(all as FactoryFunctionMap, { number: "BigNumber", precision: 40 });

/**
 * The exact value of a double as a BigNumber (mathjs converts a number through its shortest
 * decimal string, which is not the binary value: 1 - 2^-52 would become 0.9999999999999998).
 */
function exactBig(value: number): unknown {
  if (value === 0 || !Number.isFinite(value)) return math.bignumber(value);
  let exponent = Math.floor(Math.log2(Math.abs(value))) - 52;
  let mantissa = value / 2 ** exponent;
  while (!Number.isInteger(mantissa)) {
    exponent -= 1;
    mantissa = value / 2 ** exponent;
  }
  return math.multiply(
    math.bignumber(mantissa),
    math.pow(math.bignumber(2), math.bignumber(exponent)),
  );
}

/** Evaluate `expression` (mathjs syntax) at 40 significant digits with the doubles in `scope`. */
export function highPrecision(expression: string, scope: Record<string, number>): number {
  const bigScope: Record<string, unknown> = {};
  for (const [name, value] of Object.entries(scope)) bigScope[name] = exactBig(value);
  return Number(math.evaluate(expression, bigScope).toString());
}

/**
 * Tolerance of a double-precision closed form that ends in a power or exponential: rounding of
 * its argument gives a relative error of about epsilon |ln(result)|, plus a few roundings
 * elsewhere (1e-14 is about 45 epsilon).
 */
export function powerTolerance(reference: number): number {
  return 1e-14 * (1 + Math.abs(Math.log(reference)));
}

/** Half a unit in the last printed digit: the tolerance of a value printed to that precision. */
export function printedTolerance(printed: string): number {
  const decimals = printed.split(".")[1]?.length ?? 0;
  return 0.5 * 10 ** -decimals * (1 + 1e-9);
}

/** `actual` agrees with a value printed as `printed` to the printed precision. */
export function expectAtPrintedPrecision(actual: number, printed: string): void {
  expect(Math.abs(actual - Number(printed))).toBeLessThanOrEqual(printedTolerance(printed));
}

export function relativeError(actual: number, expected: number): number {
  return Math.abs(actual - expected) / Math.abs(expected);
}
