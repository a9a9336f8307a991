/**
 * Capacity, verified by solving the network independently at the scale found (every limit met)
 * and just above it (a limit broken or no solution), and against the isentropic choked flow of a
 * short smooth pipe.
 */
import { describe, expect, it } from "vitest";
import { solveNetwork } from "../../src/index.js";
import { capacity } from "../../src/study/index.js";
import { withDemandsScaled } from "./helpers.js";
import { BRANCH_SI, SHORT_PIPE, VENT_HEADER } from "./networks.js";

/** Just above the scale found: 10 times the search's relative tolerance of 1e-6. */
const ABOVE = 1 + 1e-5;

describe("capacity", () => {
  it("of a short smooth pipe is the isentropic choked flow of its bore", () => {
    const answer = capacity(SHORT_PIPE, { relativeTolerance: 1e-9 });
    expect(answer.found).toBe(true);
    if (!answer.found) return;
    expect(answer.limitedBy).toMatchObject({ kind: "choke", id: "P" });
    // G* = p0 sqrt(gamma / (R T0)) (2 / (gamma + 1))^((gamma + 1) / (2 (gamma - 1))), the choked
    // mass flux of an isentropic nozzle (J. D. Anderson, Modern Compressible Flow, 3rd ed., 2003,
    // ch. 5), with the gas constants machnet reports for its air preset.
    const { heatCapacityRatio: gamma, specificGasConstant: r } = answer.result.gas;
    const flux =
      700000 *
      Math.sqrt(gamma / (r * 293.15)) *
      (2 / (gamma + 1)) ** ((gamma + 1) / (2 * (gamma - 1)));
    // The same closed form for air at 700 kPa, 293.15 K gives 1652.3 kg/(s m2) (PRACTICE table
    // of choked-flow checks, CALC; printed to 5 digits).
    expect(Math.abs(flux - 1652.3) / 1652.3).toBeLessThan(1e-4);
    const area = (Math.PI * 0.05 ** 2) / 4;
    // 1e-4: the residual friction (fD L/D = 1e-6) and the pipe kernel's treatment of the entrance
    // lower the flow by about 1e-5.
    expect(Math.abs((answer.scale * 0.5) / (flux * area) - 1)).toBeLessThan(1e-4);
  });

  it("of the branch network is set by its smallest junction pressure, checked by solving", () => {
    const demands = [0, 0, 300 / 3600, 150 / 3600];
    const limit = 6.5e5 + 101325; // settings.limits.minPressure "6.5 bar(g)" of the network
    const answer = capacity(BRANCH_SI);
    expect(answer.found).toBe(true);
    if (!answer.found) return;
    expect(answer.limitedBy.kind).toBe("min-pressure");
    const at = solveNetwork(withDemandsScaled(BRANCH_SI, demands, answer.scale));
    const junctions = at.nodes.filter((node) => node.kind === "junction");
    expect(Math.min(...junctions.map((node) => node.pressure))).toBeGreaterThanOrEqual(
      limit * (1 - 1e-9),
    );
    expect(at.edges.some((edge) => edge.choked)).toBe(false);
    const above = solveNetwork(withDemandsScaled(BRANCH_SI, demands, answer.scale * ABOVE));
    const lowest = above.nodes.find((node) => node.id === answer.limitedBy.id);
    expect(lowest?.pressure).toBeLessThan(limit);
  });

  it("of the vent header's injections is set by the tailpipe's choke, checked by solving", () => {
    const answer = capacity(VENT_HEADER, { group: "injections" });
    expect(answer.found).toBe(true);
    if (!answer.found) return;
    expect(answer.limitedBy).toMatchObject({ kind: "choke", id: "TAIL" });
    const injections = [-0.6, -0.3, 0, 0];
    const scaled = (factor: number) => {
      const copy = structuredClone(VENT_HEADER);
      copy.nodes.forEach((node, i) => {
        if ((injections[i] as number) < 0) node.demand = (injections[i] as number) * factor;
      });
      return copy;
    };
    const at = solveNetwork(scaled(answer.scale));
    expect(at.converged).toBe(true);
    expect(at.edges.find((edge) => edge.id === "TAIL")?.choked).toBe(false);
    const above = solveNetwork(scaled(answer.scale * ABOVE));
    expect(above.edges.find((edge) => edge.id === "TAIL")?.choked).toBe(true);
  });

  it("takes a Mach limit of its own", () => {
    const answer = capacity(BRANCH_SI, { limits: { minPressure: "1 bar(g)", maxMach: 0.3 } });
    expect(answer.found).toBe(true);
    if (!answer.found) return;
    expect(answer.limitedBy).toMatchObject({ kind: "max-mach", limit: 0.3 });
    expect(Math.abs(answer.limitedBy.value - 0.3)).toBeLessThan(1e-5);
  });

  it("says when no limit is reached below the largest scale searched", () => {
    const answer = capacity(BRANCH_SI, { limits: { minPressure: "1 bar(g)" }, maxScale: 1.5 });
    expect(answer).toMatchObject({ found: false, reason: "unlimited" });
  });
});
