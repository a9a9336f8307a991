/**
 * The state at one cross-section of a pipe, from what a user knows there: the static state and
 * one flow quantity, or the stagnation temperature and the static temperature, or the stagnation
 * state and the static pressure. Isentropic relations of a calorically perfect ideal gas.
 * Browser-safe; problems come back as data (an {@link InputIssue} whose path names the
 * command-line flag).
 */

import { gasDensity, speedOfSound } from "../gas/gas.js";
import type { Gas } from "../gas/gas-types.js";
import type { InputIssue } from "../input/issues.js";
import {
  isentropicPressureRatio,
  isentropicTemperatureRatio,
  machFromPressureRatio,
} from "../physics/isentropic.js";
import { displayGaugePressure, displayUnit, type UnitSetName } from "./display-units.js";
import { formatNumber } from "./format-number.js";
import type { TextTable } from "./result-table.js";

/** What is known at the section. All SI: Pa absolute, K, m/s, kg/(m2 s). */
export type SectionStateInput =
  /** Static pressure and temperature and the flow speed. */
  | { given: "velocity"; pressure: number; temperature: number; velocity: number }
  /** Static pressure and temperature and the Mach number. */
  | { given: "mach"; pressure: number; temperature: number; mach: number }
  /** Static pressure and temperature and the mass flux G = rho v. */
  | { given: "massFlux"; pressure: number; temperature: number; massFlux: number }
  /** Stagnation and static temperature of adiabatic flow; static pressure optional. */
  | {
      given: "stagnationTemperature";
      stagnationTemperature: number;
      temperature: number;
      pressure?: number;
    }
  /** Stagnation temperature and pressure of isentropic flow and the static pressure. */
  | {
      given: "stagnationState";
      stagnationTemperature: number;
      stagnationPressure: number;
      pressure: number;
    };

/** The state at the section. null: not defined by what was given (no static pressure). */
export interface SectionState {
  given: SectionStateInput["given"];
  /** Static pressure [Pa absolute]. */
  pressure: number | null;
  /** Static temperature [K]. */
  temperature: number;
  /** [kg/m3] */
  density: number | null;
  /** [m/s] */
  speedOfSound: number;
  /** [-] */
  mach: number;
  /** [m/s] */
  velocity: number;
  /** G = rho v [kg/(m2 s)]. */
  massFlux: number | null;
  /** [K] */
  stagnationTemperature: number;
  /** Isentropic stagnation pressure of the local state [Pa absolute]. */
  stagnationPressure: number | null;
}

function valueIssue(
  path: string,
  value: number,
  message: string,
): { ok: false; issue: InputIssue } {
  return { ok: false, issue: { code: "value", path, value, message } };
}

/**
 * The state at one section of a pipe.
 *
 * a = (gamma R T)^0.5;  M = v / a;  rho = p / (R T);  G = rho v;
 * T0 = T (1 + (gamma - 1) / 2 M^2);  p0 = p (T0 / T)^(gamma / (gamma - 1));
 * from T0 and T: M = (2 / (gamma - 1) (T0 / T - 1))^0.5;
 * from p0 and p: M = (2 / (gamma - 1) ((p / p0)^(-(gamma - 1) / gamma) - 1))^0.5, T = T0 (T / T0)(M).
 *
 * @param gas - the gas (R, gamma)
 * @param input - what is known at the section, SI
 * @returns the state, or an issue at the flag (`--velocity`, `--temperature`, ...) that is
 *   impossible: a negative speed, Mach number or mass flux, T > T0, p > p0
 * @remarks Ideal, calorically perfect gas. T0 from T holds for any adiabatic flow (also with
 *   friction); p0 is the pressure the local flow would reach if brought to rest isentropically.
 *   Source: Ames Research Staff, NACA Report 1135, 1953, Table I; J. D. Anderson, Modern
 *   Compressible Flow, 3rd ed., McGraw-Hill, 2003, ch. 3.
 * @example sectionState(gasPreset("air"), { given: "mach", pressure: 101325, temperature: 288.15, mach: 0.5 })
 *   // speedOfSound 340.297 m/s, stagnationPressure 120193 Pa (p/p0 = 0.84302, NACA 1135 Table I;
 *   // checked in test/cli/state.test.ts)
 */
