import { readFileSync } from "node:fs";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  colebrookWhite,
  darcyFrictionFactor,
  darcyFrictionFactorLogSlope,
  darcyFrictionProduct,
  darcyFrictionWithSlope,
  LAMINAR_LIMIT_REYNOLDS,
  laminarFrictionFactor,
  TURBULENT_LIMIT_REYNOLDS,
} from "../../src/physics/friction.js";
import { expectAtPrintedPrecision, relativeError } from "./high-precision.js";

interface ColebrookCase {
  reynolds: number;
  relativeRoughness: number;
  kind: "grid" | "extended";
  exact: number;
  fluidsDefault: number;
  fluidsMpmath: number;
}
const fixture = JSON.parse(
  readFileSync(new URL("../fixtures/friction/colebrook.json", import.meta.url), "utf8"),
) as { fluidsVersion: string; mpmathVersion: string; cases: ColebrookCase[] };

const SEED = 20240611;
const ROUGHNESSES = [0, 1e-6, 1e-4, 1e-3, 1e-2, 0.05];

describe(`colebrookWhite against test/fixtures/friction/colebrook.json (fluids ${fixture.fluidsVersion}, mpmath ${fixture.mpmathVersion})`, () => {
  const grid = fixture.cases.filter((c) => c.kind === "grid");
  const extended = fixture.cases.filter((c) => c.kind === "extended");

  it(`matches the exact Lambert W solution (mpmath, 60 digits) to 1e-13 on the grid Re 4e3..1e8, eps/D 0..0.05 (${grid.length} cases)`, () => {
    // 1e-13: the Newton iteration stops at rounding level (about 1e-15); the margin covers the
    // rounding of the logarithm and of 1/x^2 (Colebrook's condition number in x is below 1).
    for (const c of grid) {
      expect(relativeError(colebrookWhite(c.reynolds, c.relativeRoughness), c.exact)).toBeLessThan(
        1e-13,
      );
    }
  });

  it("matches fluids.friction.Colebrook (double-precision Lambert W) to 1e-12 on the grid", () => {
    // 1e-12: fluids' docstring gives its closed form as generally within 1e-12 of the iterative
    // solution; on this grid it is within 2e-14 of the exact value (see the fixture).
    for (const c of grid) {
      expect(
        relativeError(colebrookWhite(c.reynolds, c.relativeRoughness), c.fluidsDefault),
      ).toBeLessThan(1e-12);
    }
  });

  it("matches fluids.friction.Colebrook(tol=0) (mpmath closed form) to 1e-10 on the grid", () => {
    // 1e-10: fluids' mpmath branch keeps the constant 18.574 as a binary float, and its
    // W-term cancels against ln(10) eD Re, which leaves up to 2.5e-11 at eD Re = 5e6 (fixture).
    for (const c of grid) {
      expect(
        relativeError(colebrookWhite(c.reynolds, c.relativeRoughness), c.fluidsMpmath),
      ).toBeLessThan(1e-10);
    }
  });

  it(`is solved to 1e-13 outside the turbulent range too, Re 1 to 1e9 (${extended.length} cases)`, () => {
    for (const c of extended) {
      expect(relativeError(colebrookWhite(c.reynolds, c.relativeRoughness), c.exact)).toBeLessThan(
        1e-13,
      );
    }
  });
});

describe("colebrookWhite against PRACTICE.md 7.6 (CALC, printed to 7 decimals)", () => {
  const rows: [number, number, string][] = [
    [1e5, 1e-4, "0.0185139"],
    [1e5, 0, "0.0179898"],
    [1e6, 1e-4, "0.0134414"],
    [1e6, 1e-3, "0.0199435"],
    [4000, 0, "0.0399070"],
    [1e7, 1e-5, "0.0089957"],
    [1e8, 1e-2, "0.0379043"],
  ];
  for (const [reynolds, roughness, printed] of rows) {
    it(`gives ${printed} at Re = ${reynolds}, eps/D = ${roughness}`, () => {
      expectAtPrintedPrecision(colebrookWhite(reynolds, roughness), printed);
    });
  }

  it("gives the fluids doctest value Colebrook(1E5, 1E-4) = 0.018513866077471", () => {
    // The doctest prints 14 significant digits (truncated), so 1e-13 relative.
    expect(relativeError(colebrookWhite(1e5, 1e-4), 0.018513866077471)).toBeLessThan(1e-13);
  });
});

describe("laminar friction factor", () => {
  it("is 64/Re (Hagen-Poiseuille, White, Fluid Mechanics, 7th ed., 2011, ch. 6)", () => {
    expect(laminarFrictionFactor(1000)).toBe(0.064);
    expect(laminarFrictionFactor(64)).toBe(1);
  });
});

