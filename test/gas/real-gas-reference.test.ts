/**
 * Peng-Robinson and the NASA polynomials against reference equations of state: CoolProp 8.0.0
 * (HEOS backend: the multiparameter reference equation of each fluid, named in the fixture and
 * in docs/validation.md), through test/fixtures/real-gas/real-gas-reference.json, made by
 * make-real-gas-reference.py beside it.
 *
 * Two kinds of check. machnet's Peng-Robinson against the fixture's independent evaluation of
 * the same equation with the same constants: tight, it checks the code. Peng-Robinson against
 * the reference equations: loose, with bounds that say what a user can expect of the equation.
 */

import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { gasPreset, MOLAR_GAS_CONSTANT } from "../../src/gas/gas.js";
import { CRITICAL, NASA7 } from "../../src/gas/gas-model-data.js";
import type { SpeciesName } from "../../src/gas/gas-presets.js";
import type { Gas, Nasa7HeatCapacity, Nasa7Species } from "../../src/gas/gas-types.js";
import {
  nasa7Entropy,
  nasa7MixtureEnthalpy,
  nasa7MixtureHeatCapacity,
} from "../../src/gas/nasa7.js";
import { gasState } from "../../src/gas/thermo.js";

interface ReferenceState {
  p: number;
  T: number;
  reducedTemperature?: number;
  Z: number;
  density_kg_per_m3: number;
  soundSpeed_m_per_s: number;
  cp_J_per_molK: number;
  enthalpyDeparture_J_per_mol: number;
  pengRobinson: { Z: number; enthalpyDeparture_J_per_mol: number };
}

interface IdealGasRow {
  T: number;
  cp0_J_per_molK: number;
  h0_minus_h0_298_J_per_mol: number;
  s0_minus_s0_298_J_per_molK: number;
}

interface RealGasFixture {
  pure: Record<
    string,
    {
      equationOfState: string;
      states: ReferenceState[];
      secondVirial: { T: number; B_m3_per_mol: number }[];
    }
  >;
  mixtures: Record<string, { states: ReferenceState[] }>;
  idealGas: Record<string, { validFrom_K: number; validUpTo_K: number; values: IdealGasRow[] }>;
  critical: Record<string, { Tc: number; pc: number; omega: number }>;
  vapourPressure: Record<string, { T: number; p: number }[]>;
}

const fixture = JSON.parse(
  readFileSync(new URL("../fixtures/real-gas/real-gas-reference.json", import.meta.url), "utf8"),
) as RealGasFixture;

type PresetWithEquation =
  | "methane"
  | "nitrogen"
  | "carbon-dioxide"
  | "oxygen"
  | "argon"
  | "helium"
  | "hydrogen"
  | "air";

const PURE = Object.keys(fixture.pure) as PresetWithEquation[];
const QUANTUM_GASES = new Set(["helium", "hydrogen"]);

/** The preset with Peng-Robinson and NASA cp(T). */
function realGas(name: PresetWithEquation | "natural-gas"): Gas {
  return gasPreset(name, { equationOfState: "peng-robinson", heatCapacity: "nasa7" });
}

/** H - H_ig [J/mol] of gasState: its enthalpy less that of the same gas without the equation. */
function enthalpyDeparture(gas: Gas, p: number, t: number): number {
  const ideal: Gas = { ...gas, equationOfState: undefined };
  return (gasState(gas, p, t).enthalpy - gasState(ideal, p, t).enthalpy) * gas.molarMass;
}

/** Every state of the fixture, pure fluids and mixtures, with the gas to evaluate it. */
function allStates(): { label: string; gas: Gas; row: ReferenceState }[] {
  const out: { label: string; gas: Gas; row: ReferenceState }[] = [];
  for (const name of PURE) {
    const gas = realGas(name);
    for (const row of fixture.pure[name]?.states ?? []) out.push({ label: name, gas, row });
  }
  for (const name of ["natural-gas", "air"] as const) {
    const gas = realGas(name);
    for (const row of fixture.mixtures[name]?.states ?? []) {
      out.push({ label: `${name} mixture`, gas, row });
    }
  }
  return out;
}

