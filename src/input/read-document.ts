/**
 * JSON text -> checked document: parse, validate against the schema, convert every quantity to
 * SI, apply defaults, and check the rules the schema cannot express. Every problem is collected
 * (not only the first) and reported with its JSON Pointer.
 */
import { Ajv2020, type ErrorObject } from "ajv/dist/2020.js";
import { type ParseError, parse as parseTolerant, printParseErrorCode } from "jsonc-parser";
import { GAS_PRESET_NAMES, gasMixture, gasPreset, idealGas, isGasPresetName } from "../gas/gas.js";
import type { Gas, ViscosityLaw } from "../gas/gas-types.js";
import type {
  CheckedDocument,
  CheckedEdge,
  CheckedNode,
  DesignLimits,
  GasInput,
  InputNote,
  NetworkDocument,
  PipeEdgeInput,
  QuantityInput,
  SolverSettings,
} from "./document-types.js";
import { InputError, type InputIssue, jsonPointer, pointerSegment, sortIssues } from "./issues.js";
import { networkSchema } from "./network-schema.js";
import { parseQuantity, type QuantityKind } from "./quantity.js";
import { readComponentEdge, readPipeExtras } from "./read-components.js";

/** Defaults of the solver settings, documented in docs/model.md. */
export const DEFAULT_SETTINGS = {
  pipeModel: "adiabatic",
  tolerance: 1e-9,
  maxIterations: 100,
} as const;

/**
 * Default design limits, common practice (docs/model.md, "Design checks"): Mach 0.5 in headers
 * and branches, rho v^2 200 000 Pa (NORSOK P-001 for flare lines). A document's own
 * `settings.limits` replace these one by one.
 */
export const DEFAULT_LIMITS: Readonly<DesignLimits> = Object.freeze({
  maxMach: 0.5,
  maxMomentumFlux: 200_000,
});

/** Longest pipe accepted [m]: 10 000 km, beyond any gas transmission line. */
export const MAX_PIPE_LENGTH = 1e7;

/** Default absolute roughness [m]: carbon steel, not corroded (NORSOK P-001 section 5.2.2). */
export const DEFAULT_ROUGHNESS = 0.05e-3;

/** Default ambient state: 101325 Pa and 293.15 K (20 degC), common practice. */
export const DEFAULT_AMBIENT = { pressure: 101325, temperature: 293.15 } as const;

/** Largest input text accepted, in characters: larger files are refused before parsing. */
export const MAX_DOCUMENT_LENGTH = 64 * 1024 * 1024;

/** Result of reading: the checked document, or every problem found. */
export type ReadResult =
  | { ok: true; document: CheckedDocument }
  | { ok: false; issues: InputIssue[] };

/**
 * Parse JSON text. Syntax errors come back as one issue with line and column (1-based).
 */
export function parseJsonText(
  text: string,
): { ok: true; value: unknown } | { ok: false; issues: InputIssue[] } {
  if (text.length > MAX_DOCUMENT_LENGTH) {
    return {
      ok: false,
      issues: [
        {
          code: "document",
          path: "",
          message: `the document is ${text.length} characters long; the largest accepted is ${MAX_DOCUMENT_LENGTH}`,
        },
      ],
    };
  }
  if (text.trim() === "") {
    return {
      ok: false,
      issues: [
        { code: "document", path: "", message: "the document is empty; expected a JSON object" },
      ],
    };
  }
  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  try {
    return { ok: true, value: JSON.parse(body) };
  } catch {
    // JSON.parse does not say where; a tolerant parser finds the first error's offset.
    const errors: ParseError[] = [];
    parseTolerant(body, errors, { allowTrailingComma: false, disallowComments: true });
    const first = errors[0];
    const offset = first?.offset ?? 0;
    const { line, column } = lineAndColumn(body, offset);
    const what = first ? describeParseError(printParseErrorCode(first.error)) : "invalid JSON";
    return {
      ok: false,
      issues: [
        {
          code: "json-syntax",
          path: "",
          line,
          column,
          message: `invalid JSON at line ${line}, column ${column}: ${what}`,
        },
      ],
    };
  }
}

function describeParseError(code: string): string {
  const words = code.replace(/([a-z])([A-Z])/g, "$1 $2").toLowerCase();
  return words.replace(/^invalid symbol$/, "unexpected character");
}

