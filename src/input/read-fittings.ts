/**
 * Reading a pipe's fittings: each entry's fields checked, its loss coefficient referred to the
 * pipe's velocity head, and the sum that the pipe adds to its minor loss. Every problem is
 * reported with its JSON Pointer.
 */
import type { FittingInput } from "./document-types.js";
import {
  type FittingType,
  fittingLossCoefficient,
  REDUCER_TYPES,
  type ReducerType,
  reducerAddedLossCoefficient,
  reducerLossCoefficient,
} from "./fittings.js";
import { catalogPipe, parseNominalSize } from "./pipe-catalog.js";
import type { ValueReader } from "./read-components.js";

/** Fields only a reducer or an expander takes. */
const REDUCER_FIELDS = ["angle", "outletDiameter", "outletSize", "outletSchedule"] as const;

/** The pipe the fittings are on. */
export interface FittingPipe {
  /** Inside diameter [m] (finite). */
  diameter: number;
  /** Nominal pipe size [in] for Darby's 3-K method. */
  nominalPipeSize: number;
  /** The pipe's schedule, if it is given by size (the default of a reducer's outletSchedule). */
  schedule?: string;
}

/**
 * Sum of the loss coefficients of a pipe's fittings [-], referred to its velocity head: Darby
 * 3-K values at the pipe's nominal size, and for a reducer or expander the part of its Crane
 * TP-410 loss that the junction at the pipe's `to` end does not already take
 * (reducerAddedLossCoefficient).
 */
export function readFittings(
  fittings: readonly FittingInput[],
  path: string,
  pipe: FittingPipe,
  reader: ValueReader,
): number {
  let sum = 0;
  let reducerPath: string | undefined;
  fittings.forEach((fitting, index) => {
    const fittingPath = `${path}/${index}`;
    if (!isReducerType(fitting.type)) {
      for (const field of REDUCER_FIELDS) {
        if (fitting[field] === undefined) continue;
        reader.fail({
          code: "schema",
          path: `${fittingPath}/${field}`,
          message: `a fitting of type "${fitting.type}" has no field "${field}"; only "reducer" and "expander" take ${REDUCER_FIELDS.join(", ")}`,
        });
      }
      sum +=
        (fitting.count ?? 1) *
        fittingLossCoefficient(fitting.type as FittingType, pipe.nominalPipeSize);
      return;
    }
    if (reducerPath !== undefined) {
      reader.fail({
        code: "value",
        path: `${fittingPath}/type`,
        value: fitting.type,
        message: `a pipe has one outlet, and ${reducerPath} already puts a reducer or expander there; split the pipe at a node to change its size twice`,
      });
    }
    reducerPath ??= fittingPath;
    if (fitting.count !== undefined && fitting.count !== 1) {
      reader.fail({
        code: "value",
        path: `${fittingPath}/count`,
        value: fitting.count,
        message: `a ${fitting.type} sits at the pipe's outlet, so its count can only be 1 (got ${fitting.count})`,
      });
    }
    const lossCoefficient = readReducer(fitting, fitting.type, fittingPath, pipe, reader);
    if (Number.isFinite(lossCoefficient)) sum += reducerAddedLossCoefficient(lossCoefficient);
  });
  return sum;
}

function isReducerType(type: string): type is ReducerType {
  return (REDUCER_TYPES as readonly string[]).includes(type);
}

