/**
 * The Peng-Robinson (1976) equation of state for a gas or gas mixture: mixture parameters,
 * the cubic in Z with the choice of its root, the departure functions and the partial
 * derivatives that src/gas/thermo.ts turns into a {@link ThermoState}. Molar quantities, SI.
 * Pure functions, no allocation (they run inside pipe integrations).
 *
 * Source for every relation here: D.-Y. Peng and D. B. Robinson, A New Two-Constant Equation
 * of State, Ind. Eng. Chem. Fundam. 15, 59-64 (1976), eq. 4-18; the departure functions are
 * the standard residual-property integrals of the same equation (e.g. B. E. Poling, J. M.
 * Prausnitz and J. P. O'Connell, The Properties of Gases and Liquids, 5th ed., McGraw-Hill
 * 2001, ch. 6, Table 6-3). docs/model.md derives them.
 */

import type { PengRobinsonEquationOfState } from "./gas-types.js";

/** Molar gas constant [J/(mol K)], CODATA 2018 (as in gas.ts; repeated to keep this file a leaf). */
const RU = 8.314462618;

/** Omega_a and Omega_b of Peng and Robinson (1976), eq. 9 and 10. */
const OMEGA_A = 0.45724;
const OMEGA_B = 0.0778;

/** a/(b Ru T) at the critical point of the equation: a larger value is a subcritical isotherm. */
const CRITICAL_ATTRACTION_RATIO = OMEGA_A / OMEGA_B;

/** Critical molar volume over b, Zc/Omega_b with Zc = 0.3074 (Peng and Robinson 1976). */
const CRITICAL_VOLUME_OVER_B = 0.3074 / OMEGA_B;

const SQRT2 = Math.SQRT2;

/** The Peng-Robinson state at (p, T), molar and SI, filled in place. */
export interface PengRobinsonValues {
  /** v [m3/mol] of the root chosen (see {@link pengRobinsonState}). */
  molarVolume: number;
  /** Z = p v / (Ru T) [-]. */
  compressibility: number;
  /** H - H_ideal at the same T [J/mol]. */
  enthalpyDeparture: number;
  /** Cv - Cv_ideal at the same T [J/(mol K)]. */
  heatCapacityCvDeparture: number;
  /** (dp/dT) at constant v [Pa/K]. */
  pressureTemperatureSlope: number;
  /** (dp/dv) at constant T [Pa mol/m3], negative on a stable branch. */
  pressureVolumeSlope: number;
  /** True when the gas would condense here (see {@link pengRobinsonState}). */
  condensing: boolean;
  /** One-fluid a(T) [Pa m6/mol2]. */
  attraction: number;
  /** da/dT [Pa m6/(mol2 K)]. */
  attractionSlope: number;
  /** d2a/dT2 [Pa m6/(mol2 K2)]. */
  attractionCurvature: number;
  /** One-fluid b [m3/mol]. */
  covolume: number;
}

/** A fresh record for {@link pengRobinsonState}. */
export function emptyPengRobinsonValues(): PengRobinsonValues {
  return {
    molarVolume: 0,
    compressibility: 1,
    enthalpyDeparture: 0,
    heatCapacityCvDeparture: 0,
    pressureTemperatureSlope: 0,
    pressureVolumeSlope: 0,
    condensing: false,
    attraction: 0,
    attractionSlope: 0,
    attractionCurvature: 0,
    covolume: 0,
  };
}

/**
 * kappa of Peng and Robinson (1976), eq. 18: kappa = 0.37464 + 1.54226 omega - 0.26992 omega^2.
 *
 * @param acentricFactor - omega [-]; fitted for 0 < omega < 0.5 (used as is outside)
 * @returns kappa [-]
 * @remarks Source: D.-Y. Peng and D. B. Robinson, Ind. Eng. Chem. Fundam. 15, 59 (1976),
 *   eq. 18. (The later 1978 form for omega > 0.49 is not used.)
 * @example pengRobinsonKappa(0.011) // 0.39157 (methane)
 */
export function pengRobinsonKappa(acentricFactor: number): number {
  return 0.37464 + acentricFactor * (1.54226 - 0.26992 * acentricFactor);
}

/**
 * a(T), its first two temperature derivatives and b of the mixture, by the van der Waals
 * one-fluid rules a = sum_i sum_j x_i x_j (1 - k_ij) (a_i a_j)^0.5, b = sum_i x_i b_i, with
 * a_i = 0.45724 Ru^2 Tc^2/pc [1 + kappa (1 - (T/Tc)^0.5)]^2 and b_i = 0.07780 Ru Tc/pc.
 * With s_i = 1 + kappa_i (1 - (T/Tc_i)^0.5), (a_i a_j)^0.5 = (ac_i ac_j)^0.5 s_i s_j, whose
 * derivatives are taken analytically.
 */
