/**
 * Study document -> prepared study: JSON parse, ajv against the study schema, the base network
 * read and checked, every input and output resolved against it, every quantity to SI, and the
 * block of the chosen question checked. Every problem is collected and reported with its JSON
 * Pointer into the study document. Browser-safe: a study that names its network by file name
 * gets the network document from the caller.
 */

import type { CheckedDocument, QuantityInput } from "../input/document-types.js";
import type { InputIssue } from "../input/issues.js";
import { catalogPipe, PIPE_SCHEDULES, parseNominalSize } from "../input/pipe-catalog.js";
import { PIPE_DIMENSIONS } from "../input/pipe-catalog-data.js";
import { parseQuantity, type QuantityKind } from "../input/quantity.js";
import { parseJsonText, readNetworkDocument } from "../input/read-document.js";
import { validateStudyDocumentSchema } from "../input/validate-schema.js";
import { buildNetwork } from "../model/build-network.js";
import type { DisplayKind } from "../output/display-units.js";
import { DEFAULT_BLOCK_SIZE, MAX_CASES } from "./cases.js";
import { resolveOutput, resolveOutputs } from "./outputs.js";
import { article, findElement, parameterQuantityKind, resolveParameter } from "./parameters.js";
import { defaultPipeDiameters, type PipeSize } from "./pipe-diameters.js";
import { prefixIssues, type StudyIssue, sortStudyIssues } from "./study-issues.js";
import type {
  CapacityLimits,
  PreparedStudy,
  ResolvedOutput,
  ResolvedParameter,
  SizingLimits,
  StudyDocument,
  StudyParameterInput,
  SweepInput,
} from "./study-types.js";

/** Options of {@link readStudyDocument}. */
export interface ReadStudyOptions {
  /**
   * The network document (parsed JSON) when the study names its network by file name: the
   * library reads no files. Ignored when the study holds its network inline.
   */
  network?: unknown;
}

/** Result of reading a study. */
export type StudyReadResult =
  | { ok: true; study: PreparedStudy }
  | {
      ok: false;
      /** Problems in the study document (an inline network's under `/network`). */
      issues: StudyIssue[];
      /** Problems in a network given separately (paths into that document). */
      networkIssues: InputIssue[];
    };

/** Check a parsed value against schemas/study.schema.json; [] when it conforms. */
export function validateStudySchema(value: unknown): StudyIssue[] {
  return sortStudyIssues(validateStudyDocumentSchema(value));
}

/** Read a study from JSON text (see {@link readStudyDocument}). */
export function readStudyText(text: string, options: ReadStudyOptions = {}): StudyReadResult {
  const parsed = parseJsonText(text);
  if (!parsed.ok) return { ok: false, issues: parsed.issues, networkIssues: [] };
  return readStudyDocument(parsed.value, options);
}

/** Collects issues while resolving the study. */
class StudyReader {
  readonly issues: StudyIssue[] = [];

  constructor(readonly network: CheckedDocument) {}

  /** A quantity in SI, or undefined after recording the issue. */
  quantity(input: QuantityInput, kind: QuantityKind, path: string): number | undefined {
    const result = parseQuantity(input, kind, {
      ambientPressure: this.network.ambientPressure,
      molarMass: this.network.gas.molarMass,
      path,
    });
    if (!result.ok) {
      this.issues.push(result.issue);
      return undefined;
    }
    return result.value;
  }

  /** A positive quantity (a limit) in SI, or undefined after recording the issue. */
  positive(input: QuantityInput | undefined, kind: QuantityKind, path: string): number | undefined {
    if (input === undefined) return undefined;
    const value = this.quantity(input, kind, path);
    if (value !== undefined && !(value > 0)) {
      this.fail({
        code: "value",
        path,
        value: input,
        message: `must be greater than 0 (got ${JSON.stringify(input)})`,
      });
      return undefined;
    }
    return value;
  }

  parameter(input: StudyParameterInput, path: string): ResolvedParameter | undefined {
    const resolved = resolveParameter(this.network, input, path);
    if ("issues" in resolved) {
      this.issues.push(...resolved.issues);
      return undefined;
    }
    return resolved.parameter;
  }