describe("darcyFrictionFactor over all Reynolds numbers", () => {
  it("is the laminar law up to 2300 and Colebrook-White from 4000", () => {
    expect(LAMINAR_LIMIT_REYNOLDS).toBe(2300);
    expect(TURBULENT_LIMIT_REYNOLDS).toBe(4000);
    for (const roughness of ROUGHNESSES) {
      for (const reynolds of [1e-6, 1, 100, 2000, 2300]) {
        expect(darcyFrictionFactor(reynolds, roughness)).toBe(64 / reynolds);
      }
      for (const reynolds of [4000, 1e5, 1e9]) {
        expect(darcyFrictionFactor(reynolds, roughness)).toBe(colebrookWhite(reynolds, roughness));
      }
    }
  });

  it("is continuous at 2300 and 4000 (values just either side agree to 1e-8)", () => {
    // A C1 function changes by |d ln f / d ln Re| * 2e-9 relative across Re (1 +- 1e-9): about
    // 2e-9 here, so 1e-8 relative.
    for (const roughness of ROUGHNESSES) {
      for (const limit of [LAMINAR_LIMIT_REYNOLDS, TURBULENT_LIMIT_REYNOLDS]) {
        const below = darcyFrictionFactor(limit * (1 - 1e-9), roughness);
        const above = darcyFrictionFactor(limit * (1 + 1e-9), roughness);
        expect(relativeError(above, below)).toBeLessThan(1e-8);
      }
    }
  });

  it("has a continuous slope at 2300 and 4000 (one-sided finite differences agree to 1e-4)", () => {
    // One-sided differences with step h = 1e-6 in ln Re: truncation about h |second derivative|
    // (below 1e-5 here), rounding about 1e-16 / h = 1e-10; so 1e-4 absolute in d ln f / d ln Re.
    const h = 1e-6;
    const logF = (reynolds: number, roughness: number) =>
      Math.log(darcyFrictionFactor(reynolds, roughness));
    for (const roughness of ROUGHNESSES) {
      for (const limit of [LAMINAR_LIMIT_REYNOLDS, TURBULENT_LIMIT_REYNOLDS]) {
        const left = (logF(limit, roughness) - logF(limit * Math.exp(-h), roughness)) / h;
        const right = (logF(limit * Math.exp(h), roughness) - logF(limit, roughness)) / h;
        expect(Math.abs(left - right)).toBeLessThan(1e-4);
        expect(
          Math.abs(darcyFrictionFactorLogSlope(limit * (1 + 1e-12), roughness) - right),
        ).toBeLessThan(1e-4);
        expect(
          Math.abs(darcyFrictionFactorLogSlope(limit * (1 - 1e-12), roughness) - left),
        ).toBeLessThan(1e-4);
      }
    }
  });

  it("darcyFrictionFactorLogSlope is the derivative of ln fD against ln Re (central differences, 1e-6)", () => {
    // Central differences with h = 1e-4 in ln Re: truncation h^2 |third derivative| / 6 and
    // rounding 1e-16 / h, both well below 1e-6.
    const h = 1e-4;
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 9, noNaN: true }),
        fc.constantFrom(...ROUGHNESSES),
        (e, roughness) => {
          const reynolds = 10 ** e;
          // Keep the difference stencil on one side of each limit.
          for (const limit of [LAMINAR_LIMIT_REYNOLDS, TURBULENT_LIMIT_REYNOLDS]) {
            fc.pre(Math.abs(Math.log(reynolds / limit)) > 2 * h);
          }
          const difference =
            (Math.log(darcyFrictionFactor(reynolds * Math.exp(h), roughness)) -
              Math.log(darcyFrictionFactor(reynolds * Math.exp(-h), roughness))) /
            (2 * h);
          expect(
            Math.abs(darcyFrictionFactorLogSlope(reynolds, roughness) - difference),
          ).toBeLessThan(1e-6);
        },
      ),
      { seed: SEED, numRuns: 500 },
    );
  });

  it("is finite and positive for every Re > 0 and eps/D in [0, 0.05]", () => {
    fc.assert(
      fc.property(
        fc.double({ min: -300, max: 12, noNaN: true }),
        fc.double({ min: 0, max: 0.05, noNaN: true }),
        (e, roughness) => {
          const f = darcyFrictionFactor(10 ** e, roughness);
          expect(Number.isFinite(f) && f > 0).toBe(true);
        },
      ),
      { seed: SEED, numRuns: 2000 },
    );
    expect(darcyFrictionFactor(Number.MIN_VALUE, 0)).toBe(Number.MAX_VALUE);
  });

  it("darcyFrictionProduct is 64 at zero flow and through the laminar range, and fD Re above", () => {
    for (const roughness of ROUGHNESSES) {
      expect(darcyFrictionProduct(0, roughness)).toBe(64);
      expect(darcyFrictionProduct(2300, roughness)).toBe(64);
      for (const reynolds of [2500, 3500, 4000, 1e6]) {
        expect(darcyFrictionProduct(reynolds, roughness)).toBe(
          darcyFrictionFactor(reynolds, roughness) * reynolds,
        );
      }
      const above = darcyFrictionProduct(2300 * (1 + 1e-9), roughness);
      expect(relativeError(above, 64)).toBeLessThan(1e-8);
    }
  });

  it("throws a RangeError for Re <= 0, a non-finite Re or a roughness outside [0, 1)", () => {
    expect(() => darcyFrictionFactor(0, 1e-4)).toThrow(
      "Reynolds number must be a finite number > 0 (got 0); at zero flow use darcyFrictionProduct",
    );
    expect(() => darcyFrictionFactor(Number.NaN, 1e-4)).toThrow(RangeError);
    expect(() => colebrookWhite(-1, 0)).toThrow(
      "Reynolds number must be a finite number > 0 (got -1)",
    );
    expect(() => colebrookWhite(1e5, -1e-3)).toThrow(
      "relative roughness must be in [0, 1) (got -0.001)",
    );
    expect(() => darcyFrictionProduct(-1, 0)).toThrow(
      "Reynolds number must be a finite number >= 0 (got -1)",
    );
    expect(() => darcyFrictionFactorLogSlope(Number.POSITIVE_INFINITY, 0)).toThrow(RangeError);
  });
});

