/**
 * Exit codes of the command line and the error that carries one: lines for standard error and
 * the code to exit with.
 */

/** Exit codes, documented in docs/cli.md. */
export const EXIT = {
  /** Success. */
  ok: 0,
  /** The solve did not converge, or the network has no solution. */
  notASolution: 1,
  /** Invalid input: file, JSON, schema, units, topology, command-line values. */
  invalidInput: 2,
  /** A defect in machnet: an internal check failed or something unexpected was thrown. */
  internal: 3,
} as const;

/** A failure the user can act on: print `lines` on standard error, exit with `exitCode`. */
export class CliError extends Error {
  readonly lines: readonly string[];
  readonly exitCode: number;

  constructor(lines: readonly string[], exitCode: number = EXIT.invalidInput) {
    super(lines.join("\n"));
    this.name = "CliError";
    this.lines = lines;
    this.exitCode = exitCode;
  }
}

/** Text lines joined, each ending in "\n". */
export function linesText(lines: readonly string[]): string {
  return lines.map((line) => `${line}\n`).join("");
}