export function sectionState(
  gas: Gas,
  input: SectionStateInput,
): { ok: true; state: SectionState } | { ok: false; issue: InputIssue } {
  const gamma = gas.heatCapacityRatio;
  const given = input.given;
  if (given === "stagnationTemperature") {
    const { stagnationTemperature, temperature } = input;
    if (temperature > stagnationTemperature) {
      return valueIssue(
        "--temperature",
        temperature,
        `the static temperature ${formatNumber(temperature, 6)} K is above the stagnation temperature ${formatNumber(stagnationTemperature, 6)} K; in adiabatic flow T <= T0`,
      );
    }
    const mach = Math.sqrt((2 / (gamma - 1)) * (stagnationTemperature / temperature - 1));
    const pressure = input.pressure ?? null;
    return stateAt(gas, given, pressure, temperature, mach, undefined, stagnationTemperature);
  }
  if (given === "stagnationState") {
    const { stagnationTemperature, stagnationPressure, pressure } = input;
    if (pressure > stagnationPressure) {
      return valueIssue(
        "--pressure",
        pressure,
        `the static pressure ${formatNumber(pressure, 6)} Pa is above the stagnation pressure ${formatNumber(stagnationPressure, 6)} Pa; in isentropic flow p <= p0`,
      );
    }
    const mach = machFromPressureRatio(pressure / stagnationPressure, gamma);
    const temperature = stagnationTemperature * isentropicTemperatureRatio(mach, gamma);
    return stateAt(
      gas,
      given,
      pressure,
      temperature,
      mach,
      undefined,
      stagnationTemperature,
      stagnationPressure,
    );
  }
  const { pressure, temperature } = input;
  const a = speedOfSound(gas, temperature);
  if (given === "velocity") {
    if (!(input.velocity >= 0)) {
      return valueIssue(
        "--velocity",
        input.velocity,
        `must be 0 or more (got ${input.velocity} m/s)`,
      );
    }
    return stateAt(gas, given, pressure, temperature, input.velocity / a, input.velocity);
  }
  if (given === "mach") {
    if (!(input.mach >= 0)) {
      return valueIssue("--mach", input.mach, `must be 0 or more (got ${input.mach})`);
    }
    return stateAt(gas, given, pressure, temperature, input.mach);
  }
  if (!(input.massFlux >= 0)) {
    return valueIssue(
      "--mass-flux",
      input.massFlux,
      `must be 0 or more (got ${input.massFlux} kg/(m2 s))`,
    );
  }
  const velocity = input.massFlux / gasDensity(gas, pressure, temperature);
  return stateAt(gas, given, pressure, temperature, velocity / a, velocity);
}

/**
 * The whole state from the static pressure (null if unknown), the static temperature and the
 * Mach number, keeping the velocity and stagnation values given exactly as given.
 */
function stateAt(
  gas: Gas,
  given: SectionStateInput["given"],
  pressure: number | null,
  temperature: number,
  mach: number,
  velocity = mach * speedOfSound(gas, temperature),
  stagnationTemperature = temperature / isentropicTemperatureRatio(mach, gas.heatCapacityRatio),
  stagnationPressure = pressure === null
    ? null
    : pressure / isentropicPressureRatio(mach, gas.heatCapacityRatio),
): { ok: true; state: SectionState } {
  const density = pressure === null ? null : gasDensity(gas, pressure, temperature);
  return {
    ok: true,
    state: {
      given,
      pressure,
      temperature,
      density,
      speedOfSound: speedOfSound(gas, temperature),
      mach,
      velocity,
      massFlux: density === null ? null : density * velocity,
      stagnationTemperature,
      stagnationPressure,
    },
  };
}

