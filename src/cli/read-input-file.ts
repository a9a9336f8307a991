/**
 * Read a network file as text for the command line: every way it can fail is one clear line
 * naming the file, and exit code 2.
 */

import { CliError } from "./cli-error.js";
import type { FullCliIo } from "./cli-io.js";

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
 *   `FILE: not valid UTF-8 text`, `FILE: cannot be read (...)`; an error without a code (not a
 *   file-system error) is passed on
 */
export async function readInputFile(path: string, io: FullCliIo): Promise<string> {
  let content: Buffer | string;
  try {
    content = await io.readFile(path);
  } catch (error) {
    const code = (error as { code?: unknown } | null)?.code;
    if (typeof code !== "string") throw error;
    const meaning = READ_ERRORS[code];
    throw new CliError([
      `${path}: ${meaning ?? `cannot be read (${code}: ${(error as Error).message})`}`,
    ]);
  }
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
