/**
 * `machnet report FILE`: read, solve and write the visual report, one self-contained HTML file
 * (or, with `--format svg`, the network drawing alone).
 *
 * Output: `--output PATH` writes there; `--output -` writes to standard output; without
 * `--output` the report goes next to FILE with its extension replaced by .html or .svg
 * (`net.json` -> `net.html`; a FILE without .json gets .html appended).
 */

import { createHash } from "node:crypto";
import { readFile } from "node:fs/promises";
import { dirname, join } from "node:path";
import { fileURLToPath } from "node:url";
import { InputError } from "../input/issues.js";
import { readNetworkText } from "../input/read-document.js";
import { UNIT_SET_NAMES, type UnitSetName } from "../output/display-units.js";
import { COLOR_QUANTITIES, type ColorQuantity } from "../output/report/color-scale.js";
import { drawNetworkSvg } from "../output/report/network-svg.js";
import { findProfilePath } from "../output/report/profile-path.js";
import { renderReportHtml } from "../output/report/report-html.js";
import { notASolutionReason, resultNotes } from "../output/result-table.js";
import type { NetworkResult } from "../results/result-types.js";
import { InternalCheckError, solveCheckedDocument } from "../solve/solve-network.js";
import { CliError, EXIT, linesText } from "./cli-error.js";
import { issueLines } from "./issue-lines.js";
import { readInputFile } from "./read-input-file.js";

/** Arguments of `machnet report`, as the command line parsed them (values not yet checked). */
export interface ReportArguments {
  file: string;
  /** Output path; "-" for standard output. @defaultValue FILE with .html or .svg */
  output?: string;
  /** mach, pressure, velocity or flow. @defaultValue "mach" */
  colorBy?: string;
  /** @defaultValue "html" */
  format?: "html" | "svg";
  /** si, metric or us. @defaultValue "metric" */
  units?: string;
  /** Node id the profile runs to. */
  to?: string;
  /** Node id the profile starts from. */
  from?: string;
}

/** What `machnet report` reads and writes. */
export interface ReportIo {
  stdout(text: string): void;
  stderr(text: string): void;
  readFile(path: string): Promise<Buffer | string>;
  writeFile(path: string, text: string): Promise<void>;
}

const FORMATS = ["html", "svg"] as const;

/** The default output path: FILE with its .json extension replaced (or with one appended). */
export function defaultReportPath(file: string, format: "html" | "svg"): string {
  const base = /\.json$/i.test(file) ? file.slice(0, -".json".length) : file;
  return `${base}.${format}`;
}

/** The version in machnet's package.json, found by walking up from this file. */
async function packageVersion(): Promise<string> {
  let directory = dirname(fileURLToPath(import.meta.url));
  for (let level = 0; level < 6; level++) {
    try {
      const manifest = JSON.parse(await readFile(join(directory, "package.json"), "utf8")) as {
        name?: string;
        version?: string;
      };
      if (manifest.name === "machnet" && typeof manifest.version === "string")
        return manifest.version;
    } catch {
      // No package.json here: look one level up.
    }
    directory = dirname(directory);
  }
  return "unknown";
}

function checkChoice<T extends string>(
  option: string,
  value: string | undefined,
  choices: readonly T[],
  fallback: T,
): T {
  if (value === undefined) return fallback;
  if ((choices as readonly string[]).includes(value)) return value as T;
  throw new CliError([`${option}: must be one of ${choices.join(", ")} (got "${value}")`]);
}

/**
 * Run `machnet report`.
 *
 * @param args - file, output, colour quantity, format, unit set, profile ends
 * @param io - standard output and error, file reading and writing
 * @returns the exit code: 0 report written for a solution; 1 report written for a result that is
 *   not a solution (marked NOT A SOLUTION); 2 invalid input or options (`FILE: /path: message`
 *   lines on standard error, nothing written); 3 internal error
 */
export async function runReport(args: ReportArguments, io: ReportIo): Promise<number> {
  try {
    return await report(args, io);
  } catch (error) {
    if (error instanceof CliError) {
      io.stderr(linesText(error.lines));
      return error.exitCode;
    }
    const message =
      error instanceof InternalCheckError ? error.message : `internal error: ${describe(error)}`;
    io.stderr(linesText([`${args.file}: ${message}`]));
    return EXIT.internal;
  }
}

function describe(error: unknown): string {
  return error instanceof Error ? `${error.name}: ${error.message}` : String(error);
}

async function report(args: ReportArguments, io: ReportIo): Promise<number> {
  const colorBy: ColorQuantity = checkChoice("--color", args.colorBy, COLOR_QUANTITIES, "mach");
  const format = checkChoice("--format", args.format, FORMATS, "html");
  const units: UnitSetName = checkChoice("--units", args.units, UNIT_SET_NAMES, "metric");
  if (format === "svg" && (args.to !== undefined || args.from !== undefined)) {
    throw new CliError([
      "--to and --from choose the profile of the HTML report; --format svg draws the network only",
    ]);
  }
  const output = args.output ?? defaultReportPath(args.file, format);
  if (output === args.file) {
    throw new CliError([`${args.file}: the report would replace the input file; give --output`]);
  }

  let bytes: Buffer | string = "";
  const text = await readInputFile(args.file, {
    stdout: io.stdout,
    stderr: io.stderr,
    readFile: async (path) => {
      bytes = await io.readFile(path);
      return bytes;
    },
    writeFile: io.writeFile,
    isTTY: false,
    env: {},
  });
  const read = readNetworkText(text);
  if (!read.ok) throw new CliError(issueLines(args.file, read.issues));
  let result: NetworkResult;
  try {
    result = solveCheckedDocument(read.document);
  } catch (error) {
    if (error instanceof InputError) throw new CliError(issueLines(args.file, error.issues));
    throw error;
  }
  if (args.to !== undefined || args.from !== undefined) {
    const path = findProfilePath(read.document, result, {
      ...(args.to !== undefined ? { to: args.to } : {}),
      ...(args.from !== undefined ? { from: args.from } : {}),
    });
    if (!path.ok) throw new CliError([`${args.file}: --${path.option ?? "to"}: ${path.message}`]);
  }

  const sourceHash = createHash("sha256").update(bytes).digest("hex");
  const content =
    format === "svg"
      ? drawNetworkSvg(read.document, result, { colorBy, units })
      : renderReportHtml(read.document, result, {
          colorBy,
          units,
          ...(args.to !== undefined ? { profileTo: args.to } : {}),
          ...(args.from !== undefined ? { profileFrom: args.from } : {}),
          sourceName: args.file,
          sourceHash,
          version: await packageVersion(),
        });

  const stderr = resultNotes(result).map((note) => `note: ${args.file}: ${note}`);
  const reason = notASolutionReason(result);
  if (reason !== undefined)
    stderr.push(
      `${args.file}: NOT A SOLUTION: ${reason} (the report is written, marked NOT A SOLUTION)`,
    );
  if (output === "-") {
    io.stdout(content);
  } else {
    try {
      await io.writeFile(output, content);
    } catch (error) {
      const code = (error as { code?: unknown } | null)?.code;
      if (typeof code !== "string") throw error;
      throw new CliError([
        `${output}: cannot write the report (${code}: ${(error as Error).message})`,
      ]);
    }
    io.stdout(`wrote ${output}\n`);
  }
  if (stderr.length > 0) io.stderr(linesText(stderr));
  return reason === undefined ? EXIT.ok : EXIT.notASolution;
}
