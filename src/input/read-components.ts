/**
 * Reading the edges other than plain pipes: components (orifice, nozzle, valve, regulator, check
 * valve) and a pipe's catalog fields (nominal size and schedule, material, fittings). Values to
 * SI, defaults, and the rules the schema does not express, each problem with its JSON Pointer.
 */
import type {
  CheckEdgeInput,
  CheckedComponent,
  CheckedComponentEdge,
  EdgeInput,
  PipeEdgeInput,
  QuantityInput,
  RegulatorEdgeInput,
  RestrictionEdgeInput,
  ValveEdgeInput,
} from "./document-types.js";
import type { InputIssue } from "./issues.js";
import {
  catalogPipe,
  nominalSizeFromInsideDiameter,
  PIPE_MATERIALS,
  type PipeMaterialName,
  parseNominalSize,
} from "./pipe-catalog.js";
import type { QuantityKind } from "./quantity.js";
import { type FittingPipe, readFittings } from "./read-fittings.js";

/** What the document reader offers (src/input/read-document.ts): quantities to SI, problems. */
export interface ValueReader {
  quantity(input: QuantityInput | undefined, kind: QuantityKind, path: string): number | undefined;
  positive(input: QuantityInput | undefined, kind: QuantityKind, path: string): number | undefined;
  fail(issue: InputIssue): void;
}

/**
 * Kv per Cv [-]: Kv = 0.865 Cv. Cv is the flow in US gal/min of water at 1 psi, Kv in m3/h at
 * 1 bar; for one valve Q = Kv sqrt(dp / 1 bar) = Cv sqrt(dp / 1 psi) in their units, so
 * Kv / Cv = (m3/h per gal/min) sqrt(bar / psi) = (0.003785411784 x 60) sqrt(1e5 / 6894.757293168)
 * = 0.864978 (exact unit definitions, NIST SP 811). python3-fluids 1.0.22 Cv_to_Kv divides by
 * 1.1560992283536566, the same number.
 */
export const KV_PER_CV = 0.003785411784 * 60 * Math.sqrt(1e5 / 6894.757293168);

/**
 * Default pressure differential ratio factor xT [-]: 0.70, the default of python3-fluids 1.0.22
 * size_control_valve_g and a value typical of globe valves; give the manufacturer's.
 */
export const DEFAULT_PRESSURE_DIFFERENTIAL_RATIO_FACTOR = 0.7;

/** Default rangeability of an equal-percentage trim [-] (common practice, no source). */
export const DEFAULT_RANGEABILITY = 50;

/** Default discharge coefficients (sources in src/physics/components/orifice.ts, nozzle.ts). */
export const DEFAULT_DISCHARGE_COEFFICIENT = { orifice: 0.6, nozzle: 0.985 } as const;

/** Default proportional band of a regulator, as a fraction of its absolute setpoint [-]. */
export const DEFAULT_BAND_FRACTION = 0.01;

/** Largest diameter ratio d / D: ISO 5167-2 plates (0.75) and ISO 5167-3 nozzles (0.8). */
const LARGEST_DIAMETER_RATIO = { orifice: 0.75, nozzle: 0.8 } as const;

/** Fields each edge kind takes (the schema lists all of them for every edge). */
const FIELDS: Record<EdgeInput["kind"], readonly string[]> = {
  pipe: [
    "length",
    "diameter",
    "size",
    "schedule",
    "material",
    "roughness",
    "frictionFactor",
    "minorLoss",
    "fittings",
    "model",
    "heatTransferCoefficient",
    "heatTransferPerLength",
    "surroundingTemperature",
  ],
  orifice: ["boreDiameter", "pipeDiameter", "dischargeCoefficient"],
  nozzle: ["boreDiameter", "pipeDiameter", "dischargeCoefficient"],
  valve: [
    "kv",
    "cv",
    "xT",
    "opening",
    "characteristic",
    "rangeability",
    "valveDiameter",
    "pipeDiameter",
    "outletPipeDiameter",
  ],
  regulator: ["setpoint", "proportionalBand", "kv", "cv", "xT", "pipeDiameter"],
  check: ["kv", "cv", "lossCoefficient", "xT", "pipeDiameter"],
};
const COMMON_FIELDS = ["id", "kind", "description", "from", "to"];

/** Report every field that this kind of edge does not take. */
export function checkEdgeFields(edge: EdgeInput, path: string, reader: ValueReader): void {
  const allowed = FIELDS[edge.kind];
  for (const field of Object.keys(edge)) {
    if (COMMON_FIELDS.includes(field) || allowed.includes(field)) continue;
    reader.fail({
      code: "schema",
      path: `${path}/${field}`,
      message: `a ${edge.kind} has no field "${field}"; a ${edge.kind} takes: ${[...COMMON_FIELDS, ...allowed].join(", ")}`,
    });
  }
}

