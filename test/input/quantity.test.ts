import fc from "fast-check";
import { describe, expect, test } from "vitest";
import { MOLAR_GAS_CONSTANT } from "../../src/gas/gas.js";
import { parseQuantity, type QuantityKind } from "../../src/input/quantity.js";
import { REFERENCE_CONDITIONS, referenceDensity } from "../../src/input/reference-conditions.js";

// Unit definitions, written here from the defining documents (not from the code under test):
/** 1 in = 25.4 mm exactly: international yard and pound agreement, 1959 (1 yd = 0.9144 m). */
const INCH = 0.0254;
/** 1 ft = 12 in. */
const FOOT = 12 * INCH;
/** 1 lb = 0.45359237 kg exactly: international yard and pound agreement, 1959. */
const POUND = 0.45359237;
/** Standard acceleration of gravity 9.80665 m/s2 (3rd CGPM, 1901): 1 lbf = 1 lb x g_n. */
const STANDARD_GRAVITY = 9.80665;
/** 1 psi = 1 lbf/in2 = 6894.757293168 Pa, from the definitions above. */
const PSI = (POUND * STANDARD_GRAVITY) / INCH ** 2;
/** 1 bar = 1e5 Pa exactly by definition (BIPM SI Brochure, 8th ed., 2006, Table 8). */
const BAR = 1e5;
/** T [K] = t [degC] + 273.15 (definition of the Celsius scale). */
const celsius = (t: number) => t + 273.15;
/** T [K] = (t [degF] + 459.67) x 5/9 (definition: T [degR] = t [degF] + 459.67, 1 degR = 5/9 K). */
const fahrenheit = (t: number) => ((t + 459.67) * 5) / 9;
/** Molar gas constant, CODATA 2018 (Tiesinga et al., Rev. Mod. Phys. 93, 025010, 2021). */
const RU = 8.314462618;
/** Molar mass of dry air, ISO 2533:1975 standard atmosphere: 28.96442 kg/kmol. */
const AIR_MOLAR_MASS = 0.02896442;

/** Closed-form conversions: a product of a few exact decimal factors, so float rounding only. */
const CLOSED_FORM = 1e-12;

function siValue(input: unknown, kind: QuantityKind, context = {}): number {
  const result = parseQuantity(input, kind, context);
  if (!result.ok) throw new Error(`expected a value, got issue: ${result.issue.message}`);
  return result.value;
}

function issueOf(input: unknown, kind: QuantityKind, context = {}) {
  const result = parseQuantity(input, kind, context);
  if (result.ok) throw new Error(`expected an issue, got ${result.value}`);
  return result.issue;
}

function expectRelative(actual: number, expected: number, tolerance: number): void {
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(tolerance * Math.abs(expected));
}

describe("unit definitions used as checks", () => {
  test("1 psi from the lb, g_n and in definitions is 6894.757293168 Pa", () => {
    // Printed to 13 significant digits: half a unit in the last digit.
    expect(Math.abs(PSI - 6894.757293168)).toBeLessThanOrEqual(5e-10);
  });
});

