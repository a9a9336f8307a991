import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  fannoDensityRatio,
  fannoParameter,
  fannoPressureRatio,
  fannoStagnationPressureRatio,
  fannoTemperatureRatio,
  frictionKernelSeries,
  machFromFannoParameter,
  maxSupersonicFannoParameter,
} from "../../src/physics/fanno.js";
import {
  expectAtPrintedPrecision,
  highPrecision,
  powerTolerance,
  relativeError,
} from "./high-precision.js";

// Closed forms written from the published equations (Shapiro 1953, Vol. I, ch. 6; Anderson,
// Modern Compressible Flow, 3rd ed., 2003, ch. 3), with the Darcy factor: fD L*/D = 4 Cf L*/D.
const FANNO_PARAMETER =
  "(1 - M^2) / (g * M^2) + (g + 1) / (2 * g) * log((g + 1) * M^2 / (2 + (g - 1) * M^2))";
const TEMPERATURE = "(g + 1) / (2 + (g - 1) * M^2)";
const PRESSURE = "(1 / M) * sqrt((g + 1) / (2 + (g - 1) * M^2))";
const DENSITY = "(1 / M) * sqrt((2 + (g - 1) * M^2) / (g + 1))";
const STAGNATION_PRESSURE = "(1 / M) * ((2 + (g - 1) * M^2) / (g + 1)) ^ ((g + 1) / (2 * (g - 1)))";

const EPSILON = Number.EPSILON;
const SEED = 20240611;
const logUniform = (minExponent: number, maxExponent: number) =>
  fc.double({ min: minExponent, max: maxExponent, noNaN: true }).map((e) => 10 ** e);

/** d ln(fD L* / D) / d ln M, from dF/dM = 4 (M^2 - 1) / (gamma M^3 (2 + (gamma - 1) M^2)). */
function fannoLogSlope(mach: number, gamma: number): number {
  const m2 = mach * mach;
  const slope = (4 * (m2 - 1)) / (gamma * m2 * (2 + (gamma - 1) * m2));
  return slope / highPrecision(FANNO_PARAMETER, { M: mach, g: gamma });
}

describe("Fanno flow against PRACTICE.md 7.1 (gamma = 1.4, subsonic)", () => {
  // PRACTICE.md 7.1: Farokhi, Aircraft Propulsion, 2nd ed., Wiley 2014, App. E for M 0.10-0.16
  // (= CALC), CALC rows elsewhere. fD L*/D there is the Darcy form (= 4 Cf L*/D). Each value is
  // checked at its printed precision (half a unit in the last digit).
  const rows: [number, string, string, string, string][] = [
    [0.1, "66.922", "1.1976", "10.944", "5.8218"],
    [0.12, "45.408", "1.1966", "9.1156", "4.8643"],
    [0.14, "32.511", "1.1953", "7.8093", "4.1824"],
    [0.16, "24.198", "1.1939", "6.8291", "3.6727"],
    [0.2, "14.533", "1.1905", "5.4554", "2.9635"],
    [0.3, "5.2993", "1.1788", "3.6191", "2.0351"],
    [0.4, "2.3085", "1.1628", "2.6958", "1.5901"],
    [0.5, "1.0691", "1.1429", "2.1381", "1.3398"],
    [0.6, "0.49082", "1.1194", "1.7634", "1.1882"],
    [0.7, "0.20814", "1.0929", "1.4935", "1.0944"],
    [0.8, "0.07229", "1.0638", "1.2893", "1.0382"],
    [0.9, "0.014512", "1.0327", "1.1291", "1.0089"],
  ];
  for (const [mach, parameter, temperature, pressure, stagnation] of rows) {
    it(`matches the table at M = ${mach}`, () => {
      expectAtPrintedPrecision(fannoParameter(mach, 1.4), parameter);
      expectAtPrintedPrecision(fannoTemperatureRatio(mach, 1.4), temperature);
      expectAtPrintedPrecision(fannoPressureRatio(mach, 1.4), pressure);
      expectAtPrintedPrecision(fannoStagnationPressureRatio(mach, 1.4), stagnation);
    });
  }
});

