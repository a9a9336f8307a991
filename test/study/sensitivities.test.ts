/**
 * Sensitivities from the converged Jacobian (implicit function theorem) against central finite
 * differences of full network solves, on a looped network, a branched one and a vent header with
 * injections.
 *
 * Tolerance: the two are compared as elasticities, (theta / y) dy/dtheta, to 1e-5 absolute. The
 * finite differences use full solves at theta (1 +- 1e-4) with the solver tolerance tightened to
 * 1e-12: truncation (1e-4)^2 = 1e-8, solver noise about 1e-12 / 1e-4 = 1e-8. The IFT values carry
 * the round-off of the residual differences (steps of 5e-5 of the input), measured below 1e-6.
 * Comparing elasticities, not raw derivatives, keeps a vanishing derivative (a flow that hardly
 * depends on a far pipe's length) from being judged by its round-off.
 */
import { describe, expect, it } from "vitest";
import { solveNetwork } from "../../src/index.js";
import { StudyError, sensitivities } from "../../src/study/index.js";
import { readField, withDemandsScaled, withValue } from "./helpers.js";
import { BRANCH, RING, VENT_HEADER, withTolerance } from "./networks.js";

const STEP = 1e-4;
const TOLERANCE = 1e-5;

/** Elasticities of outputs to an input by central differences of full solves. */
function finiteDifferences(
  network: object,
  change: (factor: number) => object,
  outputs: readonly string[],
): number[] {
  const solve = (document: object) => {
    const result = solveNetwork(document);
    expect(result.status).toBe("converged");
    return result;
  };
  const base = solve(network);
  const up = solve(change(1 + STEP));
  const down = solve(change(1 - STEP));
  return outputs.map(
    (output) =>
      (readField(up, output) - readField(down, output)) / (2 * STEP) / readField(base, output),
  );
}

describe("sensitivities", () => {
  const cases = [
    {
      name: "small ring",
      network: withTolerance(RING, 1e-12),
      inputs: [
        // SI base values by definition: 7 bar(g) on the default ambient 101325 Pa; 30 degC.
        { path: "/nodes/0/pressure", base: 7e5 + 101325 },
        { path: "/nodes/0/temperature", base: 303.15 },
        { path: "/edges/1/diameter", base: 0.05248 },
        { path: "/edges/2/length", base: 35 },
        { path: "/edges/5/minorLoss", base: 3 },
        { path: "/nodes/2/demand", base: 400 / 3600 },
      ],
      outputs: [
        "nodes/TOOL/pressure",
        "nodes/C/pressure",
        "edges/AB/massFlow",
        "edges/BC/massFlow",
        "edges/DROP/velocity",
        "network/maxMach",
      ],
    },
    {
      name: "vent header with two injections",
      network: withTolerance(VENT_HEADER, 1e-12),
      inputs: [
        { path: "/edges/2/diameter", base: 0.10226 },
        { path: "/nodes/0/temperature", base: 313.15 },
        { path: "/nodes/1/demand", base: -0.3 },
      ],
      outputs: [
        "nodes/HDR/pressure",
        "nodes/RV-1/pressure",
        "nodes/HDR/temperature",
        "edges/L1/velocity",
      ],
    },
  ];

  for (const { name, network, inputs, outputs } of cases) {
    it(`agree with finite differences of full solves: ${name}`, () => {
      const answer = sensitivities(network, {
        inputs: inputs.map(({ path }) => ({ path })),
        outputs,
      });
      inputs.forEach((input, j) => {
        expect(answer.inputs[j]?.value).toBeCloseTo(input.base, 9);
        const differences = finiteDifferences(
          network,
          (factor) => withValue(network, input.path, input.base * factor),
          outputs,
        );
        outputs.forEach((output, i) => {
          const expected = differences[i] as number;
          const found = answer.relative[i]?.[j] as number;
          expect(
            Math.abs(found - expected),
            `${output} by ${input.path}: IFT ${found}, differences ${expected}`,
          ).toBeLessThanOrEqual(TOLERANCE);
        });
      });
    });
  }

  it("differentiate by a group scale: all demands of the branch network", () => {
    const network = withTolerance(BRANCH, 1e-12);
    const demands = [0, 0, 300 / 3600, 150 / 3600];
    const outputs = ["nodes/PAINT/pressure", "edges/MAIN/massFlow", "edges/B2/velocity"];
    const answer = sensitivities(network, { inputs: [{ group: "demands" }], outputs });
    expect(answer.inputs[0]).toMatchObject({ label: "demand scale", value: 1 });
    const differences = finiteDifferences(
      network,
      (factor) => withDemandsScaled(network, demands, factor),
      outputs,
    );
    outputs.forEach((_, i) => {
      const expected = differences[i] as number;
      expect(Math.abs((answer.relative[i]?.[0] as number) - expected)).toBeLessThanOrEqual(
        TOLERANCE,
      );
    });
    // The mass flow in the main is the sum of the demands: its elasticity to their scale is 1
    // (mass balance, exactly).
    expect(answer.relative[1]?.[0]).toBeCloseTo(1, 6);
  });

  it("take a one-sided difference for an input at its bound (roughness 0)", () => {
    const network = withTolerance(withValue(BRANCH, "/edges/2/roughness", 0), 1e-12);
    const answer = sensitivities(network, {
      inputs: [{ path: "/edges/2/roughness" }],
      outputs: ["nodes/PAINT/pressure"],
    });
    expect(answer.inputs[0]?.difference).toBe("forward");
    // Against a forward difference of full solves at 5 um (1e-4 of the bore is 2.7 um): a smooth
    // pipe's friction grows with roughness, so the consumer loses pressure.
    const h = 5e-6;
    const at = (roughness: number) =>
      readField(
        solveNetwork(withValue(network, "/edges/2/roughness", roughness)),
        "nodes/PAINT/pressure",
      );
    const forward = (-3 * at(0) + 4 * at(h) - at(2 * h)) / (2 * h);
    const found = answer.derivatives[0]?.[0] as number;
    expect(found).toBeLessThan(0);
    // 2 %: the full-solve difference itself has a truncation error of order h^2 f''' here, where
    // the friction factor's slope in roughness changes fastest (near a smooth wall).
    expect(Math.abs(found - forward) / Math.abs(forward)).toBeLessThan(0.02);
  });

  it("report inputs that cannot be used with their paths", () => {
    let error: unknown;
    try {
      sensitivities(RING, {
        inputs: [{ path: "/nodes/1/pressure" }, { path: "/edges/9/diameter" }],
        outputs: ["nodes/NOWHERE/pressure"],
      });
    } catch (caught) {
      error = caught;
    }
    expect(error).toBeInstanceOf(StudyError);
    const issues = (error as StudyError).issues;
    expect(issues.map((issue) => [issue.code, issue.path])).toEqual([
      ["value", "/inputs/0/path"],
      ["unknown-reference", "/inputs/1/path"],
      ["unknown-reference", "/outputs/0"],
    ]);
    expect(issues[0]?.message).toBe(
      `node "A": a junction's pressure is solved for; vary a reservoir's pressure instead`,
    );
  });
});
