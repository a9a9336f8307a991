/**
 * Read a network file as text for the command line: every way it can fail is one clear line
 * naming the file, and exit code 2.
 */

import { CliError } from "./cli-error.js";
import type { FullCliIo } from "./cli-io.js";

/**
 * Largest network file read [bytes]: 32 MiB. A network of 100 000 pipes written with two-space
 * indents takes about 24 MB (benchmarks/generate-network.js); a larger file is refused with one
 * line before it is parsed, so a wrong path to a log or a dump does not tie up the machine.
 */
export const MAX_INPUT_FILE_BYTES = 32 * 1024 * 1024;

function tooLarge(path: string, bytes: number | undefined): CliError {
  const size =
    bytes === undefined ? "larger than 2 GiB" : `${(bytes / 1024 / 1024).toFixed(1)} MiB`;
  return new CliError([
    `${path}: the file is ${size}; a network file may be at most ${MAX_INPUT_FILE_BYTES / 1024 / 1024} MiB`,
  ]);
}

/** What a file-system error code means, in words. */
const READ_ERRORS: Readonly<Record<string, string>> = {
  ENOENT: "no such file",
  ENOTDIR: "no such file (a part of the path is not a directory)",
  EISDIR: "is a directory; give the path of a network JSON file",
  EACCES: "permission denied",
  EPERM: "permission denied",
  ENAMETOOLONG: "the file name is too long",
  ELOOP: "too many symbolic links in the path",
  EMFILE: "too many open files; try again",
};

/**
 * The text of a file: UTF-8, a leading byte-order mark removed.
 *
 * @throws CliError (exit 2) `FILE: no such file`, `FILE: is a directory...`,
 *   `FILE: not valid UTF-8 text`, `FILE: the file is 50.0 MiB; ...`, `FILE: cannot be read
 *   (...)`, always one line; an error without a code (not a file-system error) is passed on
 */
export async function readInputFile(path: string, io: FullCliIo): Promise<string> {
  let content: Buffer | string;
  try {
    content = await io.readFile(path);
  } catch (error) {
    const code = (error as { code?: unknown } | null)?.code;
    if (typeof code !== "string") throw error;
    // Node refuses to read a file above 2 GiB into one buffer.
    if (code === "ERR_FS_FILE_TOO_LARGE") throw tooLarge(path, undefined);
    const meaning = READ_ERRORS[code];
    const detail = String((error as Error).message).replace(/\s*[\r\n]+\s*/g, " ");
    throw new CliError([`${path}: ${meaning ?? `cannot be read (${code}: ${detail})`}`]);
  }
  // A string from an in-memory reader counts its UTF-16 units, near enough to bytes here.
  if (content.length > MAX_INPUT_FILE_BYTES) throw tooLarge(path, content.length);
  if (typeof content === "string") {
    return content.charCodeAt(0) === 0xfeff ? content.slice(1) : content;
  }
  try {
    // fatal: invalid bytes throw instead of becoming U+FFFD; the BOM is removed (ignoreBOM false).
    return new TextDecoder("utf-8", { fatal: true }).decode(content);
  } catch {
    throw new CliError([`${path}: not valid UTF-8 text; save the file as UTF-8`]);
  }
}