  output(text: string, path: string): ResolvedOutput | undefined {
    const resolved = resolveOutput(this.network, text, path);
    if ("issue" in resolved) {
      this.issues.push(resolved.issue);
      return undefined;
    }
    return resolved.output;
  }

  fail(issue: StudyIssue): void {
    this.issues.push(issue);
  }
}

/**
 * Check a study document already parsed from JSON (or built in code) and prepare it: the base
 * network read, inputs and outputs resolved, values in SI. Never throws for bad input: every
 * problem comes back with its JSON Pointer. The caller's objects are not changed.
 *
 * @param value - the study document
 * @param options - the network document, when the study names it by file name
 * @example
 * const read = readStudyDocument({
 *   network: { nodes: [...], edges: [...] },
 *   inputs: [{ group: "demands", range: { from: 0.5, to: 1.5, steps: 10 } }],
 *   outputs: ["network/minPressure"],
 * });
 * if (read.ok) caseCount(read.study); // 11 (checked in test/study/examples.test.ts)
 */
export function readStudyDocument(value: unknown, options: ReadStudyOptions = {}): StudyReadResult {
  const fail = (issues: StudyIssue[], networkIssues: InputIssue[] = []): StudyReadResult => ({
    ok: false,
    issues: sortStudyIssues(issues),
    networkIssues,
  });
  if (typeof value !== "object" || value === null || Array.isArray(value)) {
    const found = value === null ? "null" : Array.isArray(value) ? "an array" : typeof value;
    return fail([
      {
        code: "document",
        path: "",
        message: `a study document must be a JSON object with a "network" (got ${found})`,
      },
    ]);
  }
  const schemaIssues = validateStudySchema(value);
  if (schemaIssues.length > 0) return fail(schemaIssues);
  const doc = value as StudyDocument;

  // The base network.
  let networkValue: unknown;
  const inline = typeof doc.network === "object";
  if (inline) {
    networkValue = doc.network;
  } else if (options.network !== undefined) {
    networkValue = options.network;
  } else {
    return fail([
      {
        code: "document",
        path: "/network",
        message: `names the network file ${JSON.stringify(doc.network)}; the library reads no files: pass the network document in the options (the command line reads the file)`,
      },
    ]);
  }
  const read = readNetworkDocument(networkValue);
  const networkProblems = read.ok ? topologyIssues(read.document) : read.issues;
  if (!read.ok || networkProblems.length > 0) {
    return inline ? fail(prefixIssues("/network", networkProblems)) : fail([], networkProblems);
  }
  const network = read.document;
  const reader = new StudyReader(network);
  const question = doc.question ?? "sweep";

  // Sweep inputs and outputs.
  const inputs: SweepInput[] = [];
  if (doc.inputs !== undefined && question !== "sweep") {
    reader.fail({
      code: "value",
      path: "/inputs",
      value: question,
      message: `"inputs" are the varied inputs of a sweep; question "${question}" takes its inputs from its own block "${question}"`,
    });
  }
  if (question === "sweep") {
    if (doc.inputs === undefined) {
      reader.fail({
        code: "schema",
        path: "",
        message: 'a sweep needs "inputs": the inputs to vary, each with "values" or a "range"',
      });
    } else {
      doc.inputs.forEach((input, position) => {
        const resolved = sweepInput(reader, input, `/inputs/${position}`);
        if (resolved) inputs.push(resolved);
      });
    }
  }
  const outputs = resolveOutputs(network, doc.outputs, "/outputs");
  if ("issues" in outputs) reader.issues.push(...outputs.issues);
  const combine = doc.combine ?? "grid";
  if (reader.issues.length === 0 && question === "sweep") {
    checkCases(reader, inputs, combine);
    checkLabels(
      reader,
      inputs.map((input) => input.label),
      "/inputs",
      "input",
    );
    if (!("issues" in outputs)) {
      checkLabels(
        reader,
        outputs.outputs.map((output) => output.label),
        "/outputs",
        "output",
      );
    }
  }

  const study: PreparedStudy = {
    name: doc.name ?? "",
    question,
    units: doc.units ?? "si",
    network,
    inputs,
    combine,
    outputs: "outputs" in outputs ? outputs.outputs : [],
    warmStart: doc.warmStart ?? true,
    blockSize: doc.blockSize ?? DEFAULT_BLOCK_SIZE,
  };

  const missingBlock = (name: string) =>
    reader.fail({
      code: "schema",
      path: "",
      message: `question "${name}" needs a "${name}" block`,
    });
  for (const name of ["target", "capacity", "sensitivities", "sizing"] as const) {
    if (doc[name] !== undefined && question !== name) {
      reader.fail({
        code: "value",
        path: `/${name}`,
        value: question,
        message: `the "${name}" block is read only with "question": "${name}" (the question is "${question}")`,
      });
    }
  }
  if (question === "target") {
    if (doc.target === undefined) missingBlock("target");
    else readTarget(reader, doc, study);
  } else if (question === "capacity") {
    readCapacity(reader, doc, study);
  } else if (question === "sensitivities") {
    if (doc.sensitivities === undefined) missingBlock("sensitivities");
    else readSensitivities(reader, doc, study);
  } else if (question === "sizing") {
    readSizing(reader, doc, study);
  }

  if (reader.issues.length > 0) return fail(reader.issues);
  return { ok: true, study };
}

