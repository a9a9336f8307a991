/**
 * The hardest networks found by the hardening work, kept as regression fixtures in
 * test/fixtures/hard-networks/, and the defects found, each reduced to a small network.
 *
 * A test marked `it.fails` shows a defect that is not fixed yet: it fails today, so the suite
 * stays green and the defect stays visible. When a fix makes it pass, vitest reports the
 * `it.fails` as failed: then drop the `.fails`. Each fixture's "description" says what goes
 * wrong and what is expected.
 */
import { readdirSync, readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { checkNetwork, InputError, type NetworkResult, solveNetwork } from "../../src/index.js";
import { describeOutcome, diagnosisProblems, solutionProblems, solveOutcome } from "./outcome.js";

const directory = new URL("../fixtures/hard-networks/", import.meta.url);

function fixture(name: string): { name?: string; description?: string } & Record<string, unknown> {
  return JSON.parse(readFileSync(new URL(name, directory), "utf8"));
}

/** The defect fixtures and what a correct solver gives for each. */
const DEFECTS: {
  file: string;
  /** What a correct solver returns ("solved-or-honest": converged, or not-converged). */
  expected: "converged" | "no-solution" | "input-error" | "solved-or-honest";
  /** For no-solution: the edge that must be named as limiting. */
  limiting?: string;
  /** For input-error: the path of the issue. */
  path?: string;
  /** Still failing: the test is `it.fails`. */
  open: boolean;
  defect: string;
}[] = [
  {
    file: "at-rest-three-nodes.json",
    expected: "converged",
    open: false,
    defect: "A (fixed in fff371f): the sparse LU's singular-pivot test is not row-scale invariant",
  },
  {
    file: "large-manifold-small-flow.json",
    expected: "converged",
    open: false,
    defect:
      "B (fixed in fff371f): the mass tolerance is below the floating-point resolution of the flows",
  },
  {
    file: "dead-end-stub.json",
    expected: "converged",
    open: false,
    defect:
      "C (fixed in fff371f): the adiabatic kernel's derivatives within a few ulp of zero pressure drop",
  },
  {
    file: "overloaded-tee-near-capacity.json",
    expected: "no-solution",
    limiting: "FEED",
    open: false,
    defect: "E (fixed in fff371f): the diagnosis reads capacities that were never computed (NaN)",
  },
  {
    file: "overloaded-tee-no-start.json",
    expected: "no-solution",
    limiting: "FEED",
    open: false,
    defect:
      "D (fixed in fff371f): the continuation's zero-demand start fails (defect A at the throughput floor)",
  },
  {
    file: "tiny-flow-through-header.json",
    expected: "converged",
    open: false,
    defect:
      "B2 (fixed: junction pressures held as offsets): flows below the resolution of the pressures stalled (what remains of B)",
  },
  {
    file: "offsets-far-below-supply-736.json",
    expected: "converged",
    open: false,
    defect:
      "B3 (fixed: a reference pressure per group of close junctions): flows on drops of 1e-12 of the pressure at junctions far below the highest reservoir pressure (offsets of -0.6) stalled",
  },
  {
    file: "offsets-far-below-supply-871.json",
    expected: "converged",
    open: false,
    defect:
      "B3 (fixed: a reference pressure per group of close junctions): flows on drops of 1e-12 of the pressure beside a second reservoir at 0.6 of the highest stalled",
  },
  {
    file: "tiny-flow-large-bore.json",
    expected: "solved-or-honest",
    open: false,
    defect: "K: convergence accepted at the flows' round-off fails the independent check",
  },
  {
    file: "absurd-pipe-length.json",
    expected: "input-error",
    path: "/edges/0/length",
    open: false,
    defect: "H: no upper bound on a pipe's length (readEdge)",
  },
];

const defectFiles = new Set(DEFECTS.map((d) => d.file));
const regressionFiles = readdirSync(directory)
  .filter((name) => name.endsWith(".json") && !defectFiles.has(name))
  .sort();

describe("hard networks (regression fixtures from the corpus)", () => {
  it("has the fixtures", () => {
    expect(regressionFiles.length).toBeGreaterThanOrEqual(8);
  });

  for (const file of regressionFiles) {
    it(`${file} converges with conservation or is diagnosed as having no solution`, () => {
      const document = fixture(file);
      const outcome = solveOutcome(document);
      if (outcome.kind === "converged") {
        expect(solutionProblems(outcome.result, document), file).toEqual([]);
      } else if (outcome.kind === "no-solution") {
        expect(diagnosisProblems(outcome.result), file).toEqual([]);
      } else {
        expect.fail(`${file}: ${describeOutcome(outcome)}`);
      }
    });
  }
});

describe("defects, reduced to small networks", () => {
  for (const d of DEFECTS) {
    const ending = d.expected === "solved-or-honest" ? "converged or not-converged" : d.expected;
    const title = `${d.file} ends in ${ending}${d.limiting ? ` naming ${d.limiting}` : ""} (defect ${d.defect})`;
    (d.open ? it.fails : it)(title, () => {
      const document = fixture(d.file);
      const outcome = solveOutcome(document);
      if (d.expected === "solved-or-honest") {
        expect(["converged", "not-converged"], describeOutcome(outcome)).toContain(outcome.kind);
      } else {
        expect(outcome.kind, describeOutcome(outcome)).toBe(d.expected);
      }
      if (outcome.kind === "converged") {
        expect(solutionProblems(outcome.result, document)).toEqual([]);
      }
      if (outcome.kind === "no-solution") {
        expect(diagnosisProblems(outcome.result)).toEqual([]);
        const named = outcome.result.diagnosis?.limitingEdges.map((edge) => edge.id) ?? [];
        expect(named).toContain(d.limiting);
      }
      if (outcome.kind === "input-error") {
        expect(outcome.error.issues.map((issue) => issue.path)).toContain(d.path);
      }
    });
  }

  it("every defect fixture is a valid document that checkNetwork accepts (the defect is in the solve)", () => {
    for (const d of DEFECTS.filter((x) => x.expected !== "input-error")) {
      expect(checkNetwork(fixture(d.file)).ok, d.file).toBe(true);
    }
  });

  it("the defect fixtures that do not converge say so: never a wrong 'converged', never NaN", () => {
    for (const d of DEFECTS.filter((x) => x.expected !== "input-error" && !x.open)) {
      const outcome = solveOutcome(fixture(d.file));
      if (outcome.kind === "exception" || outcome.kind === "internal-check") {
        expect.fail(`${d.file}: ${describeOutcome(outcome)}`);
      }
      if (outcome.kind === "input-error") continue;
      const result: NetworkResult = outcome.result;
      if (result.status === "not-converged") {
        expect(result.converged).toBe(false);
        expect(result.warnings[0]?.code).toBe("not-converged");
      }
      expect(JSON.stringify(result)).not.toMatch(/NaN|Infinity|null/);
    }
  });

  // Defect G: the path of an unknown field is `${path}/${name}` without RFC 6901 escaping
  // (schemaIssue in src/input/validate-schema.ts), so a field named "a/b" is reported at
  // /edges/0/a/b, a place that does not exist.
  it("an unknown field named a/b is reported at /edges/0/a~1b (RFC 6901 escaping; defect G, fixed)", () => {
    const document = fixture("dead-end-stub.json") as { edges: Record<string, unknown>[] };
    (document.edges[0] as Record<string, unknown>)["a/b"] = 1;
    const checked = checkNetwork(document);
    expect(checked.ok).toBe(false);
    expect(checked.issues.map((issue) => issue.path)).toContain("/edges/0/a~1b");
  });

  // Defect I (fixed): parseJsonText caught JSON.parse's SyntaxError and asked jsonc-parser,
  // which recurses once per nesting level, for the line and column: 10 000 unclosed brackets
  // overflowed the call stack and a RangeError escaped checkNetwork and solveNetwork (exit 3 in
  // the CLI). The first error is now found by a walk with its own stack.
  it("invalid JSON nested 10 000 deep is an input error with line and column, not a RangeError (defect I)", () => {
    const text = `{"nodes": ${"[".repeat(10_000)}}`;
    let error: unknown;
    try {
      solveNetwork(text);
    } catch (caught) {
      error = caught;
    }
    expect(error).toBeInstanceOf(InputError);
    expect((error as InputError).issues[0]?.code).toBe("json-syntax");
    expect((error as InputError).issues[0]?.message).toBe(
      "invalid JSON at line 1, column 10011: value expected",
    );
  });

  it("valid JSON nested 100 000 deep is an input error with a path (no stack overflow)", () => {
    const text = `{"nodes": ${"[".repeat(100_000)}${"]".repeat(100_000)}, "edges": []}`;
    const checked = checkNetwork(text);
    expect(checked.ok).toBe(false);
    expect(checked.issues.every((issue) => issue.path.startsWith("/"))).toBe(true);
  });
});
