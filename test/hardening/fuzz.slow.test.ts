/**
 * `npm run fuzz`: many more mutated documents and corpus networks than the suite runs, with
 * the same checks (test/hardening/mutation-check.ts, outcome.ts).
 *
 * Environment (all optional):
 * - FUZZ_RUNS: mutated documents per form, object and JSON text (default 20 000);
 * - FUZZ_SEED: seed of the first form; the text form uses FUZZ_SEED + 1 (default: the time, printed);
 * - FUZZ_CORPUS: corpus networks, from seed 1009 on, past the suite's 1 008 (default 2 000);
 * - FUZZ_KNOWN_DEFECTS=1: keep the inputs that set off the known defects (they fail then).
 * A failure prints the seed and the fast-check path; rerun with FUZZ_SEED to reproduce it.
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { corpus } from "./corpus.js";
import { knownDefectTrigger, mutationProblem } from "./mutation-check.js";
import { buildCase, mutatedCase } from "./mutations.js";
import {
  describeOutcome,
  diagnosisProblems,
  knownDefect,
  solutionProblems,
  solveOutcome,
} from "./outcome.js";

const runs = Number(process.env.FUZZ_RUNS ?? 20_000);
const seed = Number(process.env.FUZZ_SEED ?? Date.now() % 2_147_483_647);
const corpusCount = Number(process.env.FUZZ_CORPUS ?? 2000);
const keepKnown = process.env.FUZZ_KNOWN_DEFECTS === "1";

describe("fuzz", () => {
  for (const [offset, asText] of [
    [0, false],
    [1, true],
  ] as const) {
    it(`mutated documents as ${asText ? "JSON text" : "objects"} (${runs} cases, seed ${seed + offset})`, () => {
      console.log(`fuzz: seed ${seed + offset}, ${runs} cases, ${asText ? "text" : "objects"}`);
      fc.assert(
        fc.property(mutatedCase, (c) => {
          const item = { ...c, asText };
          if (!keepKnown) fc.pre(knownDefectTrigger(buildCase(item).document) === undefined);
          const problem = mutationProblem(item);
          if (problem !== undefined) throw new Error(problem);
        }),
        { seed: seed + offset, numRuns: runs, endOnFailure: true },
      );
    });
  }

  it(`corpus networks past the suite's (${corpusCount}, seeds 1009 on)`, () => {
    const problems: string[] = [];
    let good = 0;
    for (const item of corpus(corpusCount, 1009)) {
      const outcome = solveOutcome(item.document);
      const label = `seed ${item.seed} (${item.family})`;
      if (outcome.kind === "converged") {
        good++;
        for (const p of solutionProblems(outcome.result, item.document))
          problems.push(`${label}: ${p}`);
      } else if (outcome.kind === "no-solution") {
        good++;
        for (const p of diagnosisProblems(outcome.result)) problems.push(`${label}: ${p}`);
      } else if (
        outcome.kind !== "not-converged" &&
        (keepKnown || knownDefect(outcome) === undefined)
      ) {
        problems.push(`${label}: ${describeOutcome(outcome)}`);
      }
    }
    console.log(
      `fuzz corpus: ${good} of ${corpusCount} converged or diagnosed (${((100 * good) / corpusCount).toFixed(1)} %)`,
    );
    expect(problems).toEqual([]);
  });
});
