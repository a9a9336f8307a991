import { describe, expect, test } from "vitest";
import { parseQuantity, type QuantityKind } from "../../src/input/quantity.js";
import {
  type DisplayKind,
  displayGaugePressure,
  displayUnit,
  UNIT_SET_NAMES,
  type UnitSetName,
} from "../../src/output/display-units.js";

// Unit definitions, written here from the defining documents (not from the code under test):
/** 1 in = 25.4 mm exactly: international yard and pound agreement, 1959. */
const INCH = 0.0254;
const FOOT = 12 * INCH;
/** 1 lb = 0.45359237 kg exactly: international yard and pound agreement, 1959. */
const POUND = 0.45359237;
/** 1 lbf = 1 lb x 9.80665 m/s2 (standard gravity, 3rd CGPM 1901); 1 psi = 1 lbf/in2. */
const PSI = (POUND * 9.80665) / INCH ** 2;
/** 1 bar = 1e5 Pa exactly (BIPM SI Brochure, 8th ed., 2006, Table 8). */
const BAR = 1e5;
/**
 * International Table Btu: 1 Btu = 1 lb x 1 degF x 1 cal_IT/(g K), cal_IT = 4.1868 J
 * (5th International Conference on the Properties of Steam, London 1956) = 1055.05585262 J.
 */
const BTU = POUND * 1000 * (5 / 9) * 4.1868;

/** Closed-form conversions: a product of a few exact decimal factors, so float rounding only. */
const CLOSED_FORM = 1e-12;

function expectRelative(actual: number, expected: number, tolerance: number): void {
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(tolerance * Math.abs(expected));
}

const DISPLAY_KINDS: readonly DisplayKind[] = [
  "pressure",
  "pressureDifference",
  "temperature",
  "length",
  "diameter",
  "massFlow",
  "velocity",
  "density",
  "massFlux",
  "viscosity",
  "momentumFlux",
  "heatFlow",
  "dimensionless",
];

/**
 * For each set and kind: an SI value, its label and the value in that unit worked out by hand
 * from the definitions above (degC: t = T - 273.15; degF: t = T x 9/5 - 459.67).
 */
const EXPECTED: Record<UnitSetName, Record<DisplayKind, [number, string, number]>> = {
  si: {
    pressure: [901325, "Pa", 901325],
    pressureDifference: [2500, "Pa", 2500],
    temperature: [308.15, "K", 308.15],
    length: [150, "m", 150],
    diameter: [0.0762, "m", 0.0762],
    massFlow: [0.5, "kg/s", 0.5],
    velocity: [18.288, "m/s", 18.288],
    density: [1.225, "kg/m3", 1.225],
    massFlux: [50, "kg/(m2·s)", 50],
    viscosity: [1.82e-5, "Pa·s", 1.82e-5],
    momentumFlux: [200000, "Pa", 200000],
    heatFlow: [1500, "W", 1500],
    dimensionless: [0.35, "-", 0.35],
  },
  metric: {
    pressure: [901325, "bar(a)", 9.01325],
    pressureDifference: [2500, "bar", 0.025],
    temperature: [308.15, "°C", 35],
    length: [150, "m", 150],
    diameter: [0.08, "mm", 80],
    massFlow: [0.5, "kg/h", 1800],
    velocity: [18.288, "m/s", 18.288],
    density: [1.225, "kg/m3", 1.225],
    massFlux: [50, "kg/(m2·s)", 50],
    viscosity: [1.82e-5, "µPa·s", 18.2],
    momentumFlux: [200000, "Pa", 200000],
    heatFlow: [1500, "kW", 1.5],
    dimensionless: [0.35, "-", 0.35],
  },
  us: {
    pressure: [120 * PSI, "psia", 120],
    pressureDifference: [2500, "psi", 2500 / PSI],
    temperature: [308.15, "°F", 95],
    length: [150 * FOOT, "ft", 150],
    diameter: [0.0762, "in", 3],
    massFlow: [(1000 * POUND) / 3600, "lb/h", 1000],
    velocity: [18.288, "ft/s", 60],
    density: [1.225, "lb/ft3", (1.225 * FOOT ** 3) / POUND],
    massFlux: [50, "lb/(ft2·s)", (50 * FOOT ** 2) / POUND],
    // 1 cP = 1 mPa s (1 P = 0.1 Pa s, CGS definition).
    viscosity: [1.82e-5, "cP", 0.0182],
    // 1 Pa = 1 kg/(m s2) = (1/lb) lb / ((1/ft) ft s2).
    momentumFlux: [200000, "lb/(ft·s2)", (200000 * FOOT) / POUND],
    heatFlow: [1500, "Btu/h", (1500 * 3600) / BTU],
    dimensionless: [0.35, "-", 0.35],
  },
};

