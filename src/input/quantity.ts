/**
 * Quantity strings from an input document ("8 bar(g)", "3 in", "1200 Nm3/h") to SI numbers.
 *
 * unitmath does every plain unit conversion (through unit-text.ts, which reads the structure of
 * the unit text). Two rules are written by hand here because no unit library covers them: gauge pressure (relative to an ambient pressure the caller gives) and
 * normal or standard volumetric flow, which is an amount of gas and becomes a mass flow through
 * the ideal-gas density at a named reference state (see reference-conditions.ts).
 */

import type { InputIssue } from "./issues.js";
import {
  REFERENCE_CONDITIONS,
  type ReferenceCondition,
  referenceDensity,
} from "./reference-conditions.js";
import {
  convertUnit,
  type KnownUnit,
  knownUnit,
  sameDimension,
  siBaseUnits,
  unitOf,
} from "./unit-text.js";

/** What a quantity measures; decides the accepted units and the SI unit of the result. */
export type QuantityKind =
  | "pressure"
  | "pressureDifference"
  | "temperature"
  | "temperatureDifference"
  | "length"
  | "massFlow"
  | "massFlux"
  | "velocity"
  | "viscosity"
  | "molarMass"
  | "area"
  /** W/(m2 K) */
  | "heatTransferCoefficient"
  /** W/(m K) */
  | "heatTransferPerLength"
  | "dimensionless";

/** Facts about the place a quantity comes from. */
export interface QuantityContext {
  /**
   * Ambient (barometric) pressure [Pa] that gauge pressures are relative to.
   * @defaultValue 101325
   */
  ambientPressure?: number;
  /** Molar mass of the gas [kg/mol]: needed to turn a standard/normal volumetric flow into mass flow. */
  molarMass?: number;
  /**
   * JSON Pointer of the value in the user's document, used in issue paths.
   * @defaultValue ""
   */
  path?: string;
}

/** A warning about a value that was read, to pass on to the user. */
export interface QuantityNote {
  /** `bare-pressure-unit-absolute`: "7 bar" or "100 psi" was read as an absolute pressure. */
  code: "bare-pressure-unit-absolute";
  path: string;
  message: string;
}

/** The SI value and any notes, or the one problem that stops the value being read. */
export type QuantityResult =
  | { ok: true; value: number; notes: QuantityNote[] }
  | { ok: false; issue: InputIssue };

interface KindSpec {
  /** "a pressure", for messages. */
  noun: string;
  /** The SI unit in the unit-text grammar (unit-text.ts); null for dimensionless. */
  si: string | null;
  /** Example values, for messages. */
  examples: string;
  /** Common units, for the unknown-unit message. */
  units: string;
}

