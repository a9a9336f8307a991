/**
 * Data behind the temperature-dependent heat capacity (NASA 7-coefficient polynomials) and the
 * Peng-Robinson equation of state of the presets. Plain numbers only; src/gas/gas.ts attaches
 * them to `Gas` objects on request. docs/model.md tabulates the sources.
 *
 * Every value here but the fitted alkane polynomials (below) is FROM MEMORY (no copy of the
 * sources was at hand) and is confirmed by the closed-form checks of test/gas/gas-models.test.ts:
 * continuity of cp, h and s at the common temperature, h(298.15 K) against the enthalpy of
 * formation, cp/R = 5/2 for monatomic gases, cp near 298.15 K against the presets' own cp, and cp
 * against independent tables; and by test/gas/real-gas-reference.test.ts against the reference
 * equations of state of CoolProp 8.0.0 (their ideal-gas cp0, and Z, density, speed of sound and
 * enthalpy departure), whose measured agreement is stated beside each species.
 */

import type { SpeciesName } from "./gas-presets.js";

/** One species' NASA 7-coefficient polynomial: ranges [K] and a1..a7 of each range. */
export interface Nasa7Data {
  formula: string;
  lowTemperature: number;
  commonTemperature: number;
  highTemperature: number;
  low: readonly number[];
  high: readonly number[];
}

/**
 * NASA 7-coefficient polynomials, source: A. Burcat and B. Ruscic, Third Millennium Ideal Gas
 * and Condensed Phase Thermochemical Database for Combustion with Updates from Active
 * Thermochemical Tables, Argonne National Laboratory ANL-05/20 (2005), the "Burcat database".
 * From memory: the recalled sets are the Burcat entries as they are also reproduced in the
 * thermodynamic file of GRI-Mech 3.0 (O2, H2, CH4, CO2) and in the database itself (N2, Ar,
 * He). Argon and helium: cp/R = 5/2 exactly, a6 = -745.375 (h = 0 at 298.15 K), a7 from the
 * standard entropy.
 *
 * "Confirmed against CoolProp 8.0.0 cp0 to X %" gives the largest deviation of cp from the
 * ideal-gas part of the fluid's reference equation of state in CoolProp 8.0.0 over 200-1000 K
 * (or the equation's range), test/gas/real-gas-reference.test.ts; cp0 within 0.2 % confirms a set.
 *
 * The C2-C6 alkanes of the natural-gas preset (ethane to n-hexane) have no recalled set that
 * passes issue #5's rule (within 0.5 % of CoolProp 8.0.0 cp0 and continuous at the common
 * temperature): ethane's Burcat set passed (0.49 % at 200 K), propane (0.69 %), isobutane
 * (0.65 %) and n-butane (0.75 %, with a jump at 1000 K) did not, the recalled n-hexane set is
 * wrong and the pentanes could not be recalled (test/fixtures/real-gas, "nasa7Candidates").
 * All seven therefore carry polynomials in the NASA 7-coefficient form FITTED BY MACHNET
 * (test/fixtures/real-gas/fit-alkane-nasa7.py, output fit-alkane-nasa7.json) to the ideal-gas
 * cp0 of each fluid's reference equation of state in CoolProp 8.0.0, by least squares of the
 * relative cp deviation over 200 K to the equation's upper limit (500-675 K), in two ranges
 * that meet at 400 K with cp, h and s continuous there. They are NOT NASA or Burcat data. Above
 * the upper limit machnet holds cp at its end value (src/gas/nasa7.ts). a6 and a7 follow the
 * convention of the other species: H(298.15 K) is the standard enthalpy of formation and
 * S°(298.15 K, 1 bar) the standard entropy, both from chemicals 1.5.2 (chemicals.reaction Hfg
 * and S0g, their default source per species: ATcT, the CRC Handbook, Yaws or the NIST
 * WebBook); machnet uses only changes from 298.15 K, so these two figures move no result.
 */