function where(label: string, row: ReferenceState): string {
  return `${label} ${row.p / 1e5} bar ${row.T} K`;
}

describe("critical constants (Poling et al. 5th ed., from memory) against the reference equations", () => {
  it("agree with the critical points and acentric factors of CoolProp 8.0.0's equations", () => {
    // Different compilations of measured critical points: Tc agree to about 0.1 %, pc to about
    // 1 % (hydrogen differs most, 1.3 %, from the normal-hydrogen equation), omega to a few
    // thousandths (helium 0.0065). Tolerances 0.2 %, 1.5 %, 0.01: a wrongly recalled digit
    // beyond the third shows.
    const names = Object.keys(CRITICAL) as SpeciesName[];
    expect(names.length).toBe(14);
    for (const name of names) {
      const recalled = CRITICAL[name];
      const reference = fixture.critical[name];
      if (recalled === undefined || reference === undefined) throw new Error(name);
      expectWithin(recalled.criticalTemperature / reference.Tc - 1, 2e-3, `${name} Tc`);
      expectWithin(recalled.criticalPressure / reference.pc - 1, 1.5e-2, `${name} pc`);
      expectWithin(recalled.acentricFactor - reference.omega, 0.01, `${name} omega`, "");
    }
  });
});

describe("Peng-Robinson: machnet against an independent evaluation (same equation, same constants)", () => {
  it("gives the fixture's Z and H - H_ig at every state, pure gases and mixtures", () => {
    // Fixture: numpy.roots for Z (companion-matrix eigenvalues, ~1e-12), 64-point Gauss-Legendre
    // quadrature of the residual integral (exact to rounding for this smooth integrand) with
    // da/dT by a central difference of step 1e-4 T (error ~1e-8 relative). Tolerances: Z 1e-9
    // relative; H - H_ig 1e-6 relative plus 1e-6 J/mol.
    const states = allStates();
    expect(states.length).toBeGreaterThan(200);
    for (const { label, gas, row } of states) {
      const state = gasState(gas, row.p, row.T);
      const what = where(label, row);
      const zError = Math.abs(state.compressibility / row.pengRobinson.Z - 1);
      if (!(zError <= 1e-9))
        throw new Error(`${what}: Z ${state.compressibility} vs ${row.pengRobinson.Z}`);
      const h = enthalpyDeparture(gas, row.p, row.T);
      const expected = row.pengRobinson.enthalpyDeparture_J_per_mol;
      if (!(Math.abs(h - expected) <= 1e-6 * Math.abs(expected) + 1e-6)) {
        throw new Error(`${what}: H - H_ig ${h} vs ${expected} J/mol`);
      }
      expect(state.condensing, what).toBe(false);
    }
  });
});

/**
 * Where a state lies, for the accuracy bands of Peng-Robinson: the quantum gases H2 and He (whose
 * attraction term, with omega < 0, describes them poorly), states below 1.25 times the critical
 * temperature (near the critical point or below it: the vapour side, at most 0.8 times the
 * vapour pressure), and the rest ("classical": far supercritical light gases, and the mixtures).
 */
type Region = "quantum" | "near-critical" | "classical";

function regionOf(label: string, row: ReferenceState): Region {
  if (QUANTUM_GASES.has(label)) return "quantum";
  if (row.reducedTemperature !== undefined && row.reducedTemperature < 1.25) return "near-critical";
  return "classical";
}