const KINDS: Record<QuantityKind, KindSpec> = {
  pressure: {
    noun: "a pressure",
    si: "Pa",
    examples: '"7 bar(g)" or "101.325 kPa"',
    units:
      "Pa, kPa, MPa, bar(a), bar(g), bara, barg, mbar, psia, psig, psi(a), psi(g), kPa(g), MPa(g), atm",
  },
  pressureDifference: {
    noun: "a pressure difference",
    si: "Pa",
    examples: '"0.1 bar" or "1.5 psi"',
    units: "Pa, kPa, MPa, bar, mbar, psi",
  },
  temperature: {
    noun: "a temperature",
    si: "K",
    examples: '"20 degC" or "293.15 K"',
    units: "K, degC, °C, celsius, degF, °F, fahrenheit, degR, rankine",
  },
  temperatureDifference: {
    noun: "a temperature difference",
    si: "K",
    examples: '"5 K" or "9 degF"',
    units: "K, degC, °C, degF, °F, degR",
  },
  length: {
    noun: "a length",
    si: "m",
    examples: '"80 mm" or "3 in"',
    units: "m, cm, mm, um, km, in, ft, yd, mi",
  },
  massFlow: {
    noun: "a mass flow",
    si: "kg/s",
    examples: '"1800 kg/h" or "1200 Nm3/h"',
    units:
      "kg/s, kg/min, kg/h, g/s, t/h, lb/s, lb/h, lbm/s, lbm/h; at reference conditions Nm3/h, Nm3/min, Nm3/s, NL/min, Sm3/h, Sm3/min, Sm3/d, scfm, scfh, MMscfd",
  },
  massFlux: {
    noun: "a mass flux",
    si: "kg/(m^2 s)",
    examples: '"50 kg/(m2 s)"',
    units: "kg/(m2 s), lb/(ft2 s)",
  },
  velocity: {
    noun: "a velocity",
    si: "m/s",
    examples: '"20 m/s" or "60 ft/s"',
    units: "m/s, km/h, ft/s, ft/min",
  },
  viscosity: {
    noun: "a dynamic viscosity",
    si: "Pa s",
    examples: '"18.2 uPa s" or "0.0182 cP"',
    units: "Pa s, mPa s, uPa s, µPa·s, cP, poise, lb/(ft s)",
  },
  molarMass: {
    noun: "a molar mass",
    si: "kg/mol",
    examples: '"28.96 g/mol"',
    units: "g/mol, kg/mol, kg/kmol",
  },
  area: {
    noun: "an area",
    si: "m^2",
    examples: '"0.005 m2" or "7.1 in2"',
    units: "m2, cm2, mm2, in2, ft2",
  },
  heatTransferCoefficient: {
    noun: "a heat transfer coefficient",
    si: "W/(m^2 K)",
    examples: '"10 W/(m2 K)"',
    units: "W/(m2 K), kW/(m2 K), BTU/(h ft2 degF)",
  },
  heatTransferPerLength: {
    noun: "a heat-transfer coefficient per unit length",
    si: "W/(m K)",
    examples: '"1.5 W/(m K)"',
    units: "W/(m K), kW/(m K), BTU/(h ft degF)",
  },
  dimensionless: {
    noun: "a plain number",
    si: null,
    examples: '"0.5"',
    units: "none",
  },
};

/** Dimensions named in wrong-dimension messages, first match wins. */
const DIMENSION_NAMES: readonly (readonly [string, string])[] = [
  ["a pressure", "Pa"],
  ["a length", "m"],
  ["a temperature", "K"],
  ["a mass flow", "kg/s"],
  ["a volumetric flow", "m^3/s"],
  ["a velocity", "m/s"],
  ["a mass flux", "kg/(m^2 s)"],
  ["a dynamic viscosity", "Pa s"],
  ["a molar mass", "kg/mol"],
  ["an area", "m^2"],
  ["a volume", "m^3"],
  ["a heat transfer coefficient", "W/(m^2 K)"],
  ["a density", "kg/m^3"],
  ["a mass", "kg"],
  ["a time", "s"],
  ["an energy", "J"],
  ["a power", "W"],
  ["a force", "N"],
  ["an amount of substance", "mol"],
  ["an electric charge", "C"],
  ["an electric capacitance", "F"],
  ["an angle", "rad"],
];