export const NASA7: Partial<Record<SpeciesName, Nasa7Data>> = {
  /** From memory, confirmed against CoolProp 8.0.0 cp0 (Span et al. 2000) to 0.11 % (200-1000 K). */
  nitrogen: {
    formula: "N2",
    lowTemperature: 200,
    commonTemperature: 1000,
    highTemperature: 6000,
    low: [
      3.53100528, -1.23660988e-4, -5.02999433e-7, 2.43530612e-9, -1.40881235e-12, -1.04697628e3,
      2.96747038,
    ],
    high: [
      2.95257637, 1.3969004e-3, -4.92631603e-7, 7.86010195e-11, -4.60755204e-15, -9.23948688e2,
      5.87188762,
    ],
  },
  /** From memory, confirmed against CoolProp 8.0.0 cp0 (Schmidt and Wagner 1985) to 0.06 % (200-1000 K). */
  oxygen: {
    formula: "O2",
    lowTemperature: 200,
    commonTemperature: 1000,
    highTemperature: 3500,
    low: [
      3.78245636, -2.99673416e-3, 9.84730201e-6, -9.68129509e-9, 3.24372837e-12, -1.06394356e3,
      3.65767573,
    ],
    high: [
      3.28253784, 1.48308754e-3, -7.57966669e-7, 2.09470555e-10, -2.16717794e-14, -1.08845772e3,
      5.45323129,
    ],
  },
  /** Exact for a monatomic gas; CoolProp 8.0.0 cp0 (Tegeler et al. 1999) agrees to 6e-6 (its gas constant). */
  argon: {
    formula: "Ar",
    lowTemperature: 200,
    commonTemperature: 1000,
    highTemperature: 6000,
    low: [2.5, 0, 0, 0, 0, -745.375, 4.37967491],
    high: [2.5, 0, 0, 0, 0, -745.375, 4.37967491],
  },
  /** Exact for a monatomic gas; CoolProp 8.0.0 cp0 (Ortiz-Vega et al. 2019) agrees to 3e-7. */
  helium: {
    formula: "He",
    lowTemperature: 200,
    commonTemperature: 1000,
    highTemperature: 6000,
    low: [2.5, 0, 0, 0, 0, -745.375, 0.928723974],
    high: [2.5, 0, 0, 0, 0, -745.375, 0.928723974],
  },
  /**
   * From memory; NOT confirmed to 0.2 %: against CoolProp 8.0.0 cp0 (Leachman et al. 2009,
   * normal hydrogen) 0.92 % high at 200 K and within 0.39 % at 250-1000 K (the fit's ripple).
   */
  hydrogen: {
    formula: "H2",
    lowTemperature: 200,
    commonTemperature: 1000,
    highTemperature: 3500,
    low: [
      2.34433112, 7.98052075e-3, -1.9478151e-5, 2.01572094e-8, -7.37611761e-12, -9.17935173e2,
      6.83010238e-1,
    ],
    high: [
      3.3372792, -4.94024731e-5, 4.99456778e-7, -1.79566394e-10, 2.00255376e-14, -9.50158922e2,
      -3.20502331,
    ],
  },
  /** From memory, confirmed against CoolProp 8.0.0 cp0 (Span and Wagner 1996) to 0.14 % (216.6-1000 K). */
  "carbon-dioxide": {
    formula: "CO2",
    lowTemperature: 200,
    commonTemperature: 1000,
    highTemperature: 3500,
    low: [
      2.35677352, 8.98459677e-3, -7.12356269e-6, 2.45919022e-9, -1.43699548e-13, -4.83719697e4,
      9.90105222,
    ],
    high: [
      3.85746029, 4.41437026e-3, -2.21481404e-6, 5.23490188e-10, -4.72084164e-14, -4.8759166e4,
      2.27163806,
    ],
  },
  /**
   * From memory; NOT confirmed to 0.2 %: against CoolProp 8.0.0 cp0 (Setzmann and Wagner 1991)
   * within 0.22 % at 200-500 K and 0.46 % up to 625 K, the equation's upper limit. Above it the
   * polynomial (73.62 J/(mol K) at 1000 K), CoolProp's extrapolated cp0 (72.80) and a recalled
   * NIST-JANAF value (71.80) disagree, unresolved (docs/validation.md).
   */
  methane: {
    formula: "CH4",
    lowTemperature: 200,
    commonTemperature: 1000,
    highTemperature: 3500,
    low: [
      5.14987613, -1.36709788e-2, 4.91800599e-5, -4.84743026e-8, 1.66693956e-11, -1.02466476e4,
      -4.64130376,
    ],
    high: [
      7.4851495e-2, 1.33909467e-2, -5.73285809e-6, 1.22292535e-9, -1.0181523e-13, -9.46834459e3,
      1.8437318e1,
    ],
  },
  /**
   * NASA 7-coefficient form fitted by machnet (test/fixtures/real-gas/fit-alkane-nasa7.py) to
   * CoolProp 8.0.0 cp0 of Buecker-JPCRD-2006 (Buecker and Wagner 2006); not from the NASA or Burcat
   * databases. Largest cp deviation +0.014 % (at 200 K) over 200-675 K. H(298.15 K) -83.78 kJ/mol
   * (ATcT), S° 229.2 J/(mol K) (CRC).
   */
  ethane: {
    formula: "C2H6",
    lowTemperature: 200,
    commonTemperature: 400,
    highTemperature: 675,
    low: [
      4.934717566, -0.01053039813, 6.774077484e-5, -5.424015794e-8, -8.618127218e-12, -11566.9071,
      0.07538793278,
    ],
    high: [
      2.683314977, 0.004365132632, 4.06190233e-5, -5.821998042e-8, 2.60451216e-11, -11324.91063,
      9.639172632,
    ],
  },
  /**
   * NASA 7-coefficient form fitted by machnet (test/fixtures/real-gas/fit-alkane-nasa7.py) to
   * CoolProp 8.0.0 cp0 of Lemmon-JCED-2009 (Lemmon, McLinden and Wagner 2009); not from the NASA or
   * Burcat databases. Largest cp deviation +0.021 % (at 200 K) over 200-650 K. H(298.15 K) -104.39
   * kJ/mol (ATcT), S° 270.3 J/(mol K) (CRC).
   */
  propane: {
    formula: "C3H8",
    lowTemperature: 200,
    commonTemperature: 400,
    highTemperature: 650,
    low: [
      5.438423708, -0.008403506622, 9.075161458e-5, -7.881703539e-8, -1.152050821e-11, -14443.80401,
      0.7146371247,
    ],
    high: [
      1.881866302, 0.01576352341, 4.376661581e-5, -7.631876296e-8, 3.720823245e-11, -14067.98221,
      15.7504522,
    ],
  },
  /**
   * NASA 7-coefficient form fitted by machnet (test/fixtures/real-gas/fit-alkane-nasa7.py) to
   * CoolProp 8.0.0 cp0 of Buecker-JPCRD-2006B (Buecker and Wagner 2006); not from the NASA or
   * Burcat databases. Largest cp deviation +0.029 % (at 200 K) over 200-575 K. H(298.15 K) -135.36
   * kJ/mol (ATcT), S° 295.34 J/(mol K) (Yaws).
   */
  isobutane: {
    formula: "C4H10",
    lowTemperature: 200,
    commonTemperature: 400,
    highTemperature: 575,
    low: [
      4.525292435, 0.01516112242, 1.278976427e-5, 1.06906381e-7, -1.763098109e-10, -18544.25313,
      4.053029178,
    ],
    high: [
      0.8623362758, 0.03049223344, 3.878310941e-5, -8.461302573e-8, 4.356591408e-11, -18084.66553,
      20.46613183,
    ],
  },
  /**
   * NASA 7-coefficient form fitted by machnet (test/fixtures/real-gas/fit-alkane-nasa7.py) to
   * CoolProp 8.0.0 cp0 of Buecker-JPCRD-2006B (Buecker and Wagner 2006); not from the NASA or
   * Burcat databases. Largest cp deviation +0.033 % (at 200 K) over 200-575 K. H(298.15 K) -125.85
   * kJ/mol (ATcT), S° 304.4 J/(mol K) (Yaws).
   */
  "n-butane": {
    formula: "C4H10",
    lowTemperature: 200,
    commonTemperature: 400,
    highTemperature: 575,
    low: [
      8.295533254, -0.01842499132, 0.0001402222426, -1.249894066e-7, -1.394791405e-11, -17775.96563,
      -10.26092827,
    ],
    high: [
      2.113323602, 0.02577408288, 4.301608603e-5, -8.397988534e-8, 4.19487915e-11, -17142.21375,
      15.64381583,
    ],
  },
  /**
   * NASA 7-coefficient form fitted by machnet (test/fixtures/real-gas/fit-alkane-nasa7.py) to
   * CoolProp 8.0.0 cp0 of Lemmon-JCED-2006 (Lemmon and Span 2006); not from the NASA or Burcat
   * databases. Largest cp deviation +0.006 % (at 200 K) over 200-500 K. H(298.15 K) -153.60 kJ/mol
   * (CRC), S° 343.89 J/(mol K) (Yaws).
   */
  isopentane: {
    formula: "C5H12",
    lowTemperature: 200,
    commonTemperature: 400,
    highTemperature: 500,
    low: [
      1.4009865, 0.04891546699, -4.178874966e-5, 1.127916832e-7, -1.215800659e-10, -20862.01851,
      19.89515185,
    ],
    high: [
      -3.911115839, 0.08740801214, -0.0001316888859, 1.712552889e-7, -9.980524902e-11, -20317.47351,
      42.13083511,
    ],
  },
  /**
   * NASA 7-coefficient form fitted by machnet (test/fixtures/real-gas/fit-alkane-nasa7.py) to
   * CoolProp 8.0.0 cp0 of Thol-FPE-2019-alkanes-pentane (Thol et al. 2019); not from the NASA or
   * Burcat databases. Largest cp deviation +0.004 % (at 200 K) over 200-650 K. H(298.15 K) -146.90
   * kJ/mol (CRC), S° 347.82 J/(mol K) (NIST WebBook).
   */
  "n-pentane": {
    formula: "C5H12",
    lowTemperature: 200,
    commonTemperature: 400,
    highTemperature: 650,
    low: [
      14.93572307, -0.08660308838, 0.0004851019445, -8.260418908e-7, 5.19285765e-10, -21170.35004,
      -32.73323829,
    ],
    high: [
      5.768073716, 0.009645569284, 0.000102801145, -1.457268402e-7, 6.210416228e-11, -20465.14092,
      2.6915832,
    ],
  },
  /**
   * NASA 7-coefficient form fitted by machnet (test/fixtures/real-gas/fit-alkane-nasa7.py) to
   * CoolProp 8.0.0 cp0 of Thol-FPE-2019-alkanes-hexane (Thol et al. 2019); not from the NASA or
   * Burcat databases. Largest cp deviation +0.036 % (at 200 K) over 200-600 K. H(298.15 K) -166.94
   * kJ/mol (ATcT), S° 388.82 J/(mol K) (NIST WebBook).
   */
  "n-hexane": {
    formula: "C6H14",
    lowTemperature: 200,
    commonTemperature: 400,
    highTemperature: 600,
    low: [
      19.4323303, -0.115636829, 0.000580980465, -8.615313816e-7, 4.305165258e-10, -24365.92055,
      -48.53810415,
    ],
    high: [
      0.9029382224, 0.047260592, 5.508797418e-5, -1.319503601e-7, 7.192421458e-11, -22701.83908,
      26.12311809,
    ],
  },
};

