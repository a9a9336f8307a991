/**
 * The study contract: JSON Schema (draft 2020-12) of a study document, which names a base network
 * and what to vary, what to record and which question to answer. schemas/study.schema.json is
 * written from this object by `npm run schemas`, and a test checks that the two agree.
 *
 * The schema checks shape and types. What needs the network (a JSON Pointer that resolves, a node
 * or edge id that exists, a quantity in the right unit) and the rules between fields (`values` or
 * `range`, the block a question needs) are checked after it by src/study/read-study.ts, with the
 * same kind of JSON-Pointer messages.
 */

const quantity = {
  description:
    'A plain number in SI base units (Pa absolute, K, m, kg/s) or a string "<number> <unit>" such as "7 bar(g)", "35 degC", "80 mm", "1800 kg/h". A scale factor is a plain number.',
  type: ["number", "string"],
  maxLength: 64,
} as const;

const outputList = {
  description:
    'Results to record: "all", or a list of "nodes/<id>/<field>", "edges/<id>/<field>" and "network/<field>" (fields in docs/study.md).',
  type: ["string", "array"],
  items: { type: "string", minLength: 1, maxLength: 400 },
  minItems: 1,
  maxItems: 10000,
} as const;

/** One input that a study varies, or that a design question works on. */
const parameter = {
  type: "object",
  description:
    'Either "path" (a JSON Pointer into the network whose value is set) or "group" (a set of values scaled together); with "values" or "range" in a sweep, "bracket" in a target search.',
  additionalProperties: false,
  properties: {
    name: {
      type: "string",
      minLength: 1,
      maxLength: 200,
      description: "Column name in the output. Default: the path or the group.",
    },
    path: {
      type: "string",
      minLength: 1,
      maxLength: 400,
      description:
        'JSON Pointer into the network, e.g. "/nodes/3/demand" or "/edges/0/diameter"; an index or an id ("/nodes/PRESS-LINE/demand").',
    },
    group: {
      type: ["string", "object"],
      description:
        '"demands" (every positive demand), "injections" (every negative demand), { "nodes": [ids] } (their demands) or { "edges": [ids] or "all", "field": "diameter" | "length" | "roughness" | "minorLoss" }: scaled together by a factor.',
      additionalProperties: false,
      properties: {
        nodes: {
          type: "array",
          minItems: 1,
          maxItems: 100000,
          items: { type: "string", minLength: 1, maxLength: 200 },
        },
        edges: {
          type: ["string", "array"],
          minItems: 1,
          maxItems: 100000,
          items: { type: "string", minLength: 1, maxLength: 200 },
        },
        field: { enum: ["demand", "diameter", "length", "roughness", "minorLoss"] },
      },
    },
    values: {
      type: "array",
      minItems: 1,
      maxItems: 1000000,
      items: quantity,
      description: "The values, in order.",
    },
    range: {
      type: "object",
      additionalProperties: false,
      required: ["from", "to", "steps"],
      description: "Equal steps from `from` to `to`, both included: steps + 1 values.",
      properties: {
        from: quantity,
        to: quantity,
        steps: { type: "integer", minimum: 1, maximum: 1000000 },
        spacing: {
          enum: ["linear", "log"],
          description: "Equal differences (linear, default) or equal ratios (log).",
        },
      },
    },
    bracket: {
      type: "array",
      minItems: 2,
      maxItems: 2,
      items: quantity,
      description: "Target search: two values of the input between which the target lies.",
    },
  },
} as const;

const limitQuantity = (description: string) => ({ ...quantity, description }) as const;

