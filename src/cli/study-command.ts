/**
 * `machnet study FILE`: read a study document and its network, then run the sweep (one row per
 * case, CSV or JSON lines, optionally one shard of it, on worker threads) or answer its design
 * question (target, capacity, sensitivities, sizing).
 *
 * Rows come out in case order whatever order the threads finish in, and a case is solved the same
 * way whichever thread, shard or machine runs it (src/study/cases.ts), so a parallel run, a
 * serial run and merged shards give the same bytes.
 */

import { createHash } from "node:crypto";
import { existsSync } from "node:fs";
import { availableParallelism } from "node:os";
import { dirname, isAbsolute, join } from "node:path";
import { fileURLToPath } from "node:url";
import { SingleBar } from "cli-progress";
import { Piscina } from "piscina";
import { parseJsonText } from "../input/read-document.js";
import { answerJson, answerStudy, answerText } from "../study/answer-text.js";
import {
  blockCount,
  caseCount,
  type Shard,
  shardBlockRange,
  shardCaseRange,
} from "../study/cases.js";
import { readStudyDocument } from "../study/read-study.js";
import { averageIterations, type StudyRow, solveStudyBlock } from "../study/run-study.js";
import { type StudyFormat, shardHeaderLine, studyWriter } from "../study/study-format.js";
import { formatStudyIssue, type StudyIssue, sortStudyIssues } from "../study/study-issues.js";
import type { PreparedStudy } from "../study/study-types.js";
import { CliError, EXIT, linesText } from "./cli-error.js";
import type { FullCliIo } from "./cli-io.js";
import { issueLines } from "./issue-lines.js";
import { readInputFile } from "./read-input-file.js";

/** Options of `machnet study`, as commander parsed them (values not yet checked). */
export interface StudyCommandOptions {
  output?: string;
  format?: string;
  workers?: string;
  shard?: string;
  quiet?: boolean;
}

/** What the command needs from the process beyond {@link FullCliIo} (injected by tests). */
export interface StudyRuntime {
  /** Whether standard error is a terminal: a progress bar there, plain lines otherwise. */
  stderrIsTTY: boolean;
  /** Stream the progress bar draws on. @defaultValue process.stderr */
  progressStream?: NodeJS.WritableStream;
  /** Threads to use without --workers. @defaultValue os.availableParallelism() */
  threads?: number;
  /** Clock [ms] for the rate and time left. @defaultValue performance.now */
  now?: () => number;
}

const SWEEP_FORMATS = ["csv", "jsonl"] as const;

/**
 * Cases per worker thread when --workers is not given. Starting a pool (loading machnet, 0.11 s
 * per thread on an idle machine, and compiling it) took about 0.4 s, the time of a few thousand
 * cases of a small network in one thread (docs/study.md); below that a second thread does not pay.
 */
const CASES_PER_THREAD = 1000;
const ANSWER_FORMATS = ["text", "json"] as const;

/** Output format from --format or the output file's extension. */
function chooseFormat(options: StudyCommandOptions, sweep: boolean): string {
  const byExtension = (() => {
    const output = options.output;
    if (output === undefined || output === "-") return undefined;
    if (/\.csv$/i.test(output)) return "csv";
    if (/\.(jsonl|ndjson)$/i.test(output)) return "jsonl";
    if (/\.json$/i.test(output)) return "json";
    if (/\.txt$/i.test(output)) return "text";
    return undefined;
  })();
  const allowed: readonly string[] = sweep ? SWEEP_FORMATS : ANSWER_FORMATS;
  const what = sweep ? "a sweep writes csv or jsonl" : "a design question writes text or json";
  if (options.format !== undefined) {
    if (!allowed.includes(options.format)) {
      throw new CliError([`--format ${options.format}: ${what}`]);
    }
    if (byExtension !== undefined && byExtension !== options.format) {
      throw new CliError([
        `--format ${options.format} does not match the output file ${options.output} (${byExtension})`,
      ]);
    }
    return options.format;
  }
  if (byExtension !== undefined) {
    if (!allowed.includes(byExtension)) {
      throw new CliError([`${options.output}: ${what}; name the file .${allowed.join(" or .")}`]);
    }
    return byExtension;
  }
  return sweep ? "csv" : "text";
}

