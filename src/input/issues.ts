/**
 * Input problems as data. Every problem names its place in the user's document (a JSON Pointer),
 * what is wrong and what is expected, in one line a user can act on. Callers switch on `code`.
 */

/** One problem found in an input document, a quantity string or a command-line value. */
export type InputIssue =
  /** The document does not match schemas/network.schema.json. */
  | { code: "schema"; path: string; message: string }
  /** Text that is not JSON, with line and column (1-based). */
  | { code: "json-syntax"; path: string; message: string; line: number; column: number }
  /** A quantity string that cannot be read: unknown unit, wrong dimension, not a number. */
  | { code: "unit"; path: string; message: string; value: string | number }
  /** A value of the right unit that is physically impossible (absolute pressure <= 0, T <= 0 K...). */
  | { code: "value"; path: string; message: string; value: string | number }
  /** An edge names a node that the document does not define. */
  | { code: "unknown-node"; path: string; message: string; nodeId: string }
  /** Two nodes or edges share an id (ids are unique across nodes and edges together). */
  | { code: "duplicate-id"; path: string; message: string; id: string }
  /** An edge whose two ends are the same node. */
  | { code: "self-loop"; path: string; message: string; edgeId: string }
  /** A node that no edge touches. */
  | { code: "isolated-node"; path: string; message: string; nodeId: string }
  /** A connected part of the network with no reservoir: its pressure level is undefined. */
  | { code: "no-reservoir"; path: string; message: string; nodeIds: string[] }
  /** The document as a whole cannot be used (empty file, not an object, too large). */
  | { code: "document"; path: string; message: string }
  /** A valid request that this version cannot carry out (a gas model no edge model supports yet). */
  | { code: "unsupported"; path: string; message: string };

/** The codes of {@link InputIssue}, for callers that tabulate them. */
export type InputIssueCode = InputIssue["code"];

/**
 * Thrown by `solveNetwork` (and the other entry points that take a document) when the input
 * cannot be solved as given. Carries every problem found, sorted by path.
 */
export class InputError extends Error {
  /** Every problem found, sorted by JSON path. */
  readonly issues: readonly InputIssue[];

  constructor(issues: readonly InputIssue[]) {
    const sorted = sortIssues(issues);
    super(sorted.map(formatIssue).join("\n"));
    this.name = "InputError";
    this.issues = sorted;
  }
}

/** One line for a problem: `/edges/3/diameter: must be greater than 0 (got "-80 mm")`. */
export function formatIssue(issue: InputIssue): string {
  return issue.path === "" ? issue.message : `${issue.path}: ${issue.message}`;
}

/** Issues sorted by path (stable, so problems at one place keep their order). */
export function sortIssues(issues: readonly InputIssue[]): InputIssue[] {
  return [...issues].sort((a, b) => comparePaths(a.path, b.path));
}

/** Compare JSON Pointers segment by segment, numbers numerically (so /edges/2 < /edges/10). */
function comparePaths(a: string, b: string): number {
  const sa = a.split("/");
  const sb = b.split("/");
  const n = Math.min(sa.length, sb.length);
  for (let i = 0; i < n; i++) {
    const x = sa[i] as string;
    const y = sb[i] as string;
    if (x === y) continue;
    const nx = /^\d+$/.test(x) ? Number(x) : Number.NaN;
    const ny = /^\d+$/.test(y) ? Number(y) : Number.NaN;
    if (!Number.isNaN(nx) && !Number.isNaN(ny)) return nx - ny;
    return x < y ? -1 : 1;
  }
  return sa.length - sb.length;
}

/** Escape one segment of a JSON Pointer (RFC 6901). */
export function pointerSegment(segment: string | number): string {
  const text = String(segment);
  // Most segments (indices, field names) have nothing to escape: they skip the replacements.
  if (text.indexOf("~") < 0 && text.indexOf("/") < 0) return text;
  return text.replace(/~/g, "~0").replace(/\//g, "~1");
}

/** Join segments into a JSON Pointer: `jsonPointer("edges", 3, "diameter")` is `/edges/3/diameter`. */
export function jsonPointer(...segments: (string | number)[]): string {
  let pointer = "";
  for (const segment of segments) pointer += `/${pointerSegment(segment)}`;
  return pointer;
}
