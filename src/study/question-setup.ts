/**
 * Shared parts of the design questions: options checked the way a study document is (same schema,
 * same messages, paths relative to the options object), and a solver of the base network at
 * values of one input that warm-starts from the nearest value already solved. Browser-safe.
 */

import type { InputIssue } from "../input/issues.js";
import { InputError } from "../input/issues.js";
import { parseJsonText } from "../input/read-document.js";
import type { NetworkResult } from "../results/result-types.js";
import type { StructureHolder } from "../solve/network-system.js";
import { readStudyDocument } from "./read-study.js";
import { type CaseOutcome, solveCase } from "./solve-case.js";
import { StudyError, type StudyIssue } from "./study-issues.js";
import type { PreparedStudy, ResolvedParameter, StudyQuestion } from "./study-types.js";

/**
 * A study for one design question from a network document and the question's options, or the
 * errors: {@link InputError} for the network (paths into it), {@link StudyError} for the options
 * (paths into the options object).
 */
export function prepareQuestion(
  network: unknown,
  question: Exclude<StudyQuestion, "sweep">,
  options: object,
  outputs?: readonly string[] | string,
): PreparedStudy {
  let value = network;
  if (typeof network === "string") {
    const parsed = parseJsonText(network);
    if (!parsed.ok) throw new InputError(parsed.issues);
    value = parsed.value;
  }
  const studyDocument: Record<string, unknown> = { network: value, question, [question]: options };
  if (outputs !== undefined) studyDocument.outputs = outputs;
  const read = readStudyDocument(studyDocument);
  if (read.ok) return read.study;
  const networkIssues: InputIssue[] = [];
  const optionIssues: StudyIssue[] = [];
  const prefix = `/${question}`;
  for (const issue of read.issues) {
    if (issue.path === "/network" || issue.path.startsWith("/network/")) {
      networkIssues.push({ ...issue, path: issue.path.slice("/network".length) } as InputIssue);
    } else if (issue.path === "" && issue.code === "document") {
      networkIssues.push(issue as InputIssue);
    } else if (issue.path === prefix || issue.path.startsWith(`${prefix}/`)) {
      optionIssues.push({ ...issue, path: issue.path.slice(prefix.length) });
    } else {
      optionIssues.push(issue);
    }
  }
  if (networkIssues.length > 0) throw new InputError(networkIssues);
  throw new StudyError(optionIssues);
}

/** Solves of the base network at values of one input, each warm-started from the nearest. */
export interface ParameterSolver {
  /** Solve at a value of the input [SI, or a scale factor]. */
  solve(value: number): CaseOutcome;
  /** Solves so far. */
  readonly solves: number;
  /** Newton iterations so far. */
  readonly iterations: number;
}

/** A {@link ParameterSolver} for one input of a network (state lives in the returned object). */
export function parameterSolver(
  study: Pick<PreparedStudy, "network">,
  parameter: ResolvedParameter,
): ParameterSolver {
  const solved: { value: number; start: Pick<NetworkResult, "nodes"> }[] = [];
  let solves = 0;
  // Every trial has the base network's layout: one sparse structure for all of them.
  const structureHolder: StructureHolder = {};
  let iterations = 0;
  return {
    solve(value: number): CaseOutcome {
      let nearest: (typeof solved)[number] | undefined;
      for (const point of solved) {
        if (
          nearest === undefined ||
          Math.abs(point.value - value) < Math.abs(nearest.value - value)
        ) {
          nearest = point;
        }
      }
      const outcome = solveCase(
        study.network,
        [parameter],
        [value],
        nearest?.start,
        structureHolder,
      );
      solves++;
      iterations += outcome.iterations;
      if (outcome.status === "converged" && outcome.result) {
        solved.push({ value, start: { nodes: outcome.result.nodes } });
      }
      return outcome;
    },
    get solves() {
      return solves;
    },
    get iterations() {
      return iterations;
    },
  };
}