/**
 * The bounds a user can expect of Peng-Robinson at 200-400 K and 1-200 bar. Basis: cubic
 * equations give gas-phase volumes to a few percent away from the critical point, worse near
 * it, and sound speeds and enthalpy departures (derivatives of the equation) less well
 * (Poling, Prausnitz and O'Connell, 5th ed., ch. 4 and 6). Each figure is the largest deviation
 * measured here in its band, rounded up (docs/validation.md lists the measured maxima), so a
 * change that makes machnet's Peng-Robinson worse fails.
 *
 * Z and density: |Z_PR/Z_ref - 1| and |rho_ref/rho_PR - 1| (the same figure but for the molar
 * masses, which differ by 1e-5). Speed of sound and cp: |a_PR/a_ref - 1|, |cp_PR/cp_ref - 1|,
 * with machnet's NASA ideal-gas part. Enthalpy departure: |(H - H_ig)_PR - (H - H_ig)_ref|
 * over the ideal-gas molar cp, in kelvin: the error it makes in the temperature after an
 * isenthalpic expansion to low pressure.
 */
function bounds(
  label: string,
  row: ReferenceState,
): { z: number; a: number; h: number; cp: number } {
  const region = regionOf(label, row);
  const p = row.p;
  if (p <= 10e5) {
    const near = region === "near-critical";
    return {
      z: 0.01,
      a: 0.015,
      h: near ? 2.5 : 1,
      cp: { classical: 0.005, "near-critical": 0.085, quantum: 0.01 }[region],
    };
  }
  if (p <= 50e5) {
    return {
      z: { classical: 0.035, "near-critical": 0.05, quantum: 0.03 }[region],
      a: 0.03,
      h: 4,
      cp: region === "near-critical" ? 0.12 : 0.015,
    };
  }
  if (region === "near-critical") return { z: 0.07, a: 0.17, h: 5, cp: 0.12 };
  if (region === "quantum") return { z: 0.06, a: 0.04, h: 9, cp: 0.01 };
  return { z: 0.04, a: p <= 100e5 ? 0.02 : 0.08, h: 7, cp: p <= 100e5 ? 0.05 : 0.075 };
}