/** The parseQuantity kind that reads each display label back, where one exists. */
const PARSE_KIND: Partial<Record<DisplayKind, QuantityKind>> = {
  pressure: "pressure",
  pressureDifference: "pressureDifference",
  temperature: "temperature",
  length: "length",
  diameter: "length",
  massFlow: "massFlow",
  velocity: "velocity",
  massFlux: "massFlux",
  viscosity: "viscosity",
  momentumFlux: "pressureDifference",
};

describe("displayUnit", () => {
  test("the unit sets are si, metric and us", () => {
    expect(UNIT_SET_NAMES).toEqual(["si", "metric", "us"]);
  });

  for (const set of UNIT_SET_NAMES) {
    test.each(DISPLAY_KINDS.map((kind) => [kind]))(
      `${set} %s: label and value from the unit definitions`,
      (kind) => {
        const [valueSI, label, expected] = EXPECTED[set][kind];
        const unit = displayUnit(set, kind);
        expect(unit.label).toBe(label);
        expectRelative(unit.fromSI(valueSI), expected, CLOSED_FORM);
      },
    );

    test.each(Object.entries(PARSE_KIND))(
      `${set} %s: a displayed value reads back through parseQuantity`,
      (kind, parseKind) => {
        const unit = displayUnit(set, kind as DisplayKind);
        for (const valueSI of [EXPECTED[set][kind as DisplayKind][0], 3.7e5, 0.0123, 291.4]) {
          const result = parseQuantity(
            `${unit.fromSI(valueSI)} ${unit.label}`,
            parseKind as QuantityKind,
          );
          expect(result.ok && result.notes).toEqual([]);
          // Two float conversions, to the unit and back: 1e-12 relative. An offset scale (°C, °F)
          // adds and removes up to 459.67, so there the rounding scales with |T| + 459.67.
          const scale = kind === "temperature" ? Math.abs(valueSI) + 459.67 : Math.abs(valueSI);
          const error = result.ok ? Math.abs(result.value - valueSI) : Number.NaN;
          expect(error).toBeLessThanOrEqual(CLOSED_FORM * scale);
        }
      },
    );
  }

  test("the documented example: 0.0779 m is 77.9 mm", () => {
    const unit = displayUnit("metric", "diameter");
    expect(unit.label).toBe("mm");
    expect(unit.fromSI(0.0779)).toBeCloseTo(77.9, 12);
  });

  test("offset scales convert each value: 0 K is -273.15 °C and -459.67 °F", () => {
    expect(displayUnit("metric", "temperature").fromSI(0)).toBeCloseTo(-273.15, 10);
    expect(displayUnit("us", "temperature").fromSI(0)).toBeCloseTo(-459.67, 10);
    expect(displayUnit("us", "temperature").fromSI(273.15)).toBeCloseTo(32, 10);
  });

  test("an unknown unit set or kind throws RangeError naming the choices", () => {
    expect(() => displayUnit("imperial" as UnitSetName, "pressure")).toThrow(
      'unknown unit set "imperial"; unit sets: si, metric, us',
    );
    expect(() => displayUnit("si", "power" as DisplayKind)).toThrow(RangeError);
  });
});

describe("displayGaugePressure", () => {
  test("the documented example: 901325 Pa at ambient 101325 Pa is 8 bar(g)", () => {
    const gauge = displayGaugePressure("metric", 901325, 101325);
    expect(gauge.label).toBe("bar(g)");
    expect(gauge.value).toBeCloseTo(8, 12);
  });

  test.each<[UnitSetName, number, number, string, number]>([
    ["si", 901325, 101325, "Pa(g)", 800000],
    ["metric", 8.5 * BAR + 95000, 95000, "bar(g)", 8.5],
    ["us", 120 * PSI + 101325, 101325, "psig", 120],
    ["metric", 90000, 101325, "bar(g)", -0.11325],
  ])("%s: %d Pa absolute at ambient %d Pa is %s %d", (set, valueSI, ambient, label, expected) => {
    const gauge = displayGaugePressure(set, valueSI, ambient);
    expect(gauge.label).toBe(label);
    // One subtraction of numbers near 1e6 Pa, then a factor: 1e-10 relative of the result.
    expectRelative(gauge.value, expected, 1e-10);
  });

  test.each(UNIT_SET_NAMES.map((set) => [set]))(
    "%s: a gauge display reads back through parseQuantity",
    (set) => {
      const ambientPressure = 97500;
      for (const valueSI of [901325, 250000, 97500, 60000]) {
        const gauge = displayGaugePressure(set, valueSI, ambientPressure);
        const result = parseQuantity(`${gauge.value} ${gauge.label}`, "pressure", {
          ambientPressure,
        });
        // Subtracting then adding back the ambient loses up to ~1e-10 Pa near 1e6 Pa.
        expect(result.ok && Math.abs(result.value - valueSI)).toBeLessThanOrEqual(1e-9);
      }
    },
  );
});
