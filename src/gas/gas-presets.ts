/**
 * Data behind the gas presets: molar mass, heat capacity at 298.15 K and Sutherland constants
 * for each species, each with its source. Plain numbers only; src/gas/gas.ts turns them into
 * `Gas` objects. docs/model.md (gas section) tabulates the same values.
 *
 * "From memory" marks a value recalled rather than read from the source named; every such
 * value is checked in test/gas/gas.test.ts against an independent reference.
 */

import type { SutherlandViscosity } from "./gas-types.js";

/**
 * Standard atomic weights [g/mol], IUPAC CIAAW 2021 (abridged / conventional values for the
 * elements whose standard atomic weight is an interval: H, C, N, O, Ar). He is the full value
 * 4.002602. From memory; test/gas/gas.test.ts checks each species' molar mass against the
 * element table of the chemicals 1.5.2 library within 1e-4.
 */
const ATOMIC_WEIGHT = { H: 1.008, He: 4.002602, C: 12.011, N: 14.007, O: 15.999, Ar: 39.95 };

type Element = keyof typeof ATOMIC_WEIGHT;

/** Molar mass [kg/mol] of a formula given as element counts, e.g. { C: 1, H: 4 }. */
function formulaMass(formula: Partial<Record<Element, number>>): number {
  let gramsPerMole = 0;
  for (const element of Object.keys(formula) as Element[]) {
    gramsPerMole += ATOMIC_WEIGHT[element] * (formula[element] ?? 0);
  }
  return gramsPerMole / 1000;
}

/** Sutherland law data in the units the sources print. */
function sutherland(
  referenceViscosityMicroPaS: number,
  referenceTemperature: number,
  sutherlandConstant: number,
): SutherlandViscosity {
  return {
    kind: "sutherland",
    referenceViscosity: referenceViscosityMicroPaS * 1e-6,
    referenceTemperature,
    sutherlandConstant,
  };
}

/**
 * One species. The heat capacity is given either as gamma itself (air by convention, monatomic
 * gases by kinetic theory) or as the ideal-gas molar cp at 298.15 K, from which gas.ts derives
 * gamma = Cp / (Cp - Ru).
 */
export interface SpeciesData {
  /** M [kg/mol]. */
  molarMass: number;
  heat: { heatCapacityRatio: number } | { molarHeatCapacity: number };
  /** Viscosity law (a fresh copy is made for every preset built). */
  viscosity: SutherlandViscosity;
}

/** Fahrenheit-scale (Rankine) reference temperatures of Crane TP-410, converted to K. */
const RANKINE = 5 / 9;

/**
 * Sutherland constants marked "fit" were fitted here (T0 = 273.15 K) to Perry's Chemical
 * Engineers' Handbook, 8th ed., Table 2-312 (DIPPR eq. 102 coefficients, as reproduced in the
 * chemicals 1.5.2 library) over 250-550 K by test/fixtures/gas/make-gas-reference.py; the tests
 * check them against the VDI Heat Atlas PPDS data, which the fit did not use.
 */