describe("Peng-Robinson against the reference equations of state (CoolProp 8.0.0)", () => {
  it("names the reference equation of each fluid", () => {
    expect(
      Object.fromEntries(Object.entries(fixture.pure).map(([n, f]) => [n, f.equationOfState])),
    ).toEqual({
      methane: "Setzmann-JPCRD-1991",
      nitrogen: "Span-JPCRD-2000",
      "carbon-dioxide": "Span-JPCRD-1996",
      oxygen: "Schmidt-FPE-1985,Stewart-JPCRD-1991",
      argon: "Tegeler-JPCRD-1999",
      helium: "OrtizVega-JPCRD-2019",
      hydrogen: "Leachman-JPCRD-2009",
      air: "Lemmon-JPCRD-2000",
    });
  });

  it("gives Z and density within their bands at 1-200 bar, 200-400 K (methane, nitrogen, CO2, O2, Ar, He, H2, air)", () => {
    for (const { label, gas, row } of allStates()) {
      const state = gasState(gas, row.p, row.T);
      const bound = bounds(label, row).z;
      const what = `${where(label, row)} (${regionOf(label, row)})`;
      expectWithin(state.compressibility / row.Z - 1, bound, `${what} Z`);
      expectWithin(row.density_kg_per_m3 / state.density - 1, bound, `${what} density`);
    }
  });

  it("gives the speed of sound within its band", () => {
    for (const { label, gas, row } of allStates()) {
      const a = gasState(gas, row.p, row.T).soundSpeed;
      expectWithin(a / row.soundSpeed_m_per_s - 1, bounds(label, row).a, `${where(label, row)} a`);
    }
  });

  it("gives cp within its band (the natural-gas preset too, with its alkanes' fitted cp(T))", () => {
    // The natural-gas mixture with NASA cp (issue #5; with its constant cp it was up to 6 % low at
    // 350 K): measured 0.35 % to 10 bar and 0.94 % to 50 bar, in the classical bands; at 50-100
    // bar 5.14 % low at 250 K and 100 bar, PR's own error at 1.28 times the mixture's
    // pseudo-critical temperature (Kay's rule, 195 K), just outside the near-critical region of
    // a pure fluid (methane there: 4.67 %). Its bound at 50-100 bar: 5.5 %.
    for (const { label, gas, row } of allStates()) {
      const cp = gasState(gas, row.p, row.T).specificHeatCp * gas.molarMass;
      const denseNaturalGas = label === "natural-gas mixture" && row.p > 50e5;
      const bound = denseNaturalGas ? 0.055 : bounds(label, row).cp;
      expectWithin(cp / row.cp_J_per_molK - 1, bound, `${where(label, row)} cp`);
    }
  });

  it("gives the enthalpy departure H - H_ig within its band (as a temperature error)", () => {
    for (const { label, gas, row } of allStates()) {
      const ideal: Gas = { ...gas, equationOfState: undefined };
      const cpMolar = gasState(ideal, row.p, row.T).specificHeatCp * gas.molarMass;
      const error =
        (enthalpyDeparture(gas, row.p, row.T) - row.enthalpyDeparture_J_per_mol) / cpMolar;
      expectWithin(error, bounds(label, row).h, `${where(label, row)} (H - H_ig)/cp [K]`, "K");
    }
  });

  it("misses hydrogen's and helium's positive H - H_ig at 300 K (a known limit, documented)", () => {
    // Reference: H - H_ig > 0 (they warm when throttled at room temperature, above their
    // Joule-Thomson inversion temperatures). Peng-Robinson with omega < 0 gets below a tenth of
    // it at 10 bar: hydrogen -3.1 against +8.8 J/mol (the wrong sign: it would cool), helium
    // +0.5 against +13.1. docs/model.md warns of it; this pins the behaviour described there.
    for (const name of ["hydrogen", "helium"] as const) {
      const row = fixture.pure[name]?.states.find((s) => s.p === 10e5 && s.T === 300);
      if (row === undefined) throw new Error(name);
      expect(row.enthalpyDeparture_J_per_mol, name).toBeGreaterThan(5);
      expect(enthalpyDeparture(realGas(name), row.p, row.T), name).toBeLessThan(
        0.1 * row.enthalpyDeparture_J_per_mol,
      );
    }
    expect(enthalpyDeparture(realGas("hydrogen"), 10e5, 300)).toBeLessThan(0);
  });

  it("tends to the ideal gas at low pressure: Z - 1 -> B p/(Ru T) with B near the reference's", () => {
    // Z at 1 bar within 0.15 % of the reference (measured at most 0.10 %, methane at 200 K).
    for (const { label, gas, row } of allStates()) {
      if (row.p !== 1e5) continue;
      expectWithin(
        gasState(gas, row.p, row.T).compressibility / row.Z - 1,
        1.5e-3,
        where(label, row),
      );
    }
    // B from machnet at 100 Pa, (Z - 1) Ru T/p (the third virial term adds ~1e-6 relative),
    // against the reference's B(T). PR's B is below the reference's for every gas and
    // temperature here, by 3.8 to 15.9 cm3/mol (air at 400 K; methane at 200 K): that is its Z
    // error at low pressure. Bound 17 cm3/mol.
    for (const name of PURE) {
      const gas = realGas(name);
      for (const { T, B_m3_per_mol } of fixture.pure[name]?.secondVirial ?? []) {
        const p = 100;
        const b = ((gasState(gas, p, T).compressibility - 1) * MOLAR_GAS_CONSTANT * T) / p;
        expect(b, `${name} B at ${T} K`).toBeLessThan(B_m3_per_mol);
        expectWithin((b - B_m3_per_mol) * 1e6, 17, `${name} B at ${T} K [cm3/mol]`, "cm3/mol");
      }
    }
  });

  it("flags condensation at the reference's vapour pressure (methane, nitrogen, CO2, O2, Ar at 0.6-0.95 Tc)", () => {
    // The pressure at which `condensing` switches on at T is PR's vapour pressure (equal
    // residual Gibbs energies of its two roots). Peng and Robinson fitted kappa(omega) to
    // vapour pressures of such fluids; measured here within 1.51 % of the reference equations'
    // (nitrogen at 0.6 Tc; 0.14-1.2 % elsewhere). Bound 2 %: a state within 2 % of saturation
    // may be flagged on the wrong side.
    for (const [name, rows] of Object.entries(fixture.vapourPressure)) {
      const gas = realGas(name as PresetWithEquation);
      expect(rows.length, name).toBeGreaterThanOrEqual(3);
      for (const { T, p } of rows) {
        let low = 0.5 * p;
        let high = 2 * p;
        expect(gasState(gas, low, T).condensing, `${name} ${T} K`).toBe(false);
        expect(gasState(gas, high, T).condensing, `${name} ${T} K`).toBe(true);
        for (let i = 0; i < 60; i++) {
          const middle = Math.sqrt(low * high);
          if (gasState(gas, middle, T).condensing) high = middle;
          else low = middle;
        }
        expectWithin(low / p - 1, 0.02, `${name} vapour pressure at ${T} K`);
      }
    }
  });

  it("gives the natural-gas preset's Z within 4 % of GERG-2008 at 10-100 bar, 250-350 K", () => {
    // CoolProp's multi-fluid mixture of the ten components with the GERG-2008 binary parameters
    // (Kunz and Wagner 2012; N2/CO2 from EOS-CG), against machnet's one-fluid Peng-Robinson
    // with k_ij = 0. Measured at most 3.59 % (75 bar, 250 K): PR's own error for methane (2.9 %
    // at 250 K, 50 bar) plus the zero k_ij. Air as a four-component mixture against EOS-CG:
    // at most 3.00 % (200 bar, 200 K), as the pseudo-pure air equation.
    for (const name of ["natural-gas", "air"] as const) {
      const gas = realGas(name);
      const rows = fixture.mixtures[name]?.states ?? [];
      expect(rows.length).toBeGreaterThanOrEqual(16);
      for (const row of rows) {
        const z = gasState(gas, row.p, row.T).compressibility;
        expectWithin(z / row.Z - 1, 0.04, `${where(name, row)} mixture Z`);
      }
    }
  });
});