/** The JSON Schema of a study document. */
export const studySchema = {
  $schema: "https://json-schema.org/draft/2020-12/schema",
  $id: "https://machnet.invalid/schemas/study.schema.json",
  title: "machnet study",
  description:
    "A parametric study or design question on a base network: a sweep over varied inputs, a target search, the capacity of the network, sensitivities at one case, or pipe sizing.",
  type: "object",
  additionalProperties: false,
  required: ["network"],
  properties: {
    $schema: { type: "string" },
    name: { type: "string", maxLength: 1000 },
    description: { type: "string", maxLength: 100000 },
    network: {
      type: ["string", "object"],
      description:
        "The base network: a file name relative to the study file, or the network document itself.",
      minLength: 1,
      maxLength: 4096,
    },
    question: {
      enum: ["sweep", "target", "capacity", "sensitivities", "sizing"],
      description: "What the study answers. Default sweep.",
    },
    units: {
      enum: ["si", "metric", "us"],
      description: "Unit set of the CSV output and of the printed answers. Default si.",
    },
    inputs: {
      type: "array",
      minItems: 1,
      maxItems: 64,
      items: parameter,
      description: "Sweep: the varied inputs.",
    },
    combine: {
      enum: ["grid", "zip"],
      description:
        "Sweep: every combination (grid, the last input varying fastest) or the i-th value of each input together (zip, equal lengths). Default grid.",
    },
    outputs: outputList,
    warmStart: {
      type: "boolean",
      description:
        "Start each case from the nearest solved case of its block (continuation). Default true.",
    },
    blockSize: {
      type: "integer",
      minimum: 1,
      maximum: 100000,
      description:
        "Cases per block: each block starts cold and warm-starts within itself; workers and shards take whole blocks. Default 32.",
    },
    target: {
      type: "object",
      additionalProperties: false,
      required: ["input", "output", "value"],
      properties: {
        input: parameter,
        output: { type: "string", minLength: 1, maxLength: 400 },
        value: limitQuantity("The value the output should take."),
        relativeTolerance: {
          type: "number",
          exclusiveMinimum: 0,
          maximum: 0.1,
          description: "Accept |output - value| <= this x |value|. Default 1e-6.",
        },
        maxSolves: { type: "integer", minimum: 3, maximum: 10000, description: "Default 60." },
      },
    },
    capacity: {
      type: "object",
      additionalProperties: false,
      properties: {
        group: parameter.properties.group,
        limits: {
          type: "object",
          additionalProperties: false,
          properties: {
            minPressure: limitQuantity("Smallest junction pressure. Default: the network's."),
            maxPressure: limitQuantity("Largest junction pressure (a back-pressure limit)."),
            maxMach: { type: "number", exclusiveMinimum: 0, maximum: 1 },
            maxVelocity: limitQuantity("Largest velocity at any pipe end."),
          },
        },
        relativeTolerance: { type: "number", exclusiveMinimum: 0, maximum: 0.1 },
        maxScale: { type: "number", exclusiveMinimum: 1, maximum: 1e9 },
        maxSolves: { type: "integer", minimum: 3, maximum: 10000 },
      },
    },
    sensitivities: {
      type: "object",
      additionalProperties: false,
      required: ["inputs"],
      properties: {
        inputs: { type: "array", minItems: 1, maxItems: 10000, items: parameter },
        outputs: outputList,
      },
    },
    sizing: {
      type: "object",
      additionalProperties: false,
      properties: {
        edges: {
          type: ["string", "array"],
          minItems: 1,
          maxItems: 100000,
          items: { type: "string", minLength: 1, maxLength: 200 },
          description: 'The pipes to size: "all" (default) or a list of edge ids.',
        },
        diameters: {
          type: "array",
          minItems: 1,
          maxItems: 1000,
          items: quantity,
          description:
            "Allowed inside diameters. Default: ASME B36.10M Sch 40, DN 25 to DN 300 (docs/study.md).",
        },
        schedule: {
          type: "string",
          minLength: 1,
          maxLength: 16,
          description:
            'Instead of "diameters": a schedule of ASME B36.10M or B36.19M ("40", "STD", "10S"), with "sizes" or every size from DN 15 to DN 600.',
        },
        sizes: {
          type: "array",
          minItems: 1,
          maxItems: 1000,
          items: { type: "string", minLength: 1, maxLength: 32 },
          description: 'Nominal sizes in the schedule: "DN 50", "2 in", "NPS 2".',
        },
        limits: {
          type: "object",
          additionalProperties: false,
          properties: {
            maxMach: { type: "number", exclusiveMinimum: 0, maximum: 1 },
            maxVelocity: limitQuantity("Largest velocity at either end of a pipe."),
            maxPressureDrop: limitQuantity(
              'Largest pressure drop along one pipe, e.g. "0.05 bar".',
            ),
            minDeliveryPressure: limitQuantity(
              "Smallest pressure at a junction with a positive demand.",
            ),
          },
        },
        maxSolves: { type: "integer", minimum: 1, maximum: 1000000 },
      },
    },
  },
} as const;
