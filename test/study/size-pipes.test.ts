/**
 * Pipe sizing, verified by independent solves: the chosen sizes meet every limit, and each pipe
 * one size smaller (the others as chosen) breaks the limit reported as binding.
 */
import { describe, expect, it } from "vitest";
import { type NetworkResult, solveNetwork } from "../../src/index.js";
import { type SizingAnswer, StudyError, sizePipes } from "../../src/study/index.js";
import { RING } from "./networks.js";

const LIMITS = {
  maxVelocity: 15, // m/s
  maxPressureDrop: 5000, // Pa along one pipe
  minDeliveryPressure: 6.7e5 + 101325, // 6.7 bar(g) at every consumer
};
const SCH40 = [0.02664, 0.05248, 0.07792, 0.10226, 0.15408, 0.20274, 0.25446, 0.30318];

/** The ring with the given diameters, solved on its own. */
function solveWith(diameters: Record<string, number>): NetworkResult {
  const copy = structuredClone(RING);
  for (const edge of copy.edges) {
    const diameter = diameters[edge.id];
    if (diameter !== undefined) (edge as { diameter?: unknown }).diameter = diameter;
  }
  return solveNetwork(copy);
}

/** The limits a result breaks, as "limit@id", by reading the result directly. */
function broken(result: NetworkResult): string[] {
  if (!result.converged) return ["no-solution"];
  const found: string[] = [];
  for (const edge of result.edges) {
    if (edge.choked) found.push(`choke@${edge.id}`);
    if (Math.max(edge.inlet.mach, edge.outlet.mach) > 0.5) found.push(`max-mach@${edge.id}`);
    if (Math.max(edge.inlet.velocity, edge.outlet.velocity) > LIMITS.maxVelocity) {
      found.push(`max-velocity@${edge.id}`);
    }
    if (edge.pressureDrop > LIMITS.maxPressureDrop) found.push(`max-pressure-drop@${edge.id}`);
  }
  for (const node of result.nodes) {
    if (node.kind === "junction" && node.demand > 0 && node.pressure < LIMITS.minDeliveryPressure) {
      found.push(`min-delivery-pressure@${node.id}`);
    }
  }
  return found;
}

function chosen(answer: SizingAnswer): Record<string, number> {
  return Object.fromEntries(answer.pipes.map((pipe) => [pipe.id, pipe.diameter]));
}