function lineAndColumn(text: string, offset: number): { line: number; column: number } {
  let line = 1;
  let lineStart = 0;
  for (let i = 0; i < offset && i < text.length; i++) {
    if (text.charCodeAt(i) === 10) {
      line++;
      lineStart = i + 1;
    }
  }
  return { line, column: offset - lineStart + 1 };
}

let compiledValidator: ReturnType<Ajv2020["compile"]> | undefined;

/** The schema validator, compiled once on first use (allowed shared state: it never changes). */
function schemaValidator(): ReturnType<Ajv2020["compile"]> {
  if (compiledValidator === undefined) {
    const ajv = new Ajv2020({
      allErrors: true,
      verbose: true,
      strict: true,
      strictRequired: false,
      allowUnionTypes: true,
    });
    compiledValidator = ajv.compile(networkSchema);
  }
  return compiledValidator;
}

/** Check a parsed value against schemas/network.schema.json; [] when it conforms. */
export function validateAgainstSchema(value: unknown): InputIssue[] {
  const validate = schemaValidator();
  if (validate(value)) return [];
  // Copy at once: ajv keeps only the last call's errors on the validator.
  const errors = [...(validate.errors ?? [])];
  const issues = errors
    .map((error) => schemaIssue(error))
    .filter((issue): issue is InputIssue => issue !== undefined);
  return dedupe(sortIssues(issues));
}

function dedupe(issues: InputIssue[]): InputIssue[] {
  const seen = new Set<string>();
  return issues.filter((issue) => {
    const key = `${issue.path}\u0000${issue.message}`;
    if (seen.has(key)) return false;
    seen.add(key);
    return true;
  });
}

/**
 * Reword one ajv error as a user-facing line, keeping ajv's path; undefined for the summary
 * errors (`if`, `anyOf`, `allOf`) whose branches report the real problem. Shared by every
 * document machnet validates (networks, studies).
 */
export function schemaIssue(error: ErrorObject): InputIssue | undefined {
  const path = error.instancePath;
  const params = error.params as Record<string, unknown>;
  switch (error.keyword) {
    case "required":
      return {
        code: "schema",
        path,
        message: `missing required field "${String(params.missingProperty)}"`,
      };
    case "additionalProperties": {
      const allowed = allowedFields(error.parentSchema);
      return {
        code: "schema",
        path: `${path}/${pointerSegment(String(params.additionalProperty))}`,
        message: `unknown field "${String(params.additionalProperty)}"${allowed ? `; allowed fields here: ${allowed}` : ""}`,
      };
    }
    case "type": {
      const expected = String(params.type);
      const wanted =
        expected === "number,string"
          ? 'a number in SI units or a quantity string such as "80 mm"'
          : `of type ${expected.replace(",", " or ")}`;
      return { code: "schema", path, message: `must be ${wanted}` };
    }
    case "enum":
      return {
        code: "schema",
        path,
        message: `must be one of ${(params.allowedValues as unknown[]).map((v) => JSON.stringify(v)).join(", ")}`,
      };
    case "minItems":
      return {
        code: "schema",
        path,
        message: `must have at least ${String(params.limit)} item(s)`,
      };
    case "maxItems":
      return { code: "schema", path, message: `must have at most ${String(params.limit)} items` };
    case "minLength":
      return { code: "schema", path, message: "must not be empty" };
    case "maxLength":
      return {
        code: "schema",
        path,
        message: `must be at most ${String(params.limit)} characters long`,
      };
    case "minimum":
    case "maximum":
    case "exclusiveMinimum":
    case "exclusiveMaximum":
      return {
        code: "schema",
        path,
        message: `must be ${String(params.comparison)} ${String(params.limit)}`,
      };
    case "not":
      return notIssue(path, error.schema);
    case "if":
    case "anyOf":
    case "allOf":
      // The failing branch's own errors say what is wrong; these summaries add nothing.
      return undefined;
    case "integer":
      return { code: "schema", path, message: "must be a whole number" };
    default:
      return { code: "schema", path, message: error.message ?? "is not valid here" };
  }
}

function allowedFields(parentSchema: unknown): string {
  const properties = (parentSchema as { properties?: Record<string, unknown> } | undefined)
    ?.properties;
  return properties ? Object.keys(properties).join(", ") : "";
}

