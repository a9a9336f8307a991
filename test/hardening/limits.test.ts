/**
 * Limits on work: settings.maxIterations and settings.timeLimit (or SolveOptions.timeLimitMs).
 * A solve that hits one returns a result marked not converged, with the residuals of the best
 * iterate, finite numbers, and never hangs.
 *
 * The time limit is tested with an injected clock (SolveOptions.now) that advances one
 * millisecond per reading: the solve then stops after a set number of clock readings whatever
 * the machine's speed, so the test is deterministic. One test uses the real clock, with a
 * generous bound, only to show that a solve with a budget ends.
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { generateNetwork } from "../../benchmarks/generate-network.js";
import { type NetworkDocument, type NetworkResult, solveNetwork } from "../../src/index.js";
import { nonFinitePaths } from "./outcome.js";

function fixture(name: string): NetworkDocument {
  return JSON.parse(
    readFileSync(new URL(`../fixtures/hard-networks/${name}`, import.meta.url), "utf8"),
  );
}

/** A clock that advances 1 ms per reading, and how often it was read. */
function tickingClock() {
  const clock = { readings: 0, now: () => clock.readings++ };
  return clock;
}

/** What every result cut short by a limit must be. */
function expectMarkedNotConverged(result: NetworkResult, label: string): void {
  expect(result.converged, label).toBe(false);
  expect(result.status, label).toBe("not-converged");
  expect(result.warnings[0]?.code, label).toBe("not-converged");
  expect(result.residual, label).toBe(Math.max(result.residuals.mass, result.residuals.energy));
  expect(result.residual, label).toBeGreaterThan(0);
  expect(nonFinitePaths(result), label).toEqual([]);
}

/** The same junction states moved far from the solution: direct Newton fails from there. */
function farStart(result: NetworkResult): Pick<NetworkResult, "nodes"> {
  return {
    nodes: result.nodes.map((node, index) =>
      node.kind === "junction"
        ? {
            ...node,
            pressure: node.pressure * (index % 2 === 0 ? 5 : 0.2),
            temperature: node.temperature * 5,
          }
        : node,
    ),
  };
}

describe("maxIterations", () => {
  // 22 Newton iterations from the first guess (test/fixtures/hard-networks).
  const grid = fixture("grid-22-iterations.json");
  const withLimit = (maxIterations: number): NetworkResult =>
    solveNetwork({ ...grid, settings: { ...grid.settings, maxIterations } });

  it("a network that needs 22 iterations, allowed 1 to 6, is not converged each time", () => {
    for (let limit = 1; limit <= 6; limit++) {
      const result = withLimit(limit);
      expectMarkedNotConverged(result, `maxIterations ${limit}`);
      expect(result.warnings[0]?.message).toMatch(/the best iterate, not a solution/);
    }
  });

  it("reports the best iterate: its residual never grows as more iterations are allowed", () => {
    // The direct run is the same path each time, cut later: its best residual can only fall.
    const residuals = [1, 2, 3, 4, 5, 6].map((limit) => withLimit(limit).residual);
    for (let k = 1; k < residuals.length; k++) {
      expect(residuals[k] as number).toBeLessThanOrEqual(residuals[k - 1] as number);
    }
  });

  it("counts the iterations of the rescue too, but never more than a few times the limit", () => {
    // With the limit on each Newton run, the continuation's steps add at most their own limit
    // each: 1 direct + 1 at zero demand + at most 20 steps (step halving from 1/4 to 1/1024).
    const result = withLimit(1);
    expect(result.iterations).toBeLessThanOrEqual(30);
  });

  it("with enough iterations the same network converges", () => {
    expect(withLimit(100).status).toBe("converged");
  });
});

