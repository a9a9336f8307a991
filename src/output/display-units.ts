/**
 * Display units: SI results to the unit set a user reads tables in. unitmath does the conversions
 * (through input/unit-text.ts); gauge pressure (relative to an ambient the caller gives) is the
 * one rule written by hand, because no unit library knows the ambient.
 */

import { convertUnit } from "../input/unit-text.js";

/** `si`: SI base units; `metric`: bar(a), °C, mm, kg/h; `us`: psia, °F, in, lb/h. */
export type UnitSetName = "si" | "metric" | "us";

/** What a displayed value measures. `diameter` is a length shown in a smaller unit. */
export type DisplayKind =
  | "pressure"
  | "pressureDifference"
  | "temperature"
  | "length"
  | "diameter"
  | "massFlow"
  | "velocity"
  | "density"
  | "massFlux"
  | "viscosity"
  /** rho v^2, Pa */
  | "momentumFlux"
  /** W */
  | "heatFlow"
  | "dimensionless";

/** A unit to show values in: its label and the conversion from the SI value. */
export interface DisplayUnit {
  /** Label for a table header or after a number: "bar(a)", "°C", "lb/h". */
  label: string;
  /** The value in this unit, from the SI value (Pa absolute, K, m, kg/s, ...). */
  fromSI(value: number): number;
}

/** The unit sets, in the order to list them (command-line help, docs). */
export const UNIT_SET_NAMES: readonly UnitSetName[] = Object.freeze(["si", "metric", "us"]);

/** A label and the same unit in the unit-text grammar (null: dimensionless). */
interface UnitChoice {
  label: string;
  unit: string | null;
}

/** The SI unit of each kind, in the unit-text grammar. */
const SI_UNITS: Readonly<Record<DisplayKind, string | null>> = {
  pressure: "Pa",
  pressureDifference: "Pa",
  temperature: "K",
  length: "m",
  diameter: "m",
  massFlow: "kg/s",
  velocity: "m/s",
  density: "kg/m^3",
  massFlux: "kg/(m^2 s)",
  viscosity: "Pa s",
  momentumFlux: "Pa",
  heatFlow: "W",
  dimensionless: null,
};

// psi is written lbf/in^2, its exact definition.
const UNIT_SETS: Readonly<Record<UnitSetName, Readonly<Record<DisplayKind, UnitChoice>>>> = {
  si: {
    pressure: { label: "Pa", unit: "Pa" },
    pressureDifference: { label: "Pa", unit: "Pa" },
    temperature: { label: "K", unit: "K" },
    length: { label: "m", unit: "m" },
    diameter: { label: "m", unit: "m" },
    massFlow: { label: "kg/s", unit: "kg/s" },
    velocity: { label: "m/s", unit: "m/s" },
    density: { label: "kg/m3", unit: "kg/m^3" },
    massFlux: { label: "kg/(m2·s)", unit: "kg/(m^2 s)" },
    viscosity: { label: "Pa·s", unit: "Pa s" },
    momentumFlux: { label: "Pa", unit: "Pa" },
    heatFlow: { label: "W", unit: "W" },
    dimensionless: { label: "-", unit: null },
  },
  metric: {
    pressure: { label: "bar(a)", unit: "bar" },
    pressureDifference: { label: "bar", unit: "bar" },
    temperature: { label: "°C", unit: "degC" },
    length: { label: "m", unit: "m" },
    diameter: { label: "mm", unit: "mm" },
    massFlow: { label: "kg/h", unit: "kg/h" },
    velocity: { label: "m/s", unit: "m/s" },
    density: { label: "kg/m3", unit: "kg/m^3" },
    massFlux: { label: "kg/(m2·s)", unit: "kg/(m^2 s)" },
    viscosity: { label: "µPa·s", unit: "uPa s" },
    momentumFlux: { label: "Pa", unit: "Pa" },
    heatFlow: { label: "kW", unit: "kW" },
    dimensionless: { label: "-", unit: null },
  },
  us: {
    pressure: { label: "psia", unit: "lbf/in^2" },
    pressureDifference: { label: "psi", unit: "lbf/in^2" },
    temperature: { label: "°F", unit: "degF" },
    length: { label: "ft", unit: "ft" },
    diameter: { label: "in", unit: "in" },
    massFlow: { label: "lb/h", unit: "lb/h" },
    velocity: { label: "ft/s", unit: "ft/s" },
    density: { label: "lb/ft3", unit: "lb/ft^3" },
    massFlux: { label: "lb/(ft2·s)", unit: "lb/(ft^2 s)" },
    viscosity: { label: "cP", unit: "mPa s" },
    momentumFlux: { label: "lb/(ft·s2)", unit: "lb/(ft s^2)" },
    heatFlow: { label: "Btu/h", unit: "BTU/h" },
    dimensionless: { label: "-", unit: null },
  },
};