describe("@example values in src/physics/friction.ts", () => {
  it("@example of laminarFrictionFactor", () => {
    expect(laminarFrictionFactor(1000)).toBe(0.064);
  });
  it("@example of colebrookWhite", () => {
    expect(Math.abs(colebrookWhite(1e5, 1e-4) - 0.018513866077471)).toBeLessThan(1e-15);
  });
  it("@example of darcyFrictionFactor", () => {
    expect(Math.abs(darcyFrictionFactor(3000, 0) - 0.03129108)).toBeLessThan(5e-9);
  });
  it("@example of darcyFrictionProduct", () => {
    expect(darcyFrictionProduct(0, 1e-3)).toBe(64);
  });
  it("@example of darcyFrictionFactorLogSlope", () => {
    expect(darcyFrictionFactorLogSlope(1000, 0)).toBe(-1);
  });
});

describe("darcyFrictionWithSlope", () => {
  it("warm-started from another root (a record with inverseRoot) gives the exact solution of the fixture's grid", () => {
    // Reference: test/fixtures/friction/colebrook.json, the exact Lambert W solution (mpmath, 60
    // digits), 1e-13 as for colebrookWhite above. Against the cold solve 2e-15: each stops at
    // rounding level of x = 1/sqrt(fD), a few units of 1e-16, twice that in fD = 1/x^2.
    const grid = fixture.cases.filter((c) => c.kind === "grid");
    const far = { factor: 0, logSlope: 0, inverseRoot: Number.NaN };
    const near = { factor: 0, logSlope: 0, inverseRoot: Number.NaN };
    for (const c of grid) {
      // `far` keeps the root of the previous case (another roughness or Reynolds number);
      // `near` starts from the root at a Reynolds number 0.1 % higher, as in a Newton iteration.
      darcyFrictionWithSlope(c.reynolds * 1.001, c.relativeRoughness, near);
      for (const warm of [far, near]) {
        darcyFrictionWithSlope(c.reynolds, c.relativeRoughness, warm);
        expect(relativeError(warm.factor, c.exact)).toBeLessThan(1e-13);
        const cold = darcyFrictionFactor(c.reynolds, c.relativeRoughness);
        expect(relativeError(warm.factor, cold)).toBeLessThan(2e-15);
      }
    }
  });

  it("converges from any positive start, however far from the root", () => {
    // The same tolerances as above; starts far above the root make the first Newton step leave
    // x > 0, where the bracketed iteration takes over.
    const grid = fixture.cases.filter((c) => c.kind === "grid");
    for (const start of [1e-300, 1e-3, 30, 1e3, 1e300]) {
      for (const c of grid) {
        const record = { factor: 0, logSlope: 0, inverseRoot: start };
        darcyFrictionWithSlope(c.reynolds, c.relativeRoughness, record);
        expect(relativeError(record.factor, c.exact)).toBeLessThan(1e-13);
        expect(record.inverseRoot).toBeCloseTo(1 / Math.sqrt(record.factor), 12);
      }
    }
  });

  it("gives the same factor and slope as the two separate functions, in every regime", () => {
    const out = { factor: 0, logSlope: 0 };
    for (const reynolds of [50, 2300, 2301, 3000, 3999, 4000, 1e5, 1e8]) {
      for (const roughness of [0, 1e-4, 0.01]) {
        darcyFrictionWithSlope(reynolds, roughness, out);
        expect(out.factor).toBe(darcyFrictionFactor(reynolds, roughness));
        expect(out.logSlope).toBe(darcyFrictionFactorLogSlope(reynolds, roughness));
      }
    }
  });
});