describe("the time limit", () => {
  const grid = fixture("grid-22-iterations.json");

  it("stops at the deadline: not converged, the stop reason is time, best-iterate residuals", () => {
    for (const budget of [1, 3, 8]) {
      const clock = tickingClock();
      const result = solveNetwork(grid, { timeLimitMs: budget, now: clock.now });
      expectMarkedNotConverged(result, `budget ${budget} ms`);
      expect(result.warnings[0]?.message).toMatch(/\(time\)/);
      // One clock reading per Newton iteration, plus the start: the solve stops at the budget.
      expect(clock.readings).toBeLessThanOrEqual(budget + 3);
    }
  });

  it("reads no clock without a time limit, and the result is the same as with a generous one", () => {
    const clock = tickingClock();
    const unlimited = solveNetwork(grid);
    const generous = solveNetwork(grid, { timeLimitMs: 1e9, now: clock.now });
    expect(generous.status).toBe("converged");
    expect(JSON.stringify(generous)).toBe(JSON.stringify(unlimited));
  });

  it("settings.timeLimit in the document works like SolveOptions.timeLimitMs", () => {
    const clock = tickingClock();
    const result = solveNetwork(
      { ...grid, settings: { ...grid.settings, timeLimit: 0.004 } },
      { now: clock.now },
    );
    expectMarkedNotConverged(result, "settings.timeLimit 4 ms");
    expect(clock.readings).toBeLessThanOrEqual(7);
  });

  // The budget covers building the model and its sparse structure, the first guess, the Newton
  // iterations and the rescue, not reading the document or assembling the results: on this
  // network a 10 ms budget returns after about 1.6 s on the 2-core test machine (mostly reading
  // and building), 0 iterations done.
  it("ends a large network's solve on a tiny real budget (5 000 edges, 10 ms; bound 20 s against a hang, not a benchmark)", () => {
    const large = generateNetwork({ edges: 5000, seed: 3 });
    const started = performance.now();
    const result = solveNetwork({ ...large, settings: { ...large.settings, timeLimit: 0.01 } });
    expect(performance.now() - started).toBeLessThan(20_000);
    expectMarkedNotConverged(result, "5 000 edges, 10 ms");
  });

  it("ends the no-solution diagnosis of an overloaded network at the deadline too", () => {
    const overload = fixture("overload-diagnosed.json");
    const clock = tickingClock();
    const result = solveNetwork(overload, { timeLimitMs: 30, now: clock.now });
    expect(result.converged).toBe(false);
    // The continuation reads the clock once per step and each Newton run once per iteration.
    expect(clock.readings).toBeLessThanOrEqual(60);
    expect(nonFinitePaths(result)).toEqual([]);
  });

  // Defect M (fixed): when the deadline fell inside the continuation, the largest demand scale
  // reached so far was taken for the largest feasible one, and with a choked vent in the network
  // (choked at every scale) the solve reported "no solution: the supplies can deliver only
  // 25.0 % of the stated demands" for a network that converges without the time limit.
  it("a feasible network cut short by its time limit during the rescue is not-converged (time), never no-solution (defect M)", () => {
    const vents = fixture("vents-at-capacity.json");
    const solution = solveNetwork(vents);
    expect(solution.status).toBe("converged");
    for (const budget of [12, 16, 20, 24]) {
      const clock = tickingClock();
      const result = solveNetwork(vents, {
        initialResult: farStart(solution),
        timeLimitMs: budget,
        now: clock.now,
      });
      expect(result.status, `budget ${budget}`).toBe("not-converged");
      expect(result.warnings[0]?.message, `budget ${budget}`).toMatch(/\(time\), the time limit/);
    }
  });

  // Defect M, minor part (fixed): a continuation cut short by the deadline reported the stop
  // reason of the direct run ("stalled"), not "time".
  it("names the time limit as the stop reason when it ends the rescue (defect M)", () => {
    const ring = fixture("ring-10-iterations.json");
    const solution = solveNetwork(ring);
    const clock = tickingClock();
    const result = solveNetwork(ring, {
      initialResult: farStart(solution),
      timeLimitMs: 12,
      now: clock.now,
    });
    expect(result.status).toBe("not-converged");
    expect(result.warnings[0]?.message).toMatch(/\(time\), the time limit of 12 ms ran out/);
  });
});