function mixtureParameters(
  eos: PengRobinsonEquationOfState,
  temperature: number,
  out: PengRobinsonValues,
): void {
  const components = eos.components;
  const interaction = eos.binaryInteraction;
  let a = 0;
  let aSlope = 0;
  let aCurvature = 0;
  let b = 0;
  for (let i = 0; i < components.length; i++) {
    const ci = components[i] as (typeof components)[number];
    const xi = ci.moleFraction;
    const tci = ci.criticalTemperature;
    const pci = ci.criticalPressure;
    b += (xi * OMEGA_B * RU * tci) / pci;
    const aci = (OMEGA_A * RU * RU * tci * tci) / pci;
    const ki = pengRobinsonKappa(ci.acentricFactor);
    const rooti = Math.sqrt(temperature / tci);
    const si = 1 + ki * (1 - rooti);
    const si1 = -ki / (2 * Math.sqrt(temperature * tci));
    const si2 = ki / (4 * temperature * Math.sqrt(temperature * tci));
    for (let j = 0; j < components.length; j++) {
      const cj = components[j] as (typeof components)[number];
      const tcj = cj.criticalTemperature;
      const acj = (OMEGA_A * RU * RU * tcj * tcj) / cj.criticalPressure;
      const kj = pengRobinsonKappa(cj.acentricFactor);
      const sj = 1 + kj * (1 - Math.sqrt(temperature / tcj));
      const sj1 = -kj / (2 * Math.sqrt(temperature * tcj));
      const sj2 = kj / (4 * temperature * Math.sqrt(temperature * tcj));
      const kij = interaction === undefined ? 0 : (interaction[i]?.[j] ?? 0);
      const weight = xi * cj.moleFraction * (1 - kij) * Math.sqrt(aci * acj);
      a += weight * si * sj;
      aSlope += weight * (si1 * sj + si * sj1);
      aCurvature += weight * (si2 * sj + 2 * si1 * sj1 + si * sj2);
    }
  }
  out.attraction = a;
  out.attractionSlope = aSlope;
  out.attractionCurvature = aCurvature;
  out.covolume = b;
}

/** Value of Z^3 + c2 Z^2 + c1 Z + c0 and its derivative, for Newton polishing. */
function polishRoot(z: number, c2: number, c1: number, c0: number): number {
  let root = z;
  for (let iteration = 0; iteration < 3; iteration++) {
    const value = ((root + c2) * root + c1) * root + c0;
    const slope = (3 * root + 2 * c2) * root + c1;
    if (slope === 0) break;
    root -= value / slope;
  }
  return root;
}

/**
 * Residual molar Gibbs energy over Ru T of the one-fluid at a root Z: ln phi = Z - 1 -
 * ln(Z - B) - A/(2 sqrt2 B) ln[(Z + (1 + sqrt2) B)/(Z + (1 - sqrt2) B)]. The root with the
 * smaller value is the stable one.
 */
function residualGibbs(z: number, attraction: number, covolume: number): number {
  return (
    z -
    1 -
    Math.log(z - covolume) -
    (attraction / (2 * SQRT2 * covolume)) *
      Math.log((z + (1 + SQRT2) * covolume) / (z + (1 - SQRT2) * covolume))
  );
}

