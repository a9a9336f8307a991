/**
 * The `machnet` command line: arguments -> library -> standard output, standard error and an exit
 * code. The only code in machnet that prints, reads files or looks at the process.
 *
 * Exit codes: 0 success; 1 no solution or not converged; 2 invalid input; 3 internal error.
 */

import { readFileSync } from "node:fs";
import { dirname, join } from "node:path";
import { fileURLToPath } from "node:url";
import { Command, CommanderError, Option } from "commander";
import { GAS_PRESET_NAMES } from "../gas/gas.js";
import { UNIT_SET_NAMES } from "../output/display-units.js";
import { CSV_TABLE_NAMES } from "../output/result-csv.js";
import { InternalCheckError } from "../solve/solve-network.js";
import { checkCommand } from "./check-command.js";
import { CliError, EXIT, linesText } from "./cli-error.js";
import { type CliIo, completeIo, type FullCliIo } from "./cli-io.js";
import { type MergeCommandOptions, mergeCommand } from "./merge-command.js";
import { runReport } from "./report-command.js";
import { type SolveCommandOptions, solveCommand } from "./solve-command.js";
import { STATE_MODES, type StateCommandOptions, stateCommand } from "./state-command.js";
import { type StudyCommandOptions, type StudyRuntime, studyCommand } from "./study-command.js";

export { EXIT } from "./cli-error.js";
export type { CliIo } from "./cli-io.js";

/** The version in package.json, found by walking up from this file (src/cli or dist/src/cli). */
function packageVersion(): string {
  let directory = dirname(fileURLToPath(import.meta.url));
  for (let level = 0; level < 6; level++) {
    try {
      const manifest = JSON.parse(readFileSync(join(directory, "package.json"), "utf8")) as {
        name?: string;
        version?: string;
      };
      if (manifest.name === "machnet" && typeof manifest.version === "string") {
        return manifest.version;
      }
    } catch {
      // No package.json here: look one level up.
    }
    directory = dirname(directory);
  }
  return "unknown";
}

const EXIT_CODES_HELP = `
Exit codes:
  0  success
  1  the solve did not converge, or the network has no solution (the output is still printed,
     marked NOT A SOLUTION)
  2  invalid input: file, JSON, schema, units, topology or command-line values
  3  internal error in machnet (please report it); MACHNET_DEBUG=1 prints the stack trace

Results are engineering estimates; pressure and relief systems are designed and checked to the
applicable codes by qualified engineers.`;

function unitsOption(): Option {
  return new Option("--units <set>", "unit set of the printed values")
    .choices([...UNIT_SET_NAMES])
    .default("metric");
}