/** Gauge labels for {@link displayGaugePressure}. */
const GAUGE_LABELS: Readonly<Record<UnitSetName, string>> = {
  si: "Pa(g)",
  metric: "bar(g)",
  us: "psig",
};

/**
 * The unit a kind of value is shown in for a unit set.
 *
 * | kind | si | metric | us |
 * |---|---|---|---|
 * | pressure | Pa | bar(a) | psia |
 * | pressureDifference | Pa | bar | psi |
 * | temperature | K | °C | °F |
 * | length | m | m | ft |
 * | diameter | m | mm | in |
 * | massFlow | kg/s | kg/h | lb/h |
 * | velocity | m/s | m/s | ft/s |
 * | density | kg/m3 | kg/m3 | lb/ft3 |
 * | massFlux | kg/(m2·s) | kg/(m2·s) | lb/(ft2·s) |
 * | viscosity | Pa·s | µPa·s | cP |
 * | momentumFlux (rho v^2) | Pa | Pa | lb/(ft·s2) |
 * | heatFlow | W | kW | Btu/h |
 * | dimensionless | - | - | - |
 *
 * @param set - the unit set
 * @param kind - what the value measures
 * @returns the label and the conversion from SI
 * @remarks Conversions by unitmath from the unit definitions (1 in = 25.4 mm, 1 lb = 0.45359237 kg,
 *   1 lbf = 1 lb x 9.80665 m/s2, psi = lbf/in2, Btu the International Table Btu = 1055.05585262 J,
 *   1 cP = 1 mPa·s). Labels are also accepted by `parseQuantity`.
 * @throws RangeError for a set or kind that does not exist (callers without type checks)
 * @example displayUnit("metric", "diameter").fromSI(0.0779) // 77.9 (label "mm"; checked in
 *   test/output/display-units.test.ts)
 */
export function displayUnit(set: UnitSetName, kind: DisplayKind): DisplayUnit {
  const choices = UNIT_SETS[set];
  if (choices === undefined) {
    throw new RangeError(`unknown unit set "${set}"; unit sets: ${UNIT_SET_NAMES.join(", ")}`);
  }
  const choice = choices[kind];
  const si = SI_UNITS[kind];
  if (choice === undefined || si === undefined) {
    throw new RangeError(
      `unknown display kind "${kind}"; kinds: ${Object.keys(SI_UNITS).join(", ")}`,
    );
  }
  const target = choice.unit;
  if (target === null || si === null) return { label: choice.label, fromSI: (value) => value };
  const offset = convertUnit(0, si, target);
  if (offset !== 0) {
    // An offset scale (°C, °F): let unitmath convert each value.
    return { label: choice.label, fromSI: (value) => convertUnit(value, si, target) };
  }
  const factor = convertUnit(1, si, target);
  return { label: choice.label, fromSI: (value) => value * factor };
}

/**
 * A pressure shown as gauge pressure in a unit set: "bar(g)", "psig", "Pa(g)".
 *
 * p_gauge = p_abs - p_ambient, then converted like a pressure difference.
 *
 * @param set - the unit set
 * @param valueSI - absolute pressure [Pa]
 * @param ambientPressure - ambient (barometric) pressure [Pa] the gauge reads from
 * @returns the gauge value in the set's pressure unit and its label
 * @remarks Written by hand: no unit library knows the ambient. A pressure below ambient gives a
 *   negative gauge value.
 * @example displayGaugePressure("metric", 901325, 101325) // { value: 8, label: "bar(g)" }
 *   (checked in test/output/display-units.test.ts)
 */
export function displayGaugePressure(
  set: UnitSetName,
  valueSI: number,
  ambientPressure: number,
): { value: number; label: string } {
  const unit = displayUnit(set, "pressureDifference");
  return { value: unit.fromSI(valueSI - ambientPressure), label: GAUGE_LABELS[set] };
}