/** |deviation| <= bound, with a readable failure (percent for a relative figure). */
function expectWithin(deviation: number, bound: number, what: string, unit?: string): void {
  if (!(Math.abs(deviation) <= bound)) {
    const shown =
      unit === undefined
        ? `${(deviation * 100).toFixed(3)} %, allowed ${bound * 100} %`
        : `${deviation.toFixed(3)} ${unit}, allowed ${bound} ${unit}`;
    throw new Error(`${what}: ${shown}`);
  }
}

/**
 * Agreement required of machnet's NASA polynomials with the reference equations' ideal-gas
 * parts, relative, for cp0 and for the changes of h0 and s0 from 298.15 K (integrals of cp0, so
 * bounded by the largest cp0 deviation on the way). 0.2 % confirms a recalled set of a preset
 * (the fits are stated good to about 0.1-0.2 % of the tables they fit). Hydrogen and methane do
 * not meet it: their bounds are the measured deviations rounded up (docs/validation.md). The
 * natural-gas components (the fitted C2-C6 alkanes) must meet 0.5 % (the rule of issue #5).
 */
function idealGasTolerance(name: string, temperature: number): number {
  if (name === "hydrogen") return temperature < 250 ? 0.01 : 0.004;
  if (name === "methane") return 0.005;
  return name in SPECIES_PRESETS ? 0.002 : 0.005;
}

const SPECIES_PRESETS = {
  nitrogen: true,
  oxygen: true,
  argon: true,
  helium: true,
  hydrogen: true,
  "carbon-dioxide": true,
  methane: true,
  air: true,
};

