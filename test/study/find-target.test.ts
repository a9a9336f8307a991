/**
 * Target solving, verified by solving the network independently at the value found.
 */
import { describe, expect, it } from "vitest";
import { solveNetwork } from "../../src/index.js";
import { findTarget, StudyError } from "../../src/study/index.js";
import { readField, withDemandsScaled, withValue } from "./helpers.js";
import { BRANCH_SI } from "./networks.js";

const DEMANDS = [0, 0, 300 / 3600, 150 / 3600];

/**
 * Tolerance of the check: the search stops within 1e-6 of the target (its default); the
 * independent cold solve differs from the search's warm-started one by the solver tolerance,
 * below 1e-7 of the value (see test/study/sweep.test.ts).
 */
const CHECK = 1e-6 + 1e-7;

describe("findTarget", () => {
  it("finds the supply pressure that keeps every junction at 6.5 bar(g), searching from the network's", () => {
    const answer = findTarget(BRANCH_SI, {
      input: { path: "/nodes/0/pressure" },
      output: "network/minPressure",
      value: "6.5 bar(g)",
    });
    expect(answer.found).toBe(true);
    if (!answer.found) return;
    // 6.5 bar(g) = 6.5e5 + 101325 Pa (bar: BIPM SI Brochure, Table 8; default ambient).
    const target = 6.5e5 + 101325;
    expect(answer.target).toBe(target);
    const alone = solveNetwork(withValue(BRANCH_SI, "/nodes/0/pressure", answer.input));
    expect(Math.abs(readField(alone, "network/minPressure") - target)).toBeLessThanOrEqual(
      CHECK * target,
    );
    // The supply must sit above the target by the network's losses.
    expect(answer.input).toBeGreaterThan(target);
  });

  it("finds the demand scale at which a branch reaches Mach 0.3, within a bracket", () => {
    const answer = findTarget(BRANCH_SI, {
      input: { group: "demands", bracket: [0.5, 5] },
      output: "edges/B2/mach",
      value: 0.3,
    });
    expect(answer.found).toBe(true);
    if (!answer.found) return;
    const alone = solveNetwork(withDemandsScaled(BRANCH_SI, DEMANDS, answer.input));
    expect(Math.abs(readField(alone, "edges/B2/mach") - 0.3)).toBeLessThanOrEqual(CHECK * 0.3);
    expect(answer.bracket[0]).toBeLessThanOrEqual(answer.input);
    expect(answer.bracket[1]).toBeGreaterThanOrEqual(answer.input);
  });

  it("finds the bore of a branch that delivers 6.9 bar(g) at its consumer", () => {
    const answer = findTarget(BRANCH_SI, {
      input: { path: "/edges/2/diameter", bracket: ["15 mm", "50 mm"] },
      output: "nodes/PAINT/pressure",
      value: "6.9 bar(g)",
    });
    expect(answer.found).toBe(true);
    if (!answer.found) return;
    const target = 6.9e5 + 101325;
    const alone = solveNetwork(withValue(BRANCH_SI, "/edges/2/diameter", answer.input));
    expect(Math.abs(readField(alone, "nodes/PAINT/pressure") - target)).toBeLessThanOrEqual(
      CHECK * target,
    );
  });

  it("says when the target cannot be bracketed by the given ends", () => {
    const answer = findTarget(BRANCH_SI, {
      input: { path: "/nodes/0/pressure", bracket: ["6 bar(g)", "8 bar(g)"] },
      output: "network/minPressure",
      value: "9 bar(g)",
    });
    expect(answer).toMatchObject({ found: false, reason: "not-bracketed" });
    if (answer.found) return;
    expect(answer.message).toMatch(
      /^the target cannot be bracketed: network\/minPressure is \d+(\.\d+)? at \/nodes\/0\/pressure = 701325 and \d+(\.\d+)? at \/nodes\/0\/pressure = 901325, both below the target 1001325 \(SI\); widen the bracket or check the target$/,
    );
    expect(answer.solves).toBe(2);
  });

  it("says when the search from the network's value finds no bracket", () => {
    // A higher supply pressure only lowers the velocity in B2: Mach 0.9 is never reached.
    const answer = findTarget(BRANCH_SI, {
      input: { path: "/nodes/0/pressure" },
      output: "edges/B2/mach",
      value: 0.9,
    });
    expect(answer).toMatchObject({ found: false, reason: "not-bracketed" });
    if (answer.found) return;
    expect(answer.message).toMatch(
      /^the target cannot be bracketed: over \/nodes\/0\/pressure from /,
    );
    expect(answer.message).toContain("never reaching the target 0.9");
  });

  it("reports unusable options with paths into the options", () => {
    expect(() =>
      findTarget(BRANCH_SI, {
        input: { path: "/edges/MAIN/colour" },
        output: "edges/B2/choked",
        value: 1,
      }),
    ).toThrow(StudyError);
    try {
      findTarget(BRANCH_SI, {
        input: { path: "/edges/MAIN/colour" },
        output: "edges/B2/mach",
        value: "x",
      });
    } catch (error) {
      const issues = (error as StudyError).issues;
      expect(issues.map((issue) => [issue.code, issue.path])).toEqual([
        ["value", "/input/path"],
        ["unit", "/value"],
      ]);
      expect(issues[0]?.message).toBe(
        '"/edges/MAIN/colour" cannot be varied; the fields a study can vary on a pipe are length, diameter, roughness, minorLoss, frictionFactor',
      );
    }
  });
});