describe("Fanno flow on the supersonic branch (gamma = 1.4, from memory + closed form)", () => {
  // Values recalled from memory of standard Fanno tables (gamma = 1.4, 4 Cf L*/D = fD L*/D), so
  // each is first confirmed against the 40-digit closed form at its printed precision. Three
  // recalled values failed and were left out: T/T* = 0.86957 and p/p* = 0.62167 at M = 1.5
  // (closed form 0.82759 and 0.60648) and fD L*/D = 0.43197 at M = 2.5 (closed form 0.43198).
  const rows: { mach: number; f?: string; t?: string; p?: string; p0?: string }[] = [
    { mach: 1.2, f: "0.03364", t: "0.93168", p: "0.80436", p0: "1.0304" },
    { mach: 1.5, f: "0.13605", p0: "1.1762" },
    { mach: 2, f: "0.30500", t: "0.66667", p: "0.40825", p0: "1.6875" },
    { mach: 2.5, t: "0.53333", p: "0.29212", p0: "2.6367" },
    { mach: 3, f: "0.52216", t: "0.42857", p: "0.21822", p0: "4.2346" },
  ];
  const columns = [
    ["f", FANNO_PARAMETER, fannoParameter],
    ["t", TEMPERATURE, fannoTemperatureRatio],
    ["p", PRESSURE, fannoPressureRatio],
    ["p0", STAGNATION_PRESSURE, fannoStagnationPressureRatio],
  ] as const;
  for (const row of rows) {
    for (const [key, expression, relation] of columns) {
      const printed = row[key];
      if (printed === undefined) continue;
      it(`${relation.name} at M = ${row.mach} matches the recalled ${printed}, confirmed by the closed form`, () => {
        expectAtPrintedPrecision(highPrecision(expression, { M: row.mach, g: 1.4 }), printed);
        expectAtPrintedPrecision(relation(row.mach, 1.4), printed);
      });
    }
  }
});

describe("Fanno closed forms against a 40-digit evaluation", () => {
  const machs = [
    1e-6,
    1e-3,
    0.1,
    0.5,
    0.9,
    0.99,
    0.9999,
    1 - 1e-8,
    1 + 1e-8,
    1.0001,
    1.01,
    1.5,
    3,
    10,
    1e3,
    1e6,
  ];
  it("fannoParameter agrees to 1e-14 relative, also next to Mach 1 where it is of order (M - 1)^2", () => {
    for (const gamma of [1.1, 1.3, 1.4, 1.67]) {
      for (const mach of machs) {
        const reference = highPrecision(FANNO_PARAMETER, { M: mach, g: gamma });
        // 1e-14: the series branch and the log branch each carry a few roundings; the log branch
        // loses up to a factor 20 to cancellation at its edge |z| = 0.05.
        expect(relativeError(fannoParameter(mach, gamma), reference)).toBeLessThan(1e-14);
      }
    }
  });

  it("the ratios agree to 1e-14 (1 + |ln ratio|) relative", () => {
    for (const gamma of [1.1, 1.3, 1.4, 1.67]) {
      for (const mach of machs) {
        const scope = { M: mach, g: gamma };
        for (const [expression, relation] of [
          [TEMPERATURE, fannoTemperatureRatio],
          [PRESSURE, fannoPressureRatio],
          [DENSITY, fannoDensityRatio],
          [STAGNATION_PRESSURE, fannoStagnationPressureRatio],
        ] as const) {
          const reference = highPrecision(expression, scope);
          expect(relativeError(relation(mach, gamma), reference)).toBeLessThan(
            powerTolerance(reference),
          );
        }
      }
    }
  });

  it("maxSupersonicFannoParameter is the M -> infinity limit (gamma + 1)/(2 gamma) ln((gamma + 1)/(gamma - 1)) - 1/gamma", () => {
    for (const gamma of [1.1, 1.3, 1.4, 1.67]) {
      const reference = highPrecision("(g + 1) / (2 * g) * log((g + 1) / (g - 1)) - 1 / g", {
        g: gamma,
      });
      expect(relativeError(maxSupersonicFannoParameter(gamma), reference)).toBeLessThan(1e-15);
      expect(fannoParameter(Number.POSITIVE_INFINITY, gamma)).toBe(
        maxSupersonicFannoParameter(gamma),
      );
    }
  });

  it("frictionKernelSeries sums atanh(z) - z/(1 + z) to 1e-15 relative for |z| <= 0.05", () => {
    for (const z of [-0.05, -0.02, -1e-3, -1e-8, 1e-8, 1e-3, 0.02, 0.05]) {
      const reference = highPrecision("log((1 + z) / (1 - z)) / 2 - z / (1 + z)", { z });
      expect(relativeError(frictionKernelSeries(z), reference)).toBeLessThan(1e-15);
    }
  });
});