/** `K/N` -> a shard, or a CliError. */
export function parseShard(text: string): Shard {
  const match = /^(\d+)\/(\d+)$/.exec(text.trim());
  const index = match ? Number(match[1]) : Number.NaN;
  const count = match ? Number(match[2]) : Number.NaN;
  if (!match || !(count >= 1) || !(index >= 1) || index > count || count > 1_000_000) {
    throw new CliError([
      `--shard ${text}: expected K/N with whole numbers 1 <= K <= N, e.g. --shard 3/8 for the third of eight slices`,
    ]);
  }
  return { index, count };
}

function parseWorkers(text: string): number {
  const value = /^\d+$/.test(text.trim()) ? Number(text) : Number.NaN;
  if (!(value >= 1 && value <= 1024)) {
    throw new CliError([`--workers ${text}: expected a whole number of threads from 1 to 1024`]);
  }
  return value;
}

/** Read the study file and its network file; every problem as a CliError (exit 2). */
async function readStudyFiles(file: string, io: FullCliIo): Promise<PreparedStudy> {
  const text = await readInputFile(file, io);
  const parsed = parseJsonText(text);
  if (!parsed.ok) throw new CliError(issueLines(file, parsed.issues));
  const value = parsed.value as { network?: unknown } | null;
  let network: unknown;
  let networkFile: string | undefined;
  if (value !== null && typeof value === "object" && typeof value.network === "string") {
    networkFile = isAbsolute(value.network) ? value.network : join(dirname(file), value.network);
    let networkText: string;
    try {
      networkText = await readInputFile(networkFile, io);
    } catch (error) {
      if (error instanceof CliError) {
        throw new CliError(error.lines.map((line) => `${file}: /network: ${line}`));
      }
      throw error;
    }
    const networkParsed = parseJsonText(networkText);
    if (!networkParsed.ok) throw new CliError(issueLines(networkFile, networkParsed.issues));
    network = networkParsed.value;
  }
  const read = readStudyDocument(parsed.value, network === undefined ? {} : { network });
  if (read.ok) return read.study;
  throw new CliError([
    ...studyIssueLines(file, read.issues),
    ...issueLines(networkFile ?? file, read.networkIssues),
  ]);
}

function studyIssueLines(file: string, issues: readonly StudyIssue[]): string[] {
  return sortStudyIssues(issues).map(
    (issue) => `${file}: ${formatStudyIssue(issue).replace(/[\r\n]+/g, " ")}`,
  );
}

/** Write the output to --output or standard output. */
async function writeOutput(path: string | undefined, text: string, io: FullCliIo): Promise<void> {
  if (path === undefined || path === "-") {
    io.stdout(text);
    return;
  }
  try {
    await io.writeFile(path, text);
  } catch (error) {
    const code = (error as { code?: unknown } | null)?.code;
    if (typeof code !== "string") throw error;
    throw new CliError([`${path}: cannot write the output (${code}: ${(error as Error).message})`]);
  }
}

/** Progress of a sweep on standard error. */
interface Progress {
  update(done: number): void;
  stop(): void;
}

function seconds(value: number): string {
  if (!Number.isFinite(value)) return "?";
  if (value < 60) return `${Math.ceil(value)} s`;
  if (value < 3600) return `${Math.floor(value / 60)} min ${Math.round(value % 60)} s`;
  return `${Math.floor(value / 3600)} h ${Math.round((value % 3600) / 60)} min`;
}