/**
 * The state as a JSON-ready object, SI: always `density`, `speedOfSound`, `mach`, `velocity`,
 * `stagnationTemperature`, `stagnationPressure` (density and stagnation pressure null when no
 * static pressure was given), and `temperature` when it was computed rather than given (from the
 * stagnation state).
 */
export function sectionStateJson(state: SectionState): Record<string, number | null> {
  const json: Record<string, number | null> = {
    density: state.density,
    speedOfSound: state.speedOfSound,
    mach: state.mach,
    velocity: state.velocity,
    stagnationTemperature: state.stagnationTemperature,
    stagnationPressure: state.stagnationPressure,
  };
  if (state.given === "stagnationState") json.temperature = state.temperature;
  return json;
}

/** Which quantities each input form gives (the rest are computed). */
const GIVEN: Readonly<Record<SectionStateInput["given"], readonly string[]>> = {
  velocity: ["pressure", "temperature", "velocity"],
  mach: ["pressure", "temperature", "mach"],
  massFlux: ["pressure", "temperature", "massFlux"],
  stagnationTemperature: ["stagnationTemperature", "temperature", "pressure"],
  stagnationState: ["stagnationTemperature", "stagnationPressure", "pressure"],
};

/** The rows of the state table, in order: label, quantity, display kind, digits. */
const SECTION_ROWS: readonly {
  label: string;
  key: Exclude<keyof SectionState, "given">;
  kind: Parameters<typeof displayUnit>[1];
  digits: number;
}[] = [
  { label: "static pressure", key: "pressure", kind: "pressure", digits: 6 },
  { label: "static temperature", key: "temperature", kind: "temperature", digits: 5 },
  { label: "density", key: "density", kind: "density", digits: 5 },
  { label: "speed of sound", key: "speedOfSound", kind: "velocity", digits: 5 },
  { label: "Mach number", key: "mach", kind: "dimensionless", digits: 5 },
  { label: "velocity", key: "velocity", kind: "velocity", digits: 5 },
  { label: "mass flux", key: "massFlux", kind: "massFlux", digits: 5 },
  { label: "stagnation temperature", key: "stagnationTemperature", kind: "temperature", digits: 5 },
  { label: "stagnation pressure", key: "stagnationPressure", kind: "pressure", digits: 6 },
];

/**
 * The state as a table of quantity, value, unit and whether it was given or computed.
 *
 * @param gas - the gas (its name and gamma go in the title)
 * @param state - from {@link sectionState}
 * @param units - the unit set
 * @param ambientPressure - reference of the gauge pressures [Pa]
 */
export function sectionStateTable(
  gas: Gas,
  state: SectionState,
  units: UnitSetName,
  ambientPressure: number,
): TextTable {
  const given = GIVEN[state.given];
  const rows: string[][] = [];
  for (const row of SECTION_ROWS) {
    const value = state[row.key];
    if (value === null) continue;
    const mark = given.includes(row.key) ? "given" : "";
    const unit = displayUnit(units, row.kind);
    rows.push([
      row.label,
      formatNumber(unit.fromSI(value), row.digits),
      row.kind === "dimensionless" ? "" : unit.label,
      mark,
    ]);
    if (row.kind === "pressure") {
      // Each pressure also as a gauge pressure, on the next row.
      const gauge = displayGaugePressure(units, value, ambientPressure);
      rows.push([row.label, formatNumber(gauge.value, row.digits), gauge.label, mark]);
    }
  }
  return {
    title: `State at one section: ${gas.name}, gamma ${formatNumber(gas.heatCapacityRatio)}, R ${formatNumber(gas.specificGasConstant, 6)} J/(kg K); isentropic, calorically perfect gas`,
    columns: [
      { label: "quantity", unit: "", align: "left" },
      { label: "value", unit: "", align: "right" },
      { label: "unit", unit: "", align: "left" },
      { label: "", unit: "", align: "left" },
    ],
    rows,
  };
}