describe("parseQuantity reads pressures", () => {
  test.each([
    ["8 bar(g)", 8 * BAR + 101325],
    ["7.2 barg", 7.2 * BAR + 101325],
    ["7.5 bar(g)", 7.5 * BAR + 101325],
    ["120 psi(g)", 120 * PSI + 101325],
    ["120 psig", 120 * PSI + 101325],
    ["101.325 kPa", 101325],
    ["1.01325 bar(a)", 101325],
    ["1.01325 bara", 101325],
    ["14.696 psia", 14.696 * PSI],
    ["14.696 psi(a)", 14.696 * PSI],
    ["0.7 MPa(g)", 0.7e6 + 101325],
    ["600 kPa(g)", 600e3 + 101325],
    ["1 atm", 101325],
    ["1013.25 mbar", 101325],
    ["1.2e5 Pa", 1.2e5],
    ["8bar(g)", 8 * BAR + 101325],
    ["8 bar (g)", 8 * BAR + 101325],
  ])("%s is %d Pa absolute at the default ambient 101325 Pa", (input, expected) => {
    expectRelative(siValue(input, "pressure"), expected, CLOSED_FORM);
  });

  test("a gauge pressure is relative to the ambient given", () => {
    // A site at about 540 m altitude: ambient 95 kPa.
    expectRelative(
      siValue("7.5 bar(g)", "pressure", { ambientPressure: 95000 }),
      7.5 * BAR + 95000,
      CLOSED_FORM,
    );
    expectRelative(
      siValue("120 psig", "pressure", { ambientPressure: 95000 }),
      120 * PSI + 95000,
      CLOSED_FORM,
    );
    // An absolute pressure does not move with the ambient.
    expect(siValue("1.01325 bar(a)", "pressure", { ambientPressure: 95000 })).toBe(101325);
  });

  test("a plain number is taken as Pa absolute", () => {
    expect(siValue(901325, "pressure")).toBe(901325);
    expect(siValue(901325, "pressure", { ambientPressure: 95000 })).toBe(901325);
  });

  test("bare bar and psi are read as absolute with a note at the value's path", () => {
    const bar = parseQuantity("7 bar", "pressure", { path: "/nodes/0/pressure" });
    expect(bar).toEqual({
      ok: true,
      value: 7 * BAR,
      notes: [
        {
          code: "bare-pressure-unit-absolute",
          path: "/nodes/0/pressure",
          message:
            '"7 bar" was read as an absolute pressure; write "7 bar(a)" if that is meant, or "7 bar(g)" for a gauge pressure',
        },
      ],
    });
    const psi = parseQuantity("100 psi", "pressure", { path: "/nodes/1/pressure" });
    expect(psi.ok && psi.value).toBeCloseTo(100 * PSI, 8);
    expect(psi.ok && psi.notes.map((note) => [note.code, note.path])).toEqual([
      ["bare-pressure-unit-absolute", "/nodes/1/pressure"],
    ]);
    expect(psi.ok && psi.notes[0]?.message).toContain('"100 psi(g)" for a gauge pressure');
  });

  test("units that say absolute or gauge, and kPa, MPa, atm, give no note", () => {
    for (const input of [
      "7 bar(a)",
      "7 bara",
      "7 bar(g)",
      "100 psia",
      "100 psig",
      "101.325 kPa",
      "0.5 MPa",
      "1 atm",
    ]) {
      const result = parseQuantity(input, "pressure");
      expect(result.ok && result.notes).toEqual([]);
    }
  });

  test("a pressure difference takes bare units and no ambient", () => {
    expect(siValue("0.1 bar", "pressureDifference")).toBeCloseTo(0.1 * BAR, 9);
    expectRelative(siValue("1.5 psi", "pressureDifference"), 1.5 * PSI, CLOSED_FORM);
    expect(siValue("-30 mbar", "pressureDifference")).toBeCloseTo(-3000, 9);
    expect(parseQuantity("0.1 bar", "pressureDifference")).toMatchObject({ notes: [] });
  });

  test("gauge and absolute readings differ by exactly the ambient (property, seed 4207)", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.01, max: 500, noNaN: true }),
        fc.double({ min: 50_000, max: 110_000, noNaN: true }),
        (barValue, ambientPressure) => {
          const gauge = siValue(`${barValue} bar(g)`, "pressure", { ambientPressure });
          const absolute = siValue(`${barValue} bar(a)`, "pressure", { ambientPressure });
          // Float rounding of one addition at up to 5e7 Pa: 1e-8 Pa is far above it.
          return Math.abs(gauge - absolute - ambientPressure) <= 1e-8;
        },
      ),
      { seed: 4207, numRuns: 200 },
    );
  });
});

