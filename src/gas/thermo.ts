/**
 * The gas's thermodynamic state at a given pressure and temperature: the one interface through
 * which pipe models that integrate along the pipe (and, when a gas asks for it, junction mixing)
 * see density, enthalpy, heat capacities and the speed of sound.
 *
 * It dispatches on the gas's data: the ideal-gas part is the constant `specificHeatCp` or, when
 * the gas carries `heatCapacity` (NASA 7-coefficient polynomials), cp(T) and h(T) from
 * src/gas/nasa7.ts; the equation of state is the ideal gas or, when the gas carries
 * `equationOfState`, Peng-Robinson (src/gas/peng-robinson.ts), whose departures are added to
 * the ideal-gas part. A gas with neither gives exactly what src/gas/gas.ts gives.
 */

import type { Gas } from "./gas-types.js";
import { nasa7MixtureEnthalpy, nasa7MixtureHeatCapacity } from "./nasa7.js";
import {
  emptyPengRobinsonValues,
  type PengRobinsonValues,
  pengRobinsonState,
} from "./peng-robinson.js";

/** Reference temperature at which the enthalpy of every gas is zero [K]. */
export const ENTHALPY_REFERENCE_TEMPERATURE = 298.15;

/** A thermodynamic state point, all SI, specific quantities per kilogram. */
export interface ThermoState {
  /** rho [kg/m3]. */
  density: number;
  /** Z = p / (rho R T) [-]; 1 for an ideal gas. */
  compressibility: number;
  /** h [J/kg], zero for the ideal gas at ENTHALPY_REFERENCE_TEMPERATURE. */
  enthalpy: number;
  /** cp = (dh/dT) at constant p [J/(kg K)]. */
  specificHeatCp: number;
  /** cv = (du/dT) at constant volume [J/(kg K)]. */
  specificHeatCv: number;
  /** a [m/s]. */
  soundSpeed: number;
  /** (d rho / d T) at constant p [kg/(m3 K)]. */
  densityTemperatureSlope: number;
  /** (d rho / d p) at constant T [kg/(m3 Pa)]. */
  densityPressureSlope: number;
  /** (d h / d p) at constant T [J/(kg Pa)]; 0 for an ideal gas. */
  enthalpyPressureSlope: number;
  /**
   * True when the gas would condense at this state by its equation of state (always false for
   * an ideal gas). The other fields then describe a metastable vapour or a liquid, not the gas:
   * a caller must report the state and not use them. See {@link gasState}.
   */
  condensing: boolean;
}

/** A fresh state record, to be filled by {@link gasState} (reuse it in hot loops). */
export function emptyThermoState(): ThermoState {
  return {
    density: 0,
    compressibility: 1,
    enthalpy: 0,
    specificHeatCp: 0,
    specificHeatCv: 0,
    soundSpeed: 0,
    densityTemperatureSlope: 0,
    densityPressureSlope: 0,
    enthalpyPressureSlope: 0,
    condensing: false,
  };
}