function notIssue(path: string, schema: unknown): InputIssue {
  const required = (schema as { required?: string[] } | undefined)?.required ?? [];
  if (required.includes("roughness") && required.includes("frictionFactor")) {
    return {
      code: "schema",
      path,
      message: 'give either "roughness" or "frictionFactor", not both',
    };
  }
  if (required.includes("heatTransferCoefficient") && required.includes("heatTransferPerLength")) {
    return {
      code: "schema",
      path,
      message:
        'give either "heatTransferCoefficient" (per wall area) or "heatTransferPerLength", not both',
    };
  }
  if (required.includes("demand")) {
    return {
      code: "schema",
      path: `${path}/demand`,
      message: "a reservoir takes no demand: its flow follows from the network",
    };
  }
  if (required.includes("pressure")) {
    return {
      code: "schema",
      path: `${path}/pressure`,
      message: "a junction's pressure is solved for; only a reservoir has a fixed pressure",
    };
  }
  return { code: "schema", path, message: "is not allowed here" };
}

/**
 * Read a network document from JSON text: parse, validate, convert, check. Never throws for bad
 * input: every problem comes back as an issue with its JSON Pointer.
 */
export function readNetworkText(text: string): ReadResult {
  const parsed = parseJsonText(text);
  if (!parsed.ok) return parsed;
  return readNetworkDocument(parsed.value);
}

/**
 * Check a network document already parsed from JSON (or built in code) and convert it to SI.
 * The caller's object is not changed.
 */
export function readNetworkDocument(value: unknown): ReadResult {
  if (typeof value !== "object" || value === null || Array.isArray(value)) {
    const found = value === null ? "null" : Array.isArray(value) ? "an array" : typeof value;
    return {
      ok: false,
      issues: [
        {
          code: "document",
          path: "",
          message: `a network document must be a JSON object with "nodes" and "edges" (got ${found})`,
        },
      ],
    };
  }
  const schemaIssues = validateAgainstSchema(value);
  if (schemaIssues.length > 0) return { ok: false, issues: schemaIssues };
  return convertDocument(value as NetworkDocument);
}

/** Like {@link readNetworkDocument} but throws an {@link InputError} with every issue. */
export function checkedDocumentOrThrow(value: unknown): CheckedDocument {
  const result = typeof value === "string" ? readNetworkText(value) : readNetworkDocument(value);
  if (!result.ok) throw new InputError(result.issues);
  return result.document;
}

/** Collects issues and notes while converting values. */
class Reader {
  readonly issues: InputIssue[] = [];
  readonly notes: InputNote[] = [];
  ambientPressure: number = DEFAULT_AMBIENT.pressure;
  molarMass: number | undefined;

  quantity(input: QuantityInput | undefined, kind: QuantityKind, path: string): number | undefined {
    if (input === undefined) return undefined;
    const context: { ambientPressure: number; path: string; molarMass?: number } = {
      ambientPressure: this.ambientPressure,
      path,
    };
    if (this.molarMass !== undefined) context.molarMass = this.molarMass;
    const result = parseQuantity(input, kind, context);
    if (!result.ok) {
      this.issues.push(result.issue);
      return undefined;
    }
    for (const note of result.notes) this.notes.push(note);
    return result.value;
  }

  positive(input: QuantityInput | undefined, kind: QuantityKind, path: string): number | undefined {
    const value = this.quantity(input, kind, path);
    if (value !== undefined && !(value > 0)) {
      this.issues.push({
        code: "value",
        path,
        value: input as QuantityInput,
        message: `must be greater than 0 (got ${JSON.stringify(input)})`,
      });
      return undefined;
    }
    return value;
  }

  fail(issue: InputIssue): void {
    this.issues.push(issue);
  }
}