describe("parseQuantity reads temperatures", () => {
  test.each([
    ["35 degC", celsius(35)],
    ["20 degC", celsius(20)],
    ["30 degC", celsius(30)],
    ["60 degC", celsius(60)],
    ["60 °C", celsius(60)],
    ["60 celsius", celsius(60)],
    ["95 degF", fahrenheit(95)],
    ["95 °F", fahrenheit(95)],
    ["300 K", 300],
    ["540 degR", (540 * 5) / 9],
  ])("%s is %d K", (input, expected) => {
    expectRelative(siValue(input, "temperature"), expected, CLOSED_FORM);
  });

  test("95 degF and 35 degC are the same temperature, 308.15 K", () => {
    // (95 + 459.67) x 5/9 = 308.15 exactly.
    expect(siValue("95 degF", "temperature")).toBeCloseTo(308.15, 10);
    expect(siValue("35 degC", "temperature")).toBeCloseTo(308.15, 10);
  });

  test("a temperature difference counts 1 degC as 1 K and 1 degF as 1 degR (5/9 K)", () => {
    expect(siValue("5 degC", "temperatureDifference")).toBeCloseTo(5, 12);
    expect(siValue("5 °C", "temperatureDifference")).toBeCloseTo(5, 12);
    expect(siValue("9 degF", "temperatureDifference")).toBeCloseTo(5, 12);
    expect(siValue("-9 °F", "temperatureDifference")).toBeCloseTo(-5, 12);
    expect(siValue("5 K", "temperatureDifference")).toBe(5);
  });
});

describe("parseQuantity reads lengths, flows and the other kinds", () => {
  test.each<[string, QuantityKind, number]>([
    ["3 in", "length", 3 * INCH],
    ["80 mm", "length", 0.08],
    ["0.045 mm", "length", 0.045e-3],
    ["2 ft", "length", 2 * FOOT],
    ["150 m", "length", 150],
    ["0.5 kg/s", "massFlow", 0.5],
    ["1800 kg/h", "massFlow", 0.5],
    ["-0.8 kg/s", "massFlow", -0.8],
    ["30 kg/min", "massFlow", 0.5],
    ["1.8 t/h", "massFlow", 0.5],
    ["1000 lb/h", "massFlow", (1000 * POUND) / 3600],
    ["2 lbm/s", "massFlow", 2 * POUND],
    ["50 kg/(m2 s)", "massFlux", 50],
    ["20 m/s", "velocity", 20],
    ["60 ft/s", "velocity", 60 * FOOT],
    // 1 P = 1 g/(cm s) = 0.1 Pa s (CGS definition), so 1 cP = 1 mPa s.
    ["0.0182 cP", "viscosity", 0.0182e-3],
    ["18.2 uPa s", "viscosity", 18.2e-6],
    ["18.2 µPa·s", "viscosity", 18.2e-6],
    ["28.96 g/mol", "molarMass", 0.02896],
    ["7.1 in2", "area", 7.1 * INCH ** 2],
    ["7.1 in²", "area", 7.1 * INCH ** 2],
    ["10 W/(m2 K)", "heatTransferCoefficient", 10],
    ["0.5", "dimensionless", 0.5],
  ])("%s as %s is %d in SI", (input, kind, expected) => {
    expectRelative(siValue(input, kind), expected, CLOSED_FORM);
  });

  test("a plain number is SI for every kind", () => {
    for (const kind of [
      "length",
      "massFlow",
      "velocity",
      "viscosity",
      "molarMass",
      "area",
      "dimensionless",
    ] as const) {
      expect(siValue(0.25, kind)).toBe(0.25);
    }
    expect(siValue(-0.8, "massFlow")).toBe(-0.8);
  });
});