function startProgress(
  total: number,
  options: StudyCommandOptions,
  io: FullCliIo,
  runtime: StudyRuntime,
  now: () => number,
): Progress {
  if (options.quiet || total === 0) return { update: () => {}, stop: () => {} };
  const started = now();
  const rate = (done: number) => done / Math.max(1e-9, (now() - started) / 1000);
  if (runtime.stderrIsTTY) {
    const bar = new SingleBar({
      stream: runtime.progressStream ?? process.stderr,
      format: "study |{bar}| {value}/{total} cases | {rate} cases/s | {eta_formatted} left",
      hideCursor: true,
      etaBuffer: 50,
    });
    bar.start(total, 0, { rate: "0" });
    return {
      update: (done) => bar.update(done, { rate: rate(done).toFixed(1) }),
      stop: () => bar.stop(),
    };
  }
  // Plain lines: one per tenth of the cases.
  let nextLine = 1;
  return {
    update: (done) => {
      if (done < Math.ceil((nextLine * total) / 10) && done < total) return;
      while (nextLine <= 10 && done >= Math.ceil((nextLine * total) / 10)) nextLine++;
      const perSecond = rate(done);
      const left = (total - done) / perSecond;
      io.stderr(
        `study: ${done}/${total} cases (${Math.floor((100 * done) / total)} %), ${perSecond.toFixed(1)} cases/s, about ${seconds(left)} left\n`,
      );
    },
    stop: () => {},
  };
}

/** The worker file next to this module, or the one the environment names (tests). */
function workerFile(io: FullCliIo): string {
  const named = io.env.MACHNET_STUDY_WORKER;
  if (named !== undefined && named !== "") return named;
  return fileURLToPath(new URL("./study-worker.js", import.meta.url));
}

/** Solve the blocks on `threads` worker threads; rows handed on in case order. */
async function runOnPool(
  study: PreparedStudy,
  blocks: number[],
  threads: number,
  filename: string,
  onBlock: (rows: StudyRow[]) => void,
  onDone: (count: number) => void,
): Promise<void> {
  const pool = new Piscina({
    filename,
    workerData: { study },
    minThreads: threads,
    maxThreads: threads,
    idleTimeout: 1000,
  });
  try {
    let done = 0;
    const tasks = blocks.map((block) => pool.run(block) as Promise<StudyRow[]>);
    for (const task of tasks) {
      task.then(
        (rows) => {
          done += rows.length;
          onDone(done);
        },
        () => {},
      );
    }
    for (const task of tasks) onBlock(await task);
  } finally {
    await pool.destroy();
  }
}

/** A fingerprint of the prepared study: shards of one study carry the same one. */
function studyFingerprint(study: PreparedStudy): string {
  return createHash("sha256").update(JSON.stringify(study)).digest("hex");
}

/**
 * Run `machnet study`.
 *
 * @returns 0 when the sweep ran (failed cases are rows that say why) or the question has an
 *   answer; 1 when a design question has none (not bracketed, infeasible...)
 * @throws CliError (exit 2) for a file, document or option that cannot be used
 */
export async function studyCommand(
  file: string,
  options: StudyCommandOptions,
  io: FullCliIo,
  runtime: StudyRuntime,
): Promise<number> {
  const shard = options.shard === undefined ? undefined : parseShard(options.shard);
  const requestedWorkers =
    options.workers === undefined ? undefined : parseWorkers(options.workers);
  const study = await readStudyFiles(file, io);
  const sweep = study.question === "sweep";
  const format = chooseFormat(options, sweep);
  if (!sweep) {
    if (shard !== undefined || requestedWorkers !== undefined) {
      throw new CliError([
        `--shard and --workers apply to sweeps; question "${study.question}" runs its solves one after the other`,
      ]);
    }
    return answerCommand(study, format as "text" | "json", options, io);
  }
  return sweepCommand(study, format as StudyFormat, shard, requestedWorkers, options, io, runtime);
}

async function answerCommand(
  study: PreparedStudy,
  format: "text" | "json",
  options: StudyCommandOptions,
  io: FullCliIo,
): Promise<number> {
  let answer: ReturnType<typeof answerStudy>;
  try {
    answer = answerStudy(study);
  } catch (error) {
    if (
      study.question === "sensitivities" &&
      error instanceof Error &&
      /does not converge/.test(error.message)
    ) {
      throw new CliError([`sensitivities: ${error.message}`], EXIT.notASolution);
    }
    throw error;
  }
  const text = answerText(study, answer);
  const output =
    format === "json" ? `${JSON.stringify(answerJson(answer), null, 2)}\n` : linesText(text.lines);
  await writeOutput(options.output, output, io);
  return text.answered ? EXIT.ok : EXIT.notASolution;
}

