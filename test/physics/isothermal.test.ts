import { readFileSync } from "node:fs";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  isothermalChokedOutletPressure,
  isothermalChokedPressureRatio,
  isothermalFrictionParameter,
  isothermalLimitingMach,
  isothermalMassFlux,
  isothermalPressureRatio,
  machFromIsothermalFrictionParameter,
} from "../../src/physics/isothermal.js";
import { expectAtPrintedPrecision, highPrecision, relativeError } from "./high-precision.js";

interface IsothermalCase {
  name: string;
  inletDensity: number;
  darcyFrictionFactor: number;
  inletPressure: number;
  outletPressure: number;
  length: number;
  diameter: number;
  massFlow: number;
  criticalOutletPressure: number;
  chokedMassFlow: number;
}
const fixture = JSON.parse(
  readFileSync(new URL("../fixtures/friction/isothermal.json", import.meta.url), "utf8"),
) as { fluidsVersion: string; cases: IsothermalCase[] };

// Closed form written from the published equation (Shapiro 1953, Vol. I, ch. 6), Darcy factor.
const FRICTION_PARAMETER = "(1 - g * M^2) / (g * M^2) + log(g * M^2)";
const EPSILON = Number.EPSILON;
const SEED = 20240611;
const logUniform = (minExponent: number, maxExponent: number) =>
  fc.double({ min: minExponent, max: maxExponent, noNaN: true }).map((e) => 10 ** e);

/** Any specific gas constant will do: the relations use R T only, which the cases fix as p1/rho1. */
const SPECIFIC_GAS_CONSTANT = 287.05;

function pipeArea(diameter: number): number {
  return (Math.PI * diameter * diameter) / 4;
}

describe(`isothermal pipe flow against fluids ${fixture.fluidsVersion} (test/fixtures/friction/isothermal.json)`, () => {
  for (const c of fixture.cases) {
    const frictionParameter = (c.darcyFrictionFactor * c.length) / c.diameter;
    // fluids' isothermal_gas uses rho/P1 = 1/(R T): rho is the density at the inlet pressure.
    const temperature = c.inletPressure / (c.inletDensity * SPECIFIC_GAS_CONSTANT);
    it(`gives the mass flow of fluids.compressible.isothermal_gas: ${c.name}`, () => {
      const massFlow =
        isothermalMassFlux(
          c.inletPressure,
          c.outletPressure,
          SPECIFIC_GAS_CONSTANT,
          temperature,
          frictionParameter,
        ) * pipeArea(c.diameter);
      // 1e-12: the same closed form; fluids forms P1^2 - P2^2 directly, which loses up to
      // 1e-13 to cancellation in the small-pressure-drop case.
      expect(relativeError(massFlow, c.massFlow)).toBeLessThan(1e-12);
    });
    it(`gives the choke pressure of fluids.compressible.P_isothermal_critical_flow: ${c.name}`, () => {
      const critical = isothermalChokedOutletPressure(c.inletPressure, frictionParameter);
      // 1e-12: fluids evaluates the Lambert W closed form in double precision (scipy lambertw).
      expect(relativeError(critical, c.criticalOutletPressure)).toBeLessThan(1e-12);
      const chokedMassFlow =
        isothermalMassFlux(
          c.inletPressure,
          critical,
          SPECIFIC_GAS_CONSTANT,
          temperature,
          frictionParameter,
        ) * pipeArea(c.diameter);
      // At the maximum G is flat in p2, so the small difference in p2* does not show.
      expect(relativeError(chokedMassFlow, c.chokedMassFlow)).toBeLessThan(1e-12);
    });
  }
});