/**
 * The thermodynamic state of the gas at (p, T).
 *
 * Ideal-gas part: constant cp, h = cp (T - 298.15 K); or, with NASA data, the ideal-mixture
 * cp(T) = Ru/M sum x_i Cp_i/Ru and h(T) = Ru/M sum x_i (H_i(T) - H_i(298.15 K))/Ru.
 * Ideal gas: rho = p/(R T), cv = cp - R, a = (cp/cv R T)^0.5, (d rho/d T)_p = -rho/T,
 * (d rho/d p)_T = 1/(R T), (d h/d p)_T = 0.
 * Peng-Robinson (molar v, M the molar mass): rho = M/v; h = h_ig + (H - H_ig)/M;
 * cv = cv_ig + (Cv - Cv_ig)/M; cp = cv - T (dp/dT)_v^2 / ((dp/dv)_T M);
 * a^2 = -(v^2/M) (dp/dv)_T cp/cv; (d rho/d T)_p = (M/v^2) (dp/dT)_v/(dp/dv)_T;
 * (d rho/d p)_T = -(M/v^2)/(dp/dv)_T; (d h/d p)_T = (v + T (dp/dT)_v/(dp/dv)_T)/M.
 * `condensing` reports a state where the gas would condense (see src/gas/peng-robinson.ts for
 * how it is decided); the vapour-like root is used whenever it exists.
 *
 * @param gas - the gas
 * @param pressure - absolute p [Pa], > 0
 * @param temperature - T [K], > 0
 * @param out - the record to fill (allocation-free in hot loops); a new one by default
 * @param scratch - working record of the equation of state (pass one in hot loops)
 * @returns `out`, filled
 * @remarks Sources: J. D. Anderson, Modern Compressible Flow, 3rd ed., McGraw-Hill 2003, ch. 1
 *   and 3 (perfect gas); B. J. McBride, M. J. Zehe and S. Gordon, NASA TP-2002-211556 (2002)
 *   (polynomials); D.-Y. Peng and D. B. Robinson, Ind. Eng. Chem. Fundam. 15, 59 (1976) (equation
 *   of state); general thermodynamic relations (e.g. Poling, Prausnitz and O'Connell, The
 *   Properties of Gases and Liquids, 5th ed., 2001, ch. 6). Inputs are not range-checked
 *   here: callers pass checked states. NASA data are held at their end values outside their
 *   fitted ranges (200 K to 3500 K or more).
 * @example gasState(gasPreset("air"), 101325, 288.15).density // 1.2250 kg/m3 (ISO 2533 sea level)
 * @example gasState(gasPreset("nitrogen", { heatCapacity: "nasa7" }), 1e5, 1000).specificHeatCp // 1166.7 J/(kg K), 32.683 J/(mol K) (NIST-JANAF 32.697)
 * @example gasState(gasPreset("methane", { equationOfState: "peng-robinson" }), 100e5, 300).compressibility // 0.8338
 */
export function gasState(
  gas: Gas,
  pressure: number,
  temperature: number,
  out: ThermoState = emptyThermoState(),
  scratch?: PengRobinsonValues,
): ThermoState {
  const r = gas.specificGasConstant;
  // Ideal-gas part: cp and h per kilogram.
  let cpIdeal: number;
  let enthalpyIdeal: number;
  const heatCapacity = gas.heatCapacity;
  if (heatCapacity === undefined) {
    cpIdeal = gas.specificHeatCp;
    enthalpyIdeal = cpIdeal * (temperature - ENTHALPY_REFERENCE_TEMPERATURE);
  } else {
    cpIdeal = r * nasa7MixtureHeatCapacity(heatCapacity, temperature);
    enthalpyIdeal = r * nasa7MixtureEnthalpy(heatCapacity, temperature);
  }
  const eos = gas.equationOfState;
  if (eos === undefined) {
    const density = pressure / (r * temperature);
    const cvIdeal = cpIdeal - r;
    out.density = density;
    out.compressibility = 1;
    out.enthalpy = enthalpyIdeal;
    out.specificHeatCp = cpIdeal;
    out.specificHeatCv = cvIdeal;
    out.soundSpeed = Math.sqrt(
      (heatCapacity === undefined ? gas.heatCapacityRatio : cpIdeal / cvIdeal) * r * temperature,
    );
    out.densityTemperatureSlope = -density / temperature;
    out.densityPressureSlope = 1 / (r * temperature);
    out.enthalpyPressureSlope = 0;
    out.condensing = false;
    return out;
  }
  const real = pengRobinsonState(eos, pressure, temperature, scratch ?? emptyPengRobinsonValues());
  const molarMass = gas.molarMass;
  const v = real.molarVolume;
  const dpdT = real.pressureTemperatureSlope;
  const dpdv = real.pressureVolumeSlope;
  const cv = cpIdeal - r + real.heatCapacityCvDeparture / molarMass;
  const cp = cv - (temperature * dpdT * dpdT) / (dpdv * molarMass);
  out.density = molarMass / v;
  out.compressibility = real.compressibility;
  out.enthalpy = enthalpyIdeal + real.enthalpyDeparture / molarMass;
  out.specificHeatCp = cp;
  out.specificHeatCv = cv;
  out.soundSpeed = Math.sqrt((-(v * v) / molarMass) * dpdv * (cp / cv));
  out.densityTemperatureSlope = ((molarMass / (v * v)) * dpdT) / dpdv;
  out.densityPressureSlope = -molarMass / (v * v) / dpdv;
  out.enthalpyPressureSlope = (v + (temperature * dpdT) / dpdv) / molarMass;
  out.condensing = real.condensing;
  return out;
}

