/**
 * Input issues as command-line lines: `FILE: /edges/3/diameter: must be greater than 0 (got "-80 mm")`.
 */

import { formatIssue, type InputIssue, sortIssues } from "../input/issues.js";

/** One line per issue, sorted by path, each starting with the file name. */
export function issueLines(file: string, issues: readonly InputIssue[]): string[] {
  return sortIssues(issues).map(
    (issue) => `${file}: ${formatIssue(issue).replace(/[\r\n]+/g, " ")}`,
  );
}