/** The NASA data machnet has for a species of NASA7 (mole fraction 1), or for air. */
function nasaData(name: string): Nasa7HeatCapacity {
  if (name === "air") {
    const air = gasPreset("air", { heatCapacity: "nasa7" }).heatCapacity;
    if (air === undefined) throw new Error("air");
    return air;
  }
  const data = NASA7[name as SpeciesName];
  if (data === undefined) throw new Error(name);
  return {
    kind: "nasa7",
    species: [
      {
        name: data.formula,
        moleFraction: 1,
        molarMass: 0,
        lowTemperature: data.lowTemperature,
        commonTemperature: data.commonTemperature,
        highTemperature: data.highTemperature,
        lowCoefficients: [...data.low],
        highCoefficients: [...data.high],
      },
    ],
  };
}

describe("NASA 7-coefficient polynomials against the reference equations' ideal-gas cp0 (CoolProp 8.0.0)", () => {
  it("gives cp0(T), h0(T) - h0(298.15 K) and s0(T) - s0(298.15 K) of every NASA species and air at 200-1000 K", () => {
    // Inside 200-1000 K and the reference equation's own range (CO2 from its triple point
    // 216.6 K; methane to 625 K, above which Setzmann-Wagner's cp0 is an extrapolation; the
    // alkanes to 500-675 K).
    const names = [...Object.keys(NASA7), "air"];
    expect(names.length).toBe(15);
    for (const name of names) {
      const reference = fixture.idealGas[name];
      if (reference === undefined) throw new Error(`${name}: not in the fixture`);
      const heatCapacity = nasaData(name);
      const bottom = Math.max(200, reference.validFrom_K);
      const top = Math.min(1000, reference.validUpTo_K);
      let count = 0;
      for (const row of reference.values) {
        if (row.T < bottom || row.T > top) continue;
        count++;
        const tolerance = idealGasTolerance(name, row.T);
        const what = `${name} at ${row.T} K`;
        const cp = nasa7MixtureHeatCapacity(heatCapacity, row.T) * MOLAR_GAS_CONSTANT;
        expectWithin(cp / row.cp0_J_per_molK - 1, tolerance, `${what} cp0`);
        const h = nasa7MixtureEnthalpy(heatCapacity, row.T) * MOLAR_GAS_CONSTANT;
        const expectedH = row.h0_minus_h0_298_J_per_mol;
        expectWithin(
          h - expectedH,
          tolerance * Math.abs(expectedH) + 0.05,
          `${what} h0 [J/mol]`,
          "J/mol",
        );
        let s = 0;
        for (const species of heatCapacity.species) {
          s +=
            species.moleFraction * (nasa7Entropy(species, row.T) - nasa7Entropy(species, 298.15));
        }
        s *= MOLAR_GAS_CONSTANT;
        const expectedS = row.s0_minus_s0_298_J_per_molK;
        expectWithin(
          s - expectedS,
          tolerance * Math.abs(expectedS) + 1e-4,
          `${what} s0 [J/(mol K)]`,
          "J/(mol K)",
        );
      }
      // 298.15 K and every 50 K of the range: 8 points for isopentane (200-500 K), 15 for CO2.
      expect(count, name).toBeGreaterThanOrEqual(8);
    }
  });
});

interface AlkaneFit {
  equationOfState: string;
  validUpTo_K: number;
  lowTemperature: number;
  commonTemperature: number;
  highTemperature: number;
  low: number[];
  high: number[];
  check: IdealGasRow[];
}

const alkaneFits = (
  JSON.parse(
    readFileSync(new URL("../fixtures/real-gas/fit-alkane-nasa7.json", import.meta.url), "utf8"),
  ) as { species: Record<string, AlkaneFit> }
).species;