/** Lowest and highest temperature {@link temperatureFromEnthalpy} searches [K]. */
const TEMPERATURE_SEARCH_RANGE = { low: 1, high: 20000 };

/**
 * The temperature at which the gas has enthalpy h at pressure p: the inverse of
 * {@link gasState}'s enthalpy.
 *
 * Calorically perfect ideal gas: T = 298.15 K + h / cp, in closed form. Otherwise Newton's
 * method on h(T, p) - h = 0 with slope cp, started from the constant-cp value and kept inside a
 * bracket that it narrows at every step (bisection when a step would leave it), to a relative
 * change of 1e-13 in T.
 *
 * @param gas - the gas
 * @param enthalpy - h [J/kg]
 * @param pressure - absolute p [Pa], > 0 (used by a real-gas equation of state only)
 * @param scratch - working state record (pass one in hot loops to avoid allocation)
 * @param eosScratch - working record of the equation of state (likewise)
 * @returns T [K]; check `gasState(...).condensing` at it when the gas has an equation of state
 * @throws RangeError if no temperature in the range searched (TEMPERATURE_SEARCH_RANGE) has h
 * @example temperatureFromEnthalpy(gasPreset("air"), 10050, 101325) // 308.153 K (cp 1004.70 J/(kg K))
 */
export function temperatureFromEnthalpy(
  gas: Gas,
  enthalpy: number,
  pressure: number,
  scratch?: ThermoState,
  eosScratch?: PengRobinsonValues,
): number {
  const guess = ENTHALPY_REFERENCE_TEMPERATURE + enthalpy / gas.specificHeatCp;
  if (gas.heatCapacity === undefined && gas.equationOfState === undefined) return guess;
  const state = scratch ?? emptyThermoState();
  const eosRecord =
    gas.equationOfState === undefined ? undefined : (eosScratch ?? emptyPengRobinsonValues());
  let low = TEMPERATURE_SEARCH_RANGE.low;
  let high = TEMPERATURE_SEARCH_RANGE.high;
  let temperature = Math.min(Math.max(guess, low * 2), high / 2);
  for (let iteration = 0; iteration < 100; iteration++) {
    gasState(gas, pressure, temperature, state, eosRecord);
    const residual = state.enthalpy - enthalpy;
    if (residual > 0) high = temperature;
    else low = temperature;
    let next = temperature - residual / state.specificHeatCp;
    if (!(next > low && next < high)) next = 0.5 * (low + high);
    if (Math.abs(next - temperature) <= 1e-13 * temperature) {
      // Closed on a root, or squeezed against an end of the range with the enthalpy beyond it.
      if (Math.abs(residual) <= 1e-9 * state.specificHeatCp * temperature) return next;
      break;
    }
    temperature = next;
  }
  // Bisection alone closes the bracket to 1e-13 in about 50 halvings: reaching here means the
  // enthalpy lies outside the range searched.
  throw new RangeError(
    `temperatureFromEnthalpy: no temperature between ${TEMPERATURE_SEARCH_RANGE.low} K and ${TEMPERATURE_SEARCH_RANGE.high} K has the enthalpy ${enthalpy} J/kg at ${pressure} Pa`,
  );
}

/**
 * Whether the gas is calorically perfect and ideal: constant cp and Z = 1 (no NASA data, no
 * equation of state). The closed-form relations (isentropic, Fanno, isothermal, the components'
 * standards in their perfect-gas form) hold exactly for such a gas only.
 */
export function isPerfectGas(gas: Gas): boolean {
  return gas.heatCapacity === undefined && gas.equationOfState === undefined;
}