/** The command tree; `run` receives each command's exit code. */
function buildProgram(io: FullCliIo, runtime: StudyRuntime, run: (code: number) => void): Command {
  const program = new Command("machnet")
    .description(
      "Steady compressible gas flow in pipe networks: solve a network file, check it, draw a report, run a parametric study or a design question on it, or work out the gas state at one pipe section.",
    )
    .exitOverride()
    .configureOutput({
      writeOut: (text) => io.stdout(text),
      writeErr: (text) => io.stderr(text),
      outputError: (text, write) => write(text),
    })
    .showHelpAfterError("(machnet help <command> lists the options)")
    .version(packageVersion(), "-V, --version", "print the version of machnet")
    .helpOption("-h, --help", "show help")
    .addHelpText("after", EXIT_CODES_HELP);

  program
    .command("solve")
    .description("solve a network document and print the results")
    .argument("<file>", "network document (JSON, UTF-8)")
    .addOption(
      new Option("--format <format>", "output format")
        .choices(["table", "json", "csv"])
        .default("table"),
    )
    .addOption(unitsOption())
    .option("-o, --output <path>", "write the output to this file instead of standard output")
    .addOption(
      new Option(
        "--table <table>",
        "only this table (table format: default all; csv: default edges)",
      ).choices([...CSV_TABLE_NAMES]),
    )
    .addHelpText(
      "after",
      `
--format json prints the result object in SI units (Pa absolute, K, kg/s, m/s).
--format csv prints one table: a header row with units in brackets, one row per edge (or node,
or component with its own figures).`,
    )
    .action(async (file: string, options: SolveCommandOptions) => {
      run(await solveCommand(file, options, io));
    });

  program
    .command("check")
    .description("check a network document (schema, units, topology) without solving it")
    .argument("<file>", "network document (JSON, UTF-8)")
    .action(async (file: string) => {
      run(await checkCommand(file, io));
    });

  program
    .command("state")
    .description(
      "gas state at one section of a pipe (isentropic, calorically perfect gas): density, speed of sound, Mach number, velocity, stagnation temperature and pressure",
    )
    .requiredOption("--gas <name>", `gas preset: ${GAS_PRESET_NAMES.join(", ")}`)
    .option("--pressure <quantity>", 'static pressure, e.g. "6 bar(g)"')
    .option("--temperature <quantity>", 'static temperature, e.g. "25 degC"')
    .option("--velocity <quantity>", 'flow velocity, e.g. "20 m/s"')
    .option("--mach <number>", "Mach number, e.g. 0.3")
    .option("--mass-flux <quantity>", 'mass flux, e.g. "150 kg/(m2 s)"')
    .option("--stagnation-temperature <quantity>", 'stagnation temperature, e.g. "20 degC"')
    .option("--stagnation-pressure <quantity>", 'stagnation pressure, e.g. "8 bar(a)"')
    .option(
      "--ambient-pressure <quantity>",
      "absolute ambient pressure that gauge values are read from",
      "101325 Pa",
    )
    .addOption(
      new Option("--format <format>", "output format").choices(["table", "json"]).default("table"),
    )
    .addOption(unitsOption())
    .addHelpText("after", `\nModes: ${STATE_MODES}.`)
    .action((options: StateCommandOptions) => {
      run(stateCommand(options, io));
    });

  program
    .command("report")
    .description(
      "solve a network and write a visual report: one self-contained HTML file with the network drawing, a pressure profile and the tables (or, with --format svg, the drawing alone)",
    )
    .argument("<file>", "network document (JSON, UTF-8)")
    .option(
      "-o, --output <path>",
      'where to write the report ("-" for standard output); default FILE with .html or .svg',
    )
    .addOption(
      new Option("--color <quantity>", "what the pipe colours show")
        .choices(["mach", "pressure", "velocity", "flow"])
        .default("mach"),
    )
    .addOption(
      new Option("--format <format>", "report format").choices(["html", "svg"]).default("html"),
    )
    .addOption(unitsOption())
    .option(
      "--to <node>",
      "node the pressure profile runs to (default: the lowest-pressure consumer)",
    )
    .option("--from <reservoir>", "reservoir the pressure profile starts from")
    .action(
      async (
        file: string,
        options: {
          output?: string;
          color?: string;
          format?: "html" | "svg";
          units?: string;
          to?: string;
          from?: string;
        },
      ) => {
        const args: Parameters<typeof runReport>[0] = { file };
        if (options.output !== undefined) args.output = options.output;
        if (options.color !== undefined) args.colorBy = options.color;
        if (options.format !== undefined) args.format = options.format;
        if (options.units !== undefined) args.units = options.units;
        if (options.to !== undefined) args.to = options.to;
        if (options.from !== undefined) args.from = options.from;
        run(await runReport(args, io));
      },
    );

  program
    .command("study")
    .description(
      "run a study document: a sweep over varied inputs (one row per case, CSV or JSON lines), or a design question (target, capacity, sensitivities, sizing)",
    )
    .argument("<file>", "study document (JSON, UTF-8; schemas/study.schema.json)")
    .option(
      "-o, --output <path>",
      "write the rows (.csv or .jsonl) or the answer (.txt or .json) to this file instead of standard output",
    )
    .option(
      "--format <format>",
      "sweep: csv (default) or jsonl; design question: text (default) or json; default from the --output extension",
    )
    .option(
      "--workers <n>",
      "worker threads for a sweep (default: one per 1000 cases, at most one per core)",
    )
    .option(
      "--shard <K/N>",
      "run only slice K of N of a sweep (for job arrays); join with machnet merge",
    )
    .option("-q, --quiet", "no progress and no summary on standard error")
    .addHelpText(
      "after",
      `
A sweep writes one row per case in case order: the varied inputs, status, Newton iterations, the
case it was warm-started from, the chosen outputs and, for a case that did not converge, why.
CSV values are in the study's unit set ("units", default si) with units in the header; JSON lines
are SI. The exit code is 0 once every case has a row, failed ones included.
A design question prints its answer; exit code 1 when there is none (not bracketed, infeasible).`,
    )
    .action(async (file: string, options: StudyCommandOptions) => {
      run(await studyCommand(file, options, io, runtime));
    });

  program
    .command("merge")
    .description(
      "join the outputs of machnet study --shard K/N runs into the file a single run writes",
    )
    .argument("<files...>", "the shard outputs, in any order")
    .option("-o, --output <path>", "write the merged file here instead of standard output")
    .action(async (files: string[], options: MergeCommandOptions) => {
      run(await mergeCommand(files, options, io));
    });

  return program;
}