function convertDocument(doc: NetworkDocument): ReadResult {
  const reader = new Reader();

  // Ambient first: gauge pressures everywhere else are relative to it.
  const ambientPressureInput = doc.ambient?.pressure;
  if (
    typeof ambientPressureInput === "string" &&
    /\(g\)|g$|gauge/i.test(ambientPressureInput.trim())
  ) {
    reader.fail({
      code: "value",
      path: "/ambient/pressure",
      value: ambientPressureInput,
      message: `the ambient pressure is the reference of gauge pressures and must be absolute (got ${JSON.stringify(ambientPressureInput)}); write e.g. "1.01325 bar(a)"`,
    });
  }
  const ambientPressure =
    inRange(
      reader,
      reader.positive(ambientPressureInput, "pressure", "/ambient/pressure"),
      ambientPressureInput,
      "/ambient/pressure",
      INPUT_RANGES.ambientPressure,
    ) ?? DEFAULT_AMBIENT.pressure;
  reader.ambientPressure = ambientPressure;
  const ambientTemperature =
    inRange(
      reader,
      reader.quantity(doc.ambient?.temperature, "temperature", "/ambient/temperature"),
      doc.ambient?.temperature,
      "/ambient/temperature",
      INPUT_RANGES.temperature,
    ) ?? DEFAULT_AMBIENT.temperature;

  // Gas next: standard and normal volume flows need its molar mass.
  const gas = readGas(doc.gas, reader);
  if (gas) reader.molarMass = gas.molarMass;

  const limitsInput = doc.settings?.limits ?? {};
  const limits: DesignLimits = { ...DEFAULT_LIMITS };
  if (limitsInput.maxMach !== undefined) limits.maxMach = limitsInput.maxMach;
  const maxVelocity = reader.positive(
    limitsInput.maxVelocity,
    "velocity",
    "/settings/limits/maxVelocity",
  );
  if (maxVelocity !== undefined) limits.maxVelocity = maxVelocity;
  const maxMomentumFlux = reader.positive(
    limitsInput.maxMomentumFlux,
    "pressureDifference",
    "/settings/limits/maxMomentumFlux",
  );
  if (maxMomentumFlux !== undefined) limits.maxMomentumFlux = maxMomentumFlux;
  const minPressure = reader.quantity(
    limitsInput.minPressure,
    "pressure",
    "/settings/limits/minPressure",
  );
  if (minPressure !== undefined) limits.minPressure = minPressure;

  const settings: SolverSettings = {
    pipeModel: doc.settings?.pipeModel ?? DEFAULT_SETTINGS.pipeModel,
    tolerance: doc.settings?.tolerance ?? DEFAULT_SETTINGS.tolerance,
    maxIterations: doc.settings?.maxIterations ?? DEFAULT_SETTINGS.maxIterations,
    limits,
  };
  if (doc.settings?.timeLimit !== undefined) settings.timeLimit = doc.settings.timeLimit;

  const nodes: CheckedNode[] = doc.nodes.map((node, index) => readNode(node, index, reader));
  const edges: CheckedEdge[] = doc.edges.map((edge, index) =>
    readEdge(edge, index, settings.pipeModel, ambientTemperature, reader),
  );
  checkElevations(nodes, edges, reader);

  if (reader.issues.length > 0 || gas === undefined) {
    return { ok: false, issues: sortIssues(reader.issues) };
  }
  return {
    ok: true,
    document: {
      name: doc.name ?? "",
      gas,
      ambientPressure,
      ambientTemperature,
      settings,
      nodes,
      edges,
      notes: reader.notes,
    },
  };
}