describe("Fanno properties", () => {
  it("fannoParameter is zero at Mach 1", () => {
    expect(fannoParameter(1, 1.4)).toBe(0);
    expect(fannoParameter(1, 1.1)).toBe(0);
  });

  it("fannoParameter is Infinity at Mach 0 and falls along the subsonic branch", () => {
    expect(fannoParameter(0, 1.4)).toBe(Number.POSITIVE_INFINITY);
    fc.assert(
      fc.property(logUniform(-6, 0), logUniform(-6, 0), (a, b) => {
        fc.pre(a < b);
        expect(fannoParameter(a, 1.4)).toBeGreaterThanOrEqual(fannoParameter(b, 1.4));
      }),
      { seed: SEED, numRuns: 1000 },
    );
  });

  it("fannoParameter rises along the supersonic branch towards its limit", () => {
    fc.assert(
      fc.property(logUniform(0, 4), logUniform(0, 4), (a, b) => {
        fc.pre(a < b);
        expect(fannoParameter(a, 1.4)).toBeLessThanOrEqual(fannoParameter(b, 1.4));
        expect(fannoParameter(b, 1.4)).toBeLessThan(maxSupersonicFannoParameter(1.4));
      }),
      { seed: SEED, numRuns: 1000 },
    );
  });

  it("the density ratio is the velocity ratio V*/V and p/p* = (rho/rho*)(T/T*)", () => {
    for (const mach of [0.2, 0.7, 1.3, 2.5]) {
      const rho = fannoDensityRatio(mach, 1.4);
      expect(
        relativeError(fannoPressureRatio(mach, 1.4), rho * fannoTemperatureRatio(mach, 1.4)),
      ).toBeLessThan(1e-15);
    }
  });
});

