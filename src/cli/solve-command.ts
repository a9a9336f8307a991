/**
 * `machnet solve FILE`: read, solve, print the result as a table, JSON or CSV.
 */

import { InputError } from "../input/issues.js";
import { readNetworkText } from "../input/read-document.js";
import type { UnitSetName } from "../output/display-units.js";
import { type CsvTableName, resultCsv } from "../output/result-csv.js";
import { resultJson } from "../output/result-json.js";
import {
  notASolutionReason,
  type ResultReport,
  resultNotes,
  resultReport,
  resultWarnings,
} from "../output/result-table.js";
import type { NetworkResult } from "../results/result-types.js";
import { solveCheckedDocument } from "../solve/solve-network.js";
import { CliError, EXIT, linesText } from "./cli-error.js";
import type { FullCliIo } from "./cli-io.js";
import { issueLines } from "./issue-lines.js";
import { readInputFile } from "./read-input-file.js";
import { renderTable } from "./render-table.js";

/** Options of `machnet solve`, as commander parsed them. */
export interface SolveCommandOptions {
  format: "table" | "json" | "csv";
  units: UnitSetName;
  output?: string;
  table?: CsvTableName;
}

/** The table-format report as text. */
export function reportText(report: ResultReport, table: CsvTableName | undefined): string {
  const parts: string[] = [];
  if (report.marker !== undefined) parts.push(report.marker, "");
  parts.push(report.heading, "");
  if (table === undefined || table === "nodes") parts.push(renderTable(report.nodes), "");
  if (table === undefined || table === "edges") parts.push(renderTable(report.edges), "");
  if (table === undefined || table === "components") {
    for (const components of report.components) parts.push(renderTable(components), "");
    if (table === "components" && report.components.length === 0) {
      parts.push("no components in this network", "");
    }
  }
  if (report.warnings.length > 0) parts.push(...report.warnings, "");
  parts.push(report.summary, report.caution);
  return linesText(parts);
}

/**
 * Run `machnet solve`.
 *
 * @returns 0 for a solution, 1 for a result that is not one (output printed all the same)
 * @throws CliError (exit 2) for a file or document that cannot be used
 */
export async function solveCommand(
  file: string,
  options: SolveCommandOptions,
  io: FullCliIo,
): Promise<number> {
  if (options.format === "json" && options.table !== undefined) {
    throw new CliError([
      "--table applies to --format table and csv; --format json always holds the whole result",
    ]);
  }
  const text = await readInputFile(file, io);
  const read = readNetworkText(text);
  if (!read.ok) throw new CliError(issueLines(file, read.issues));
  let result: NetworkResult;
  try {
    result = solveCheckedDocument(read.document);
  } catch (error) {
    // Topology problems surface here (the model is built inside the solve).
    if (error instanceof InputError) throw new CliError(issueLines(file, error.issues));
    throw error;
  }

  const stderr: string[] = resultNotes(result).map((note) => `note: ${file}: ${note}`);
  const reason = notASolutionReason(result);
  let output: string;
  if (options.format === "json") {
    output = resultJson(result);
  } else if (options.format === "csv") {
    output = resultCsv(result, { units: options.units, table: options.table ?? "edges" });
    stderr.push(...resultWarnings(result));
  } else {
    output = reportText(resultReport(result, options.units), options.table);
  }
  if (reason !== undefined) stderr.push(`${file}: ${reason}`);

  if (options.output === undefined) {
    io.stdout(output);
  } else {
    try {
      await io.writeFile(options.output, output);
    } catch (error) {
      const code = (error as { code?: unknown } | null)?.code;
      if (typeof code !== "string") throw error;
      throw new CliError([
        `${options.output}: cannot write the output (${code}: ${(error as Error).message})`,
      ]);
    }
  }
  if (stderr.length > 0) io.stderr(linesText(stderr));
  return reason === undefined ? EXIT.ok : EXIT.notASolution;
}
