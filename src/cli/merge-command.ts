/**
 * `machnet merge A B ... [--output FILE]`: join the outputs of `machnet study --shard K/N` runs
 * into one file, byte for byte the output of a single run of the whole study.
 *
 * Each shard's output starts with a header line naming its shard, its cases, the study's
 * fingerprint and the format; the merge checks that the files belong to one study, that every
 * shard is there once and complete, then writes the column header once and the rows in case
 * order.
 */

import { parseShardHeaderLine, type ShardHeader } from "../study/study-format.js";
import { CliError, EXIT } from "./cli-error.js";
import type { FullCliIo } from "./cli-io.js";
import { readInputFile } from "./read-input-file.js";

/** Options of `machnet merge`. */
export interface MergeCommandOptions {
  output?: string;
}

interface ShardFile {
  file: string;
  header: ShardHeader;
  /** The column header (CSV), or undefined (JSON lines). */
  columns: string | undefined;
  rows: string[];
}

/** The case number a row starts with, or NaN. */
function rowCase(row: string, format: ShardHeader["format"]): number {
  const match = format === "csv" ? /^(\d+),/.exec(row) : /^\{"case":(\d+),/.exec(row);
  return match ? Number(match[1]) : Number.NaN;
}

async function readShard(file: string, io: FullCliIo): Promise<ShardFile> {
  const text = await readInputFile(file, io);
  const lines = text.split("\n");
  if (lines.at(-1) === "") lines.pop();
  const header = lines[0] === undefined ? undefined : parseShardHeaderLine(lines[0]);
  if (header === undefined) {
    throw new CliError([
      `${file}: not the output of a "machnet study --shard K/N" run (its first line is not a shard header); only shard outputs can be merged`,
    ]);
  }
  const columns = header.format === "csv" ? lines[1] : undefined;
  const rows = lines.slice(header.format === "csv" ? 2 : 1);
  const expected = header.lastCase - header.firstCase + 1;
  if (rows.length !== expected) {
    throw new CliError([
      `${file}: shard ${header.shard}/${header.of} holds cases ${header.firstCase} to ${header.lastCase} (${expected} rows) but the file has ${rows.length}: it is incomplete; run the shard again`,
    ]);
  }
  rows.forEach((row, i) => {
    if (rowCase(row, header.format) !== header.firstCase + i) {
      throw new CliError([
        `${file}: row ${i + 1} should be case ${header.firstCase + i}; the file has been changed or cut; run the shard again`,
      ]);
    }
  });
  return { file, header, columns, rows };
}

/**
 * Run `machnet merge`.
 *
 * @returns 0 when the merged file is written
 * @throws CliError (exit 2) for files that are not shard outputs of one study, a shard that is
 *   missing, given twice or incomplete
 */
export async function mergeCommand(
  files: readonly string[],
  options: MergeCommandOptions,
  io: FullCliIo,
): Promise<number> {
  if (files.length === 0) throw new CliError(["merge needs the shard output files"]);
  const shards: ShardFile[] = [];
  for (const file of files) shards.push(await readShard(file, io));
  const first = shards[0] as ShardFile;
  const problems: string[] = [];
  for (const shard of shards.slice(1)) {
    const h = shard.header;
    const f = first.header;
    if (h.study !== f.study || h.cases !== f.cases || h.of !== f.of || h.format !== f.format) {
      problems.push(
        `${shard.file}: from another study or another split than ${first.file} (shard ${h.shard}/${h.of} of ${h.cases} cases, ${h.format}, study ${h.study.slice(0, 12)}; ${first.file}: shard ${f.shard}/${f.of} of ${f.cases} cases, ${f.format}, study ${f.study.slice(0, 12)})`,
      );
    } else if (shard.columns !== first.columns) {
      problems.push(`${shard.file}: its column header differs from that of ${first.file}`);
    }
  }
  if (problems.length > 0) throw new CliError(problems);
  const byIndex = new Map<number, ShardFile>();
  for (const shard of shards) {
    const earlier = byIndex.get(shard.header.shard);
    if (earlier !== undefined) {
      problems.push(
        `${shard.file}: shard ${shard.header.shard}/${shard.header.of} is given twice (also ${earlier.file})`,
      );
    }
    byIndex.set(shard.header.shard, shard);
  }
  const missing: number[] = [];
  for (let index = 1; index <= first.header.of; index++)
    if (!byIndex.has(index)) missing.push(index);
  if (missing.length > 0) {
    problems.push(
      `shard${missing.length === 1 ? "" : "s"} ${missing.join(", ")} of ${first.header.of} missing: give every shard's output`,
    );
  }
  if (problems.length > 0) throw new CliError(problems);

  const lines: string[] = [];
  if (first.columns !== undefined) lines.push(first.columns);
  let nextCase = 1;
  for (let index = 1; index <= first.header.of; index++) {
    const shard = byIndex.get(index) as ShardFile;
    if (shard.rows.length > 0 && shard.header.firstCase !== nextCase) {
      throw new CliError([
        `${shard.file}: starts at case ${shard.header.firstCase}, expected ${nextCase}`,
      ]);
    }
    lines.push(...shard.rows);
    nextCase += shard.rows.length;
  }
  if (nextCase !== first.header.cases + 1) {
    throw new CliError([
      `the shards hold ${nextCase - 1} of ${first.header.cases} cases; run the missing ones again`,
    ]);
  }
  const text = lines.map((line) => `${line}\n`).join("");
  if (options.output === undefined || options.output === "-") {
    io.stdout(text);
  } else {
    try {
      await io.writeFile(options.output, text);
    } catch (error) {
      const code = (error as { code?: unknown } | null)?.code;
      if (typeof code !== "string") throw error;
      throw new CliError([
        `${options.output}: cannot write the output (${code}: ${(error as Error).message})`,
      ]);
    }
  }
  return EXIT.ok;
}
