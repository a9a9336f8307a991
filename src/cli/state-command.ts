/**
 * `machnet state`: the gas state at one section of a pipe from the command line.
 */

import { GAS_PRESET_NAMES, gasPreset, isGasPresetName } from "../gas/gas.js";
import { formatIssue } from "../input/issues.js";
import { parseQuantity, type QuantityKind } from "../input/quantity.js";
import type { UnitSetName } from "../output/display-units.js";
import { ENGINEERING_CAUTION } from "../output/result-table.js";
import {
  type SectionStateInput,
  sectionState,
  sectionStateJson,
  sectionStateTable,
} from "../output/state-report.js";
import { CliError, EXIT, linesText } from "./cli-error.js";
import type { FullCliIo } from "./cli-io.js";
import { renderTable } from "./render-table.js";

/** Options of `machnet state`, as commander parsed them (quantities still text). */
export interface StateCommandOptions {
  gas: string;
  pressure?: string;
  temperature?: string;
  velocity?: string;
  mach?: string;
  massFlux?: string;
  stagnationTemperature?: string;
  stagnationPressure?: string;
  ambientPressure: string;
  format: "table" | "json";
  units: UnitSetName;
}

/** The three ways to call `machnet state`, for error messages and help. */
export const STATE_MODES =
  "give either --pressure and --temperature (static) with one of --velocity, --mach, --mass-flux; " +
  "or --stagnation-temperature with --temperature (static; --pressure optional); " +
  "or --stagnation-temperature, --stagnation-pressure and --pressure (static)";

type QuantityFlag =
  | "pressure"
  | "temperature"
  | "velocity"
  | "mach"
  | "massFlux"
  | "stagnationTemperature"
  | "stagnationPressure";

const FLAG_NAMES: Readonly<Record<QuantityFlag, string>> = {
  pressure: "--pressure",
  temperature: "--temperature",
  velocity: "--velocity",
  mach: "--mach",
  massFlux: "--mass-flux",
  stagnationTemperature: "--stagnation-temperature",
  stagnationPressure: "--stagnation-pressure",
};

const FLAG_KINDS: Readonly<Record<QuantityFlag, QuantityKind>> = {
  pressure: "pressure",
  temperature: "temperature",
  velocity: "velocity",
  mach: "dimensionless",
  massFlux: "massFlux",
  stagnationTemperature: "temperature",
  stagnationPressure: "pressure",
};

function usageError(problem: string): CliError {
  return new CliError([`state: ${problem}; ${STATE_MODES}`]);
}

/** Which mode the flags ask for, or a CliError saying what is missing or too much. */
function chooseMode(options: StateCommandOptions): SectionStateInput["given"] {
  const has = (flag: QuantityFlag) => options[flag] !== undefined;
  const names = (flags: QuantityFlag[]) => flags.map((flag) => FLAG_NAMES[flag]).join(", ");
  const require = (flags: QuantityFlag[], mode: string) => {
    const missing = flags.filter((flag) => !has(flag));
    if (missing.length > 0) throw usageError(`${mode} also needs ${names(missing)}`);
  };
  const forbid = (flags: QuantityFlag[], mode: string) => {
    const extra = flags.filter(has);
    if (extra.length > 0) throw usageError(`${names(extra)} cannot be combined with ${mode}`);
  };
  const flow = (["velocity", "mach", "massFlux"] as const).filter(has);
  if (flow.length > 1)
    throw usageError(`give only one of --velocity, --mach, --mass-flux (got ${names(flow)})`);
  const single = flow[0];
  if (single !== undefined) {
    const mode = FLAG_NAMES[single];
    forbid(["stagnationTemperature", "stagnationPressure"], mode);
    require(["pressure", "temperature"], mode);
    return single;
  }
  if (has("stagnationPressure")) {
    const mode = "--stagnation-pressure";
    forbid(["temperature"], `${mode} (the static temperature is computed from it)`);
    require(["stagnationTemperature", "pressure"], mode);
    return "stagnationState";
  }
  if (has("stagnationTemperature")) {
    require(["temperature"], "--stagnation-temperature");
    return "stagnationTemperature";
  }
  throw usageError("not enough to go on");
}

/**
 * Run `machnet state`.
 *
 * @returns 0
 * @throws CliError (exit 2) for an unknown gas, a quantity that cannot be read, a missing or
 *   superfluous flag, or an impossible state (T > T0, p > p0)
 */
export function stateCommand(options: StateCommandOptions, io: FullCliIo): number {
  if (!isGasPresetName(options.gas)) {
    throw new CliError([
      `--gas: unknown gas "${options.gas}"; presets: ${GAS_PRESET_NAMES.join(", ")}`,
    ]);
  }
  const gas = gasPreset(options.gas);
  const mode = chooseMode(options);
  const notes: string[] = [];
  if (/\(\s*g|g$|gauge/i.test(options.ambientPressure.trim())) {
    throw new CliError([
      `--ambient-pressure: the reference of gauge pressures must be absolute (got "${options.ambientPressure}"); write e.g. "1.01325 bar(a)"`,
    ]);
  }
  const ambient = parseQuantity(options.ambientPressure, "pressure", {
    path: "--ambient-pressure",
  });
  if (!ambient.ok) throw new CliError([formatIssue(ambient.issue)]);
  const ambientPressure = ambient.value;
  const quantity = (flag: QuantityFlag): number => {
    const text = options[flag] as string;
    const read = parseQuantity(text, FLAG_KINDS[flag], { path: FLAG_NAMES[flag], ambientPressure });
    if (!read.ok) throw new CliError([formatIssue(read.issue)]);
    for (const note of read.notes) notes.push(`note: ${note.path}: ${note.message}`);
    return read.value;
  };
  let input: SectionStateInput;
  switch (mode) {
    case "velocity":
    case "mach":
    case "massFlux": {
      const pressure = quantity("pressure");
      const temperature = quantity("temperature");
      const value = quantity(mode);
      input =
        mode === "velocity"
          ? { given: mode, pressure, temperature, velocity: value }
          : mode === "mach"
            ? { given: mode, pressure, temperature, mach: value }
            : { given: mode, pressure, temperature, massFlux: value };
      break;
    }
    case "stagnationTemperature": {
      const stagnationTemperature = quantity("stagnationTemperature");
      const temperature = quantity("temperature");
      input = { given: mode, stagnationTemperature, temperature };
      if (options.pressure !== undefined) input.pressure = quantity("pressure");
      break;
    }
    case "stagnationState":
      input = {
        given: mode,
        stagnationTemperature: quantity("stagnationTemperature"),
        stagnationPressure: quantity("stagnationPressure"),
        pressure: quantity("pressure"),
      };
      break;
  }
  const computed = sectionState(gas, input);
  if (!computed.ok) throw new CliError([formatIssue(computed.issue)]);
  if (options.format === "json") {
    io.stdout(`${JSON.stringify(sectionStateJson(computed.state), null, 2)}\n`);
  } else {
    const table = sectionStateTable(gas, computed.state, options.units, ambientPressure);
    io.stdout(linesText([renderTable(table), "", ENGINEERING_CAUTION]));
  }
  if (notes.length > 0) io.stderr(linesText(notes));
  return EXIT.ok;
}