/** Topology problems of a checked network (unknown nodes, no reservoir...). */
function topologyIssues(network: CheckedDocument): InputIssue[] {
  const built = buildNetwork(network);
  return built.ok ? [] : built.issues;
}

/** A sweep input with its values in SI. */
function sweepInput(
  reader: StudyReader,
  input: StudyParameterInput,
  path: string,
): SweepInput | undefined {
  const parameter = reader.parameter(input, path);
  if (input.bracket !== undefined) {
    reader.fail({
      code: "value",
      path: `${path}/bracket`,
      value: "bracket",
      message:
        '"bracket" belongs to the input of a target search; a sweep input takes "values" or a "range"',
    });
  }
  if ((input.values === undefined) === (input.range === undefined)) {
    reader.fail({
      code: "schema",
      path,
      message:
        'give either "values" (a list) or "range" ({ "from", "to", "steps" }), not both or neither',
    });
    return undefined;
  }
  if (parameter === undefined) return undefined;
  const values = parameterValues(reader, parameter, input, path);
  return values === undefined ? undefined : { ...parameter, values };
}

/** The values of an input (a list or a range) in SI; undefined after recording the issues. */
function parameterValues(
  reader: StudyReader,
  parameter: ResolvedParameter,
  input: StudyParameterInput,
  path: string,
): number[] | undefined {
  const kind = parameterQuantityKind(parameter);
  const before = reader.issues.length;
  if (input.values !== undefined) {
    const values = input.values.map(
      (value, i) => reader.quantity(value, kind, `${path}/values/${i}`) ?? Number.NaN,
    );
    return reader.issues.length > before ? undefined : values;
  }
  const range = input.range as NonNullable<StudyParameterInput["range"]>;
  const from = reader.quantity(range.from, kind, `${path}/range/from`);
  const to = reader.quantity(range.to, kind, `${path}/range/to`);
  if (from === undefined || to === undefined) return undefined;
  const steps = range.steps;
  if (range.spacing === "log") {
    if (!(from > 0 && to > 0)) {
      reader.fail({
        code: "value",
        path: `${path}/range`,
        value: "log",
        message: `equal ratios ("spacing": "log") need both ends greater than 0 (got ${from} and ${to} in SI)`,
      });
      return undefined;
    }
    return Array.from({ length: steps + 1 }, (_, i) =>
      i === steps ? to : from * (to / from) ** (i / steps),
    );
  }
  return Array.from({ length: steps + 1 }, (_, i) =>
    i === steps ? to : from + ((to - from) * i) / steps,
  );
}