function readGas(input: GasInput | undefined, reader: Reader): Gas | undefined {
  if (input === undefined) return gasPreset("air");
  const forms = [
    input.preset !== undefined ? "preset" : undefined,
    input.molarMass !== undefined || input.gamma !== undefined || input.viscosity !== undefined
      ? "custom"
      : undefined,
    input.components !== undefined ? "components" : undefined,
  ].filter((form) => form !== undefined);
  if (forms.length !== 1) {
    reader.fail({
      code: "schema",
      path: "/gas",
      message:
        forms.length === 0
          ? 'give one of "preset", a custom gas ("molarMass", "gamma", "viscosity") or "components"'
          : `give only one of "preset", a custom gas or "components" (got ${forms.join(" and ")})`,
    });
    return undefined;
  }
  const presetList = GAS_PRESET_NAMES.join(", ");
  if (input.preset !== undefined) {
    if (!isGasPresetName(input.preset)) {
      reader.fail({
        code: "schema",
        path: "/gas/preset",
        message: `unknown gas "${input.preset}"; presets: ${presetList}`,
      });
      return undefined;
    }
    return gasPreset(input.preset);
  }
  if (input.components !== undefined) {
    let bad = false;
    input.components.forEach((component, index) => {
      if (!isGasPresetName(component.preset)) {
        reader.fail({
          code: "schema",
          path: `/gas/components/${index}/preset`,
          message: `unknown gas "${component.preset}"; presets: ${presetList}`,
        });
        bad = true;
      }
    });
    const sum = input.components.reduce((total, component) => total + component.moleFraction, 0);
    if (Math.abs(sum - 1) > 1e-6) {
      reader.fail({
        code: "value",
        path: "/gas/components",
        value: sum,
        message: `mole fractions must add up to 1 (they add up to ${sum})`,
      });
      bad = true;
    }
    if (bad) return undefined;
    return gasMixture(
      input.components.map((component) => ({
        gas: gasPreset(component.preset as Parameters<typeof gasPreset>[0]),
        moleFraction: component.moleFraction,
      })),
      input.name ?? "mixture",
    );
  }
  // Custom ideal gas: all three parts are needed.
  let bad = false;
  for (const field of ["molarMass", "gamma", "viscosity"] as const) {
    if (input[field] === undefined) {
      reader.fail({
        code: "schema",
        path: "/gas",
        message: `a custom gas needs "${field}" (give "molarMass", "gamma" and "viscosity")`,
      });
      bad = true;
    }
  }
  if (bad) return undefined;
  const molarMass = inRange(
    reader,
    reader.positive(input.molarMass, "molarMass", "/gas/molarMass"),
    input.molarMass,
    "/gas/molarMass",
    INPUT_RANGES.molarMass,
  );
  const gamma = input.gamma as number;
  if (!(gamma > 1 && gamma < 2)) {
    reader.fail({
      code: "value",
      path: "/gas/gamma",
      value: gamma,
      message: `the heat capacity ratio must lie between 1 and 2 (got ${gamma})`,
    });
    bad = true;
  }
  const viscosityLaw = readViscosity(input.viscosity as NonNullable<GasInput["viscosity"]>, reader);
  if (bad || molarMass === undefined || viscosityLaw === undefined) return undefined;
  return idealGas({
    name: input.name ?? "custom",
    molarMass,
    heatCapacityRatio: gamma,
    viscosityLaw,
  });
}

function readViscosity(
  input: NonNullable<GasInput["viscosity"]>,
  reader: Reader,
): ViscosityLaw | undefined {
  if (typeof input === "number" || typeof input === "string") {
    const viscosity = inRange(
      reader,
      reader.positive(input, "viscosity", "/gas/viscosity"),
      input,
      "/gas/viscosity",
      INPUT_RANGES.viscosity,
    );
    return viscosity === undefined ? undefined : { kind: "constant", viscosity };
  }
  const referenceViscosity = inRange(
    reader,
    reader.positive(input.referenceViscosity, "viscosity", "/gas/viscosity/referenceViscosity"),
    input.referenceViscosity,
    "/gas/viscosity/referenceViscosity",
    INPUT_RANGES.viscosity,
  );
  const referenceTemperature = inRange(
    reader,
    reader.quantity(
      input.referenceTemperature,
      "temperature",
      "/gas/viscosity/referenceTemperature",
    ),
    input.referenceTemperature,
    "/gas/viscosity/referenceTemperature",
    INPUT_RANGES.temperature,
  );
  const sutherlandConstant = inRange(
    reader,
    reader.positive(
      input.sutherlandConstant,
      "temperatureDifference",
      "/gas/viscosity/sutherlandConstant",
    ),
    input.sutherlandConstant,
    "/gas/viscosity/sutherlandConstant",
    INPUT_RANGES.sutherlandConstant,
  );
  if (
    referenceViscosity === undefined ||
    referenceTemperature === undefined ||
    sutherlandConstant === undefined
  ) {
    return undefined;
  }
  return { kind: "sutherland", referenceViscosity, referenceTemperature, sutherlandConstant };
}

/** The plausible range of one input of the ideal-gas network model, in SI. */
export interface InputRange {
  /** Smallest and largest accepted value, in `unit`. */
  low: number;
  high: number;
  unit: string;
  /** What the range is of, for messages: "the ideal-gas model's temperatures". */
  what: string;
}

