/**
 * Named reference states for "normal" and "standard" volumetric gas flow, and the ideal-gas
 * density of a gas at such a state.
 *
 * Written by hand: no unit library covers reference-state volumes, because a normal or standard
 * cubic metre is an amount of gas, not a volume. unitmath only converts the plain units the
 * states are quoted in (60 degF, 14.696 psia) to SI.
 */

import { MOLAR_GAS_CONSTANT } from "../gas/gas.js";
import { convertUnit } from "./unit-text.js";

/** The names of the reference states machnet reads volumetric flows at. */
export type ReferenceConditionName = "normal" | "standard" | "usStandard";

/** A reference state for volumetric gas flow. */
export interface ReferenceCondition {
  /** Key in {@link REFERENCE_CONDITIONS}. */
  readonly name: ReferenceConditionName;
  /** Reference temperature T_ref [K]. */
  readonly temperature: number;
  /** Reference pressure p_ref [Pa], absolute. */
  readonly pressure: number;
  /** The standard or practice that defines the state. */
  readonly standard: string;
  /** Volume-flow units that refer to this state, as written in an input document. */
  readonly units: readonly string[];
}

/**
 * The three reference states machnet reads:
 * - `normal`: 273.15 K (0 degC), 101325 Pa, dry gas; DIN 1343 ("Normzustand"). Units Nm3/h,
 *   Nm3/min, Nm3/s, Nm3/d, NL/min.
 * - `standard`: 288.15 K (15 degC), 101325 Pa, dry gas; ISO 13443 standard reference conditions
 *   (also the sea-level state of the ISO 2533 standard atmosphere). Units Sm3/h, Sm3/min, Sm3/s,
 *   Sm3/d.
 * - `usStandard`: 60 degF (288.705556 K), 14.696 psia (101325.353 Pa); US common practice for
 *   scf, no single standard behind it (natural-gas contracts often use 14.73 psia instead).
 *   Units scfm, scfh, scfd, MMscfd.
 */
export const REFERENCE_CONDITIONS: Readonly<Record<ReferenceConditionName, ReferenceCondition>> =
  Object.freeze({
    normal: Object.freeze({
      name: "normal",
      temperature: convertUnit(0, "degC", "K"),
      pressure: convertUnit(101.325, "kPa", "Pa"),
      standard: "DIN 1343",
      units: Object.freeze(["Nm3/h", "Nm3/min", "Nm3/s", "Nm3/d", "NL/min"]),
    }),
    standard: Object.freeze({
      name: "standard",
      temperature: convertUnit(15, "degC", "K"),
      pressure: convertUnit(101.325, "kPa", "Pa"),
      standard: "ISO 13443",
      units: Object.freeze(["Sm3/h", "Sm3/min", "Sm3/s", "Sm3/d"]),
    }),
    usStandard: Object.freeze({
      name: "usStandard",
      temperature: convertUnit(60, "degF", "K"),
      // psi as pound-force per square inch: the exact definition (lbf = 0.45359237 kg x 9.80665 m/s2).
      pressure: convertUnit(14.696, "lbf/in^2", "Pa"),
      standard: "US common practice (60 degF, 14.696 psia)",
      units: Object.freeze(["scfm", "scfh", "scfd", "MMscfd"]),
    }),
  });

/**
 * Density of an ideal gas at a reference state: the mass of one normal or standard cubic metre.
 *
 * rho_ref = p_ref M / (Ru T_ref)
 *
 * @param condition - a reference state, or its name in {@link REFERENCE_CONDITIONS}
 * @param molarMass - M [kg/mol]; must be > 0
 * @returns rho_ref [kg/m3]
 * @remarks Ideal gas (compressibility Z = 1): the real-gas compressibility at the reference
 *   state is ignored, a small fraction of a percent for air and nitrogen near 1 atm (from
 *   memory, not checked here); heavy gases deviate more. Ru is the CODATA 2018
 *   molar gas constant ({@link MOLAR_GAS_CONSTANT}). Source: the ideal-gas law; reference states
 *   as in {@link REFERENCE_CONDITIONS}.
 * @throws RangeError if molarMass is not a positive finite number
 * @example referenceDensity("standard", 0.02896442) // 1.22498 kg/m3, air (ISO 2533 gives
 *   1.2250 at sea level; checked in test/input/quantity.test.ts)
 */
export function referenceDensity(
  condition: ReferenceCondition | ReferenceConditionName,
  molarMass: number,
): number {
  if (!(Number.isFinite(molarMass) && molarMass > 0)) {
    throw new RangeError(`molarMass must be a positive number in kg/mol (got ${molarMass})`);
  }
  const state = typeof condition === "string" ? REFERENCE_CONDITIONS[condition] : condition;
  return (state.pressure * molarMass) / (MOLAR_GAS_CONSTANT * state.temperature);
}