async function sweepCommand(
  study: PreparedStudy,
  format: StudyFormat,
  shard: Shard | undefined,
  requestedWorkers: number | undefined,
  options: StudyCommandOptions,
  io: FullCliIo,
  runtime: StudyRuntime,
): Promise<number> {
  const now = runtime.now ?? (() => performance.now());
  const started = now();
  const total = caseCount(study);
  const [firstBlock, endBlock] = shard
    ? shardBlockRange(blockCount(study), shard)
    : [0, blockCount(study)];
  const blocks = Array.from({ length: endBlock - firstBlock }, (_, i) => firstBlock + i);
  const [firstCase, endCase] = shard ? shardCaseRange(study, shard) : [0, total];
  const cases = endCase - firstCase;

  const writer = studyWriter(study, format);
  const lines: string[] = [];
  if (shard) {
    lines.push(
      shardHeaderLine({
        shard: shard.index,
        of: shard.count,
        firstCase: firstCase + 1,
        lastCase: endCase,
        cases: total,
        format,
        study: studyFingerprint(study),
      }),
    );
  }
  const header = writer.header();
  if (header !== undefined) lines.push(header);
  const toStdout = options.output === undefined || options.output === "-";
  const emit = (text: string[]) => {
    if (toStdout) io.stdout(linesText(text));
    else lines.push(...text);
  };
  if (toStdout) {
    io.stdout(linesText(lines));
    lines.length = 0;
  }

  // Without --workers: a thread per CASES_PER_THREAD cases, up to one per core; a worker thread
  // spends seconds loading machnet before its first case, so small sweeps run faster in this one.
  let threads =
    requestedWorkers ??
    Math.min(
      runtime.threads ?? availableParallelism(),
      Math.max(1, Math.floor(cases / CASES_PER_THREAD)),
    );
  const filename = workerFile(io);
  if (threads > 1 && !existsSync(filename)) {
    if (requestedWorkers !== undefined) {
      throw new CliError([
        `--workers ${requestedWorkers}: the worker file ${filename} is missing; build machnet (npm run build) or use --workers 1`,
      ]);
    }
    threads = 1;
  }
  threads = Math.max(1, Math.min(threads, blocks.length));

  const progress = startProgress(cases, options, io, runtime, now);
  const counts = { rows: [] as Pick<StudyRow, "iterations" | "status">[] };
  const onBlock = (rows: StudyRow[]) => {
    emit(rows.map((row) => writer.row(row)));
    for (const row of rows) counts.rows.push({ iterations: row.iterations, status: row.status });
  };
  try {
    if (threads <= 1) {
      let done = 0;
      for (const block of blocks) {
        const rows = solveStudyBlock(study, block);
        done += rows.length;
        onBlock(rows);
        progress.update(done);
      }
    } else {
      await runOnPool(study, blocks, threads, filename, onBlock, (done) => progress.update(done));
    }
  } finally {
    progress.stop();
  }
  if (!toStdout) await writeOutput(options.output, linesText(lines), io);

  if (!options.quiet) {
    const converged = counts.rows.filter((row) => row.status === "converged").length;
    const elapsed = (now() - started) / 1000;
    const scope = shard ? `shard ${shard.index}/${shard.count}: ` : "";
    io.stderr(
      `study: ${scope}${cases} cases, ${converged} converged, ${cases - converged} not (see the status column); ${averageIterations(counts.rows).toFixed(2)} Newton iterations per case on average${study.warmStart ? " (warm starts)" : " (cold starts)"}; ${elapsed.toFixed(1)} s on ${threads} thread${threads === 1 ? "" : "s"}\n`,
    );
  }
  return EXIT.ok;
}