/**
 * Plausible ranges of the inputs of the ideal-gas network model. A value outside one is
 * physically impossible for the model, or a unit slip, and is refused with its JSON Pointer and
 * the range. The reasons (docs/model.md, "Input ranges"; common practice, no source):
 * - temperature 20 K to 3000 K: below 20 K every gas but helium has condensed (hydrogen boils
 *   at about 20.3 K at 1 atm, from memory) and helium is far from ideal; above 3000 K oxygen and
 *   nitrogen dissociate and a constant cp is far off. The same range holds for the ambient
 *   temperature and a Sutherland reference temperature.
 * - reservoir pressure 100 Pa to 1e8 Pa (1000 bar) absolute: below 100 Pa the mean free path of
 *   air (about 70 um, from the 68 nm at 1 atm, from memory) is no longer small against small
 *   bores and the continuum friction laws lose their footing; above 1000 bar no gas is near
 *   ideal.
 * - ambient (barometric) pressure 10 kPa to 1 MPa: the atmosphere with room on both sides; a
 *   barometric pressure written in mbar, hPa or kPa but read as Pa falls outside.
 * - demand (and injection) at most 1e5 kg/s either way: a hundred times the flow of the largest
 *   gas trunk lines (about 1000 kg/s); beyond it a value is a unit slip.
 * - molar mass 1 g/mol to 1 kg/mol: the lightest gas is hydrogen (2.016 g/mol); a vapour of more
 *   than 1 kg/mol is no gas at pipe conditions.
 * - dynamic viscosity 1e-7 Pa s to 1e-3 Pa s: gases lie between about 1e-6 and 1e-4 Pa s; a
 *   value in uPa s or cP read as Pa s falls outside.
 * - Sutherland constant at most 1e4 K (those of common gases lie between about 70 K and 300 K,
 *   from memory).
 */
export const INPUT_RANGES = Object.freeze({
  temperature: { low: 20, high: 3000, unit: "K", what: "the ideal-gas model's temperatures" },
  pressure: { low: 100, high: 1e8, unit: "Pa", what: "absolute pressures of the model" },
  ambientPressure: { low: 1e4, high: 1e6, unit: "Pa", what: "barometric pressures" },
  demand: { low: -1e5, high: 1e5, unit: "kg/s", what: "flows of gas networks" },
  molarMass: { low: 1e-3, high: 1, unit: "kg/mol", what: "molar masses of gases" },
  viscosity: { low: 1e-7, high: 1e-3, unit: "Pa s", what: "viscosities of gases" },
  sutherlandConstant: { low: 0, high: 1e4, unit: "K", what: "Sutherland constants" },
  elevation: { low: -2e4, high: 2e4, unit: "m", what: "elevations of gas networks" },
  heatTransferCoefficient: {
    low: 0,
    high: 1e5,
    unit: "W/(m2 K)",
    what: "overall heat-transfer coefficients of pipes",
  },
  heatTransferPerLength: {
    low: 0,
    high: 1e6,
    unit: "W/(m K)",
    what: "overall heat-transfer coefficients of pipes per unit length",
  },
} satisfies Record<string, InputRange>);

/**
 * The value if it lies in the range (inclusive), otherwise undefined and an issue at `path`
 * naming the value, the range and what it is of. An undefined value passes through.
 */
function inRange(
  reader: Reader,
  value: number | undefined,
  input: QuantityInput | undefined,
  path: string,
  range: InputRange,
): number | undefined {
  if (value === undefined) return undefined;
  if (value >= range.low && value <= range.high) return value;
  reader.fail({
    code: "value",
    path,
    value: input ?? value,
    message: `${rangeNumber(value)} ${range.unit} is outside the range of ${range.what}: ${rangeNumber(range.low)} to ${rangeNumber(range.high)} ${range.unit} (got ${JSON.stringify(input)})`,
  });
  return undefined;
}

/** A number for a range message: four digits, powers of ten as "1e8" when large or small. */
function rangeNumber(value: number): string {
  const rounded = Number(value.toPrecision(4));
  const size = Math.abs(rounded);
  if (size !== 0 && (size >= 1e4 || size < 1e-3)) {
    return rounded.toExponential().replace("e+", "e");
  }
  return String(rounded);
}