/** Critical constants and acentric factor of one species. */
export interface CriticalData {
  /** Tc [K]. */
  criticalTemperature: number;
  /** pc [Pa]. */
  criticalPressure: number;
  /** omega [-]. */
  acentricFactor: number;
}

const BAR = 1e5;

/**
 * Critical constants and acentric factors, source: B. E. Poling, J. M. Prausnitz and
 * J. P. O'Connell, The Properties of Gases and Liquids, 5th ed., McGraw-Hill 2001, Appendix A
 * (Tc in K, pc in bar, omega). From memory, confirmed against the critical points and acentric
 * factors of the reference equations in CoolProp 8.0.0 (test/gas/real-gas-reference.test.ts:
 * Tc within 0.14 %, pc within 1.3 % (hydrogen; the others 0.72 %), omega within 0.0065 (helium)),
 * which also checks the compressibility they give.
 */
export const CRITICAL: Partial<Record<SpeciesName, CriticalData>> = {
  nitrogen: critical(126.2, 33.98, 0.037),
  oxygen: critical(154.58, 50.43, 0.022),
  argon: critical(150.86, 48.98, -0.002),
  helium: critical(5.19, 2.27, -0.39),
  hydrogen: critical(33.19, 13.13, -0.216),
  "carbon-dioxide": critical(304.12, 73.74, 0.225),
  methane: critical(190.56, 45.99, 0.011),
  ethane: critical(305.32, 48.72, 0.099),
  propane: critical(369.83, 42.48, 0.152),
  isobutane: critical(407.85, 36.4, 0.186),
  "n-butane": critical(425.12, 37.96, 0.2),
  isopentane: critical(460.39, 33.81, 0.229),
  "n-pentane": critical(469.7, 33.7, 0.252),
  "n-hexane": critical(507.6, 30.25, 0.3),
};