/** Zip needs equal lengths; a grid may not exceed the case limit. */
function checkCases(reader: StudyReader, inputs: SweepInput[], combine: "grid" | "zip"): void {
  if (combine === "zip") {
    const first = inputs[0]?.values.length ?? 0;
    inputs.forEach((input, position) => {
      if (input.values.length !== first) {
        reader.fail({
          code: "value",
          path: `/inputs/${position}`,
          value: input.values.length,
          message: `"combine": "zip" takes the i-th value of every input together, so every input needs the same number of values: /inputs/0 has ${first}, this one ${input.values.length}`,
        });
      }
    });
    return;
  }
  const count = inputs.reduce((product, input) => product * input.values.length, 1);
  if (count > MAX_CASES) {
    reader.fail({
      code: "value",
      path: "/inputs",
      value: count,
      message: `the grid has ${count} cases; at most ${MAX_CASES} are allowed (split the study)`,
    });
  }
}

/** Column names must be unique. */
function checkLabels(reader: StudyReader, labels: string[], path: string, what: string): void {
  const first = new Map<string, number>();
  labels.forEach((label, position) => {
    const earlier = first.get(label);
    if (earlier === undefined) {
      first.set(label, position);
      return;
    }
    reader.fail({
      code: "value",
      path: `${path}/${position}`,
      value: label,
      message: `${what} name ${JSON.stringify(label)} is used by ${path}/${earlier} already; give each ${what} its own ${what === "input" ? '"name"' : "entry"}`,
    });
  });
}

/** The quantity kind a target value of an output is read as. */
const TARGET_KINDS: Partial<Record<DisplayKind, QuantityKind>> = {
  pressure: "pressure",
  pressureDifference: "pressureDifference",
  temperature: "temperature",
  massFlow: "massFlow",
  velocity: "velocity",
  momentumFlux: "pressureDifference",
  dimensionless: "dimensionless",
};

function readTarget(reader: StudyReader, doc: StudyDocument, study: PreparedStudy): void {
  const block = doc.target as NonNullable<StudyDocument["target"]>;
  if (block.input.values !== undefined || block.input.range !== undefined) {
    reader.fail({
      code: "value",
      path: "/target/input",
      value: "values",
      message:
        'a target search finds the value itself: give a "bracket" (or nothing), not "values" or "range"',
    });
  }
  const input = reader.parameter(block.input, "/target/input");
  const output = reader.output(block.output, "/target/output");
  let kind: QuantityKind | undefined = "dimensionless";
  if (output !== undefined) {
    kind = TARGET_KINDS[output.kind];
    if (output.boolean || kind === undefined) {
      reader.fail({
        code: "value",
        path: "/target/output",
        value: block.output,
        message: `${JSON.stringify(block.output)} cannot be a target (a true/false or density field); choose a pressure, temperature, flow, velocity or Mach number`,
      });
    }
  }
  const value =
    kind === undefined ? undefined : reader.quantity(block.value, kind, "/target/value");
  let bracket: [number, number] | undefined;
  if (block.input.bracket !== undefined && input !== undefined) {
    const inputKind = parameterQuantityKind(input);
    const low = reader.quantity(block.input.bracket[0], inputKind, "/target/input/bracket/0");
    const high = reader.quantity(block.input.bracket[1], inputKind, "/target/input/bracket/1");
    if (low !== undefined && high !== undefined) {
      if (low === high) {
        reader.fail({
          code: "value",
          path: "/target/input/bracket",
          value: String(low),
          message: "the two ends of the bracket must differ",
        });
      }
      bracket = [Math.min(low, high), Math.max(low, high)];
    }
  }
  if (input === undefined || output === undefined) return;
  if (value === undefined) return;
  study.target = {
    input,
    output,
    value,
    relativeTolerance: block.relativeTolerance ?? 1e-6,
    maxSolves: block.maxSolves ?? 60,
  };
  if (bracket) study.target.bracket = bracket;
}

