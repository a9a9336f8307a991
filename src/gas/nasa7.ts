/**
 * Ideal-gas heat capacity, enthalpy and entropy from NASA 7-coefficient polynomials, for one
 * species and for an ideal mixture of species. Pure functions, no allocation (they run inside
 * pipe integrations).
 */

import type { Nasa7HeatCapacity, Nasa7Species } from "./gas-types.js";

/** Reference temperature of the sensible enthalpy [K]. */
const REFERENCE_TEMPERATURE = 298.15;

/** The coefficients a1..a7 that apply at T (the low range up to the common temperature). */
function coefficientsAt(species: Nasa7Species, temperature: number): readonly number[] {
  return temperature <= species.commonTemperature
    ? species.lowCoefficients
    : species.highCoefficients;
}

/**
 * Dimensionless molar heat capacity Cp/Ru of one species by its NASA 7-coefficient polynomial.
 *
 * Cp/Ru = a1 + a2 T + a3 T^2 + a4 T^3 + a5 T^4
 *
 * @param species - the species' data
 * @param temperature - T [K], inside [lowTemperature, highTemperature] (outside, the
 *   polynomial is extrapolated: callers clamp, see {@link nasa7MixtureProperties})
 * @returns Cp/Ru [-]
 * @remarks Source: B. J. McBride, M. J. Zehe and S. Gordon, NASA Glenn Coefficients for
 *   Calculating Thermodynamic Properties of Individual Species, NASA TP-2002-211556 (2002),
 *   eq. 1-3 (the 7-coefficient form of the older NASA SP-273). Valid over the fitted ranges.
 */
export function nasa7HeatCapacity(species: Nasa7Species, temperature: number): number {
  const a = coefficientsAt(species, temperature);
  const t = temperature;
  return (
    (a[0] as number) +
    t * ((a[1] as number) + t * ((a[2] as number) + t * ((a[3] as number) + t * (a[4] as number))))
  );
}

/**
 * Dimensionless absolute molar enthalpy H/(Ru T) of one species (formation enthalpy included):
 * H/(Ru T) = a1 + a2 T/2 + a3 T^2/3 + a4 T^3/4 + a5 T^4/5 + a6/T.
 *
 * @param species - the species' data
 * @param temperature - T [K]
 * @returns H/(Ru T) [-]; at 298.15 K, H is the standard enthalpy of formation
 * @remarks Source: McBride, Zehe and Gordon, NASA TP-2002-211556, eq. 2.
 */
export function nasa7Enthalpy(species: Nasa7Species, temperature: number): number {
  const a = coefficientsAt(species, temperature);
  const t = temperature;
  return (
    (a[0] as number) +
    t *
      ((a[1] as number) / 2 +
        t * ((a[2] as number) / 3 + t * ((a[3] as number) / 4 + (t * (a[4] as number)) / 5))) +
    (a[5] as number) / t
  );
}

/**
 * Dimensionless standard molar entropy S°/Ru of one species at 1 bar:
 * S°/Ru = a1 ln T + a2 T + a3 T^2/2 + a4 T^3/3 + a5 T^4/4 + a7.
 *
 * @param species - the species' data
 * @param temperature - T [K]
 * @returns S°/Ru [-]
 * @remarks Source: McBride, Zehe and Gordon, NASA TP-2002-211556, eq. 3.
 */
export function nasa7Entropy(species: Nasa7Species, temperature: number): number {
  const a = coefficientsAt(species, temperature);
  const t = temperature;
  return (
    (a[0] as number) * Math.log(t) +
    t *
      ((a[1] as number) +
        t * ((a[2] as number) / 2 + t * ((a[3] as number) / 3 + (t * (a[4] as number)) / 4))) +
    (a[6] as number)
  );
}

/** Molar sensible enthalpy H(T) - H(298.15 K) over Ru [K], inside the fitted range. */
function sensibleEnthalpyOverR(species: Nasa7Species, temperature: number): number {
  return (
    nasa7Enthalpy(species, temperature) * temperature -
    nasa7Enthalpy(species, REFERENCE_TEMPERATURE) * REFERENCE_TEMPERATURE
  );
}

/** T clamped to a species' fitted range [K]. */
function clampedTemperature(species: Nasa7Species, temperature: number): number {
  return Math.min(Math.max(temperature, species.lowTemperature), species.highTemperature);
}

/**
 * Ideal-mixture molar heat capacity over Ru: Cp/Ru = sum x_i Cp_i/Ru.
 *
 * Outside a species' fitted range its cp is held at the value at the nearer end of the range
 * (the polynomials are not meant to be extrapolated); {@link nasa7MixtureEnthalpy} continues
 * h with that cp, so cp and h stay continuous and h monotonic.
 *
 * @param heatCapacity - the species and their mole fractions
 * @param temperature - T [K], > 0
 * @returns Cp/Ru [-]
 * @remarks Ideal mixing (Gibbs-Dalton): no heat of mixing. Source: Y. A. Cengel and M. A.
 *   Boles, Thermodynamics: An Engineering Approach, McGraw-Hill, chapter "Gas mixtures";
 *   polynomials: McBride, Zehe and Gordon, NASA TP-2002-211556, eq. 1.
 */
export function nasa7MixtureHeatCapacity(
  heatCapacity: Nasa7HeatCapacity,
  temperature: number,
): number {
  let cp = 0;
  for (const species of heatCapacity.species) {
    cp +=
      species.moleFraction * nasa7HeatCapacity(species, clampedTemperature(species, temperature));
  }
  return cp;
}

/**
 * Ideal-mixture molar sensible enthalpy over Ru, zero at 298.15 K:
 * H/Ru = sum x_i (H_i(T) - H_i(298.15 K))/Ru, continued linearly outside a species' range with
 * the cp at the range's end (see {@link nasa7MixtureHeatCapacity}).
 *
 * @param heatCapacity - the species and their mole fractions
 * @param temperature - T [K], > 0
 * @returns (H - H(298.15 K))/Ru [K]
 * @remarks Source: McBride, Zehe and Gordon, NASA TP-2002-211556, eq. 2; ideal mixing.
 */
export function nasa7MixtureEnthalpy(heatCapacity: Nasa7HeatCapacity, temperature: number): number {
  let h = 0;
  for (const species of heatCapacity.species) {
    const clamped = clampedTemperature(species, temperature);
    const cp = nasa7HeatCapacity(species, clamped);
    h +=
      species.moleFraction *
      (sensibleEnthalpyOverR(species, clamped) + cp * (temperature - clamped));
  }
  return h;
}
