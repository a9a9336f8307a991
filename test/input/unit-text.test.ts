import { describe, expect, test } from "vitest";
import {
  convertUnit,
  knownUnit,
  readUnitText,
  sameDimension,
  siBaseUnits,
} from "../../src/input/unit-text.js";

/** The terms of a reading as "name^power" strings, for compact expectations. */
function terms(text: string): string[] {
  const reading = readUnitText(text);
  if (!reading.ok) throw new Error(`"${text}" not read: ${reading.problem}`);
  return reading.terms.map((term) => `${term.name}^${term.power}`);
}

function known(text: string) {
  const result = knownUnit(text);
  if (!result.ok) throw new Error(`"${text}" unknown`);
  return result.unit;
}

describe("the unit-text grammar (docs/units.md)", () => {
  test("a space or * multiplies; ^ raises to a signed decimal power", () => {
    expect(terms("Pa s")).toEqual(["Pa^1", "s^1"]);
    expect(terms("kg*m")).toEqual(["kg^1", "m^1"]);
    expect(terms("m^2 s^-1")).toEqual(["m^2", "s^-1"]);
    expect(terms("m^0.5")).toEqual(["m^0.5"]);
  });

  test("a / divides by the next factor only", () => {
    expect(terms("kg/m^2 s")).toEqual(["kg^1", "m^-2", "s^1"]);
    expect(terms("m/s/s")).toEqual(["m^1", "s^-1", "s^-1"]);
  });

  test("parentheses group a product, which may be raised to a power", () => {
    expect(terms("kg/(m^2 s)")).toEqual(["kg^1", "m^-2", "s^-1"]);
    expect(terms("BTU/(h ft^2 degF)")).toEqual(["BTU^1", "h^-1", "ft^-2", "degF^-1"]);
    expect(terms("(m s)^2")).toEqual(["m^2", "s^2"]);
    expect(terms("W/(m (K/s))")).toEqual(["W^1", "m^-1", "K^-1", "s^1"]);
  });

  test("a number where a unit name belongs is told apart from other faults", () => {
    expect(readUnitText("2 m")).toEqual({ ok: false, problem: "number" });
    for (const text of ["", "kg//m", "(m", "m)", "m^", "m ^ x", "kg/", "m$"]) {
      expect(readUnitText(text), text).toEqual({ ok: false, problem: "syntax" });
    }
  });

  test("a name unitmath does not know is unknown, a number inside is a number", () => {
    expect(knownUnit("furlongs_per_ell")).toEqual({ ok: false, problem: "unknown" });
    expect(knownUnit("2 m")).toEqual({ ok: false, problem: "number" });
  });
});

describe("dimensions and conversions", () => {
  test("dimensions compare by SI base quantities, not by spelling", () => {
    expect(sameDimension(known("kg/(m^2 s)"), known("kg m^-2 s^-1"))).toBe(true);
    expect(sameDimension(known("N/m^2"), known("Pa"))).toBe(true);
    expect(sameDimension(known("m^3/h"), known("kg/s"))).toBe(false);
    expect(siBaseUnits(known("kPa"))).toBe("kg / m s^2");
  });

  // Exact by definition (NIST SP 811, 2008, appendix B.8, and the 1959 international yard and
  // pound agreement): 1 in = 0.0254 m, 1 lb = 0.45359237 kg, 1 lbf = 1 lb x 9.80665 m/s2, so
  // 1 lbf/in2 = 0.45359237 x 9.80665 / 0.0254^2 Pa; 1 BTU (International Table) = 1055.05585262 J.
  test("US units convert by their exact definitions (NIST SP 811)", () => {
    const psi = (0.45359237 * 9.80665) / 0.0254 ** 2;
    expect(convertUnit(100, "lbf/in^2", "Pa")).toBeCloseTo(100 * psi, 9);
    expect(convertUnit(1, "BTU", "J")).toBeCloseTo(1055.05585262, 9);
    expect(convertUnit(1, "lb/(ft s)", "Pa s")).toBeCloseTo(0.45359237 / 0.3048, 12);
    // 1 BTU/(h ft2 degF) = 1055.05585262 J / (3600 s x 0.3048^2 m2 x 5/9 K) = 5.678263 W/(m2 K).
    expect(convertUnit(1, "BTU/(h ft^2 degF)", "W/(m^2 K)")).toBeCloseTo(
      1055.05585262 / (3600 * 0.3048 ** 2 * (5 / 9)),
      10,
    );
  });

  test("a lone temperature unit counts from its own zero (ITS-90 scale definitions)", () => {
    expect(convertUnit(20, "degC", "K")).toBeCloseTo(293.15, 12);
    expect(convertUnit(68, "degF", "K")).toBeCloseTo(293.15, 12);
    expect(convertUnit(300, "K", "degC")).toBeCloseTo(26.85, 12);
    // Inside a compound unit a degree is a difference: 1 W/(m2 degC) = 1 W/(m2 K).
    expect(convertUnit(1, "W/(m^2 degC)", "W/(m^2 K)")).toBeCloseTo(1, 14);
  });

  test("a conversion between different dimensions is a caller's error", () => {
    expect(() => convertUnit(1, "m", "s")).toThrow();
    expect(() => convertUnit(1, "furlongs_per_ell", "m")).toThrow(/unknown unit/);
  });
});

describe("unit text that reduces to no unit", () => {
  test("a zero power or one in exponent notation is an unknown unit, not a crash", () => {
    for (const text of ["m^0", "m^-0", "(m s)^0", "m^0.0000001"]) {
      expect(knownUnit(text), text).toEqual({ ok: false, problem: "unknown" });
    }
  });
});