/** A reducer's or expander's Crane K referred to the pipe, NaN if a field cannot be read. */
function readReducer(
  fitting: FittingInput,
  type: ReducerType,
  path: string,
  pipe: FittingPipe,
  reader: ValueReader,
): number {
  if (fitting.angle === undefined) {
    reader.fail({
      code: "schema",
      path,
      message: `missing required field "angle": a ${type} needs its included cone angle in degrees (180 for a sudden step)`,
    });
  }
  const outlet = readOutletDiameter(fitting, type, path, pipe, reader);
  if (fitting.angle === undefined || !Number.isFinite(outlet)) return Number.NaN;
  const fieldPath = `${path}/${fitting.outletSize !== undefined ? "outletSize" : "outletDiameter"}`;
  const given = JSON.stringify(fitting.outletSize ?? fitting.outletDiameter);
  const pipeMillimetres = (pipe.diameter * 1000).toPrecision(4);
  const outletMillimetres = (outlet * 1000).toPrecision(4);
  if (type === "reducer" && !(outlet < pipe.diameter)) {
    reader.fail({
      code: "value",
      path: fieldPath,
      value: fitting.outletSize ?? (fitting.outletDiameter as string | number),
      message: `a reducer leads into a smaller pipe, but ${given} (${outletMillimetres} mm) is not smaller than this pipe's ${pipeMillimetres} mm; a larger one takes an "expander"`,
    });
    return Number.NaN;
  }
  if (type === "expander" && !(outlet > pipe.diameter)) {
    reader.fail({
      code: "value",
      path: fieldPath,
      value: fitting.outletSize ?? (fitting.outletDiameter as string | number),
      message: `an expander leads into a larger pipe, but ${given} (${outletMillimetres} mm) is not larger than this pipe's ${pipeMillimetres} mm; a smaller one takes a "reducer"`,
    });
    return Number.NaN;
  }
  return reducerLossCoefficient(type, pipe.diameter, outlet, fitting.angle);
}

/** The inside diameter a reducer leads into [m]: outletDiameter, or outletSize and schedule. */
function readOutletDiameter(
  fitting: FittingInput,
  type: ReducerType,
  path: string,
  pipe: FittingPipe,
  reader: ValueReader,
): number {
  if (fitting.outletSize === undefined) {
    if (fitting.outletSchedule !== undefined) {
      reader.fail({
        code: "schema",
        path: `${path}/outletSchedule`,
        message: `an outletSchedule needs an "outletSize" (e.g. "DN50" or "2 in") to go with it`,
      });
    }
    if (fitting.outletDiameter === undefined) {
      reader.fail({
        code: "schema",
        path,
        message: `missing required field "outletDiameter" (or "outletSize"): a ${type} needs the inside diameter of the pipe it leads into`,
      });
      return Number.NaN;
    }
    return (
      reader.positive(fitting.outletDiameter, "length", `${path}/outletDiameter`) ?? Number.NaN
    );
  }
  if (fitting.outletDiameter !== undefined) {
    reader.fail({
      code: "schema",
      path: `${path}/outletDiameter`,
      message: `give either "outletDiameter" or "outletSize", not both (got ${JSON.stringify(fitting.outletDiameter)} and ${JSON.stringify(fitting.outletSize)})`,
    });
  }
  const size = parseNominalSize(fitting.outletSize);
  if (size === undefined) {
    reader.fail({
      code: "value",
      path: `${path}/outletSize`,
      value: fitting.outletSize,
      message: `not a nominal size (got ${JSON.stringify(fitting.outletSize)}); write e.g. "DN50", "2 in", "NPS 2" or "1 1/2 in"`,
    });
    return Number.NaN;
  }
  const schedule = fitting.outletSchedule ?? pipe.schedule;
  if (schedule === undefined) {
    reader.fail({
      code: "schema",
      path,
      message: `missing required field "outletSchedule": this pipe is given by diameter, so an outletSize needs its schedule, e.g. "40"`,
    });
    return Number.NaN;
  }
  const outletPipe = catalogPipe(size, schedule);
  if ("error" in outletPipe) {
    const unknownSchedule = outletPipe.error.startsWith("unknown schedule");
    reader.fail({
      code: "value",
      path: `${path}/${unknownSchedule && fitting.outletSchedule !== undefined ? "outletSchedule" : "outletSize"}`,
      value:
        unknownSchedule && fitting.outletSchedule !== undefined ? schedule : fitting.outletSize,
      message: outletPipe.error,
    });
    return Number.NaN;
  }
  return outletPipe.insideDiameter;
}