/** What a pipe's catalog fields give. */
export interface PipeExtras {
  /** Inside diameter [m], NaN if it could not be read. */
  diameter: number;
  /** Roughness of its material [m], if a material is given. */
  materialRoughness?: number;
  /** Sum of the fittings' loss coefficients [-], referred to the pipe's velocity head. */
  fittingsLoss: number;
  catalog?: { nominalPipeSize: number; nominalDiameter: number; schedule: string };
}

/**
 * A pipe's diameter (inside diameter, or nominal size and schedule), material and fittings.
 * Also reports fields a pipe does not take.
 */
export function readPipeExtras(edge: PipeEdgeInput, path: string, reader: ValueReader): PipeExtras {
  checkEdgeFields(edge, path, reader);
  const extras: PipeExtras = { diameter: Number.NaN, fittingsLoss: 0 };
  if (edge.size !== undefined) {
    if (edge.diameter !== undefined) {
      reader.fail({
        code: "schema",
        path: `${path}/diameter`,
        message: `give either "diameter" or "size" with "schedule", not both (got ${JSON.stringify(edge.diameter)} and ${JSON.stringify(edge.size)})`,
      });
    }
    const size = parseNominalSize(edge.size);
    if (size === undefined) {
      reader.fail({
        code: "value",
        path: `${path}/size`,
        value: edge.size,
        message: `not a nominal size (got ${JSON.stringify(edge.size)}); write e.g. "DN80", "3 in", "NPS 3" or "1 1/2 in"`,
      });
    } else if (edge.schedule === undefined) {
      reader.fail({
        code: "schema",
        path,
        message: `missing required field "schedule": a nominal size needs its schedule, e.g. "40", "STD" or "10S"`,
      });
    } else {
      const pipe = catalogPipe(size, edge.schedule);
      if ("error" in pipe) {
        const unknownSchedule = pipe.error.startsWith("unknown schedule");
        reader.fail({
          code: "value",
          path: `${path}/${unknownSchedule ? "schedule" : "size"}`,
          value: unknownSchedule ? edge.schedule : edge.size,
          message: pipe.error,
        });
      } else {
        extras.diameter = pipe.insideDiameter;
        extras.catalog = {
          nominalPipeSize: pipe.nominalPipeSize,
          nominalDiameter: pipe.nominalDiameter,
          schedule: pipe.schedule,
        };
      }
    }
  } else {
    if (edge.schedule !== undefined) {
      reader.fail({
        code: "schema",
        path: `${path}/schedule`,
        message: `a schedule needs a nominal "size" (e.g. "DN80" or "3 in") to go with it`,
      });
    }
    if (edge.diameter === undefined) {
      reader.fail({
        code: "schema",
        path,
        message: `missing required field "diameter" (or give "size" and "schedule")`,
      });
    } else {
      extras.diameter = reader.positive(edge.diameter, "length", `${path}/diameter`) ?? Number.NaN;
    }
  }
  if (edge.material !== undefined) {
    const other =
      edge.roughness !== undefined
        ? "roughness"
        : edge.frictionFactor !== undefined
          ? "frictionFactor"
          : undefined;
    if (other !== undefined) {
      reader.fail({
        code: "schema",
        path: `${path}/material`,
        message: `give either "material" or "${other}", not both: the material sets the roughness`,
      });
    } else {
      extras.materialRoughness = PIPE_MATERIALS[edge.material as PipeMaterialName].roughness;
    }
  }
  if (edge.fittings !== undefined && Number.isFinite(extras.diameter)) {
    const pipe: FittingPipe = {
      diameter: extras.diameter,
      nominalPipeSize:
        extras.catalog?.nominalPipeSize ?? nominalSizeFromInsideDiameter(extras.diameter),
    };
    if (extras.catalog !== undefined) pipe.schedule = extras.catalog.schedule;
    extras.fittingsLoss = readFittings(edge.fittings, `${path}/fittings`, pipe, reader);
  }
  return extras;
}

