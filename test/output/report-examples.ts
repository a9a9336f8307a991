/**
 * Shared by the report tests: the three example networks of docs/examples/, read and solved once
 * per test file, and small helpers that take the report's SVG apart by its documented markup
 * (`<g class="mn-edge" data-id=...>`, `<g class="mn-node" ...>`).
 */
import { readFileSync } from "node:fs";
import type { CheckedDocument } from "../../src/input/document-types.js";
import { readNetworkDocument } from "../../src/input/read-document.js";
import type { NetworkResult } from "../../src/results/result-types.js";
import { solveCheckedDocument } from "../../src/solve/solve-network.js";

export const EXAMPLE_NAMES = [
  "workshop-ring-main",
  "nitrogen-tank-header",
  "vent-collection-header",
] as const;
export type ExampleName = (typeof EXAMPLE_NAMES)[number];

/** The example's JSON text, as on disk. */
export function exampleText(name: ExampleName): string {
  return readFileSync(new URL(`../../docs/examples/${name}.json`, import.meta.url), "utf8");
}

/** The example's document as written (ids, lengths as text). */
export function exampleJson(name: ExampleName): {
  nodes: { id: string; kind: string; demand?: string }[];
  edges: { id: string; from: string; to: string; length: string }[];
} {
  return JSON.parse(exampleText(name));
}

/** Read and solve a document. */
export function solved(document: unknown): { document: CheckedDocument; result: NetworkResult } {
  const read = readNetworkDocument(document);
  if (!read.ok) throw new Error(read.issues.map((issue) => issue.message).join("; "));
  return { document: read.document, result: solveCheckedDocument(read.document) };
}

const cache = new Map<ExampleName, { document: CheckedDocument; result: NetworkResult }>();
/** An example, read and solved once. */
export function example(name: ExampleName): { document: CheckedDocument; result: NetworkResult } {
  let entry = cache.get(name);
  if (!entry) {
    entry = solved(JSON.parse(exampleText(name)));
    cache.set(name, entry);
  }
  return entry;
}

/** The attributes of an opening tag. */
export function attributes(tag: string): Record<string, string> {
  const found: Record<string, string> = {};
  for (const match of tag.matchAll(/([\w:-]+)="([^"]*)"/g))
    found[match[1] as string] = match[2] as string;
  return found;
}

/** Undo the five entities of the report's escaping. */
export function unescapeMarkup(text: string): string {
  return text
    .replace(/&lt;/g, "<")
    .replace(/&gt;/g, ">")
    .replace(/&quot;/g, '"')
    .replace(/&#39;/g, "'")
    .replace(/&amp;/g, "&");
}

/** One drawn element: its opening tag's attributes and its markup up to the next element. */
export interface DrawnElement {
  attributes: Record<string, string>;
  markup: string;
}

/** The pipes (`kind` "edge") or nodes of a drawing, in drawing order. */
export function drawnElements(svg: string, kind: "edge" | "node"): DrawnElement[] {
  const starts = [...svg.matchAll(new RegExp(`<g class="mn-${kind}[ "]`, "g"))].map(
    (match) => match.index,
  );
  return starts.map((start, index) => {
    const markup = svg.slice(start, starts[index + 1] ?? svg.length);
    const end = markup.indexOf(">");
    return { attributes: attributes(markup.slice(0, end + 1)), markup };
  });
}

/** The attributes of the first tag in `markup` with this class. */
export function tagWithClass(
  markup: string,
  className: string,
): Record<string, string> | undefined {
  const match = markup.match(new RegExp(`<[a-z]+ class="${className}"[^>]*>`));
  return match ? attributes(match[0]) : undefined;
}