export const SPECIES = {
  /**
   * M 28.96442 g/mol: ISO 2533:1975 Standard Atmosphere (also U.S. Standard Atmosphere 1976).
   * gamma 1.4: project convention (ISO 2533 uses kappa = 1.4).
   * Viscosity: U.S. Standard Atmosphere 1976, eq. 51, mu = beta T^1.5 / (T + S),
   * beta = 1.458e-6 kg/(m s K^0.5), S = 110.4 K (ISO 2533 uses the same law), written here with
   * T0 = 288.15 K and mu0 = beta T0^1.5 / (T0 + S) = 1.7894e-5 Pa s.
   */
  air: {
    molarMass: 0.02896442,
    heat: { heatCapacityRatio: 1.4 },
    viscosity: {
      kind: "sutherland",
      referenceViscosity: (1.458e-6 * 288.15 ** 1.5) / (288.15 + 110.4),
      referenceTemperature: 288.15,
      sutherlandConstant: 110.4,
    },
  },
  /**
   * Cp 29.124 J/(mol K): NIST-JANAF Thermochemical Tables, 4th ed. (1998), N2 at 298.15 K (from
   * memory). Viscosity: Crane Technical Paper 410, Sutherland constants (mu0 17.81 uPa s at
   * 540.99 degR = 300.55 K, S 111 K), as quoted in PRACTICE.md 7.7.
   */
  nitrogen: {
    molarMass: formulaMass({ N: 2 }),
    heat: { molarHeatCapacity: 29.124 },
    viscosity: sutherland(17.81, 540.99 * RANKINE, 111),
  },
  /**
   * Cp 29.376 J/(mol K): NIST-JANAF 4th ed., O2 at 298.15 K (from memory). Viscosity:
   * F. M. White, Viscous Fluid Flow, 3rd ed., McGraw-Hill 2006, Table 1-2 (mu0 19.19 uPa s at
   * 273 K, S 139 K; from memory).
   */
  oxygen: {
    molarMass: formulaMass({ O: 2 }),
    heat: { molarHeatCapacity: 29.376 },
    viscosity: sutherland(19.19, 273, 139),
  },
  /**
   * gamma 5/3: monatomic ideal gas, kinetic theory (cp = 5/2 Ru). Viscosity: White, Viscous
   * Fluid Flow, 3rd ed., Table 1-2 (mu0 21.25 uPa s at 273 K, S 144 K; from memory).
   */
  argon: {
    molarMass: formulaMass({ Ar: 1 }),
    heat: { heatCapacityRatio: 5 / 3 },
    viscosity: sutherland(21.25, 273, 144),
  },
  /** gamma 5/3: monatomic (kinetic theory). Viscosity: fit (see above), 18.638 uPa s, 87.6 K. */
  helium: {
    molarMass: formulaMass({ He: 1 }),
    heat: { heatCapacityRatio: 5 / 3 },
    viscosity: sutherland(18.638, 273.15, 87.6),
  },
  /**
   * Cp 28.836 J/(mol K): NIST-JANAF 4th ed., H2 (normal) at 298.15 K (from memory). Viscosity:
   * fit (see above), 8.36 uPa s, 84.4 K.
   */
  hydrogen: {
    molarMass: formulaMass({ H: 2 }),
    heat: { molarHeatCapacity: 28.836 },
    viscosity: sutherland(8.36, 273.15, 84.4),
  },
  /**
   * Cp 37.135 J/(mol K): Burcat thermochemical database NASA 7-coefficient polynomial at
   * 298.15 K (PRACTICE.md 7.8, HB/CALC). Viscosity: Crane TP-410 (mu0 14.80 uPa s at
   * 527.67 degR = 293.15 K, S 240 K), as quoted in PRACTICE.md 7.7.
   */
  "carbon-dioxide": {
    molarMass: formulaMass({ C: 1, O: 2 }),
    heat: { molarHeatCapacity: 37.135 },
    viscosity: sutherland(14.8, 527.67 * RANKINE, 240),
  },
  /**
   * Cp 35.691 J/(mol K): Burcat database polynomial at 298.15 K (PRACTICE.md 7.8, HB/CALC).
   * Viscosity: fit (see above), 10.368 uPa s, 168.6 K.
   */
  methane: {
    molarMass: formulaMass({ C: 1, H: 4 }),
    heat: { molarHeatCapacity: 35.691 },
    viscosity: sutherland(10.368, 273.15, 168.6),
  },
  /*
   * Natural-gas components below (internal, not presets). Cp: B. E. Poling, J. M. Prausnitz,
   * J. P. O'Connell, The Properties of Gases and Liquids, 5th ed., McGraw-Hill 2001, Appendix A
   * (ideal-gas CPIG at 298.15 K), as reproduced in chemicals 1.5.2 (Cp_data_Poling).
   * Viscosity: fit (see above).
   */
  ethane: {
    molarMass: formulaMass({ C: 2, H: 6 }),
    heat: { molarHeatCapacity: 52.47 },
    viscosity: sutherland(8.608, 273.15, 239.3),
  },
  propane: {
    molarMass: formulaMass({ C: 3, H: 8 }),
    heat: { molarHeatCapacity: 73.6 },
    viscosity: sutherland(7.656, 273.15, 251.4),
  },
  isobutane: {
    molarMass: formulaMass({ C: 4, H: 10 }),
    heat: { molarHeatCapacity: 96.65 },
    viscosity: sutherland(6.9, 273.15, 296.3),
  },
  "n-butane": {
    molarMass: formulaMass({ C: 4, H: 10 }),
    heat: { molarHeatCapacity: 98.49 },
    viscosity: sutherland(6.898, 273.15, 302.9),
  },
  isopentane: {
    molarMass: formulaMass({ C: 5, H: 12 }),
    heat: { molarHeatCapacity: 118.97 },
    viscosity: sutherland(6.281, 273.15, 395.4),
  },
  "n-pentane": {
    molarMass: formulaMass({ C: 5, H: 12 }),
    heat: { molarHeatCapacity: 120.04 },
    viscosity: sutherland(6.366, 273.15, 305.8),
  },
  "n-hexane": {
    molarMass: formulaMass({ C: 6, H: 14 }),
    heat: { molarHeatCapacity: 142.59 },
    viscosity: sutherland(5.875, 273.15, 381.6),
  },
} satisfies Record<string, SpeciesData>;

/** A species that has data above. */
export type SpeciesName = keyof typeof SPECIES;

/**
 * The natural-gas preset: the "Gulf Coast" test gas of AGA Report No. 8 (American Gas
 * Association, Compressibility Factors of Natural Gas and Other Related Hydrocarbon Gases,
 * 2nd ed., 1994), mole percent, from memory (the ten figures sum to exactly 100.0000, which
 * supports the recollection). A typical lean pipeline gas: 96.5 % methane.
 */
export const NATURAL_GAS_COMPOSITION: readonly { species: SpeciesName; molePercent: number }[] = [
  { species: "methane", molePercent: 96.5222 },
  { species: "nitrogen", molePercent: 0.2595 },
  { species: "carbon-dioxide", molePercent: 0.5956 },
  { species: "ethane", molePercent: 1.8186 },
  { species: "propane", molePercent: 0.4596 },
  { species: "isobutane", molePercent: 0.0977 },
  { species: "n-butane", molePercent: 0.1007 },
  { species: "isopentane", molePercent: 0.0473 },
  { species: "n-pentane", molePercent: 0.0324 },
  { species: "n-hexane", molePercent: 0.0664 },
];
