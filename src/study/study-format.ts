/**
 * Rows of a sweep as text: CSV with the unit of each column in its header (the study's unit set,
 * SI by default), or JSON lines (always SI). The same rows always give the same bytes, whichever
 * thread or machine solved them. Browser-safe.
 *
 * CSV numbers are the shortest text that reads back to the same double in SI, and 15 significant
 * digits in another unit set.
 *
 * Columns: `case`, one per varied input, `status`, `iterations`, `warm start from`, one per
 * recorded output, `message`. A case that did not converge has empty output cells and says why
 * in `message`.
 */

import {
  type DisplayUnit,
  displayGaugePressure,
  displayUnit,
  type UnitSetName,
} from "../output/display-units.js";
import { csvField } from "../output/result-csv.js";
import type { StudyRow } from "./run-study.js";
import type { PreparedStudy, ResolvedOutput } from "./study-types.js";

/** Output formats of a sweep. */
export type StudyFormat = "csv" | "jsonl";

/** Writes the header and the rows of one study in one format. */
export interface StudyWriter {
  /** The header line (CSV), or undefined for JSON lines, which have none. */
  header(): string | undefined;
  /** One row as one line, without the line break. */
  row(row: StudyRow): string;
}

/**
 * A column's name with its unit label in brackets (nothing for a dimensionless column), on one
 * line: a header that spans lines would break the one-row-per-line reading of `machnet merge`.
 */
function withUnit(name: string, unit: string): string {
  const flat = name.replace(/\s*[\r\n]+\s*/g, " ");
  return unit === "-" || unit === "" ? flat : `${flat} [${unit}]`;
}

/**
 * A number converted to a display unit, to 15 significant digits: a conversion factor's own
 * rounding (801325 Pa x 1e-5 = 8.013250000000001 bar) lies beyond them. SI values are written
 * exactly, at full precision.
 */
function csvDisplayNumber(value: number, exact: boolean): string {
  if (!Number.isFinite(value)) return "";
  return exact ? String(value) : String(Number(value.toPrecision(15)));
}

/** A JSON number, with null for a value that JSON cannot hold (NaN, infinite). */
function jsonValue(value: number | boolean): number | boolean | null {
  return typeof value === "boolean" || Number.isFinite(value) ? value : null;
}

/**
 * A writer of a study's rows.
 *
 * @param study - the prepared study (inputs, outputs, unit set, the network's ambient pressure)
 * @param format - `csv` (study units, header with units) or `jsonl` (SI)
 */
export function studyWriter(study: PreparedStudy, format: StudyFormat): StudyWriter {
  if (format === "jsonl") return jsonLinesWriter(study);
  return csvWriter(study, study.units);
}

function csvWriter(study: PreparedStudy, units: UnitSetName): StudyWriter {
  const ambient = study.network.ambientPressure;
  const exact = units === "si";
  const inputUnits: DisplayUnit[] = study.inputs.map((input) => displayUnit(units, input.kind));
  const outputUnits = study.outputs.map((output) => outputUnit(units, output, ambient));
  const header = [
    "case",
    ...study.inputs.map((input, i) => withUnit(input.label, (inputUnits[i] as DisplayUnit).label)),
    "status",
    "iterations",
    "warm start from",
    ...study.outputs.map((output, i) =>
      withUnit(output.label, (outputUnits[i] as DisplayUnit).label),
    ),
    "message",
  ]
    .map(csvField)
    .join(",");
  return {
    header: () => header,
    row: (row) => {
      const cells = [
        String(row.case),
        ...row.values.map((value, i) =>
          csvDisplayNumber((inputUnits[i] as DisplayUnit).fromSI(value), exact),
        ),
        row.status,
        String(row.iterations),
        row.warmStartFrom === undefined ? "" : String(row.warmStartFrom),
        ...study.outputs.map((_, i) => {
          const value = row.outputs?.[i];
          if (value === undefined) return "";
          if (typeof value === "boolean") return value ? "true" : "false";
          return csvDisplayNumber((outputUnits[i] as DisplayUnit).fromSI(value), exact);
        }),
        csvField(row.message ?? ""),
      ];
      return cells.join(",");
    },
  };
}