describe("the alkanes' fitted NASA 7-coefficient polynomials against CoolProp 8.0.0 cp0 (issue #5)", () => {
  // test/fixtures/real-gas/fit-alkane-nasa7.py fits them to each reference equation's ideal-gas
  // part; its "check" rows are CoolProp's own cp0, h0 and s0 (not the fit's), every 10 K.
  const alkanes = Object.keys(NASA7).filter((name) => !(name in SPECIES_PRESETS));

  it("carries the script's coefficients, fitted to the named equations over their ranges", () => {
    expect(
      Object.fromEntries(alkanes.map((name) => [name, alkaneFits[name]?.equationOfState])),
    ).toEqual({
      ethane: "Buecker-JPCRD-2006",
      propane: "Lemmon-JCED-2009",
      isobutane: "Buecker-JPCRD-2006B",
      "n-butane": "Buecker-JPCRD-2006B",
      isopentane: "Lemmon-JCED-2006",
      "n-pentane": "Thol-FPE-2019-alkanes-pentane",
      "n-hexane": "Thol-FPE-2019-alkanes-hexane",
    });
    for (const name of alkanes) {
      const fit = alkaneFits[name] as AlkaneFit;
      const data = NASA7[name as SpeciesName];
      expect(data?.low, name).toEqual(fit.low);
      expect(data?.high, name).toEqual(fit.high);
      expect(data?.lowTemperature, name).toBe(200);
      expect(data?.commonTemperature, name).toBe(fit.commonTemperature);
      // The upper limit is the equation's own (CoolProp's Tmax): no extrapolated cp0 was fitted.
      expect(data?.highTemperature, name).toBe(fit.validUpTo_K);
    }
  });

  it("gives cp0, h0(T) - h0(298.15 K) and s0(T) - s0(298.15 K) every 10 K over 200 K to the equation's limit", () => {
    // Issue #5's rule is 0.5 %. Measured: cp at most 0.037 % (n-hexane at 200 K, the end of
    // the range); bound 0.05 %, so that a worse fit fails long before the rule. h0 and s0 are
    // integrals of cp0 from 298.15 K, so their relative deviations are bounded by cp's
    // (measured 7.7e-5 of h0 and s0, n-hexane); the same 0.05 %, plus 0.05 J/mol and 1e-4
    // J/(mol K) where they pass through zero at 298.15 K.
    const bound = 5e-4;
    for (const name of alkanes) {
      const fit = alkaneFits[name] as AlkaneFit;
      const heatCapacity = nasaData(name);
      const species = heatCapacity.species[0] as Nasa7Species;
      expect(fit.check.length, name).toBeGreaterThanOrEqual(31);
      for (const row of fit.check) {
        const what = `${name} at ${row.T} K`;
        const cp = nasa7MixtureHeatCapacity(heatCapacity, row.T) * MOLAR_GAS_CONSTANT;
        expectWithin(cp / row.cp0_J_per_molK - 1, bound, `${what} cp0`);
        const h = nasa7MixtureEnthalpy(heatCapacity, row.T) * MOLAR_GAS_CONSTANT;
        const expectedH = row.h0_minus_h0_298_J_per_mol;
        expectWithin(h - expectedH, bound * Math.abs(expectedH) + 0.05, `${what} h0`, "J/mol");
        const s =
          (nasa7Entropy(species, row.T) - nasa7Entropy(species, 298.15)) * MOLAR_GAS_CONSTANT;
        const expectedS = row.s0_minus_s0_298_J_per_molK;
        expectWithin(s - expectedS, bound * Math.abs(expectedS) + 1e-4, `${what} s0`, "J/(mol K)");
      }
    }
  });

  it("holds cp at its end value above the equation's limit, with h continued by it", () => {
    // src/gas/nasa7.ts clamps: the polynomial is not used outside the range it was fitted on.
    for (const name of alkanes) {
      const heatCapacity = nasaData(name);
      const top = (alkaneFits[name] as AlkaneFit).highTemperature;
      const atTop = nasa7MixtureHeatCapacity(heatCapacity, top);
      expect(nasa7MixtureHeatCapacity(heatCapacity, top + 200), name).toBe(atTop);
      const rise =
        nasa7MixtureEnthalpy(heatCapacity, top + 200) - nasa7MixtureEnthalpy(heatCapacity, top);
      expectWithin(rise / (200 * atTop) - 1, 1e-12, `${name} h above ${top} K`);
    }
  });
});
