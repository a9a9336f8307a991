/**
 * The input contract: JSON Schema (draft 2020-12) of a network document. schemas/network.schema.json
 * is written from this object by `npm run schemas`, and a test checks that the two agree.
 *
 * The schema checks shape and types. Values that need units (a quantity is a plain number in SI
 * base units or a string "<number> <unit>") and cross-field rules (an injection needs a
 * temperature, ids are unique, edges name defined nodes) are checked after it, with the same kind
 * of JSON-Pointer messages.
 */

const quantity = {
  description:
    'A plain number in SI base units (Pa absolute, K, m, kg/s, Pa s) or a string "<number> <unit>" such as "7 bar(g)", "35 degC", "80 mm", "1800 kg/h".',
  type: ["number", "string"],
  maxLength: 64,
} as const;

const id = {
  type: "string",
  minLength: 1,
  maxLength: 200,
  description: "Unique across nodes and edges together.",
} as const;

const sutherland = {
  type: "object",
  description: "Sutherland's law mu = mu0 (T/T0)^1.5 (T0 + S)/(T + S).",
  additionalProperties: false,
  required: ["referenceViscosity", "referenceTemperature", "sutherlandConstant"],
  properties: {
    referenceViscosity: { ...quantity, description: 'mu0 (Pa s, or e.g. "17.16 uPa s")' },
    referenceTemperature: { ...quantity, description: "T0 (K or a temperature string)" },
    sutherlandConstant: { ...quantity, description: "S (K, or a temperature difference string)" },
  },
} as const;

/** The JSON Schema of a network document. */
export const networkSchema = {
  $schema: "https://json-schema.org/draft/2020-12/schema",
  $id: "https://machnet.invalid/schemas/network.schema.json",
  title: "machnet network",
  description:
    "A steady compressible gas network: nodes (reservoirs and junctions) joined by edges (pipes).",
  type: "object",
  additionalProperties: false,
  required: ["nodes", "edges"],
  properties: {
    $schema: { type: "string" },
    name: { type: "string", maxLength: 1000 },
    description: { type: "string", maxLength: 100000 },
    gas: {
      type: "object",
      description:
        'One of: { "preset": NAME }; a custom ideal gas { "molarMass", "gamma", "viscosity" }; or a mixture { "components": [...] } by mole fraction. Default: air.',
      additionalProperties: false,
      properties: {
        preset: { type: "string", maxLength: 64 },
        name: { type: "string", maxLength: 200 },
        molarMass: {
          ...quantity,
          description: 'kg/mol as a plain number, or a string such as "28.0134 g/mol"',
        },
        gamma: { type: "number", description: "Heat capacity ratio cp/cv, > 1." },
        viscosity: {
          description: "Dynamic viscosity: a constant (Pa s) or Sutherland constants.",
          anyOf: [quantity, sutherland],
        },
        components: {
          type: "array",
          minItems: 1,
          maxItems: 50,
          items: {
            type: "object",
            additionalProperties: false,
            required: ["preset", "moleFraction"],
            properties: {
              preset: { type: "string", maxLength: 64 },
              moleFraction: { type: "number", minimum: 0, maximum: 1 },
            },
          },
        },
      },
    },
    ambient: {
      type: "object",
      description:
        "Surroundings: gauge pressures are relative to ambient.pressure; a junction that no gas reaches reports ambient.temperature.",
      additionalProperties: false,
      properties: {
        pressure: { ...quantity, description: "Barometric pressure. Default 101325 Pa." },
        temperature: { ...quantity, description: "Default 293.15 K (20 degC)." },
      },
    },
    settings: {
      type: "object",
      additionalProperties: false,
      properties: {
        pipeModel: {
          enum: ["adiabatic", "isothermal"],
          description: "Default model of every pipe. Default adiabatic.",
        },
        tolerance: {
          type: "number",
          exclusiveMinimum: 0,
          maximum: 0.01,
          description: "Largest scaled residual accepted as converged. Default 1e-9.",
        },
        maxIterations: {
          type: "integer",
          minimum: 1,
          maximum: 10000,
          description: "Newton iterations before giving up. Default 100.",
        },
        timeLimit: {
          type: "number",
          exclusiveMinimum: 0,
          maximum: 86400,
          description:
            "Wall-time budget of one solve in seconds; a solve that runs out returns its best iterate marked not converged. Default: none.",
        },
        limits: {
          type: "object",
          description: "Design limits: each one exceeded gives a warning naming the edge or node.",
          additionalProperties: false,
          properties: {
            maxMach: { type: "number", exclusiveMinimum: 0 },
            maxVelocity: { ...quantity, description: 'm/s, or e.g. "20 m/s"' },
            maxMomentumFlux: { ...quantity, description: "rho v^2 in Pa (kg/(m s^2))" },
            minPressure: { ...quantity, description: "Smallest junction pressure" },
          },
        },
      },
    },
    nodes: {
      type: "array",
      minItems: 1,
      items: {
        type: "object",
        additionalProperties: false,
        required: ["id", "kind"],
        properties: {
          id,
          kind: { enum: ["reservoir", "junction"] },
          description: { type: "string", maxLength: 10000 },
          pressure: {
            ...quantity,
            description: "Reservoir: its fixed (stagnation) pressure. Not allowed on a junction.",
          },
          temperature: {
            ...quantity,
            description:
              "Reservoir: stagnation temperature of gas leaving it. Junction with a negative demand: temperature of the injected gas.",
          },
          demand: {
            ...quantity,
            description:
              "Junction: mass flow taken out of the network there (negative: injected). Mass, or standard/normal volume flow.",
          },
        },
        allOf: [
          {
            if: { properties: { kind: { const: "reservoir" } } },
            // biome-ignore lint/suspicious/noThenProperty: JSON Schema's own if/then keyword
            then: {
              required: ["pressure", "temperature"],
              not: { required: ["demand"] },
            },
          },
          {
            if: { properties: { kind: { const: "junction" } } },
            // biome-ignore lint/suspicious/noThenProperty: JSON Schema's own if/then keyword
            then: { not: { required: ["pressure"] } },
          },
        ],
      },
    },
    edges: {
      type: "array",
      minItems: 1,
      items: {
        type: "object",
        additionalProperties: false,
        required: ["id", "kind", "from", "to", "length", "diameter"],
        properties: {
          id,
          kind: { enum: ["pipe"] },
          description: { type: "string", maxLength: 10000 },
          from: { type: "string", minLength: 1, maxLength: 200 },
          to: { type: "string", minLength: 1, maxLength: 200 },
          length: { ...quantity, description: "Pipe length, > 0." },
          diameter: { ...quantity, description: "Inside diameter, > 0." },
          roughness: {
            ...quantity,
            description:
              "Absolute wall roughness; friction from Colebrook-White. Default 0.05 mm (carbon steel).",
          },
          frictionFactor: {
            type: "number",
            exclusiveMinimum: 0,
            maximum: 1,
            description: "A fixed Darcy friction factor instead of roughness.",
          },
          minorLoss: {
            type: "number",
            minimum: 0,
            maximum: 100000,
            description: "Sum of minor-loss coefficients K of the pipe's fittings. Default 0.",
          },
          model: { enum: ["adiabatic", "isothermal"] },
        },
        not: { required: ["roughness", "frictionFactor"] },
      },
    },
  },
} as const;