/**
 * The Peng-Robinson state of a gas at (p, T): compressibility, enthalpy and Cv departures and
 * the slopes (dp/dT)_v and (dp/dv)_T, from which every derived property follows.
 *
 * p = Ru T/(v - b) - a(T)/(v^2 + 2 b v - b^2), solved as the cubic
 * Z^3 - (1 - B) Z^2 + (A - 3B^2 - 2B) Z - (A B - B^2 - B^3) = 0, A = a p/(Ru T)^2, B = b p/(Ru T);
 * H - H_ig = p v - Ru T + (T a' - a)/(2 sqrt2 b) L;  Cv - Cv_ig = T a''/(2 sqrt2 b) L,
 * L = ln[(v + (1 + sqrt2) b)/(v + (1 - sqrt2) b)];
 * (dp/dT)_v = Ru/(v - b) - a'/(v^2 + 2bv - b^2);  (dp/dv)_T = -Ru T/(v - b)^2 + 2 a (v + b)/(v^2 + 2bv - b^2)^2.
 *
 * Choice of root: the cubic is solved in closed form (Cardano or the trigonometric form) and
 * each root polished by Newton steps. With one real root above B, that root is used. With
 * three, the largest (vapour-like) root is used. `condensing` is set when the gas would not be
 * a gas here: with three roots when the smallest (liquid-like) root has the lower residual
 * Gibbs energy of the two (the state lies beyond the one-fluid's saturation curve); with one
 * root when the one-fluid is subcritical at T (a/(b Ru T) > Omega_a/Omega_b) and the root is on
 * the liquid side (v < v_c = 0.3074/0.0778 b). For a mixture this compares the one-fluid's own
 * branches: it finds states where the mixture as a whole would be liquid, not the dew point
 * where a first drop forms (that needs a phase-equilibrium calculation, not done here).
 *
 * @param eos - the equation-of-state data (components with Tc [K], pc [Pa], omega [-], x [-])
 * @param pressure - absolute p [Pa], > 0
 * @param temperature - T [K], > 0
 * @param out - the record to fill
 * @returns `out`
 * @remarks Source: Peng and Robinson (1976), eq. 4-18 (the 1976 kappa polynomial, fitted for
 *   omega 0 to 0.5). Accuracy for Z of light non-polar gases about 1-2 % away from the
 *   critical point; poor for the quantum gases H2 and He at low T (docs/model.md).
 */
export function pengRobinsonState(
  eos: PengRobinsonEquationOfState,
  pressure: number,
  temperature: number,
  out: PengRobinsonValues,
): PengRobinsonValues {
  mixtureParameters(eos, temperature, out);
  const a = out.attraction;
  const aSlope = out.attractionSlope;
  const aCurvature = out.attractionCurvature;
  const b = out.covolume;
  const rt = RU * temperature;
  const attraction = (a * pressure) / (rt * rt);
  const covolume = (b * pressure) / rt;
  const c2 = -(1 - covolume);
  const c1 = attraction - 3 * covolume * covolume - 2 * covolume;
  const c0 = -(attraction * covolume - covolume * covolume - covolume * covolume * covolume);

  // Depressed cubic t^3 + p t + q = 0 with Z = t - c2/3.
  const shift = c2 / 3;
  const pDepressed = c1 - (c2 * c2) / 3;
  const qDepressed = (2 * c2 * c2 * c2) / 27 - (c2 * c1) / 3 + c0;
  const discriminant = (qDepressed * qDepressed) / 4 + (pDepressed * pDepressed * pDepressed) / 27;
  let largest: number;
  let smallest: number;
  if (discriminant > 0) {
    const root = Math.sqrt(discriminant);
    const t = Math.cbrt(-qDepressed / 2 + root) + Math.cbrt(-qDepressed / 2 - root);
    largest = polishRoot(t - shift, c2, c1, c0);
    smallest = largest;
  } else {
    const radius = 2 * Math.sqrt(-pDepressed / 3);
    const cosine = pDepressed === 0 ? 0 : (3 * qDepressed) / (pDepressed * radius);
    const angle = Math.acos(Math.min(1, Math.max(-1, cosine))) / 3;
    const r0 = radius * Math.cos(angle) - shift;
    const r2 = radius * Math.cos(angle - (4 * Math.PI) / 3) - shift;
    largest = polishRoot(r0, c2, c1, c0);
    smallest = polishRoot(r2, c2, c1, c0);
    if (!(smallest > covolume)) smallest = largest;
  }
  let z = largest;
  let condensing = false;
  if (smallest !== largest && smallest < largest) {
    condensing =
      residualGibbs(smallest, attraction, covolume) < residualGibbs(largest, attraction, covolume);
  } else if (a / (b * rt) > CRITICAL_ATTRACTION_RATIO) {
    condensing = (z * rt) / pressure < CRITICAL_VOLUME_OVER_B * b;
  }
  if (!(z > covolume)) z = covolume * (1 + 1e-12);

  const v = (z * rt) / pressure;
  const denominator = v * v + 2 * b * v - b * b;
  const logTerm = Math.log((v + (1 + SQRT2) * b) / (v + (1 - SQRT2) * b));
  out.molarVolume = v;
  out.compressibility = z;
  out.enthalpyDeparture =
    pressure * v - rt + ((temperature * aSlope - a) / (2 * SQRT2 * b)) * logTerm;
  out.heatCapacityCvDeparture = ((temperature * aCurvature) / (2 * SQRT2 * b)) * logTerm;
  out.pressureTemperatureSlope = RU / (v - b) - aSlope / denominator;
  out.pressureVolumeSlope =
    -rt / ((v - b) * (v - b)) + (2 * a * (v + b)) / (denominator * denominator);
  out.condensing = condensing;
  return out;
}