/** "<number><optional spaces><unit>" with the number in JavaScript's decimal syntax. */
const QUANTITY_PATTERN = /^([+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?)\s*(.*)$/s;

/** "bar(g)", "psi (a)", "kPa(abs)", "MPa(gauge)". */
const PARENTHESIS_SUFFIX = /^(.+?)\s*\(\s*(a|g|abs|gauge)\s*\)$/i;

/** "barg", "bara", "psig", "psia", "kPag", "MPag", "mbarg" (case as written, except PSI). */
const LETTER_SUFFIX = /^(bar|mbar|psi|PSI|kPa|MPa)(a|g|A|G)$/;

/** Bare units read as absolute that users often mean as gauge: these get a note. */
const AMBIGUOUS_PRESSURE_UNITS = new Set(["bar", "psi", "PSI"]);

/** Normal or standard volume flow units: the reference state, the volume unit and its multiple. */
const REFERENCE_VOLUME_PATTERNS: readonly {
  pattern: RegExp;
  condition: ReferenceCondition;
  volume: string;
  multiple: (match: RegExpMatchArray) => number;
}[] = [
  {
    pattern: /^Nm\^?3\/(s|min|h|hr|d|day)$/,
    condition: REFERENCE_CONDITIONS.normal,
    volume: "m^3",
    multiple: () => 1,
  },
  {
    pattern: /^N[lL]\/(s|min|h|hr)$/,
    condition: REFERENCE_CONDITIONS.normal,
    volume: "L",
    multiple: () => 1,
  },
  {
    pattern: /^Sm\^?3\/(s|min|h|hr|d|day)$/,
    condition: REFERENCE_CONDITIONS.standard,
    volume: "m^3",
    multiple: () => 1,
  },
  {
    // scfm, scfh, scfd; Mscfd a thousand and MMscfd a million scf per day (oil and gas usage).
    pattern: /^(MM|M)?(?:scf|SCF)(m|h|d|M|H|D)$/,
    condition: REFERENCE_CONDITIONS.usStandard,
    volume: "ft^3",
    multiple: (match) => (match[1] === "MM" ? 1e6 : match[1] === "M" ? 1e3 : 1),
  },
];

/** Time units in reference-volume flows, as unitmath names them. */
const TIME_UNITS: Readonly<Record<string, string>> = {
  s: "s",
  min: "min",
  m: "min",
  M: "min",
  h: "h",
  H: "h",
  hr: "h",
  d: "day",
  D: "day",
  day: "day",
};

/**
 * Read a quantity from an input document as an SI number.
 *
 * A finite number is taken as SI already (Pa absolute, K, m, kg/s, kg/(m2 s), m/s, Pa s, kg/mol,
 * m2, W/(m2 K)). A string is "<number> <unit>", the space optional ("8bar(g)").
 *
 * - Pressure: "bar(a)", "bara", "psia", "kPa(a)" are absolute; "bar(g)", "barg", "psig",
 *   "kPa(g)", "MPa(g)" are gauge and get `ambientPressure` added. A bare unit ("bar", "kPa",
 *   "psi", "atm") is absolute; bare "bar" and "psi" also give a `bare-pressure-unit-absolute`
 *   note. An absolute pressure <= 0 is an issue with code "value".
 * - Temperature: K, degC, °C, celsius, degF, °F, fahrenheit, degR. A result <= 0 K is code
 *   "value". A temperature difference counts 1 degC as 1 K and 1 degF as 1 degR.
 * - Mass flow: mass per time, or a normal/standard volume per time ("Nm3/h", "Sm3/h", "scfm"),
 *   converted with the gas density at the reference state, rho_ref = p_ref M / (Ru T_ref), which
 *   needs `molarMass`. An actual volume flow ("m3/h", "cfm") is refused: it needs the local
 *   density. Negative flows are allowed.
 * - Other kinds: any unit unitmath knows with the right dimension. The sign is not checked.
 *
 * Everything else (an unknown unit, a wrong dimension, NaN, Infinity, a non-number) gives an
 * issue with code "unit" at `context.path`.
 *
 * @param input - the value from the document
 * @param kind - what the value measures
 * @param context - ambient pressure [Pa], gas molar mass [kg/mol], JSON Pointer of the value
 * @returns the SI value with notes, or an issue
 * @throws RangeError if `context.ambientPressure` or `context.molarMass` is given and is not a
 *   positive finite number (a caller's error, not the user's)
 * @example parseQuantity("8 bar(g)", "pressure") // { ok: true, value: 901325, notes: [] }
 *   (checked in test/input/quantity.test.ts)
 */
export function parseQuantity(
  input: unknown,
  kind: QuantityKind,
  context: QuantityContext = {},
): QuantityResult {
  const path = context.path ?? "";
  const ambientPressure = context.ambientPressure ?? 101325;
  if (!(Number.isFinite(ambientPressure) && ambientPressure > 0)) {
    throw new RangeError(
      `ambientPressure must be a positive number in Pa (got ${ambientPressure})`,
    );
  }
  if (
    context.molarMass !== undefined &&
    !(Number.isFinite(context.molarMass) && context.molarMass > 0)
  ) {
    throw new RangeError(
      `molarMass must be a positive number in kg/mol (got ${context.molarMass})`,
    );
  }
  const spec = KINDS[kind];

  if (typeof input === "number") {
    if (!Number.isFinite(input)) return failure(notAQuantity(input, spec, path));
    return checkBounds(input, input, kind, path, [], `${input}`);
  }
  if (typeof input !== "string") return failure(notAQuantity(input, spec, path));

  const text = input.trim();
  const match = QUANTITY_PATTERN.exec(text);
  if (match === null) return failure(notAQuantity(input, spec, path));
  const magnitude = Number(match[1]);
  if (!Number.isFinite(magnitude)) return failure(notAQuantity(input, spec, path));
  const unitText = (match[2] ?? "").trim();

  if (spec.si === null) {
    if (unitText === "") return { ok: true, value: magnitude, notes: [] };
    return failure(
      unitIssue(
        input,
        path,
        `must be ${spec.noun} such as ${spec.examples}, without a unit (got ${show(input)})`,
      ),
    );
  }
  if (unitText === "") {
    return failure(
      unitIssue(
        input,
        path,
        `missing unit (got ${show(input)}); write ${spec.noun} with its unit, such as ${spec.examples}, or give a plain number in ${siLabel(spec.si)}`,
      ),
    );
  }

  const reference = readReferenceVolumeFlow(unitText);
  if (reference !== null) {
    return convertReferenceVolumeFlow(
      input,
      magnitude,
      reference,
      kind,
      spec,
      context.molarMass,
      path,
    );
  }

  if (kind === "pressure" || kind === "pressureDifference") {
    return convertPressure(input, magnitude, unitText, kind, spec, ambientPressure, path);
  }
  const converted = convertPlain(input, magnitude, unitText, kind, spec, path);
  if (!converted.ok) return converted;
  return checkBounds(converted.value, input, kind, path, [], describe(converted.value, kind));
}

type Conversion = { ok: true; value: number } | { ok: false; issue: InputIssue };

/** Pressure and pressure difference: absolute/gauge suffixes, then a plain conversion. */
function convertPressure(
  input: string,
  magnitude: number,
  unitText: string,
  kind: "pressure" | "pressureDifference",
  spec: KindSpec,
  ambientPressure: number,
  path: string,
): QuantityResult {
  let base = unitText;
  let reference: "absolute" | "gauge" | "bare" = "bare";
  const parenthesis = PARENTHESIS_SUFFIX.exec(unitText);
  const letter = LETTER_SUFFIX.exec(unitText);
  const suffixMatch = parenthesis ?? letter;
  if (suffixMatch !== null) {
    base = suffixMatch[1] ?? "";
    reference = (suffixMatch[2] ?? "").toLowerCase().startsWith("g") ? "gauge" : "absolute";
  }
  if (kind === "pressureDifference" && reference !== "bare") {
    return failure(
      unitIssue(
        input,
        path,
        `a pressure difference is neither gauge nor absolute: write it without (a) or (g), such as ${spec.examples} (got ${show(input)})`,
      ),
    );
  }
  const converted = convertPlain(input, magnitude, base, kind, spec, path);
  if (!converted.ok) return converted;
  if (kind === "pressureDifference") return { ok: true, value: converted.value, notes: [] };

  const notes: QuantityNote[] = [];
  let absolute = converted.value;
  let description = describe(absolute, kind);
  if (reference === "gauge") {
    // Gauge pressure is measured from the local barometric pressure (written by hand: no unit
    // library knows the ambient). p_abs = p_gauge + p_ambient.
    absolute = converted.value + ambientPressure;
    description = `${formatNumber(absolute)} Pa absolute with ambient ${formatNumber(ambientPressure)} Pa`;
  } else if (reference === "bare" && AMBIGUOUS_PRESSURE_UNITS.has(base)) {
    const unitName = base.toLowerCase();
    notes.push({
      code: "bare-pressure-unit-absolute",
      path,
      message: `${show(input)} was read as an absolute pressure; write "${magnitude} ${unitName}(a)" if that is meant, or "${magnitude} ${unitName}(g)" for a gauge pressure`,
    });
  }
  return checkBounds(absolute, input, kind, path, notes, description);
}

/** Convert "<magnitude> <unit>" after checking the unit's dimension. */
function convertPlain(
  input: string,
  magnitude: number,
  unitText: string,
  kind: QuantityKind,
  spec: KindSpec,
  path: string,
): Conversion {
  const si = spec.si as string;
  const normalized = normalizeUnitText(unitText, kind);
  const parsed = knownUnit(normalized);
  if (!parsed.ok && parsed.problem === "number") {
    // A number inside the unit text ("7 2 m"): not one quantity.
    return failure(notAQuantity(input, spec, path));
  }
  if (!parsed.ok) {
    return failure(
      unitIssue(
        input,
        path,
        `unknown unit "${unitText}" (got ${show(input)}); ${spec.noun.replace(/^an? /, "")} units: ${spec.units}`,
      ),
    );
  }
  if (!sameDimension(parsed.unit, unitOf(si))) {
    const found = dimensionName(parsed.unit);
    if (kind === "massFlow" && found === "a volumetric flow") {
      return failure(
        unitIssue(
          input,
          path,
          `${show(input)} is a volume flow at line conditions, which needs the local density to become a mass flow; give a normal or standard volume flow such as "1200 Nm3/h" or "300 scfm", or a mass flow such as "0.5 kg/s"`,
        ),
      );
    }
    let hint = "";
    if (kind === "temperature" || kind === "temperatureDifference") {
      if (unitText === "C") hint = `; write "${magnitude} degC"`;
      if (unitText === "F") hint = `; write "${magnitude} degF"`;
    }
    return failure(
      unitIssue(
        input,
        path,
        `must be ${spec.noun} such as ${spec.examples} (got ${show(input)}, ${found})${hint}`,
      ),
    );
  }
  return { ok: true, value: convertUnit(magnitude, parsed.unit, si) };
}

/** A normal/standard flow unit read: its state, a multiple (1e6 for MMscfd), volume per time. */
interface ReferenceVolumeFlow {
  condition: ReferenceCondition;
  multiple: number;
  /** Volume per time in the unit-text grammar, "m^3/h". */
  volumeFlowUnit: string;
}

/** The reference state and volume-per-time unit of a normal/standard flow unit, or null. */
function readReferenceVolumeFlow(unitText: string): ReferenceVolumeFlow | null {
  const compact = unitText.replace(/³/g, "3").replace(/\s+/g, "");
  for (const { pattern, condition, volume, multiple } of REFERENCE_VOLUME_PATTERNS) {
    const match = pattern.exec(compact);
    if (match === null) continue;
    const time = TIME_UNITS[match[match.length - 1] ?? ""];
    if (time === undefined) continue;
    return { condition, multiple: multiple(match), volumeFlowUnit: `${volume}/${time}` };
  }
  return null;
}

/**
 * Normal or standard volume flow to mass flow (written by hand: no unit library treats a
 * reference-state volume as an amount of gas).
 *
 * mass flow = volume flow at the reference state x p_ref M / (Ru T_ref)
 */
function convertReferenceVolumeFlow(
  input: string,
  magnitude: number,
  reference: ReferenceVolumeFlow,
  kind: QuantityKind,
  spec: KindSpec,
  molarMass: number | undefined,
  path: string,
): QuantityResult {
  if (kind !== "massFlow") {
    return failure(
      unitIssue(
        input,
        path,
        `must be ${spec.noun} such as ${spec.examples} (got ${show(input)}, a normal or standard volume flow)`,
      ),
    );
  }
  if (molarMass === undefined) {
    return failure(
      unitIssue(
        input,
        path,
        `a normal or standard volume flow needs the gas to be known (its molar mass) to become a mass flow, and no gas is known here (got ${show(input)}); define the gas or give a mass flow such as "0.5 kg/s"`,
      ),
    );
  }
  // The volume per time itself is a plain unit conversion.
  const volumeFlow = convertUnit(magnitude * reference.multiple, reference.volumeFlowUnit, "m^3/s");
  const value = volumeFlow * referenceDensity(reference.condition, molarMass);
  return { ok: true, value, notes: [] };
}

/**
 * Rewrite common spellings into the unit-text grammar: °C -> degC, µ -> u, "·" -> space,
 * ft2 -> ft^2, psi -> lbf/in^2 (its exact definition), cP -> mPa s.
 */
function normalizeUnitText(unitText: string, kind: QuantityKind): string {
  let text = unitText
    .replace(/°C|℃/g, "degC")
    .replace(/°F|℉/g, "degF")
    .replace(/°R/g, "degR")
    .replace(/[µμ]/g, "u")
    .replace(/[·⋅*×]/g, " ")
    .replace(/²/g, "^2")
    .replace(/³/g, "^3")
    .replace(/\bAm(?=\^?3)/g, "m")
    .replace(/([A-Za-z])(-?[1-9])(?![\d.])/g, "$1^$2");
  text = text.replace(/[A-Za-z_]+/g, (word) => wordAlias(word, kind) ?? word);
  return text;
}

/** Unit names unitmath lacks or spells otherwise, for one kind of quantity. */
function wordAlias(word: string, kind: QuantityKind): string | undefined {
  switch (word) {
    case "psi":
    case "PSI":
      return "(lbf/in^2)";
    case "cfm":
    case "acfm":
      return "(ft^3/min)";
    case "BTU":
    case "Btu":
      return "BTU";
  }
  if (kind === "viscosity") {
    // 1 P = 1 g/(cm s) = 0.1 Pa s (CGS definition), so 1 cP = 1 mPa s. "cp" could be read as a cup.
    if (word === "cP" || word === "cp" || word === "centipoise") return "(mPa s)";
    if (word === "poise") return "(dPa s)";
  }
  if (kind === "temperatureDifference") {
    // A Celsius degree is a kelvin and a Fahrenheit degree a Rankine degree: differences drop the offset.
    if (word === "degC" || word === "celsius") return "K";
    if (word === "degF" || word === "fahrenheit") return "degR";
  }
  return undefined;
}

/** Physically bounded kinds: absolute pressure and temperature must be > 0. */
function checkBounds(
  value: number,
  input: string | number,
  kind: QuantityKind,
  path: string,
  notes: QuantityNote[],
  description: string,
): QuantityResult {
  if (kind === "pressure" && value <= 0) {
    return failure({
      code: "value",
      path,
      value: input,
      message: `absolute pressure must be greater than 0 Pa (got ${show(input)}${aside(input, description)})`,
    });
  }
  if (kind === "temperature" && value <= 0) {
    return failure({
      code: "value",
      path,
      value: input,
      message: `temperature must be above absolute zero, 0 K (got ${show(input)}${aside(input, description)})`,
    });
  }
  return { ok: true, value, notes };
}

/** ", which is -98675 Pa absolute ..." for strings; nothing for plain SI numbers. */
function aside(input: string | number, description: string): string {
  return typeof input === "string" ? `, which is ${description}` : "";
}

function describe(value: number, kind: QuantityKind): string {
  const si = KINDS[kind].si;
  return si === null ? formatNumber(value) : `${formatNumber(value)} ${siLabel(si)}`;
}

function siLabel(si: string): string {
  return si.replace(/\^/g, "");
}

function dimensionName(parsed: KnownUnit): string {
  for (const [name, reference] of DIMENSION_NAMES) {
    if (sameDimension(parsed, unitOf(reference))) return name;
  }
  const siUnits = siBaseUnits(parsed);
  return siUnits === "" ? "a plain number" : `a quantity in ${siUnits}`;
}

function notAQuantity(input: unknown, spec: KindSpec, path: string): InputIssue {
  const expected =
    spec.si === null ? "a number" : `a number in ${siLabel(spec.si)} or a string "<number> <unit>"`;
  return unitIssue(
    input,
    path,
    `must be ${spec.noun} such as ${spec.examples}: ${expected} (got ${show(input)})`,
  );
}

function unitIssue(input: unknown, path: string, message: string): InputIssue {
  return { code: "unit", path, message, value: issueValue(input) };
}

function failure(issue: InputIssue): { ok: false; issue: InputIssue } {
  return { ok: false, issue };
}

/** The value as the issue's `value` field: finite numbers and strings as they are. */
function issueValue(input: unknown): string | number {
  if (typeof input === "number" && Number.isFinite(input)) return input;
  if (typeof input === "string") return input;
  return show(input);
}

/** The value as the user wrote it, for messages: strings quoted, others as JSON-like text. */
function show(input: unknown): string {
  if (typeof input === "string") return JSON.stringify(input);
  if (typeof input === "number" || typeof input === "boolean" || typeof input === "bigint")
    return String(input);
  if (input === undefined) return "nothing";
  let text: string;
  try {
    text = JSON.stringify(input) ?? String(input);
  } catch {
    text = String(input);
  }
  return text.length > 40 ? `${text.slice(0, 37)}...` : text;
}

/** Six significant digits, without trailing zeros: -98675, 308.15, 1.2e-5. */
function formatNumber(value: number): string {
  return String(Number(value.toPrecision(6)));
}