describe("parseQuantity turns normal and standard volume flows into mass flow", () => {
  const air = { molarMass: AIR_MOLAR_MASS };

  test("1200 Nm3/h of air: ideal gas at DIN 1343 normal conditions (273.15 K, 101325 Pa)", () => {
    const volumeFlow = 1200 / 3600; // m3/s at the normal state
    const expected = (volumeFlow * 101325 * AIR_MOLAR_MASS) / (RU * 273.15);
    expectRelative(siValue("1200 Nm3/h", "massFlow", air), expected, CLOSED_FORM);
    expectRelative(siValue("20 Nm3/min", "massFlow", air), expected, CLOSED_FORM);
    expectRelative(siValue("20000 NL/min", "massFlow", air), expected, CLOSED_FORM);
    expectRelative(siValue("1200 Nm³/h", "massFlow", air), expected, CLOSED_FORM);
  });

  test("300 scfm of air: ideal gas at 60 degF and 14.696 psia (US common practice)", () => {
    const volumeFlow = (300 * FOOT ** 3) / 60; // m3/s at the reference state
    const pressure = 14.696 * PSI;
    const temperature = fahrenheit(60);
    const expected = (volumeFlow * pressure * AIR_MOLAR_MASS) / (RU * temperature);
    expectRelative(siValue("300 scfm", "massFlow", air), expected, CLOSED_FORM);
    expectRelative(siValue("18000 scfh", "massFlow", air), expected, CLOSED_FORM);
    // 300 scfm is 432 000 scf per day.
    expectRelative(siValue("0.432 MMscfd", "massFlow", air), expected, CLOSED_FORM);
  });

  test("one scf at 60 degF, 14.696 psia holds 1.19529 mol (PRACTICE.md §5, HB/CALC)", () => {
    const molesPerScf =
      (referenceDensity("usStandard", AIR_MOLAR_MASS) / AIR_MOLAR_MASS) * FOOT ** 3;
    // Printed to 6 significant digits: half a unit in the last digit.
    expect(Math.abs(molesPerScf - 1.19529)).toBeLessThanOrEqual(0.000005);
  });

  test("one Nm3 (0 degC) holds 1.05491 times the gas of one Sm3 (15 degC) (PRACTICE.md §5, CALC)", () => {
    const perNormal = siValue("3600 Nm3/h", "massFlow", air);
    const perStandard = siValue("3600 Sm3/h", "massFlow", air);
    // Printed to 6 significant digits: half a unit in the last digit.
    expect(Math.abs(perNormal / perStandard - 1.05491)).toBeLessThanOrEqual(0.000005);
  });

  test("air at the ISO 13443 standard state has the ISO 2533 sea-level density 1.2250 kg/m3", () => {
    // ISO 2533:1975 sea level (288.15 K, 101325 Pa): rho = 1.2250 kg/m3, printed to 4 decimals.
    expect(Math.abs(referenceDensity("standard", AIR_MOLAR_MASS) - 1.225)).toBeLessThanOrEqual(
      0.00005,
    );
    // @example of referenceDensity: 1.22498
    expect(referenceDensity("standard", 0.02896442)).toBeCloseTo(1.22498, 5);
  });

  test("the named reference states carry the temperature, pressure and standard", () => {
    expect(REFERENCE_CONDITIONS.normal).toMatchObject({
      temperature: 273.15,
      pressure: 101325,
      standard: "DIN 1343",
    });
    expect(REFERENCE_CONDITIONS.standard).toMatchObject({
      temperature: 288.15,
      pressure: 101325,
      standard: "ISO 13443",
    });
    expectRelative(REFERENCE_CONDITIONS.usStandard.temperature, fahrenheit(60), CLOSED_FORM);
    expectRelative(REFERENCE_CONDITIONS.usStandard.pressure, 14.696 * PSI, CLOSED_FORM);
    expect(REFERENCE_CONDITIONS.usStandard.temperature).toBeCloseTo(288.70556, 5);
    expect(MOLAR_GAS_CONSTANT).toBe(RU);
    expect(Object.isFrozen(REFERENCE_CONDITIONS.normal)).toBe(true);
  });

  test("a negative normal volume flow (an injection) gives a negative mass flow", () => {
    expect(siValue("-1200 Nm3/h", "massFlow", air)).toBeCloseTo(
      -siValue("1200 Nm3/h", "massFlow", air),
      14,
    );
  });

  test("referenceDensity refuses a molar mass that is not positive", () => {
    expect(() => referenceDensity("normal", 0)).toThrow(RangeError);
    expect(() => referenceDensity("normal", Number.NaN)).toThrow(
      "molarMass must be a positive number in kg/mol",
    );
  });
});

