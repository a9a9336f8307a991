/**
 * Concentric reducers and expanders listed as a pipe's fittings: Crane TP-410's loss
 * coefficients (reference values from python3-fluids, test/fixtures/components/
 * generate_reducer_reference.py), referred to the pipe's own velocity head; what the pipe adds to
 * its minor loss; a size change through a network against Crane's K; bad values with their path.
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import {
  checkNetwork,
  type InputIssue,
  type NetworkDocument,
  solveNetwork,
} from "../../src/index.js";
import { reducerAddedLossCoefficient, reducerLossCoefficient } from "../../src/input/fittings.js";
import { catalogPipe } from "../../src/input/pipe-catalog.js";

interface ReducerCase {
  large: number;
  small: number;
  angle?: number;
  KSmall: number;
}
const reference = JSON.parse(
  readFileSync(new URL("../fixtures/components/reducer-reference.json", import.meta.url), "utf8"),
) as {
  fluids: string;
  contraction: ReducerCase[];
  expansion: ReducerCase[];
  sharpContraction: ReducerCase[];
  sharpExpansion: ReducerCase[];
};
const library = `python3-fluids ${reference.fluids}`;

function pipeWith(fittings: Record<string, unknown>[], pipe: Record<string, unknown> = {}) {
  return {
    nodes: [
      { id: "A", kind: "reservoir", pressure: "6 bar(g)", temperature: "20 degC" },
      { id: "B", kind: "reservoir", pressure: "5 bar(g)", temperature: "20 degC" },
    ],
    edges: [
      {
        id: "E",
        kind: "pipe",
        from: "A",
        to: "B",
        length: "10 m",
        size: "3 in",
        schedule: "40",
        fittings,
        ...pipe,
      },
    ],
  } as unknown as NetworkDocument;
}

function minorLossOf(fittings: Record<string, unknown>[], pipe?: Record<string, unknown>): number {
  const result = checkNetwork(pipeWith(fittings, pipe));
  if (!result.ok) throw new Error(result.issues.map((issue) => issue.message).join("\n"));
  return result.document.edges[0]?.minorLoss ?? Number.NaN;
}

describe("reducer loss coefficients (Crane TP-410)", () => {
  it(`a contraction's K on the larger pipe it leaves is ${library} contraction_conical_Crane over beta^4`, () => {
    expect(reference.contraction.length).toBe(36);
    for (const c of reference.contraction) {
      const beta = c.small / c.large;
      // fluids refers K to the smaller, downstream pipe; the pipe that lists it is the larger.
      const expected = c.KSmall / beta ** 4;
      const k = reducerLossCoefficient("reducer", c.large, c.small, c.angle as number);
      expect(Math.abs(k / expected - 1)).toBeLessThan(1e-13); // the same closed form
    }
  });

  it(`an enlargement's K on the smaller pipe it leaves is ${library} diffuser_conical(method="Crane")`, () => {
    expect(reference.expansion.length).toBe(36);
    for (const c of reference.expansion) {
      // fluids refers K to the smaller, upstream pipe: the pipe that lists it.
      const k = reducerLossCoefficient("expander", c.small, c.large, c.angle as number);
      expect(Math.abs(k / c.KSmall - 1)).toBeLessThan(1e-13); // the same closed form
    }
  });

  it(`a 180 degree step is Crane's sharp contraction and the Borda-Carnot enlargement (${library} contraction_sharp, diffuser_sharp)`, () => {
    for (const c of reference.sharpContraction) {
      const k = reducerLossCoefficient("reducer", c.large, c.small, 180);
      expect(Math.abs(k / (c.KSmall / (c.small / c.large) ** 4) - 1)).toBeLessThan(1e-13);
    }
    for (const c of reference.sharpExpansion) {
      expect(
        Math.abs(reducerLossCoefficient("expander", c.small, c.large, 180) / c.KSmall - 1),
      ).toBeLessThan(1e-13);
    }
  });

  it("the @examples: a sudden 3 x 2 in Sch 40 contraction, and what the pipe adds", () => {
    const k = reducerLossCoefficient("reducer", 0.07792, 0.05248, 180);
    expect(k).toBeCloseTo(1.3277, 4);
    expect(reducerAddedLossCoefficient(k)).toBeCloseTo(0.3277, 4);
    expect(reducerAddedLossCoefficient(0.4)).toBe(0);
  });

  it("an enlargement never loses more than the smaller pipe's velocity head (K <= 1), a contraction loses more the steeper it is", () => {
    for (const angle of [1, 10, 30, 44.99, 45, 90, 180]) {
      for (const beta of [0.1, 0.5, 0.9]) {
        expect(reducerLossCoefficient("expander", beta, 1, angle)).toBeLessThanOrEqual(1);
      }
    }
    const contraction = (angle: number) => reducerLossCoefficient("reducer", 1, 0.5, angle);
    expect(contraction(10)).toBeLessThan(contraction(30));
    expect(contraction(60)).toBeLessThan(contraction(180));
  });
});

describe("reducers on a pipe", () => {
  const size3 = catalogPipe({ system: "NPS", value: 3 }, "40");
  const size1 = catalogPipe({ system: "NPS", value: 1 }, "40");
  if ("error" in size3 || "error" in size1) throw new Error("catalog");

  it("a reducer adds its K on this pipe less the exit velocity head the junction takes", () => {
    const k = reducerLossCoefficient("reducer", size3.insideDiameter, size1.insideDiameter, 30);
    expect(k).toBeGreaterThan(1); // a 3 x 1 in contraction loses more than the junction
    expect(
      minorLossOf([{ type: "reducer", angle: 30, outletDiameter: size1.insideDiameter }]),
    ).toBeCloseTo(k - 1, 13);
    // The outlet by nominal size takes the pipe's schedule unless it has its own.
    expect(minorLossOf([{ type: "reducer", angle: 30, outletSize: "1 in" }])).toBeCloseTo(
      k - 1,
      13,
    );
    const size1Sch80 = catalogPipe({ system: "NPS", value: 1 }, "80");
    if ("error" in size1Sch80) throw new Error("catalog");
    expect(
      minorLossOf([{ type: "reducer", angle: 30, outletSize: "DN25", outletSchedule: "80" }]),
    ).toBeCloseTo(
      reducerLossCoefficient("reducer", size3.insideDiameter, size1Sch80.insideDiameter, 30) - 1,
      13,
    );
  });

  it("a mild reducer and any expander add nothing: the junction already loses more", () => {
    expect(minorLossOf([{ type: "reducer", angle: 15, outletSize: "2 1/2 in" }])).toBe(0);
    expect(
      minorLossOf([{ type: "expander", angle: 180, outletSize: "4 in" }, { type: "elbow-90" }]),
    ).toBeCloseTo(minorLossOf([{ type: "elbow-90" }]), 15);
  });

  it(`through a network, a sudden 3 x 1 in contraction costs (K + 1) velocity heads of the smaller pipe, K from ${library}`, () => {
    const c = reference.sharpContraction.find((candidate) => candidate.small < 0.03);
    if (c === undefined) throw new Error("no 3 x 1 in case");
    // Short, nearly frictionless pipes at Mach ~ 0.05: what is lost is the contraction's K and
    // the small pipe's exit velocity head (into the reservoir).
    const document: NetworkDocument = {
      gas: { preset: "air" },
      nodes: [
        { id: "UP", kind: "reservoir", pressure: 500000, temperature: 293.15 },
        { id: "J", kind: "junction" },
        { id: "DOWN", kind: "reservoir", pressure: 499000, temperature: 293.15 },
      ],
      edges: [
        {
          id: "LARGE",
          kind: "pipe",
          from: "UP",
          to: "J",
          length: "0.01 m",
          diameter: c.large,
          frictionFactor: 1e-9,
          fittings: [{ type: "reducer", angle: 180, outletDiameter: c.small }],
        },
        {
          id: "SMALL",
          kind: "pipe",
          from: "J",
          to: "DOWN",
          length: "0.01 m",
          diameter: c.small,
          frictionFactor: 1e-9,
        },
      ],
    };
    const result = solveNetwork(document);
    expect(result.converged).toBe(true);
    const flow = result.edges[1]?.massFlow as number;
    const density = 500000 / (287.0579 * 293.15);
    const velocity = flow / (density * 0.25 * Math.PI * c.small ** 2);
    const velocityHead = 0.5 * density * velocity * velocity;
    // 1 % for compressibility: Mach ~ 0.05, the density falls by ~ M^2 / 2 ~ 0.1 % to the
    // throat and the velocity head is taken at the upstream density; plus the laminar floor of
    // the nearly frictionless pipes.
    expect(Math.abs(1000 / ((c.KSmall + 1) * velocityHead) - 1)).toBeLessThan(0.01);
  });
});

describe("bad reducer values are refused with their JSON path", () => {
  const cases: [string, Record<string, unknown>[], string, RegExp, Record<string, unknown>?][] = [
    [
      "a reducer without an angle",
      [{ type: "reducer", outletSize: "2 in" }],
      "/edges/0/fittings/0",
      /missing required field "angle"/,
    ],
    [
      "an angle of 0",
      [{ type: "reducer", angle: 0, outletSize: "2 in" }],
      "/edges/0/fittings/0/angle",
      /must be > 0/,
    ],
    [
      "an angle above 180",
      [{ type: "expander", angle: 190, outletSize: "4 in" }],
      "/edges/0/fittings/0/angle",
      /must be <= 180/,
    ],
    [
      "a reducer without its outlet",
      [{ type: "reducer", angle: 30 }],
      "/edges/0/fittings/0",
      /missing required field "outletDiameter" \(or "outletSize"\)/,
    ],
    [
      "an outlet diameter and size together",
      [{ type: "reducer", angle: 30, outletDiameter: "50 mm", outletSize: "2 in" }],
      "/edges/0/fittings/0/outletDiameter",
      /give either "outletDiameter" or "outletSize", not both/,
    ],
    [
      "a negative outlet diameter",
      [{ type: "reducer", angle: 30, outletDiameter: "-50 mm" }],
      "/edges/0/fittings/0/outletDiameter",
      /must be greater than 0/,
    ],
    [
      "an outlet diameter in the wrong unit",
      [{ type: "reducer", angle: 30, outletDiameter: "50 kg" }],
      "/edges/0/fittings/0/outletDiameter",
      /./,
    ],
    [
      "a reducer into an equal pipe",
      [{ type: "reducer", angle: 30, outletSize: "3 in" }],
      "/edges/0/fittings/0/outletSize",
      /a reducer leads into a smaller pipe, but "3 in" \(77.92 mm\) is not smaller than this pipe's 77.92 mm/,
    ],
    [
      "a reducer into a larger pipe",
      [{ type: "reducer", angle: 30, outletDiameter: "100 mm" }],
      "/edges/0/fittings/0/outletDiameter",
      /is not smaller than this pipe's 77.92 mm; a larger one takes an "expander"/,
    ],
    [
      "an expander into a smaller pipe",
      [{ type: "expander", angle: 30, outletDiameter: "50 mm" }],
      "/edges/0/fittings/0/outletDiameter",
      /an expander leads into a larger pipe, but "50 mm" \(50.00 mm\) is not larger/,
    ],
    [
      "an outlet size that is not one",
      [{ type: "expander", angle: 30, outletSize: "four" }],
      "/edges/0/fittings/0/outletSize",
      /not a nominal size \(got "four"\)/,
    ],
    [
      "an unknown outlet schedule",
      [{ type: "expander", angle: 30, outletSize: "4 in", outletSchedule: "41" }],
      "/edges/0/fittings/0/outletSchedule",
      /unknown schedule "41"/,
    ],
    [
      "an outlet size the schedule lacks",
      [{ type: "reducer", angle: 30, outletSize: "DN50", outletSchedule: "100" }],
      "/edges/0/fittings/0/outletSize",
      /schedule 100 has no DN50 pipe/,
    ],
    [
      "an outlet schedule without a size",
      [{ type: "reducer", angle: 30, outletDiameter: "50 mm", outletSchedule: "40" }],
      "/edges/0/fittings/0/outletSchedule",
      /needs an "outletSize"/,
    ],
    [
      "an outlet size with no schedule on a pipe by diameter",
      [{ type: "reducer", angle: 30, outletSize: "1 in" }],
      "/edges/0/fittings/0",
      /missing required field "outletSchedule"/,
      { size: undefined, schedule: undefined, diameter: "77.92 mm" },
    ],
    [
      "a count of 2",
      [{ type: "reducer", angle: 30, outletSize: "2 in", count: 2 }],
      "/edges/0/fittings/0/count",
      /its count can only be 1 \(got 2\)/,
    ],
    [
      "a second reducer",
      [
        { type: "reducer", angle: 30, outletSize: "2 in" },
        { type: "expander", angle: 30, outletSize: "4 in" },
      ],
      "/edges/0/fittings/1/type",
      /a pipe has one outlet, and \/edges\/0\/fittings\/0 already puts a reducer or expander there/,
    ],
    [
      "an angle on an elbow",
      [{ type: "elbow-90", angle: 30 }],
      "/edges/0/fittings/0/angle",
      /a fitting of type "elbow-90" has no field "angle"; only "reducer" and "expander" take/,
    ],
    [
      "an outlet size on a gate valve",
      [{ type: "gate-valve", outletSize: "2 in" }],
      "/edges/0/fittings/0/outletSize",
      /has no field "outletSize"/,
    ],
    [
      "an unknown fitting field",
      [{ type: "reducer", angle: 30, outletSize: "2 in", length: "1 m" }],
      "/edges/0/fittings/0/length",
      /unknown field "length"; allowed fields here: type, count, angle/,
    ],
  ];
  for (const [what, fittings, path, message, pipe] of cases) {
    it(`refuses ${what} at ${path}`, () => {
      const result = checkNetwork(pipeWith(fittings, pipe));
      expect(result.ok).toBe(false);
      const issues: InputIssue[] = result.ok ? [] : result.issues;
      const found = issues.find((issue) => issue.path === path && message.test(issue.message));
      expect(found, JSON.stringify(issues)).toBeDefined();
    });
  }
});