/** Exit code for a commander error: help and version are successes, the rest invalid input. */
function commanderExitCode(error: CommanderError): number {
  if (error.code === "commander.helpDisplayed" || error.code === "commander.version")
    return EXIT.ok;
  if (error.code === "commander.help" && error.exitCode === 0) return EXIT.ok;
  return EXIT.invalidInput;
}

/** One line for a defect: no stack trace unless MACHNET_DEBUG=1. */
function reportInternalError(error: unknown, io: FullCliIo): void {
  let line: string;
  if (error instanceof InternalCheckError) {
    line = /please report/.test(error.message)
      ? error.message
      : `${error.message}; please report it`;
  } else {
    const what = error instanceof Error ? `${error.name}: ${error.message}` : String(error);
    line = `internal error: ${what}; please report it with the input that caused it`;
  }
  const lines = [line.replace(/\s*[\r\n]+\s*/g, " ")];
  if (io.env.MACHNET_DEBUG === "1" && error instanceof Error && error.stack !== undefined) {
    lines.push(error.stack);
  }
  io.stderr(linesText(lines));
}

/**
 * Run the command line.
 *
 * @param argv - the arguments after the program name, e.g. `["solve", "net.json"]`
 * @param io - streams and file access; defaults to the process's (for tests: in memory)
 * @returns the exit code: 0 success, 1 not a solution, 2 invalid input, 3 internal error
 * @example await main(["check", "plant.json"], { stdout: (t) => out.push(t), stderr: (t) => err.push(t) }) // 0
 */
export async function main(argv: string[], io?: CliIo): Promise<number> {
  const full = completeIo(io);
  // The progress bar of a study needs a terminal on standard error; in memory (tests) there is none.
  const runtime: StudyRuntime = { stderrIsTTY: io === undefined && process.stderr.isTTY === true };
  if (io === undefined) {
    // A reader that stops early (`machnet study ... | head`) closes the pipe: stop quietly, as
    // command-line tools do, instead of failing on the next write.
    process.stdout.on("error", (error: NodeJS.ErrnoException) => {
      if (error.code === "EPIPE") process.exit(process.exitCode ?? 0);
      throw error;
    });
  }
  let exitCode: number = EXIT.ok;
  try {
    const program = buildProgram(full, runtime, (code) => {
      exitCode = code;
    });
    await program.parseAsync(argv, { from: "user" });
    return exitCode;
  } catch (error) {
    if (error instanceof CommanderError) return commanderExitCode(error);
    if (error instanceof CliError) {
      full.stderr(linesText(error.lines));
      return error.exitCode;
    }
    reportInternalError(error, full);
    return EXIT.internal;
  }
}