/** A component edge to SI, with defaults. */
export function readComponentEdge(
  edge: Exclude<EdgeInput, PipeEdgeInput>,
  path: string,
  reader: ValueReader,
): CheckedComponentEdge {
  checkEdgeFields(edge, path, reader);
  let component: CheckedComponent;
  let diameter: number;
  switch (edge.kind) {
    case "orifice":
    case "nozzle": {
      const restriction = readRestriction(edge, path, reader);
      component = restriction;
      diameter = Number.isNaN(restriction.pipeDiameter)
        ? restriction.boreDiameter
        : restriction.pipeDiameter;
      break;
    }
    case "valve": {
      const valve = readValve(edge, path, reader);
      component = valve;
      diameter = Number.isNaN(valve.inletPipeDiameter)
        ? flowAreaDiameter(valve.flowCoefficient)
        : valve.inletPipeDiameter;
      break;
    }
    case "regulator":
    case "check": {
      const trim =
        edge.kind === "regulator"
          ? readRegulator(edge, path, reader)
          : readCheck(edge, path, reader);
      component = trim;
      diameter = Number.isNaN(trim.pipeDiameter)
        ? flowAreaDiameter(trim.flowCoefficient)
        : trim.pipeDiameter;
      break;
    }
  }
  return {
    id: edge.id,
    kind: edge.kind,
    from: edge.from,
    to: edge.to,
    length: 0,
    diameter,
    minorLoss: 0,
    model: "adiabatic",
    component,
  };
}

/** Diameter of a circle of the flow area Kv / 36000 m2 [m]. */
function flowAreaDiameter(kv: number): number {
  return Math.sqrt((4 * (kv / 36000)) / Math.PI);
}

/** An optional diameter: NaN if not given or not readable. */
function optionalDiameter(
  input: QuantityInput | undefined,
  path: string,
  reader: ValueReader,
): number {
  if (input === undefined) return Number.NaN;
  return reader.positive(input, "length", path) ?? Number.NaN;
}

function readRestriction(
  edge: RestrictionEdgeInput,
  path: string,
  reader: ValueReader,
): CheckedComponent & { kind: "orifice" | "nozzle" } {
  const boreDiameter =
    reader.positive(edge.boreDiameter, "length", `${path}/boreDiameter`) ?? Number.NaN;
  const pipeDiameter = optionalDiameter(edge.pipeDiameter, `${path}/pipeDiameter`, reader);
  const largest = LARGEST_DIAMETER_RATIO[edge.kind];
  const ratio = boreDiameter / pipeDiameter;
  if (Number.isFinite(ratio) && ratio > largest) {
    reader.fail({
      code: "value",
      path: `${path}/boreDiameter`,
      value: edge.boreDiameter,
      message: `a bore of ${JSON.stringify(edge.boreDiameter)} in a pipe of ${JSON.stringify(edge.pipeDiameter)} is a diameter ratio of ${ratio.toPrecision(3)}; ${edge.kind === "orifice" ? "ISO 5167-2 covers orifice plates" : "ISO 5167-3 covers nozzles"} up to ${largest}`,
    });
  }
  return {
    kind: edge.kind,
    boreDiameter,
    pipeDiameter,
    dischargeCoefficient: edge.dischargeCoefficient ?? DEFAULT_DISCHARGE_COEFFICIENT[edge.kind],
  };
}

/**
 * The flow coefficient Kv [m3/h] of a valve-like component from exactly one of `kv`, `cv` or (a
 * check valve) `lossCoefficient` with `pipeDiameter`: Kv = 36000 A sqrt(2 / K), from
 * dp = K rho v^2 / 2 and m = (Kv / 36000) sqrt(rho dp) (src/physics/components/valve.ts).
 */
function readFlowCoefficient(
  edge: ValveEdgeInput | RegulatorEdgeInput | CheckEdgeInput,
  path: string,
  pipeDiameter: number,
  reader: ValueReader,
): number {
  const lossCoefficient = edge.kind === "check" ? edge.lossCoefficient : undefined;
  const given = [
    edge.kv !== undefined ? "kv" : undefined,
    edge.cv !== undefined ? "cv" : undefined,
    lossCoefficient !== undefined ? "lossCoefficient" : undefined,
  ].filter((name) => name !== undefined);
  const options = edge.kind === "check" ? '"kv", "cv" or "lossCoefficient"' : '"kv" or "cv"';
  if (given.length !== 1) {
    reader.fail({
      code: "schema",
      path,
      message:
        given.length === 0
          ? `a ${edge.kind} needs its flow coefficient: give ${options}`
          : `give only one of ${options} (got ${given.join(" and ")})`,
    });
    return Number.NaN;
  }
  if (edge.kv !== undefined) return edge.kv;
  if (edge.cv !== undefined) return KV_PER_CV * edge.cv;
  if (Number.isNaN(pipeDiameter)) {
    if (edge.pipeDiameter === undefined) {
      reader.fail({
        code: "schema",
        path,
        message: `a loss coefficient is referred to a pipe: give "pipeDiameter" with "lossCoefficient"`,
      });
    }
    return Number.NaN;
  }
  const area = 0.25 * Math.PI * pipeDiameter * pipeDiameter;
  return 36000 * area * Math.sqrt(2 / (lossCoefficient as number));
}