function critical(temperature: number, pressureBar: number, acentricFactor: number): CriticalData {
  return {
    criticalTemperature: temperature,
    criticalPressure: pressureBar * BAR,
    acentricFactor,
  };
}

/**
 * Dry air as a mixture for the temperature-dependent and real-gas models: the composition of
 * ISO 2533:1975 Table 1 (mole percent N2 78.084, O2 20.9476, Ar 0.934, CO2 0.0314; the
 * remaining 0.0030 % of Ne, He, Kr, H2... are left out and the four are divided by their sum).
 * From memory; the molar mass it gives, 28.9648 g/mol, agrees with ISO 2533's 28.96442 within
 * 2.3e-5 relative (checked in test/gas/gas-models.test.ts), and its NASA cp agrees with the
 * ideal-gas cp0 of the Lemmon et al. (2000) air equation in CoolProp 8.0.0 to 0.08 % at
 * 200-1000 K (test/gas/real-gas-reference.test.ts). The air preset's own molar mass
 * and reference cp are kept: only the cp(T) shape and the equation of state come from this.
 */
export const AIR_COMPOSITION: readonly { species: SpeciesName; molePercent: number }[] = [
  { species: "nitrogen", molePercent: 78.084 },
  { species: "oxygen", molePercent: 20.9476 },
  { species: "argon", molePercent: 0.934 },
  { species: "carbon-dioxide", molePercent: 0.0314 },
];