/** The display unit of an output; a gauge pressure reads from the network's ambient pressure. */
export function outputUnit(
  units: UnitSetName,
  output: ResolvedOutput,
  ambientPressure: number,
): DisplayUnit {
  if (output.gauge) {
    return {
      label: displayGaugePressure(units, ambientPressure, ambientPressure).label,
      fromSI: (value) => displayGaugePressure(units, value, ambientPressure).value,
    };
  }
  return displayUnit(units, output.kind);
}

function jsonLinesWriter(study: PreparedStudy): StudyWriter {
  return {
    header: () => undefined,
    row: (row) => {
      const inputs: Record<string, number | null> = {};
      study.inputs.forEach((input, i) => {
        inputs[input.label] = jsonValue(row.values[i] as number) as number | null;
      });
      let outputs: Record<string, number | boolean | null> | null = null;
      if (row.outputs !== undefined) {
        const recorded: Record<string, number | boolean | null> = {};
        study.outputs.forEach((output, i) => {
          const value = row.outputs?.[i] as number | boolean;
          recorded[output.label] = jsonValue(
            output.gauge && typeof value === "number"
              ? value - study.network.ambientPressure
              : value,
          );
        });
        outputs = recorded;
      }
      return JSON.stringify({
        case: row.case,
        inputs,
        status: row.status,
        iterations: row.iterations,
        warmStartFrom: row.warmStartFrom ?? null,
        outputs,
        message: row.message ?? null,
      });
    },
  };
}

/** What a shard's output says about itself in its first line; the merge checks it. */
export interface ShardHeader {
  /** Shard K (1-based) of N. */
  shard: number;
  of: number;
  /** Its cases, 1-based and inclusive; lastCase = firstCase - 1 for a shard with none. */
  firstCase: number;
  lastCase: number;
  /** Cases of the whole study. */
  cases: number;
  /** Output format. */
  format: StudyFormat;
  /** A fingerprint of the study (the same for every shard of one study). */
  study: string;
}

/** Marker of a shard's first line. */
const SHARD_MARKER = "machnetShard";

/**
 * The first line of a shard's output: a CSV comment (`# machnetShard {...}`) or a JSON line
 * (`{"machnetShard":{...}}`). A whole (unsharded) run has no such line.
 */
export function shardHeaderLine(header: ShardHeader): string {
  return header.format === "csv"
    ? `# ${SHARD_MARKER} ${JSON.stringify(header)}`
    : JSON.stringify({ [SHARD_MARKER]: header });
}

/** Read a shard's first line; undefined if the line is not one. */
export function parseShardHeaderLine(line: string): ShardHeader | undefined {
  let value: unknown;
  try {
    if (line.startsWith(`# ${SHARD_MARKER} `)) {
      value = JSON.parse(line.slice(SHARD_MARKER.length + 3));
    } else if (line.startsWith(`{"${SHARD_MARKER}":`)) {
      value = (JSON.parse(line) as Record<string, unknown>)[SHARD_MARKER];
    } else {
      return undefined;
    }
  } catch {
    return undefined;
  }
  const header = value as Partial<ShardHeader> | null;
  if (
    header === null ||
    typeof header !== "object" ||
    !Number.isInteger(header.shard) ||
    !Number.isInteger(header.of) ||
    !Number.isInteger(header.firstCase) ||
    !Number.isInteger(header.lastCase) ||
    !Number.isInteger(header.cases) ||
    (header.format !== "csv" && header.format !== "jsonl") ||
    typeof header.study !== "string"
  ) {
    return undefined;
  }
  return header as ShardHeader;
}