function readNode(
  node: NetworkDocument["nodes"][number],
  index: number,
  reader: Reader,
): CheckedNode {
  const path = jsonPointer("nodes", index);
  const checked: CheckedNode = { id: node.id, kind: node.kind, demand: 0, elevation: 0 };
  const elevation = inRange(
    reader,
    reader.quantity(node.elevation, "length", `${path}/elevation`),
    node.elevation,
    `${path}/elevation`,
    INPUT_RANGES.elevation,
  );
  if (elevation !== undefined) checked.elevation = elevation;
  if (node.kind === "reservoir") {
    const pressure = inRange(
      reader,
      reader.quantity(node.pressure, "pressure", `${path}/pressure`),
      node.pressure,
      `${path}/pressure`,
      INPUT_RANGES.pressure,
    );
    if (pressure !== undefined) checked.pressure = pressure;
    const temperature = inRange(
      reader,
      reader.quantity(node.temperature, "temperature", `${path}/temperature`),
      node.temperature,
      `${path}/temperature`,
      INPUT_RANGES.temperature,
    );
    if (temperature !== undefined) checked.temperature = temperature;
    return checked;
  }
  // The sign decides whether a temperature belongs here, even for a demand out of range.
  const demand = reader.quantity(node.demand, "massFlow", `${path}/demand`);
  const demandInRange = inRange(reader, demand, node.demand, `${path}/demand`, INPUT_RANGES.demand);
  if (demandInRange !== undefined) checked.demand = demandInRange;
  const temperature = inRange(
    reader,
    reader.quantity(node.temperature, "temperature", `${path}/temperature`),
    node.temperature,
    `${path}/temperature`,
    INPUT_RANGES.temperature,
  );
  if (demand !== undefined && demand < 0) {
    if (node.temperature === undefined) {
      reader.fail({
        code: "schema",
        path: `${path}/temperature`,
        message: `an injection (negative demand ${JSON.stringify(node.demand)}) needs the temperature of the injected gas`,
      });
    } else if (temperature !== undefined) {
      checked.temperature = temperature;
    }
  } else if (node.temperature !== undefined) {
    reader.fail({
      code: "schema",
      path: `${path}/temperature`,
      message:
        "a junction's temperature is solved for; give a temperature only with a negative demand (an injection)",
    });
  }
  return checked;
}

/**
 * Pipes between nodes at different elevations must use the heat-transfer model: the closed-form
 * adiabatic and isothermal models have no gravity term (docs/model.md, "Elevation").
 */
function checkElevations(nodes: CheckedNode[], edges: CheckedEdge[], reader: Reader): void {
  const elevationOf = new Map(nodes.map((node) => [node.id, node.elevation]));
  edges.forEach((edge, index) => {
    if (edge.kind !== "pipe" || edge.model === "heat-transfer") return;
    const from = elevationOf.get(edge.from);
    const to = elevationOf.get(edge.to);
    if (from === undefined || to === undefined || from === to) return;
    reader.fail({
      code: "value",
      path: `${jsonPointer("edges", index)}/model`,
      value: edge.model,
      message: `pipe ${edge.id} joins nodes ${Number(Math.abs(to - from).toPrecision(4))} m apart in elevation, and the ${edge.model} model has no gravity term; use "model": "heat-transfer"`,
    });
  });
}