describe("parseQuantity reports what it cannot read", () => {
  const path = "/edges/3/diameter";

  test("an unknown unit names the unit and lists the kind's units", () => {
    expect(issueOf("7 bra", "pressure", { path })).toEqual({
      code: "unit",
      path,
      value: "7 bra",
      message:
        'unknown unit "bra" (got "7 bra"); pressure units: Pa, kPa, MPa, bar(a), bar(g), bara, barg, mbar, psia, psig, psi(a), psi(g), kPa(g), MPa(g), atm',
    });
    const length = issueOf("80 nn", "length", { path });
    expect(length.code).toBe("unit");
    expect(length.message).toMatch(/^unknown unit "nn" \(got "80 nn"\); length units: m, cm, mm/);
  });

  test("unit text whose powers cancel to nothing is an unknown unit, not a crash", () => {
    for (const input of ["5 m^0", "3 (m s)^0", "2 m^0.0000001"]) {
      const issue = issueOf(input, "length", { path });
      expect(issue.code, input).toBe("unit");
      expect(issue.message, input).toMatch(/^unknown unit/);
    }
  });

  test("a wrong dimension names the dimension found", () => {
    expect(issueOf("7 m", "pressure", { path })).toEqual({
      code: "unit",
      path,
      value: "7 m",
      message: 'must be a pressure such as "7 bar(g)" or "101.325 kPa" (got "7 m", a length)',
    });
    expect(issueOf("80 bar", "length", { path }).message).toBe(
      'must be a length such as "80 mm" or "3 in" (got "80 bar", a pressure)',
    );
    expect(issueOf("5 kg", "massFlow", { path }).message).toBe(
      'must be a mass flow such as "1800 kg/h" or "1200 Nm3/h" (got "5 kg", a mass)',
    );
    expect(issueOf("1200 Nm3/h", "length", { path }).message).toBe(
      'must be a length such as "80 mm" or "3 in" (got "1200 Nm3/h", a normal or standard volume flow)',
    );
    expect(issueOf("5 m", "dimensionless", { path }).message).toBe(
      'must be a plain number such as "0.5", without a unit (got "5 m")',
    );
  });

  test("a bare C or F for a temperature is a wrong dimension with a hint", () => {
    const issue = issueOf("35 C", "temperature", { path });
    expect([issue.code, issue.path]).toEqual(["unit", path]);
    expect(issue.message).toBe(
      'must be a temperature such as "20 degC" or "293.15 K" (got "35 C", an electric charge); write "35 degC"',
    );
  });

  test("a number without a unit is refused for a dimensional kind", () => {
    expect(issueOf("7", "pressure", { path })).toEqual({
      code: "unit",
      path,
      value: "7",
      message:
        'missing unit (got "7"); write a pressure with its unit, such as "7 bar(g)" or "101.325 kPa", or give a plain number in Pa',
    });
  });

  test("an absolute pressure at or below 0 is a value issue with the absolute value", () => {
    expect(issueOf("-2 bar(g)", "pressure", { path, ambientPressure: 101325 })).toEqual({
      code: "value",
      path,
      value: "-2 bar(g)",
      message:
        'absolute pressure must be greater than 0 Pa (got "-2 bar(g)", which is -98675 Pa absolute with ambient 101325 Pa)',
    });
    expect(issueOf("-1 bar(a)", "pressure", { path }).message).toBe(
      'absolute pressure must be greater than 0 Pa (got "-1 bar(a)", which is -100000 Pa)',
    );
    expect(issueOf("0 Pa", "pressure", { path }).code).toBe("value");
    expect(issueOf(0, "pressure", { path })).toEqual({
      code: "value",
      path,
      value: 0,
      message: "absolute pressure must be greater than 0 Pa (got 0)",
    });
  });

  test("a temperature at or below 0 K is a value issue", () => {
    expect(issueOf("-300 degC", "temperature", { path })).toEqual({
      code: "value",
      path,
      value: "-300 degC",
      message: 'temperature must be above absolute zero, 0 K (got "-300 degC", which is -26.85 K)',
    });
    expect(issueOf("-500 degF", "temperature", { path }).code).toBe("value");
    expect(issueOf(0, "temperature", { path }).message).toBe(
      "temperature must be above absolute zero, 0 K (got 0)",
    );
  });

  test.each<[unknown, string]>([
    [Number.NaN, "NaN"],
    [Number.POSITIVE_INFINITY, "Infinity"],
    [Number.NEGATIVE_INFINITY, "-Infinity"],
    [true, "true"],
    [null, "null"],
    [undefined, "nothing"],
    [{ value: 8, unit: "bar" }, '{"value":8,"unit":"bar"}'],
    [[8, "bar"], '[8,"bar"]'],
    ["eight bar", '"eight bar"'],
    ["", '""'],
    ["1e999 Pa", '"1e999 Pa"'],
  ])("%s is not a quantity", (input, shown) => {
    const issue = issueOf(input, "pressure", { path });
    expect([issue.code, issue.path]).toEqual(["unit", path]);
    expect(issue.message).toBe(
      `must be a pressure such as "7 bar(g)" or "101.325 kPa": a number in Pa or a string "<number> <unit>" (got ${shown})`,
    );
  });

  test("a normal volume flow without a known gas asks for the gas", () => {
    expect(issueOf("1200 Nm3/h", "massFlow", { path: "/nodes/4/demand" })).toEqual({
      code: "unit",
      path: "/nodes/4/demand",
      value: "1200 Nm3/h",
      message:
        'a normal or standard volume flow needs the gas to be known (its molar mass) to become a mass flow, and no gas is known here (got "1200 Nm3/h"); define the gas or give a mass flow such as "0.5 kg/s"',
    });
    expect(issueOf("300 scfm", "massFlow").code).toBe("unit");
  });

  test("an actual volume flow for a mass flow explains that it needs the local density", () => {
    for (const input of ["500 m3/h", "500 m^3/h", "300 cfm", "500 Am3/h"]) {
      const issue = issueOf(input, "massFlow", {
        path: "/nodes/4/demand",
        molarMass: AIR_MOLAR_MASS,
      });
      expect([issue.code, issue.path]).toEqual(["unit", "/nodes/4/demand"]);
      expect(issue.message).toBe(
        `${JSON.stringify(input)} is a volume flow at line conditions, which needs the local density to become a mass flow; give a normal or standard volume flow such as "1200 Nm3/h" or "300 scfm", or a mass flow such as "0.5 kg/s"`,
      );
    }
  });

  test("a pressure difference with (g) or (a) is refused", () => {
    expect(issueOf("0.1 bar(g)", "pressureDifference", { path })).toEqual({
      code: "unit",
      path,
      value: "0.1 bar(g)",
      message:
        'a pressure difference is neither gauge nor absolute: write it without (a) or (g), such as "0.1 bar" or "1.5 psi" (got "0.1 bar(g)")',
    });
  });

  test("the path defaults to the empty pointer", () => {
    expect(issueOf("7 m", "pressure").path).toBe("");
  });

  test("a caller's invalid ambient pressure or molar mass throws RangeError", () => {
    expect(() => parseQuantity("8 bar(g)", "pressure", { ambientPressure: -1 })).toThrow(
      RangeError,
    );
    expect(() => parseQuantity("1 Nm3/h", "massFlow", { molarMass: 0 })).toThrow(
      "molarMass must be a positive number in kg/mol (got 0)",
    );
  });
});

describe("parseQuantity's documented example", () => {
  test('parseQuantity("8 bar(g)", "pressure") is 901325 Pa with no notes', () => {
    expect(parseQuantity("8 bar(g)", "pressure")).toEqual({ ok: true, value: 901325, notes: [] });
  });

  test("a frozen context is accepted and the same input gives the same output", () => {
    const context = Object.freeze({ molarMass: AIR_MOLAR_MASS, path: "/x" });
    expect(parseQuantity("1200 Nm3/h", "massFlow", context).ok).toBe(true);
    expect(parseQuantity("1200 Nm3/h", "massFlow", { molarMass: AIR_MOLAR_MASS })).toEqual(
      parseQuantity("1200 Nm3/h", "massFlow", { molarMass: AIR_MOLAR_MASS }),
    );
  });
});