function readCapacity(reader: StudyReader, doc: StudyDocument, study: PreparedStudy): void {
  const block = doc.capacity ?? {};
  const group = reader.parameter({ group: block.group ?? "demands" }, "/capacity");
  const written = block.limits ?? {};
  const limits: CapacityLimits = {};
  const minPressure =
    reader.positive(written.minPressure, "pressure", "/capacity/limits/minPressure") ??
    (written.minPressure === undefined ? study.network.settings.limits.minPressure : undefined);
  if (minPressure !== undefined) limits.minPressure = minPressure;
  const maxPressure = reader.positive(
    written.maxPressure,
    "pressure",
    "/capacity/limits/maxPressure",
  );
  if (maxPressure !== undefined) limits.maxPressure = maxPressure;
  if (written.maxMach !== undefined) limits.maxMach = written.maxMach;
  const maxVelocity = reader.positive(
    written.maxVelocity,
    "velocity",
    "/capacity/limits/maxVelocity",
  );
  if (maxVelocity !== undefined) limits.maxVelocity = maxVelocity;
  if (group === undefined) return;
  study.capacity = {
    group,
    limits,
    relativeTolerance: block.relativeTolerance ?? 1e-6,
    maxScale: block.maxScale ?? 1000,
    maxSolves: block.maxSolves ?? 80,
  };
}

function readSensitivities(reader: StudyReader, doc: StudyDocument, study: PreparedStudy): void {
  const block = doc.sensitivities as NonNullable<StudyDocument["sensitivities"]>;
  const inputs: ResolvedParameter[] = [];
  block.inputs.forEach((input, position) => {
    const path = `/sensitivities/inputs/${position}`;
    if (input.values !== undefined || input.range !== undefined || input.bracket !== undefined) {
      reader.fail({
        code: "value",
        path,
        value: "values",
        message:
          'sensitivities are taken at the base network: an input takes "path" or "group" (and "name"), no values',
      });
    }
    const parameter = reader.parameter(input, path);
    if (parameter) inputs.push(parameter);
  });
  const outputs = resolveOutputs(
    study.network,
    block.outputs ?? doc.outputs,
    block.outputs !== undefined ? "/sensitivities/outputs" : "/outputs",
  );
  if ("issues" in outputs) {
    reader.issues.push(...outputs.issues);
    return;
  }
  checkLabels(
    reader,
    inputs.map((input) => input.label),
    "/sensitivities/inputs",
    "input",
  );
  study.sensitivities = { inputs, outputs: outputs.outputs };
}

function readSizing(reader: StudyReader, doc: StudyDocument, study: PreparedStudy): void {
  const block = doc.sizing ?? {};
  const network = study.network;
  const edges: number[] = [];
  if (block.edges === undefined || block.edges === "all") {
    network.edges.forEach((edge, index) => {
      if (edge.kind === "pipe") edges.push(index);
    });
  } else if (typeof block.edges === "string") {
    reader.fail({
      code: "value",
      path: "/sizing/edges",
      value: block.edges,
      message: `must be "all" or a list of edge ids (got ${JSON.stringify(block.edges)})`,
    });
  } else {
    block.edges.forEach((id, position) => {
      const found = findElement(network.edges, "edge", id, `/sizing/edges/${position}`);
      const edge = "issue" in found ? undefined : network.edges[found.index];
      if ("issue" in found) reader.fail(found.issue);
      else if (edge !== undefined && edge.kind !== "pipe") {
        reader.fail({
          code: "value",
          path: `/sizing/edges/${position}`,
          value: id,
          message: `edge "${id}" is ${article(edge.kind)} ${edge.kind}, not a pipe; sizing chooses pipe diameters`,
        });
      } else if (!edges.includes(found.index)) edges.push(found.index);
    });
  }
  if (edges.length === 0 && reader.issues.length === 0) {
    reader.fail({
      code: "value",
      path: "/sizing/edges",
      value: "all",
      message: "the network has no pipe to size",
    });
  }
  const sizes = sizingSizes(reader, block);
  const diameters = sizes.map((size) => size.diameter);
  const labels = sizes.map((size) => size.label);
  const written = block.limits ?? {};
  const documentLimits = network.settings.limits;
  const limits: SizingLimits = {};
  const maxMach = written.maxMach ?? documentLimits.maxMach;
  if (maxMach !== undefined) limits.maxMach = maxMach;
  const maxVelocity =
    written.maxVelocity === undefined
      ? documentLimits.maxVelocity
      : reader.positive(written.maxVelocity, "velocity", "/sizing/limits/maxVelocity");
  if (maxVelocity !== undefined) limits.maxVelocity = maxVelocity;
  const maxPressureDrop = reader.positive(
    written.maxPressureDrop,
    "pressureDifference",
    "/sizing/limits/maxPressureDrop",
  );
  if (maxPressureDrop !== undefined) limits.maxPressureDrop = maxPressureDrop;
  const minDeliveryPressure =
    written.minDeliveryPressure === undefined
      ? documentLimits.minPressure
      : reader.positive(
          written.minDeliveryPressure,
          "pressure",
          "/sizing/limits/minDeliveryPressure",
        );
  if (minDeliveryPressure !== undefined) limits.minDeliveryPressure = minDeliveryPressure;
  study.sizing = { edges, diameters, labels, limits, maxSolves: block.maxSolves ?? 5000 };
}

