/**
 * What the command line reads and writes, as an object so that tests can run it in memory. The
 * defaults are the process's streams and the file system; only src/cli touches them.
 */

import { readFile, writeFile } from "node:fs/promises";

/** The outside world of one command-line run. */
export interface CliIo {
  /** Write text to standard output (text ends with "\n" where a line ends). */
  stdout: (text: string) => void;
  /** Write text to standard error. */
  stderr: (text: string) => void;
  /** Read a file: bytes or text. Rejects like `fs.promises.readFile` (error `code` ENOENT...). */
  readFile?: (path: string) => Promise<Buffer | string>;
  /** Write a text file (UTF-8), replacing it. */
  writeFile?: (path: string, text: string) => Promise<void>;
  /** Whether standard output is a terminal (reserved; the output does not depend on it yet). */
  isTTY?: boolean;
  /** Environment variables; only MACHNET_DEBUG is read. @defaultValue process.env */
  env?: Readonly<Record<string, string | undefined>>;
}

/** A CliIo with every member present. */
export type FullCliIo = Required<CliIo>;

/** The process's streams, file system and environment. */
export function processIo(): FullCliIo {
  return {
    stdout: (text) => {
      process.stdout.write(text);
    },
    stderr: (text) => {
      process.stderr.write(text);
    },
    readFile: (path) => readFile(path),
    writeFile: (path, text) => writeFile(path, text, "utf8"),
    isTTY: process.stdout.isTTY === true,
    env: process.env,
  };
}

/** Fill the members a caller left out with the process defaults. */
export function completeIo(io: CliIo | undefined): FullCliIo {
  const defaults = processIo();
  if (io === undefined) return defaults;
  return {
    stdout: io.stdout,
    stderr: io.stderr,
    readFile: io.readFile ?? defaults.readFile,
    writeFile: io.writeFile ?? defaults.writeFile,
    isTTY: io.isTTY ?? false,
    env: io.env ?? defaults.env,
  };
}