describe("sizePipes", () => {
  const answer = sizePipes(RING, {
    limits: {
      maxVelocity: "15 m/s",
      maxPressureDrop: "0.05 bar",
      minDeliveryPressure: "6.7 bar(g)",
    },
  });

  it("chooses sizes from the default Sch 40 list that meet every limit", () => {
    expect(answer.feasible).toBe(true);
    expect(answer.violations).toEqual([]);
    for (const pipe of answer.pipes) expect(SCH40).toContain(pipe.diameter);
    expect(broken(solveWith(chosen(answer)))).toEqual([]);
  });

  it("reports for each pipe the limit that one size smaller breaks", () => {
    // The case is a real one: most pipes are held by a limit, some by one at another pipe.
    expect(answer.pipes.filter((pipe) => pipe.binding !== undefined).length).toBeGreaterThanOrEqual(
      3,
    );
    for (const pipe of answer.pipes) {
      const position = SCH40.indexOf(pipe.diameter);
      if (position === 0) {
        expect(pipe.binding, pipe.id).toBeUndefined();
        continue;
      }
      const smaller = { ...chosen(answer), [pipe.id]: SCH40[position - 1] as number };
      const limits = broken(solveWith(smaller));
      const binding = pipe.binding;
      expect(binding, pipe.id).toBeDefined();
      const name = binding?.id === undefined ? binding?.limit : `${binding.limit}@${binding.id}`;
      expect(limits, `${pipe.id} one size smaller`).toContain(name);
    }
  });

  it("gives the values at the chosen sizes and the diameters before sizing", () => {
    const result = solveWith(chosen(answer));
    for (const pipe of answer.pipes) {
      const edge = result.edges.find((e) => e.id === pipe.id);
      expect(pipe.velocity).toBeCloseTo(
        Math.max(edge?.inlet.velocity ?? 0, edge?.outlet.velocity ?? 0),
        5,
      );
      expect(pipe.label).toMatch(/^DN \d+$/);
    }
    expect(answer.pipes.find((p) => p.id === "DROP")?.previousDiameter).toBe(0.02664);
  });

  it("sizes only the listed pipes from a list of diameters of one's own", () => {
    const own = sizePipes(RING, {
      edges: ["DROP"],
      diameters: ["20 mm", "25 mm", "32 mm", "40 mm"],
      limits: { maxVelocity: "25 m/s" },
    });
    expect(own.pipes.map((pipe) => pipe.id)).toEqual(["DROP"]);
    const drop = own.pipes[0];
    expect(
      [0.02, 0.025, 0.032, 0.04].map((d) => Math.abs(d - (drop?.diameter ?? 0)) < 1e-12),
    ).toContain(true);
    expect(drop?.label).toMatch(/ mm$/);
    // 120 kg/h of air at about 7.9 bar(a), 30 degC: rho = p / (R T) = 9.1 kg/m3 (ideal gas), so
    // 25 m/s needs an area of at least 0.0333 / (9.1 x 25) = 1.47e-4 m2, a bore of 13.7 mm:
    // one of 20 mm suffices unless the pressure there is much lower.
    expect(drop?.diameter).toBeCloseTo(0.02, 12);
    expect(drop?.binding).toBeUndefined();
  });

  it("takes nominal sizes of a schedule from the pipe catalog", () => {
    const catalog = sizePipes(RING, {
      edges: ["FEED"],
      schedule: "40",
      sizes: ["DN 80", "DN 50"],
      limits: { maxVelocity: "15 m/s" },
    });
    // DN 50 Sch 40: 52.48 mm inside (ASME B36.10M via python-fluids, test/fixtures/study/sch40.json).
    expect(catalog.pipes[0]).toMatchObject({
      id: "FEED",
      label: "DN 50 Sch 40",
      diameter: 0.05248,
    });
    let error: unknown;
    try {
      sizePipes(RING, { schedule: "41", sizes: ["DN 50"] });
    } catch (caught) {
      error = caught;
    }
    expect((error as StudyError).issues.map((issue) => [issue.path, issue.message])).toEqual([
      [
        "/schedule",
        expect.stringMatching(/^unknown schedule "41"; known schedules: 10, 20, 30, 40, /),
      ],
    ]);
    expect(() => sizePipes(RING, { sizes: ["DN 55", "fifty"] })).toThrow(
      /\/sizes\/0: schedule 40 has no DN55 pipe; its sizes: DN6, [^\n]*\n\/sizes\/1: "fifty" is not a nominal size; write "DN 50", "2 in" or "NPS 2"$/,
    );
  });

  it("says when the limits cannot be met with the allowed sizes", () => {
    const impossible = sizePipes(RING, { limits: { minDeliveryPressure: "7.5 bar(g)" } });
    expect(impossible.feasible).toBe(false);
    expect(impossible.message).toMatch(/^the limits cannot all be met with the allowed sizes: /);
    expect(impossible.violations.map((v) => v.limit)).toContain("min-delivery-pressure");
  });

  it("reports unusable options with their paths", () => {
    expect(() => sizePipes(RING, { edges: ["FEED", "NOPE"], diameters: ["-3 mm"] })).toThrow(
      StudyError,
    );
    try {
      sizePipes(RING, { edges: ["FEED", "NOPE"], diameters: ["-3 mm"] });
    } catch (error) {
      expect((error as StudyError).issues.map((issue) => issue.path)).toEqual([
        "/diameters/0",
        "/edges/1",
      ]);
    }
  });
});