/** Smallest and largest DN of a schedule taken when only the schedule is given. */
const SCHEDULE_RANGE = [15, 600] as const;

/**
 * The allowed sizes of a sizing block, smallest first, without repeats: a list of diameters, a
 * schedule with nominal sizes (from the pipe catalog), or the default list.
 */
function sizingSizes(reader: StudyReader, block: NonNullable<StudyDocument["sizing"]>): PipeSize[] {
  let sizes: PipeSize[] = [];
  if (block.diameters !== undefined) {
    if (block.schedule !== undefined || block.sizes !== undefined) {
      reader.fail({
        code: "schema",
        path: "/sizing",
        message: 'give "diameters" or a "schedule" with "sizes", not both',
      });
    }
    block.diameters.forEach((value, position) => {
      const diameter = reader.positive(value, "length", `/sizing/diameters/${position}`);
      if (diameter !== undefined) {
        sizes.push({ label: `${Number((diameter * 1000).toPrecision(6))} mm`, diameter });
      }
    });
  } else if (block.schedule !== undefined || block.sizes !== undefined) {
    const written = block.schedule ?? "40";
    const schedule = PIPE_SCHEDULES.find(
      (name) => name.toUpperCase() === written.trim().toUpperCase(),
    );
    if (schedule === undefined) {
      reader.fail({
        code: "value",
        path: "/sizing/schedule",
        value: written,
        message: `unknown schedule "${written}"; known schedules: ${PIPE_SCHEDULES.join(", ")} (ASME B36.10M and B36.19M)`,
      });
      return [];
    }
    if (block.sizes === undefined) {
      for (const row of PIPE_DIMENSIONS[schedule] ?? []) {
        if (row[1] >= SCHEDULE_RANGE[0] && row[1] <= SCHEDULE_RANGE[1]) {
          sizes.push({ label: `DN ${row[1]} Sch ${schedule}`, diameter: row[4] / 1000 });
        }
      }
    } else {
      block.sizes.forEach((text, position) => {
        const path = `/sizing/sizes/${position}`;
        const nominal = parseNominalSize(text);
        const pipe = nominal === undefined ? undefined : catalogPipe(nominal, schedule);
        if (pipe === undefined || "error" in pipe) {
          reader.fail({
            code: "value",
            path,
            value: text,
            message:
              pipe === undefined
                ? `${JSON.stringify(text)} is not a nominal size; write "DN 50", "2 in" or "NPS 2"`
                : pipe.error,
          });
          return;
        }
        sizes.push({
          label: `DN ${pipe.nominalDiameter} Sch ${schedule}`,
          diameter: pipe.insideDiameter,
        });
      });
    }
  } else {
    sizes = defaultPipeDiameters();
  }
  const unique = new Map<number, PipeSize>();
  for (const size of sizes) if (!unique.has(size.diameter)) unique.set(size.diameter, size);
  return [...unique.values()].sort((a, b) => a.diameter - b.diameter);
}
