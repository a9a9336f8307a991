/**
 * Problems in a study document (or in the options of a design question) as data: every problem
 * names its place with a JSON Pointer into the study document, a stable `code` and a one-line
 * message, like the network's {@link InputIssue}s. Browser-safe.
 */

import { formatIssue, type InputIssue, sortIssues } from "../input/issues.js";

/**
 * One problem found in a study document. The codes of {@link InputIssue} keep their meaning
 * (`schema`, `unit`, `value`, `json-syntax`, `document`); one more says that a reference into the
 * network does not resolve.
 */
export type StudyIssue =
  | InputIssue
  /** A JSON Pointer, a node or edge id or an output field that the network does not have. */
  | { code: "unknown-reference"; path: string; message: string; reference: string };

/** The codes of {@link StudyIssue}. */
export type StudyIssueCode = StudyIssue["code"];

/**
 * Thrown by the design-question functions ({@link findTarget}, {@link capacity},
 * {@link sensitivities}, {@link sizePipes}) when their options cannot be used. Carries every
 * problem found, sorted by path; the paths point into the options object (`/input/path`).
 */
export class StudyError extends Error {
  /** Every problem found, sorted by path. */
  readonly issues: readonly StudyIssue[];

  constructor(issues: readonly StudyIssue[]) {
    const sorted = sortStudyIssues(issues);
    super(sorted.map(formatStudyIssue).join("\n"));
    this.name = "StudyError";
    this.issues = sorted;
  }
}

/** One line for a problem: `/inputs/0/path: the network has 4 nodes (0 to 3); got /nodes/7`. */
export function formatStudyIssue(issue: StudyIssue): string {
  return formatIssue(issue as InputIssue);
}

/** Issues sorted by path (stable), as {@link sortIssues} sorts network issues. */
export function sortStudyIssues(issues: readonly StudyIssue[]): StudyIssue[] {
  return sortIssues(issues as readonly InputIssue[]) as StudyIssue[];
}

/** The same issues with their paths moved under a prefix (`/network` for an inline network). */
export function prefixIssues(prefix: string, issues: readonly StudyIssue[]): StudyIssue[] {
  return issues.map((issue) => ({ ...issue, path: `${prefix}${issue.path}` }));
}
