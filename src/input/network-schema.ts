/**
 * The input contract: JSON Schema (draft 2020-12) of a network document. schemas/network.schema.json
 * is written from this object by `npm run schemas`, and a test checks that the two agree.
 *
 * The schema checks shape and types. Values that need units (a quantity is a plain number in SI
 * base units or a string "<number> <unit>") and cross-field rules (an injection needs a
 * temperature, ids are unique, edges name defined nodes) are checked after it, with the same kind
 * of JSON-Pointer messages.
 */

import { FITTING_TYPES } from "./fittings.js";
import { PIPE_MATERIAL_NAMES, PIPE_SCHEDULES } from "./pipe-catalog.js";

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
    "A steady compressible gas network: nodes (reservoirs and junctions) joined by edges (pipes and components).",
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
        'One of: { "preset": NAME }; a custom ideal gas { "molarMass", "gamma", "viscosity" }; or a mixture { "components": [...] } by mole fraction. Default: air. Optional property models: "heatCapacity" and "equationOfState".',
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
        heatCapacity: {
          enum: ["constant", "nasa7"],
          description:
            'Ideal-gas heat capacity: "constant" (cp at 298.15 K; default) or "nasa7" (cp(T) from NASA 7-coefficient polynomials; presets and mixtures of presets that have the data).',
        },
        equationOfState: {
          enum: ["ideal-gas", "peng-robinson"],
          description:
            'Equation of state: "ideal-gas" (default) or "peng-robinson" (Peng and Robinson 1976; a custom gas needs criticalTemperature, criticalPressure and acentricFactor).',
        },
        criticalTemperature: {
          ...quantity,
          description:
            'Custom gas with "peng-robinson": critical temperature Tc (K or a temperature string).',
        },
        criticalPressure: {
          ...quantity,
          description:
            'Custom gas with "peng-robinson": critical pressure pc, absolute (Pa or e.g. "45.99 bar").',
        },
        acentricFactor: {
          type: "number",
          description: 'Custom gas with "peng-robinson": acentric factor omega [-].',
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
          enum: ["adiabatic", "isothermal", "heat-transfer"],
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
          elevation: {
            ...quantity,
            description:
              'Height above a common datum, e.g. "12 m". Default 0. Pipes between nodes at different elevations need model "heat-transfer" (the only one with gravity).',
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
        description:
          "A pipe, or a component: orifice, nozzle, valve, regulator or check valve. Each kind takes its own fields (listed in each field's description).",
        additionalProperties: false,
        required: ["id", "kind", "from", "to"],
        properties: {
          id,
          kind: { enum: ["pipe", "orifice", "nozzle", "valve", "regulator", "check"] },
          description: { type: "string", maxLength: 10000 },
          from: { type: "string", minLength: 1, maxLength: 200 },
          to: { type: "string", minLength: 1, maxLength: 200 },
          length: { ...quantity, description: "Pipe: length, > 0." },
          diameter: {
            ...quantity,
            description: 'Pipe: inside diameter, > 0; or give "size" and "schedule".',
          },
          size: {
            type: "string",
            maxLength: 32,
            description:
              'Pipe: nominal size, "DN80" or NPS "3 in", "NPS 3", "1 1/2 in"; with "schedule" it sets the inside diameter (ASME B36.10M, B36.19M).',
          },
          schedule: {
            type: "string",
            maxLength: 8,
            description: `Pipe: schedule with "size": ${PIPE_SCHEDULES.join(", ")}.`,
          },
          material: {
            enum: PIPE_MATERIAL_NAMES,
            description:
              "Pipe: wall material, setting a typical roughness (NORSOK P-001; Idel'chik). Instead of roughness.",
          },
          roughness: {
            ...quantity,
            description:
              "Pipe: absolute wall roughness; friction from Colebrook-White. Default 0.05 mm (carbon steel).",
          },
          frictionFactor: {
            type: "number",
            exclusiveMinimum: 0,
            maximum: 1,
            description: "Pipe: a fixed Darcy friction factor instead of roughness.",
          },
          minorLoss: {
            type: "number",
            minimum: 0,
            maximum: 100000,
            description:
              "Pipe: sum of minor-loss coefficients K not listed as fittings. Default 0.",
          },
          fittings: {
            type: "array",
            maxItems: 1000,
            description:
              "Pipe: fittings by type and count; K by Darby's 3-K method (turbulent), reducers by Crane TP-410, added to minorLoss.",
            items: {
              type: "object",
              additionalProperties: false,
              required: ["type"],
              properties: {
                type: { enum: FITTING_TYPES },
                count: { type: "integer", minimum: 1, maximum: 10000, description: "Default 1." },
                angle: {
                  type: "number",
                  exclusiveMinimum: 0,
                  maximum: 180,
                  description:
                    "Reducer, expander: included cone angle in degrees; 180 is a sudden step.",
                },
                outletDiameter: {
                  ...quantity,
                  description:
                    "Reducer, expander: inside diameter of the pipe it leads into, at this pipe's `to` end.",
                },
                outletSize: {
                  type: "string",
                  maxLength: 32,
                  description:
                    'Reducer, expander: nominal size of the pipe it leads into ("DN50", "2 in"), instead of outletDiameter.',
                },
                outletSchedule: {
                  type: "string",
                  maxLength: 8,
                  description:
                    "Reducer, expander: schedule with outletSize; default the pipe's own schedule.",
                },
              },
            },
          },
          model: {
            enum: ["adiabatic", "isothermal", "heat-transfer"],
            description:
              "Pipe: flow model. heat-transfer: friction, heat exchange with the surroundings and elevation, integrated along the pipe.",
          },
          heatTransferCoefficient: {
            ...quantity,
            description:
              'Pipe, model heat-transfer: overall heat-transfer coefficient per inside wall area, >= 0, e.g. "8 W/(m2 K)". Or give heatTransferPerLength. Default 0.',
          },
          heatTransferPerLength: {
            ...quantity,
            description:
              'Pipe, model heat-transfer: overall heat-transfer coefficient per unit length, >= 0, e.g. "1.5 W/(m K)". Instead of heatTransferCoefficient.',
          },
          surroundingTemperature: {
            ...quantity,
            description:
              "Pipe, model heat-transfer: temperature of the surroundings. Default ambient.temperature.",
          },
          boreDiameter: {
            ...quantity,
            description: "Orifice: bore; nozzle: throat diameter. > 0.",
          },
          pipeDiameter: {
            ...quantity,
            description:
              "Orifice, nozzle: inside diameter of the pipe it sits in (beta = d/D; none: between plenums). Valve, regulator, check: inside diameter of the connecting pipe (for its end states; a valve's reducers).",
          },
          dischargeCoefficient: {
            type: "number",
            exclusiveMinimum: 0,
            maximum: 1,
            description: "Orifice (default 0.60), nozzle (default 0.985): C.",
          },
          kv: {
            type: "number",
            exclusiveMinimum: 0,
            description: "Valve, regulator (wide open), check: flow coefficient Kv in m3/h.",
          },
          cv: {
            type: "number",
            exclusiveMinimum: 0,
            description: "Instead of kv: flow coefficient Cv in US gal/min (Kv = 0.865 Cv).",
          },
          xT: {
            type: "number",
            exclusiveMinimum: 0,
            maximum: 1,
            description:
              "Valve, regulator, check: pressure differential ratio factor xT (IEC 60534-2-1). Default 0.70.",
          },
          opening: {
            type: "number",
            minimum: 0,
            maximum: 1,
            description: "Valve: relative travel, 0 (shut) to 1. Default 1.",
          },
          characteristic: {
            enum: ["linear", "equal-percentage"],
            description: "Valve: inherent characteristic. Default linear.",
          },
          rangeability: {
            type: "number",
            exclusiveMinimum: 1,
            maximum: 1000,
            description: "Valve: rangeability of an equal-percentage trim. Default 50.",
          },
          valveDiameter: {
            ...quantity,
            description:
              "Valve: inside diameter of its ends, when smaller than the pipe (reducers, IEC 60534-2-1 Fp and xTP).",
          },
          outletPipeDiameter: {
            ...quantity,
            description: 'Valve: the pipe downstream, when it differs from "pipeDiameter".',
          },
          setpoint: {
            ...quantity,
            description: 'Regulator: the downstream pressure it holds, e.g. "4 bar(g)".',
          },
          proportionalBand: {
            ...quantity,
            description:
              "Regulator: fall of downstream pressure from closed to wide open. Default 1 % of the absolute setpoint.",
          },
          lossCoefficient: {
            type: "number",
            exclusiveMinimum: 0,
            maximum: 100000,
            description: 'Check valve: K referred to "pipeDiameter", instead of kv or cv.',
          },
        },
        allOf: [
          {
            if: { properties: { kind: { const: "pipe" } } },
            // biome-ignore lint/suspicious/noThenProperty: JSON Schema's own if/then keyword
            then: { required: ["length"] },
          },
          {
            if: { properties: { kind: { enum: ["orifice", "nozzle"] } } },
            // biome-ignore lint/suspicious/noThenProperty: JSON Schema's own if/then keyword
            then: { required: ["boreDiameter"] },
          },
          {
            if: { properties: { kind: { const: "regulator" } } },
            // biome-ignore lint/suspicious/noThenProperty: JSON Schema's own if/then keyword
            then: { required: ["setpoint"] },
          },
          { not: { required: ["heatTransferCoefficient", "heatTransferPerLength"] } },
        ],
        not: { required: ["roughness", "frictionFactor"] },
      },
    },
  },
} as const;
