/**
 * Command-line behaviour for solver outcomes that a small network cannot be made to produce on
 * purpose: each non-solution status, a failed internal check and an unexpected exception. The
 * solver is replaced for one call at a time; every other call runs the real one.
 */
import { afterEach, describe, expect, test, vi } from "vitest";
import type { NetworkResult } from "../../src/results/result-types.js";
import {
  InternalCheckError,
  solveCheckedDocument,
  solveNetwork,
} from "../../src/solve/solve-network.js";
import { json, TWO_CONSUMERS } from "./networks.js";
import { lines, runCli } from "./run-cli.js";

vi.mock("../../src/solve/solve-network.js", async (importOriginal) => {
  const actual = await importOriginal<typeof import("../../src/solve/solve-network.js")>();
  return { ...actual, solveCheckedDocument: vi.fn(actual.solveCheckedDocument) };
});

const files = { "two.json": json(TWO_CONSUMERS) };

afterEach(() => {
  vi.mocked(solveCheckedDocument).mockClear();
});

describe("each non-solution status is marked and exits 1", () => {
  test.each([
    [
      "not-converged",
      "not converged after 100 iterations (iterations); largest scaled residual 3.10e-2: the numbers below are the best iterate, not a solution",
    ],
    ["no-solution", "no solution: the supplies can deliver only 61.0 % of the stated demands"],
  ] as const)("status %s", async (status, message) => {
    const real = solveNetwork(TWO_CONSUMERS);
    const fake: NetworkResult = {
      ...real,
      converged: false,
      status,
      warnings: [{ code: status, message }, ...real.warnings],
    };
    if (status === "no-solution") {
      fake.diagnosis = {
        largestFeasibleDemandScale: 0.61,
        limitingEdges: [],
        openEquations: [],
        message,
      };
    }
    vi.mocked(solveCheckedDocument).mockReturnValueOnce(fake);
    const run = await runCli(["solve", "two.json"], files);
    expect(run.code).toBe(1);
    expect(lines(run.stdout)[0]).toBe(`NOT A SOLUTION: ${message}`);
    expect(lines(run.stderr)).toEqual([`two.json: ${message}`]);
    // The message is the marker; it is not repeated as a warning.
    expect(run.stdout).not.toContain(`warning: ${message}`);

    vi.mocked(solveCheckedDocument).mockReturnValueOnce(fake);
    const csv = await runCli(["solve", "two.json", "--format", "csv"], files);
    expect(csv.code).toBe(1);
    expect(lines(csv.stdout)[0]).toBe(`# NOT A SOLUTION: ${message}`);
  });
});

describe("internal errors exit 3 with one line", () => {
  test("a failed internal check is reported as an internal error, no stack trace", async () => {
    vi.mocked(solveCheckedDocument).mockImplementationOnce(() => {
      throw new InternalCheckError("the independent check failed; please report this network");
    });
    const run = await runCli(["solve", "two.json"], files);
    expect(run.code).toBe(3);
    expect(run.stdout).toBe("");
    expect(run.stderr).toBe(
      "internal error: the independent check failed; please report this network\n",
    );
  });

  test("an unexpected exception is one line asking for a report", async () => {
    vi.mocked(solveCheckedDocument).mockImplementationOnce(() => {
      throw new RangeError("Reynolds number must be a finite number > 0 (got NaN)\nsecond line");
    });
    const run = await runCli(["solve", "two.json"], files);
    expect(run.code).toBe(3);
    expect(lines(run.stderr)).toEqual([
      "internal error: RangeError: Reynolds number must be a finite number > 0 (got NaN) second line; please report it with the input that caused it",
    ]);
    expect(run.stderr).not.toMatch(/\bat \S+ \(/);
  });

  test("MACHNET_DEBUG=1 adds the stack trace", async () => {
    vi.mocked(solveCheckedDocument).mockImplementationOnce(() => {
      throw new TypeError("boom");
    });
    const run = await runCli(["solve", "two.json"], files, { MACHNET_DEBUG: "1" });
    expect(run.code).toBe(3);
    const [first, ...rest] = lines(run.stderr);
    expect(first).toBe(
      "internal error: TypeError: boom; please report it with the input that caused it",
    );
    expect(rest[0]).toBe("TypeError: boom");
    expect(rest.some((line) => /^\s+at /.test(line))).toBe(true);
  });
});