describe("isothermal pipe flow against PRACTICE.md 7.3", () => {
  const frictionParameter = (0.00185 * 1000) / 0.5;
  it("gives 145.4848 kg/s for rho 11.3 kg/m3, fD 0.00185, p1 1 MPa, p2 0.9 MPa, L 1000 m, D 0.5 m (fluids isothermal_gas doctest = CALC)", () => {
    const temperature = 1e6 / (11.3 * SPECIFIC_GAS_CONSTANT);
    const massFlow =
      isothermalMassFlux(1e6, 9e5, SPECIFIC_GAS_CONSTANT, temperature, frictionParameter) *
      pipeArea(0.5);
    expectAtPrintedPrecision(massFlow, "145.4848");
  });

  it("chokes at p2* = 389.6997 kPa for p1 = 1 MPa on the same pipe (fluids P_isothermal_critical_flow doctest = CALC)", () => {
    expectAtPrintedPrecision(
      isothermalChokedOutletPressure(1e6, frictionParameter) / 1000,
      "389.6997",
    );
  });

  it("has the limiting Mach number 1/sqrt(1.4) = 0.8452 (CALC)", () => {
    expectAtPrintedPrecision(isothermalLimitingMach(1.4), "0.8452");
  });

  it("reaches the exit velocity sqrt(R T) at the choke: G* = p2* / sqrt(R T) (PRACTICE.md 7.3, CALC)", () => {
    for (const k of [0.01, 1, 3.7, 100, 1e4]) {
      const critical = isothermalChokedOutletPressure(1e6, k);
      const rt = SPECIFIC_GAS_CONSTANT * 300;
      const massFlux = isothermalMassFlux(1e6, critical, SPECIFIC_GAS_CONSTANT, 300, k);
      expect(relativeError(massFlux, critical / Math.sqrt(rt))).toBeLessThan(1e-12);
      // ... and the inlet Mach number of that flow has fD L*t/D equal to the pipe's fD L/D.
      const inletMach = (massFlux * Math.sqrt(rt)) / (1e6 * Math.sqrt(1.4));
      expect(relativeError(isothermalFrictionParameter(inletMach, 1.4), k)).toBeLessThan(1e-11);
    }
  });
});