function readValve(
  edge: ValveEdgeInput,
  path: string,
  reader: ValueReader,
): CheckedComponent & { kind: "valve" } {
  const inletPipeDiameter = optionalDiameter(edge.pipeDiameter, `${path}/pipeDiameter`, reader);
  let outletPipeDiameter = optionalDiameter(
    edge.outletPipeDiameter,
    `${path}/outletPipeDiameter`,
    reader,
  );
  if (edge.outletPipeDiameter !== undefined && edge.pipeDiameter === undefined) {
    reader.fail({
      code: "schema",
      path: `${path}/outletPipeDiameter`,
      message: `give "pipeDiameter" (the pipe upstream, and downstream unless "outletPipeDiameter" differs) with "outletPipeDiameter"`,
    });
  }
  if (edge.outletPipeDiameter === undefined) outletPipeDiameter = inletPipeDiameter;
  const valveDiameter = optionalDiameter(edge.valveDiameter, `${path}/valveDiameter`, reader);
  for (const [name, pipe] of [
    ["pipeDiameter", inletPipeDiameter],
    ["outletPipeDiameter", outletPipeDiameter],
  ] as const) {
    if (valveDiameter > pipe) {
      reader.fail({
        code: "value",
        path: `${path}/valveDiameter`,
        value: edge.valveDiameter as QuantityInput,
        message: `a valve of ${JSON.stringify(edge.valveDiameter)} is larger than its ${name} ${JSON.stringify(name === "pipeDiameter" ? edge.pipeDiameter : edge.outletPipeDiameter)}; the reducer factors of IEC 60534-2-1 are for a valve smaller than its pipe`,
      });
      break;
    }
  }
  return {
    kind: "valve",
    flowCoefficient: readFlowCoefficient(edge, path, inletPipeDiameter, reader),
    opening: edge.opening ?? 1,
    characteristic: edge.characteristic ?? "linear",
    rangeability: edge.rangeability ?? DEFAULT_RANGEABILITY,
    pressureDifferentialRatioFactor: edge.xT ?? DEFAULT_PRESSURE_DIFFERENTIAL_RATIO_FACTOR,
    valveDiameter,
    inletPipeDiameter,
    outletPipeDiameter,
  };
}

function readRegulator(
  edge: RegulatorEdgeInput,
  path: string,
  reader: ValueReader,
): CheckedComponent & { kind: "regulator" } {
  const pipeDiameter = optionalDiameter(edge.pipeDiameter, `${path}/pipeDiameter`, reader);
  const setpoint = reader.positive(edge.setpoint, "pressure", `${path}/setpoint`) ?? Number.NaN;
  let proportionalBand = DEFAULT_BAND_FRACTION * setpoint;
  if (edge.proportionalBand !== undefined) {
    proportionalBand =
      reader.positive(edge.proportionalBand, "pressureDifference", `${path}/proportionalBand`) ??
      Number.NaN;
    if (proportionalBand >= setpoint) {
      reader.fail({
        code: "value",
        path: `${path}/proportionalBand`,
        value: edge.proportionalBand,
        message: `a proportional band of ${JSON.stringify(edge.proportionalBand)} reaches down to zero absolute pressure from the setpoint ${JSON.stringify(edge.setpoint)}; it must be smaller than the absolute setpoint`,
      });
    }
  }
  return {
    kind: "regulator",
    setpoint,
    proportionalBand,
    flowCoefficient: readFlowCoefficient(edge, path, pipeDiameter, reader),
    pressureDifferentialRatioFactor: edge.xT ?? DEFAULT_PRESSURE_DIFFERENTIAL_RATIO_FACTOR,
    pipeDiameter,
  };
}

function readCheck(
  edge: CheckEdgeInput,
  path: string,
  reader: ValueReader,
): CheckedComponent & { kind: "check" } {
  const pipeDiameter = optionalDiameter(edge.pipeDiameter, `${path}/pipeDiameter`, reader);
  return {
    kind: "check",
    flowCoefficient: readFlowCoefficient(edge, path, pipeDiameter, reader),
    pressureDifferentialRatioFactor: edge.xT ?? DEFAULT_PRESSURE_DIFFERENTIAL_RATIO_FACTOR,
    pipeDiameter,
  };
}
