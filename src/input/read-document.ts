/**
 * JSON text -> checked document: parse, validate against the schema, convert every quantity to
 * SI, apply defaults, and check the rules the schema cannot express. Every problem is collected
 * (not only the first) and reported with its JSON Pointer.
 */
import { printParseErrorCode } from "jsonc-parser";
import type {
  CheckedDocument,
  CheckedEdge,
  CheckedNode,
  DesignLimits,
  InputNote,
  NetworkDocument,
  PipeEdgeInput,
  QuantityInput,
  SolverSettings,
} from "./document-types.js";
import { INPUT_RANGES, inRange, quantityInRange } from "./input-ranges.js";
import { InputError, type InputIssue, jsonPointer, sortIssues } from "./issues.js";
import { firstJsonSyntaxError } from "./json-syntax-error.js";
import { parseQuantity, type QuantityKind } from "./quantity.js";
import { readComponentEdge, readPipeExtras } from "./read-components.js";
import { readGas } from "./read-gas.js";
import { validateNetworkSchema } from "./validate-schema.js";

export { INPUT_RANGES, type InputRange } from "./input-ranges.js";

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
    // JSON.parse does not say where; a walk over the tokens (stack-safe) finds the first error.
    const first = firstJsonSyntaxError(body);
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

/** Check a parsed value against schemas/network.schema.json; [] when it conforms. */
export function validateAgainstSchema(value: unknown): InputIssue[] {
  return sortIssues(validateNetworkSchema(value));
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
    quantityInRange(
      reader,
      doc.ambient?.temperature,
      "temperature",
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

function readNode(
  node: NetworkDocument["nodes"][number],
  index: number,
  reader: Reader,
): CheckedNode {
  const path = jsonPointer("nodes", index);
  const checked: CheckedNode = { id: node.id, kind: node.kind, demand: 0, elevation: 0 };
  const elevation = quantityInRange(
    reader,
    node.elevation,
    "length",
    `${path}/elevation`,
    INPUT_RANGES.elevation,
  );
  if (elevation !== undefined) checked.elevation = elevation;
  if (node.kind === "reservoir") {
    const pressure = quantityInRange(
      reader,
      node.pressure,
      "pressure",
      `${path}/pressure`,
      INPUT_RANGES.pressure,
    );
    if (pressure !== undefined) checked.pressure = pressure;
    const temperature = quantityInRange(
      reader,
      node.temperature,
      "temperature",
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
  const temperature = quantityInRange(
    reader,
    node.temperature,
    "temperature",
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
  const perArea = quantityInRange(
    reader,
    edge.heatTransferCoefficient,
    "heatTransferCoefficient",
    `${path}/heatTransferCoefficient`,
    INPUT_RANGES.heatTransferCoefficient,
  );
  const perLength = quantityInRange(
    reader,
    edge.heatTransferPerLength,
    "heatTransferPerLength",
    `${path}/heatTransferPerLength`,
    INPUT_RANGES.heatTransferPerLength,
  );
  const surrounding = quantityInRange(
    reader,
    edge.surroundingTemperature,
    "temperature",
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
  const diameter = !Number.isFinite(extras.diameter)
    ? extras.diameter
    : (inRange(
        reader,
        extras.diameter,
        edge.diameter,
        `${path}/${edge.diameter === undefined ? "size" : "diameter"}`,
        INPUT_RANGES.pipeDiameter,
      ) ?? Number.NaN);
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