describe("isothermal closed forms and inversions", () => {
  it("isothermalFrictionParameter agrees with a 40-digit evaluation to 1e-14, also next to the limiting Mach number", () => {
    for (const gamma of [1.1, 1.3, 1.4, 1.67]) {
      const limit = 1 / Math.sqrt(gamma);
      for (const mach of [
        1e-6,
        1e-3,
        0.1,
        0.5,
        limit * 0.99,
        limit * (1 - 1e-6),
        limit * (1 - 1e-9),
        limit * 1.01,
        2,
        10,
      ]) {
        const reference = highPrecision(FRICTION_PARAMETER, { M: mach, g: gamma });
        expect(relativeError(isothermalFrictionParameter(mach, gamma), reference)).toBeLessThan(
          1e-14,
        );
      }
    }
  });

  it("isothermalFrictionParameter is zero at the limiting Mach number and falls along the subsonic branch", () => {
    expect(Math.abs(isothermalFrictionParameter(isothermalLimitingMach(1.4), 1.4))).toBeLessThan(
      1e-30,
    );
    expect(isothermalFrictionParameter(0, 1.4)).toBe(Number.POSITIVE_INFINITY);
    fc.assert(
      fc.property(logUniform(-6, Math.log10(0.845)), logUniform(-6, Math.log10(0.845)), (a, b) => {
        fc.pre(a < b);
        expect(isothermalFrictionParameter(a, 1.4)).toBeGreaterThan(
          isothermalFrictionParameter(b, 1.4),
        );
      }),
      { seed: SEED, numRuns: 1000 },
    );
  });

  it("p M is constant: isothermalPressureRatio(M1) / isothermalPressureRatio(M2) = M2 / M1", () => {
    expect(
      relativeError(isothermalPressureRatio(0.2, 1.4) / isothermalPressureRatio(0.8, 1.4), 4),
    ).toBeLessThan(1e-15);
    expect(
      relativeError(isothermalPressureRatio(isothermalLimitingMach(1.4), 1.4), 1),
    ).toBeLessThan(1e-15);
  });

  it("machFromIsothermalFrictionParameter inverts isothermalFrictionParameter for M = 1e-6 up to the limiting Mach number", () => {
    fc.assert(
      fc.property(
        fc.double({ min: -6, max: 0, noNaN: true }),
        fc.constantFrom(1.1, 1.3, 1.4, 1.67),
        (e, gamma) => {
          const mach = (10 ** e / Math.sqrt(gamma)) * (1 - 1e-12);
          const parameter = isothermalFrictionParameter(mach, gamma);
          const back = machFromIsothermalFrictionParameter(parameter, gamma);
          // Condition number of the inverse: 1/|d ln F / d ln M|, dF/dM = 2 (gamma M^2 - 1)/(gamma M^3).
          const w = gamma * mach * mach;
          const logSlope = (2 * (w - 1)) / w / parameter;
          const tolerance = Math.max(1e-12, (16 * EPSILON) / Math.abs(logSlope));
          expect(relativeError(back, mach)).toBeLessThanOrEqual(tolerance);
        },
      ),
      { seed: SEED, numRuns: 1000 },
    );
  });

  it("isothermalChokedPressureRatio solves r^2 (fD L/D + 1 - 2 ln r) = 1 (40-digit residual) from fD L/D = 1e-12 to 1e8", () => {
    for (const k of [1e-12, 1e-6, 0.01, 1, 3.7, 80, 800, 1e4, 1e8]) {
      const r = isothermalChokedPressureRatio(k);
      // d(LHS)/d ln r = 2 (1 - r^2): the residual is at most about 2 (relative error of r).
      expect(Math.abs(highPrecision("r^2 * (K + 1 - 2 * log(r))", { r, K: k }) - 1)).toBeLessThan(
        1e-14,
      );
    }
    expect(isothermalChokedPressureRatio(0)).toBe(1);
  });

  it("throws a RangeError for impossible pressures or a negative friction parameter", () => {
    expect(() => isothermalMassFlux(9e5, 1e6, 287, 300, 1)).toThrow(
      "isothermal mass flux needs inlet pressure >= outlet pressure > 0 (got 900000 Pa and 1000000 Pa)",
    );
    expect(() => isothermalMassFlux(1e6, 0, 287, 300, 1)).toThrow(RangeError);
    expect(() => isothermalMassFlux(1e6, 9e5, 287, 300, -1)).toThrow(
      "friction parameter fD L/D must be >= 0 (got -1)",
    );
    expect(() => machFromIsothermalFrictionParameter(Number.NaN, 1.4)).toThrow(RangeError);
    expect(() => isothermalChokedOutletPressure(1e6, -0.5)).toThrow(RangeError);
    expect(isothermalMassFlux(1e6, 1e6, 287, 300, 0)).toBe(0);
  });
});

describe("@example values in src/physics/isothermal.ts", () => {
  it("@example of isothermalLimitingMach", () => {
    expect(relativeError(isothermalLimitingMach(1.4), 0.8451542547285166)).toBeLessThan(1e-15);
  });
  it("@example of isothermalFrictionParameter", () => {
    expect(Math.abs(isothermalFrictionParameter(0.3, 1.4) - 4.86503456)).toBeLessThan(5e-9);
  });
  it("@example of isothermalPressureRatio", () => {
    expect(Math.abs(isothermalPressureRatio(0.5, 1.4) - 1.69030851)).toBeLessThan(5e-9);
  });
  it("@example of machFromIsothermalFrictionParameter", () => {
    expect(Math.abs(machFromIsothermalFrictionParameter(3.7, 1.4) - 0.32935639)).toBeLessThan(5e-9);
  });
  it("@example of isothermalMassFlux", () => {
    expect(Math.abs(isothermalMassFlux(1e6, 9e5, 287.05, 308.29, 3.7) - 740.95)).toBeLessThan(
      0.005,
    );
  });
  it("@example of isothermalChokedPressureRatio and isothermalChokedOutletPressure", () => {
    expect(Math.abs(isothermalChokedPressureRatio(3.7) - 0.38969973)).toBeLessThan(5e-9);
    expect(Math.abs(isothermalChokedOutletPressure(1e6, 3.7) - 389699.73)).toBeLessThan(0.005);
  });
});
