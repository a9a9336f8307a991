/**
 * Schema, value and topology checks of a network document without solving it.
 */
import type { CheckedDocument } from "./input/document-types.js";
import type { InputIssue } from "./input/issues.js";
import { readNetworkDocument, readNetworkText } from "./input/read-document.js";
import { buildNetwork } from "./model/build-network.js";

/** What {@link checkNetwork} found. */
export type CheckResult =
  | { ok: true; document: CheckedDocument; issues: [] }
  | { ok: false; issues: InputIssue[] };

/**
 * Check a network document (JSON text or a parsed value): schema, units and values, ids and
 * topology. Returns every problem, sorted by JSON Pointer; never throws for bad input.
 *
 * @example
 * checkNetwork({ nodes: [], edges: [] }).issues[0].message // "must have at least 1 item(s)"
 */
export function checkNetwork(document: unknown): CheckResult {
  const read =
    typeof document === "string" ? readNetworkText(document) : readNetworkDocument(document);
  if (!read.ok) return { ok: false, issues: read.issues };
  const built = buildNetwork(read.document);
  if (!built.ok) return { ok: false, issues: built.issues };
  return { ok: true, document: read.document, issues: [] };
}
