/**
 * `machnet check FILE`: schema, units and topology, no solve.
 */

import { checkNetwork } from "../check-network.js";
import { CliError, EXIT, linesText } from "./cli-error.js";
import type { FullCliIo } from "./cli-io.js";
import { issueLines } from "./issue-lines.js";
import { readInputFile } from "./read-input-file.js";

/**
 * Run `machnet check`: prints `FILE: ok (N nodes, M edges)` and any notes.
 *
 * @throws CliError (exit 2) with one line per problem
 */
export async function checkCommand(file: string, io: FullCliIo): Promise<number> {
  const text = await readInputFile(file, io);
  const checked = checkNetwork(text);
  if (!checked.ok) throw new CliError(issueLines(file, checked.issues));
  const { nodes, edges, notes } = checked.document;
  const plural = (count: number, word: string) => `${count} ${word}${count === 1 ? "" : "s"}`;
  io.stdout(
    linesText([`${file}: ok (${plural(nodes.length, "node")}, ${plural(edges.length, "edge")})`]),
  );
  if (notes.length > 0) {
    io.stderr(linesText(notes.map((note) => `note: ${file}: ${note.path}: ${note.message}`)));
  }
  return EXIT.ok;
}