/** U' [W/(m K)] and the surrounding temperature of a heat-transfer pipe, or an issue. */
function readHeatExchange(
  edge: PipeEdgeInput,
  path: string,
  model: CheckedEdge["model"],
  diameter: number,
  ambientTemperature: number,
  reader: Reader,
): { heatTransferPerLength: number; surroundingTemperature: number } | undefined {
  const fields = ["heatTransferCoefficient", "heatTransferPerLength", "surroundingTemperature"];
  if (model !== "heat-transfer") {
    for (const field of fields) {
      const value = edge[field as keyof PipeEdgeInput];
      if (value === undefined) continue;
      reader.fail({
        code: "value",
        path: `${path}/${field}`,
        value: value as QuantityInput,
        message: `applies to the heat-transfer model only; this pipe uses the ${model} model (set "model": "heat-transfer")`,
      });
    }
    return undefined;
  }
  const perArea = inRange(
    reader,
    reader.quantity(
      edge.heatTransferCoefficient,
      "heatTransferCoefficient",
      `${path}/heatTransferCoefficient`,
    ),
    edge.heatTransferCoefficient,
    `${path}/heatTransferCoefficient`,
    INPUT_RANGES.heatTransferCoefficient,
  );
  const perLength = inRange(
    reader,
    reader.quantity(
      edge.heatTransferPerLength,
      "heatTransferPerLength",
      `${path}/heatTransferPerLength`,
    ),
    edge.heatTransferPerLength,
    `${path}/heatTransferPerLength`,
    INPUT_RANGES.heatTransferPerLength,
  );
  const surrounding = inRange(
    reader,
    reader.quantity(edge.surroundingTemperature, "temperature", `${path}/surroundingTemperature`),
    edge.surroundingTemperature,
    `${path}/surroundingTemperature`,
    INPUT_RANGES.temperature,
  );
  return {
    heatTransferPerLength: perLength ?? (perArea ?? 0) * Math.PI * diameter,
    surroundingTemperature: surrounding ?? ambientTemperature,
  };
}

function readEdge(
  edge: NetworkDocument["edges"][number],
  index: number,
  defaultModel: CheckedEdge["model"],
  ambientTemperature: number,
  reader: Reader,
): CheckedEdge {
  const path = jsonPointer("edges", index);
  if (edge.kind !== "pipe") return readComponentEdge(edge, path, reader);
  let length = reader.positive(edge.length, "length", `${path}/length`) ?? Number.NaN;
  if (length > MAX_PIPE_LENGTH) {
    reader.fail({
      code: "value",
      path: `${path}/length`,
      value: edge.length,
      message: `a pipe ${length} m long is beyond any gas line (at most ${MAX_PIPE_LENGTH} m, 10 000 km); check the units`,
    });
    length = Number.NaN;
  }
  // Inside diameter or nominal size and schedule; material; fittings (read-components.ts).
  const extras = readPipeExtras(edge, path, reader);
  const diameter = extras.diameter;
  const checked: CheckedEdge = {
    id: edge.id,
    kind: edge.kind,
    from: edge.from,
    to: edge.to,
    length,
    diameter,
    minorLoss: (edge.minorLoss ?? 0) + extras.fittingsLoss,
    model: edge.model ?? defaultModel,
  };
  if (extras.catalog !== undefined) checked.catalog = extras.catalog;
  const exchange = readHeatExchange(
    edge,
    path,
    checked.model,
    diameter,
    ambientTemperature,
    reader,
  );
  if (exchange !== undefined && checked.kind === "pipe") {
    checked.heatTransferPerLength = exchange.heatTransferPerLength;
    checked.surroundingTemperature = exchange.surroundingTemperature;
  }
  if (edge.frictionFactor !== undefined) {
    checked.frictionFactor = edge.frictionFactor;
  } else {
    const roughness =
      edge.roughness === undefined
        ? (extras.materialRoughness ?? DEFAULT_ROUGHNESS)
        : reader.quantity(edge.roughness, "length", `${path}/roughness`);
    if (roughness !== undefined) {
      if (roughness < 0) {
        reader.fail({
          code: "value",
          path: `${path}/roughness`,
          value: edge.roughness as QuantityInput,
          message: `must be 0 or more (got ${JSON.stringify(edge.roughness)})`,
        });
      } else if (Number.isFinite(diameter) && roughness / diameter > 0.1) {
        reader.fail({
          code: "value",
          path: `${path}/roughness`,
          value: edge.roughness as QuantityInput,
          message: `relative roughness ${(roughness / diameter).toPrecision(3)} is beyond the range of the friction correlations (at most 0.1); check the units of roughness and diameter`,
        });
      } else {
        checked.roughness = roughness;
      }
    }
  }
  if (Number.isFinite(length) && Number.isFinite(diameter) && diameter > length * 1e3) {
    reader.fail({
      code: "value",
      path: `${path}/${edge.diameter === undefined ? "size" : "diameter"}`,
      value: edge.diameter ?? edge.size ?? diameter,
      message: `a diameter of ${diameter} m on a pipe ${length} m long is not a pipe; check the units`,
    });
  }
  return checked;
}
