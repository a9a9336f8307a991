/**
 * Plausible ranges of the inputs of the network model, and the check that refuses a value
 * outside one (with its JSON Pointer and the range). Used by every reader in src/input/.
 */

import type { QuantityInput } from "./document-types.js";
import type { QuantityKind } from "./quantity.js";
import type { ValueReader } from "./read-components.js";

/** The plausible range of one input of the ideal-gas network model, in SI. */
export interface InputRange {
  /** Smallest and largest accepted value, in `unit`. */
  low: number;
  high: number;
  unit: string;
  /** What the range is of, for messages: "the ideal-gas model's temperatures". */
  what: string;
}

/**
 * Plausible ranges of the inputs of the ideal-gas network model. A value outside one is
 * physically impossible for the model, or a unit slip, and is refused with its JSON Pointer and
 * the range. The reasons (docs/model.md, "Input ranges"; common practice, no source):
 * - temperature 20 K to 3000 K: below 20 K every gas but helium has condensed (hydrogen boils
 *   at about 20.3 K at 1 atm, from memory) and helium is far from ideal; above 3000 K oxygen and
 *   nitrogen dissociate and a constant cp is far off. The same range holds for the ambient
 *   temperature and a Sutherland reference temperature.
 * - reservoir pressure 100 Pa to 1e8 Pa (1000 bar) absolute: below 100 Pa the mean free path of
 *   air (about 70 um, from the 68 nm at 1 atm, from memory) is no longer small against small
 *   bores and the continuum friction laws lose their footing; above 1000 bar no gas is near
 *   ideal.
 * - ambient (barometric) pressure 10 kPa to 1 MPa: the atmosphere with room on both sides; a
 *   barometric pressure written in mbar, hPa or kPa but read as Pa falls outside.
 * - demand (and injection) at most 1e5 kg/s either way: a hundred times the flow of the largest
 *   gas trunk lines (about 1000 kg/s); beyond it a value is a unit slip.
 * - molar mass 1 g/mol to 1 kg/mol: the lightest gas is hydrogen (2.016 g/mol); a vapour of more
 *   than 1 kg/mol is no gas at pipe conditions.
 * - dynamic viscosity 1e-7 Pa s to 1e-3 Pa s: gases lie between about 1e-6 and 1e-4 Pa s; a
 *   value in uPa s or cP read as Pa s falls outside.
 * - Sutherland constant at most 1e4 K (those of common gases lie between about 70 K and 300 K,
 *   from memory).
 * - pipe inside diameter 0.1 mm to 10 m: below 0.1 mm a bore is a capillary of a few hundred
 *   mean free paths of air at 1 bar (about 70 nm), where slip begins to matter at low pressure
 *   and no pipe of a gas network is that small; above 10 m no gas duct is that wide. Common
 *   practice, no source.
 * - elevation -20 km to 20 km, and the heat-transfer coefficients (at most 1e5 W/(m2 K), about a
 *   condensing-steam film, and 1e6 W/(m K)): beyond them a value is a unit slip.
 */
export const INPUT_RANGES = Object.freeze({
  temperature: { low: 20, high: 3000, unit: "K", what: "the ideal-gas model's temperatures" },
  pressure: { low: 100, high: 1e8, unit: "Pa", what: "absolute pressures of the model" },
  ambientPressure: { low: 1e4, high: 1e6, unit: "Pa", what: "barometric pressures" },
  demand: { low: -1e5, high: 1e5, unit: "kg/s", what: "flows of gas networks" },
  molarMass: { low: 1e-3, high: 1, unit: "kg/mol", what: "molar masses of gases" },
  viscosity: { low: 1e-7, high: 1e-3, unit: "Pa s", what: "viscosities of gases" },
  sutherlandConstant: { low: 0, high: 1e4, unit: "K", what: "Sutherland constants" },
  pipeDiameter: { low: 1e-4, high: 10, unit: "m", what: "inside diameters of gas pipes" },
  elevation: { low: -2e4, high: 2e4, unit: "m", what: "elevations of gas networks" },
  heatTransferCoefficient: {
    low: 0,
    high: 1e5,
    unit: "W/(m2 K)",
    what: "overall heat-transfer coefficients of pipes",
  },
  heatTransferPerLength: {
    low: 0,
    high: 1e6,
    unit: "W/(m K)",
    what: "overall heat-transfer coefficients of pipes per unit length",
  },
} satisfies Record<string, InputRange>);

/**
 * The value if it lies in the range (inclusive), otherwise undefined and an issue at `path`
 * naming the value, the range and what it is of. An undefined value passes through.
 */
export function inRange(
  reader: ValueReader,
  value: number | undefined,
  input: QuantityInput | undefined,
  path: string,
  range: InputRange,
): number | undefined {
  if (value === undefined) return undefined;
  if (value >= range.low && value <= range.high) return value;
  reader.fail({
    code: "value",
    path,
    value: input ?? value,
    message: `${rangeNumber(value)} ${range.unit} is outside the range of ${range.what}: ${rangeNumber(range.low)} to ${rangeNumber(range.high)} ${range.unit} (got ${JSON.stringify(input)})`,
  });
  return undefined;
}

/**
 * A quantity read into SI (`reader.quantity`: units, JSON path) and then checked against its
 * range by {@link inRange}: undefined, with an issue at `path`, if it is unreadable or out of range.
 */
export function quantityInRange(
  reader: ValueReader,
  input: QuantityInput | undefined,
  kind: QuantityKind,
  path: string,
  range: InputRange,
): number | undefined {
  return inRange(reader, reader.quantity(input, kind, path), input, path, range);
}

/** A number for a range message: four digits, powers of ten as "1e8" when large or small. */
function rangeNumber(value: number): string {
  const rounded = Number(value.toPrecision(4));
  const size = Math.abs(rounded);
  if (size !== 0 && (size >= 1e4 || size < 1e-3)) {
    return rounded.toExponential().replace("e+", "e");
  }
  return String(rounded);
}
