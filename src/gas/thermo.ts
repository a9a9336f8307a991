/**
 * The gas's thermodynamic state at a given pressure and temperature: the one interface through
 * which pipe models that integrate along the pipe (and, when a gas asks for it, junction mixing)
 * see density, enthalpy, heat capacities and the speed of sound.
 *
 * This first version covers the calorically perfect ideal gas only (constant cp, Z = 1), so that
 * it gives exactly what src/gas/gas.ts gives. Temperature-dependent cp (NASA 7-coefficient
 * polynomials) and the Peng-Robinson equation of state extend `gasState` without changing its
 * signature.
 */

import type { Gas } from "./gas-types.js";

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
  };
}

/**
 * The thermodynamic state of the gas at (p, T).
 *
 * Calorically perfect ideal gas: rho = p / (R T), h = cp (T - 298.15 K), a = (gamma R T)^0.5.
 *
 * @param gas - the gas
 * @param pressure - absolute p [Pa], > 0
 * @param temperature - T [K], > 0
 * @param out - the record to fill (allocation-free in hot loops); a new one by default
 * @returns `out`, filled
 * @remarks Source: J. D. Anderson, Modern Compressible Flow, 3rd ed., McGraw-Hill 2003, ch. 1
 *   and 3. Inputs are not range-checked here: callers pass checked states.
 * @example gasState(gasPreset("air"), 101325, 288.15).density // 1.2250 kg/m3 (ISO 2533 sea level)
 */
export function gasState(
  gas: Gas,
  pressure: number,
  temperature: number,
  out: ThermoState = emptyThermoState(),
): ThermoState {
  const r = gas.specificGasConstant;
  const cp = gas.specificHeatCp;
  const density = pressure / (r * temperature);
  out.density = density;
  out.compressibility = 1;
  out.enthalpy = cp * (temperature - ENTHALPY_REFERENCE_TEMPERATURE);
  out.specificHeatCp = cp;
  out.specificHeatCv = cp - r;
  out.soundSpeed = Math.sqrt(gas.heatCapacityRatio * r * temperature);
  out.densityTemperatureSlope = -density / temperature;
  out.densityPressureSlope = 1 / (r * temperature);
  out.enthalpyPressureSlope = 0;
  return out;
}

/**
 * The temperature at which the gas has enthalpy h at pressure p: the inverse of
 * {@link gasState}'s enthalpy.
 *
 * Calorically perfect ideal gas: T = 298.15 K + h / cp.
 *
 * @param gas - the gas
 * @param enthalpy - h [J/kg]
 * @param pressure - absolute p [Pa], > 0 (unused for an ideal gas)
 * @returns T [K]
 */
export function temperatureFromEnthalpy(gas: Gas, enthalpy: number, _pressure: number): number {
  return ENTHALPY_REFERENCE_TEMPERATURE + enthalpy / gas.specificHeatCp;
}
