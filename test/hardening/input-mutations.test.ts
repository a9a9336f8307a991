/**
 * Property tests: random mutations of valid network documents (test/hardening/mutations.ts)
 * always end in a solution, a typed input error with JSON Pointers, or a result marked not
 * converged; never another exception, a NaN or Infinity in a result, or a hang.
 *
 * Seeded: a failure prints fast-check's seed and path; rerun with that seed to reproduce.
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { knownDefectTrigger, mutationProblem } from "./mutation-check.js";
import { BASE_DOCUMENTS, buildCase, mutatedCase } from "./mutations.js";
import { solveOutcome } from "./outcome.js";

/** Fixed seeds: the suite is the same on every run. */
const SEED = 20_240_917;

describe("mutated network documents", () => {
  it("every base document solves as given", () => {
    for (const [index, document] of BASE_DOCUMENTS.entries()) {
      const outcome = solveOutcome(document);
      expect(outcome.kind, `base ${index}`).toBe("converged");
    }
  });

  it(`end in a solution, an input error with paths or a not-converged result (3000 cases, seed ${SEED})`, () => {
    const tally = new Map<string, number>();
    fc.assert(
      fc.property(mutatedCase, (c) => {
        fc.pre(knownDefectTrigger(buildCase(c).document) === undefined);
        const problem = mutationProblem(c, tally);
        if (problem !== undefined) throw new Error(problem);
      }),
      { seed: SEED, numRuns: 3000, endOnFailure: true },
    );
    console.log(`mutated documents by outcome: ${JSON.stringify(Object.fromEntries(tally))}`);
    // Enough of the mutations leave a solvable document for the solver to be exercised too.
    expect(tally.get("converged") ?? 0).toBeGreaterThan(300);
  });

  it(`do the same as JSON text with raw 1e400, -0 and 1e-400 tokens (1000 cases, seed ${SEED + 1})`, () => {
    fc.assert(
      fc.property(mutatedCase, (c) => {
        fc.pre(knownDefectTrigger(buildCase({ ...c, asText: true }).document) === undefined);
        const problem = mutationProblem({ ...c, asText: true });
        if (problem !== undefined) throw new Error(problem);
      }),
      { seed: SEED + 1, numRuns: 1000, endOnFailure: true },
    );
  });

  it("build the same case from the same mutations (reproducible)", () => {
    const sample = fc.sample(mutatedCase, { seed: SEED, numRuns: 500 });
    for (const c of sample) expect(buildCase(c).text).toBe(buildCase(c).text);
  });
});