describe("machFromFannoParameter", () => {
  it("inverts fannoParameter on both branches, M = 1e-6 to 1e3", () => {
    // Mach -> parameter -> Mach: the parameter carries a few roundings (16 epsilon), which the
    // inverse may amplify by the condition number 1/|d ln F / d ln M| and no more; floor 1e-12.
    fc.assert(
      fc.property(logUniform(-6, 3), fc.constantFrom(1.1, 1.3, 1.4, 1.67), (mach, gamma) => {
        fc.pre(mach !== 1);
        const parameter = fannoParameter(mach, gamma);
        const branch = mach < 1 ? "subsonic" : "supersonic";
        const back = machFromFannoParameter(parameter, gamma, branch);
        const tolerance = Math.max(1e-12, (16 * EPSILON) / Math.abs(fannoLogSlope(mach, gamma)));
        expect(relativeError(back, mach)).toBeLessThanOrEqual(tolerance);
      }),
      { seed: SEED, numRuns: 1000 },
    );
  });

  it("returns a Mach number whose parameter is the input, from 1e-12 to 1e8 (subsonic) and to the limit (supersonic)", () => {
    // Parameter -> Mach -> parameter: recomputing F from the double M costs |d ln F / d ln M|
    // times M's rounding; tolerance 1e-12 times that slope (at least 1e-12).
    for (const gamma of [1.1, 1.4, 1.67]) {
      const limit = maxSupersonicFannoParameter(gamma);
      const subsonic = [1e-12, 1e-8, 1e-4, 0.01, 0.5, 1, 10, 1e3, 1e6, 1e8];
      const supersonic = [1e-12, 1e-8, 1e-4, 0.01, 0.2, 0.5, 0.9 * limit, (1 - 1e-6) * limit];
      for (const [branch, parameters] of [
        ["subsonic", subsonic],
        ["supersonic", supersonic],
      ] as const) {
        for (const parameter of parameters) {
          const mach = machFromFannoParameter(parameter, gamma, branch);
          expect(branch === "subsonic" ? mach < 1 : mach > 1).toBe(true);
          const tolerance = 1e-12 * Math.max(1, Math.abs(fannoLogSlope(mach, gamma)));
          expect(relativeError(fannoParameter(mach, gamma), parameter)).toBeLessThanOrEqual(
            tolerance,
          );
        }
      }
    }
  });

  it("follows the small-M asymptote fD L*/D ~ 1/(gamma M^2) up to parameter 1e8 and beyond", () => {
    // For large P: gamma P = s - 1 - (gamma + 1)/2 ln((2 s + gamma - 1)/(gamma + 1)), s = 1/M^2.
    for (const parameter of [1e6, 1e8, 1e12, 1e200]) {
      const mach = machFromFannoParameter(parameter, 1.4, "subsonic");
      expect(relativeError(mach, 1 / Math.sqrt(1.4 * parameter))).toBeLessThan(20 / parameter);
    }
  });

  it("returns 1 for parameter 0 and 0 for Infinity (subsonic)", () => {
    expect(machFromFannoParameter(0, 1.4, "subsonic")).toBe(1);
    expect(machFromFannoParameter(0, 1.4, "supersonic")).toBe(1);
    expect(machFromFannoParameter(Number.POSITIVE_INFINITY, 1.4, "subsonic")).toBe(0);
  });

  it("throws a RangeError for a negative parameter and for a supersonic one at or beyond the limit", () => {
    expect(() => machFromFannoParameter(-1, 1.4, "subsonic")).toThrow(RangeError);
    expect(() => machFromFannoParameter(-1, 1.4, "subsonic")).toThrow(
      "Fanno parameter fD L* / D must be >= 0 (got -1)",
    );
    expect(() => machFromFannoParameter(Number.NaN, 1.4, "supersonic")).toThrow(RangeError);
    const limit = maxSupersonicFannoParameter(1.4);
    expect(() => machFromFannoParameter(limit, 1.4, "supersonic")).toThrow(
      `supersonic Fanno parameter fD L* / D must be below ${limit} (its limit as M -> infinity for gamma 1.4; got ${limit})`,
    );
    expect(() => machFromFannoParameter(1, 1.4, "supersonic")).toThrow(RangeError);
  });
});

describe("@example values in src/physics/fanno.ts", () => {
  it("@example of fannoParameter", () => {
    expect(Math.abs(fannoParameter(0.5, 1.4) - 1.06906031)).toBeLessThan(5e-9);
  });
  it("@example of maxSupersonicFannoParameter", () => {
    expect(Math.abs(maxSupersonicFannoParameter(1.4) - 0.82150812)).toBeLessThan(5e-9);
  });
  it("@example of the Fanno ratios", () => {
    expect(relativeError(fannoTemperatureRatio(0.5, 1.4), 8 / 7)).toBeLessThan(1e-15);
    expect(Math.abs(fannoPressureRatio(0.5, 1.4) - 2.13808994)).toBeLessThan(5e-9);
    expect(relativeError(fannoDensityRatio(2, 1.4), Math.sqrt(3 / 8))).toBeLessThan(1e-15);
    expect(Math.abs(fannoStagnationPressureRatio(0.5, 1.4) - 1.33984375)).toBeLessThan(5e-9);
  });
  it("@example of machFromFannoParameter", () => {
    expect(Math.abs(machFromFannoParameter(1.06906031, 1.4, "subsonic") - 0.5)).toBeLessThan(5e-9);
  });
});
