/**
 * One case of a study or a design question: the base network with some inputs changed, solved
 * (warm-started from a neighbour's result when one is given). Every way a case can fail becomes
 * a status and a message, never an exception, so a study goes on. Browser-safe.
 */

import type { CheckedDocument } from "../input/document-types.js";
import { formatIssue, InputError } from "../input/issues.js";
import type { NetworkResult } from "../results/result-types.js";
import type { StructureHolder } from "../solve/network-system.js";
import { type InternalSolveOptions, solveCheckedDocument } from "../solve/solve-network.js";
import { applyParameters, caseProblems } from "./parameters.js";
import type { ResolvedParameter } from "./study-types.js";

/**
 * How a case ended: the solve's own status, or `invalid-input` (the changed inputs are not a
 * valid network, e.g. a diameter below zero), or `failed` (an error in machnet; please report).
 */
export type CaseStatus = "converged" | "not-converged" | "no-solution" | "invalid-input" | "failed";

/** A solved (or failed) case. */
export interface CaseOutcome {
  status: CaseStatus;
  /** The network of this case (the base with the inputs applied). */
  network: CheckedDocument;
  /** The result, when a solve ran (also when it did not converge). */
  result?: NetworkResult;
  /** Why, when the case did not converge; one line. */
  message?: string;
  /** Newton iterations of the solve (0 when none ran). */
  iterations: number;
}

/** Text on one line. */
export function oneLine(text: string): string {
  return text.replace(/\s*[\r\n]+\s*/g, " ").trim();
}

/** Why a result is not a solution, in one line. */
export function failureMessage(result: NetworkResult): string {
  if (result.diagnosis !== undefined) return oneLine(result.diagnosis.message);
  const warning = result.warnings.find(
    (w) => w.code === "not-converged" || w.code === "no-solution",
  );
  return oneLine(warning?.message ?? `the solve ended with status ${result.status}`);
}

/**
 * Solve the base network with the parameters set to the values.
 *
 * @param network - the base network, checked (not changed)
 * @param parameters - the inputs to change
 * @param values - their values [SI; a scale factor for a group]
 * @param start - a solved neighbour to start from (warm start); none: the solver's first guess
 * @param structureHolder - kept by the caller across the cases of one network layout: their
 *   solves share the sparse structure of the Jacobian (src/solve/network-system.ts)
 */
export function solveCase(
  network: CheckedDocument,
  parameters: readonly ResolvedParameter[],
  values: readonly number[],
  start?: Pick<NetworkResult, "nodes">,
  structureHolder?: StructureHolder,
): CaseOutcome {
  const changed = applyParameters(network, parameters, values);
  const problems = caseProblems(changed, parameters);
  if (problems.length > 0) {
    return {
      status: "invalid-input",
      network: changed,
      message: problems.join("; "),
      iterations: 0,
    };
  }
  try {
    const options: InternalSolveOptions = {};
    if (start) options.initialResult = start;
    if (structureHolder) options.structureHolder = structureHolder;
    const result = solveCheckedDocument(changed, options);
    const outcome: CaseOutcome = {
      status: result.status,
      network: changed,
      result,
      iterations: result.iterations,
    };
    if (!result.converged) outcome.message = failureMessage(result);
    return outcome;
  } catch (error) {
    if (error instanceof InputError) {
      return {
        status: "invalid-input",
        network: changed,
        message: oneLine(error.issues.map(formatIssue).join("; ")),
        iterations: 0,
      };
    }
    const what = error instanceof Error ? `${error.name}: ${error.message}` : String(error);
    return {
      status: "failed",
      network: changed,
      message: oneLine(`${what} (a defect in machnet; please report it with the study)`),
      iterations: 0,
    };
  }
}
