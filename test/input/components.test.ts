/**
 * Reading components and a pipe's catalog fields: nominal sizes and schedules, materials,
 * fittings, and every new field's bad values, each with its JSON path.
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { checkNetwork, type InputIssue, type NetworkDocument } from "../../src/index.js";
import type { CheckedComponentEdge, CheckedPipeEdge } from "../../src/input/document-types.js";
import { DARBY_FITTINGS } from "../../src/input/fitting-data.js";
import { fittingLossCoefficient } from "../../src/input/fittings.js";
import {
  catalogPipe,
  nominalSizeFromInsideDiameter,
  PIPE_MATERIALS,
  parseNominalSize,
} from "../../src/input/pipe-catalog.js";
import { DEFAULT_DISCHARGE_COEFFICIENT, KV_PER_CV } from "../../src/input/read-components.js";
import { NOZZLE_DISCHARGE_COEFFICIENT } from "../../src/physics/components/nozzle.js";
import { ORIFICE_DISCHARGE_COEFFICIENT } from "../../src/physics/components/orifice.js";

const reference = JSON.parse(
  readFileSync(new URL("../fixtures/components/component-reference.json", import.meta.url), "utf8"),
) as {
  fluids: string;
  darby3K: { row: string; nps: number; K: number }[];
  darby3KByDiameter: { row: string; Di: number; K: number }[];
  entranceSharp: number;
  pipes: { nps: number; schedule: string; Di: number; Do: number }[];
  roughness: Record<"copper" | "galvanized" | "compressedAir", (number | null)[]>;
  kToKv: { K: number; D: number; kv: number };
};
const library = `python3-fluids ${reference.fluids}`;

function network(edge: Record<string, unknown>): NetworkDocument {
  return {
    nodes: [
      { id: "A", kind: "reservoir", pressure: "6 bar(g)", temperature: "20 degC" },
      { id: "B", kind: "reservoir", pressure: "5 bar(g)", temperature: "20 degC" },
    ],
    edges: [{ id: "E", from: "A", to: "B", ...edge } as NetworkDocument["edges"][number]],
  };
}

function checkedEdge(edge: Record<string, unknown>) {
  const result = checkNetwork(network(edge));
  if (!result.ok) throw new Error(result.issues.map((issue) => issue.message).join("\n"));
  return result.document.edges[0];
}

function issuesOf(edge: Record<string, unknown>): InputIssue[] {
  const result = checkNetwork(network(edge));
  expect(result.ok).toBe(false);
  return result.issues;
}

describe("nominal sizes and schedules", () => {
  it("reads DN and NPS in the ways the trade writes them, and refuses a bare number", () => {
    expect(parseNominalSize("DN80")).toEqual({ system: "DN", value: 80 });
    expect(parseNominalSize("dn 150")).toEqual({ system: "DN", value: 150 });
    expect(parseNominalSize("3 in")).toEqual({ system: "NPS", value: 3 });
    expect(parseNominalSize('3"')).toEqual({ system: "NPS", value: 3 });
    expect(parseNominalSize("NPS 3")).toEqual({ system: "NPS", value: 3 });
    expect(parseNominalSize("1 1/2 in")).toEqual({ system: "NPS", value: 1.5 });
    expect(parseNominalSize("1-1/2 in")).toEqual({ system: "NPS", value: 1.5 });
    expect(parseNominalSize("3/4 in")).toEqual({ system: "NPS", value: 0.75 });
    expect(parseNominalSize("80")).toBeUndefined();
    expect(parseNominalSize("3 mm")).toBeUndefined();
  });

  it("gives the ASME B36.10M inside diameters of PRACTICE.md section 6 (STD via HB)", () => {
    // PRACTICE.md 6: Sch 40 / Sch 80 / 10S inside diameters in mm, printed to 0.01 mm.
    const rows: [number, number, number, number][] = [
      [25, 26.64, 24.3, 27.86],
      [50, 52.48, 49.22, 54.76],
      [80, 77.92, 73.66, 82.8],
      [100, 102.26, 97.18, 108.2],
      [150, 154.08, 146.36, 161.5],
      [200, 202.74, 193.7, 211.58],
      [250, 254.46, 242.82, 264.72],
      [300, 303.18, 288.84, 314.76],
    ];
    for (const [dn, sch40, sch80, sch10s] of rows) {
      for (const [schedule, inside] of [
        ["40", sch40],
        ["80", sch80],
        ["10S", sch10s],
      ] as const) {
        const pipe = catalogPipe({ system: "DN", value: dn }, schedule);
        if ("error" in pipe) throw new Error(pipe.error);
        expect(Math.abs(pipe.insideDiameter * 1000 - inside)).toBeLessThan(0.005);
      }
    }
  });

  it(`agrees with ${library} nearest_pipe, NPS and DN alike, B36.19M apart from B36.10M above NPS 10`, () => {
    for (const c of reference.pipes) {
      const pipe = catalogPipe({ system: "NPS", value: c.nps }, c.schedule);
      if ("error" in pipe) throw new Error(pipe.error);
      expect(pipe.insideDiameter).toBeCloseTo(c.Di, 12);
      expect(pipe.outsideDiameter).toBeCloseTo(c.Do, 12);
    }
    const stainless = catalogPipe({ system: "NPS", value: 12 }, "40S");
    const carbon = catalogPipe({ system: "NPS", value: 12 }, "40");
    if ("error" in stainless || "error" in carbon) throw new Error("missing");
    expect(stainless.standard).toBe("ASME B36.19M");
    expect(carbon.standard).toBe("ASME B36.10M");
    expect(stainless.insideDiameter).not.toBe(carbon.insideDiameter);
  });

  it("a pipe given by size and schedule gets that inside diameter", () => {
    const edge = checkedEdge({ kind: "pipe", length: "20 m", size: "DN80", schedule: "40" });
    expect(edge?.diameter).toBeCloseTo(0.07792, 12);
    expect((edge as CheckedPipeEdge).catalog).toEqual({
      nominalPipeSize: 3,
      nominalDiameter: 80,
      schedule: "40",
    });
    const same = checkedEdge({ kind: "pipe", length: "20 m", size: "3 in", schedule: "std" });
    expect(same?.diameter).toBeCloseTo(0.07792, 12);
  });
});

describe("materials", () => {
  it("set the roughness of PRACTICE.md section 4 (NORSOK P-001 rows)", () => {
    expect(PIPE_MATERIALS["carbon-steel"].roughness).toBe(0.05e-3);
    expect(PIPE_MATERIALS["carbon-steel-corroded"].roughness).toBe(0.5e-3);
    expect(PIPE_MATERIALS["stainless-steel"].roughness).toBe(0.05e-3);
    expect(PIPE_MATERIALS.grp.roughness).toBe(0.02e-3);
    expect(PIPE_MATERIALS.polyethylene.roughness).toBe(0.005e-3);
  });

  it(`take the upper end of Idel'chik's range as tabulated in ${library} (HHR_roughness)`, () => {
    expect(PIPE_MATERIALS.copper.roughness).toBe(reference.roughness.copper[1]);
    expect(PIPE_MATERIALS["galvanized-steel"].roughness).toBe(reference.roughness.galvanized[1]);
    expect(PIPE_MATERIALS["steel-compressed-air-service"].roughness).toBe(
      reference.roughness.compressedAir[2],
    );
  });

  it("a pipe's material sets its roughness", () => {
    const edge = checkedEdge({
      kind: "pipe",
      length: "20 m",
      diameter: "52.5 mm",
      material: "galvanized-steel",
    });
    expect(edge?.roughness).toBe(0.15e-3);
  });
});

describe("fittings", () => {
  it(`K of every type is Darby's 3-K value of ${library} Darby3K at Re -> infinity`, () => {
    const byRow = new Map<string, string>(
      Object.entries(DARBY_FITTINGS).map(([type, constants]) => [constants.row, type]),
    );
    let checked = 0;
    for (const c of reference.darby3K) {
      const type = byRow.get(c.row);
      if (type === undefined) continue; // a row machnet does not offer
      const k = fittingLossCoefficient(type as keyof typeof DARBY_FITTINGS, c.nps);
      expect(Math.abs(k - c.K)).toBeLessThan(1e-13); // the same closed form
      checked++;
    }
    expect(checked).toBe(6 * Object.keys(DARBY_FITTINGS).length);
    // The @example of fittingLossCoefficient.
    expect(Math.abs(fittingLossCoefficient("elbow-90", 2) - 0.3867)).toBeLessThan(5e-5);
    // Size dependence, as the method says: smaller pipes have larger K.
    expect(fittingLossCoefficient("elbow-90", 1)).toBeGreaterThan(
      fittingLossCoefficient("elbow-90", 8),
    );
  });

  it(`finds the nominal size of an inside diameter along Sch 40, as ${library} Darby3K(Di=...)`, () => {
    const byRow = new Map<string, string>(
      Object.entries(DARBY_FITTINGS).map(([type, constants]) => [constants.row, type]),
    );
    for (const c of reference.darby3KByDiameter) {
      const type = byRow.get(c.row) as keyof typeof DARBY_FITTINGS;
      const k = fittingLossCoefficient(type, nominalSizeFromInsideDiameter(c.Di));
      expect(Math.abs(k / c.K - 1)).toBeLessThan(1e-12);
    }
    expect(nominalSizeFromInsideDiameter(0.05248)).toBeCloseTo(2, 12);
  });

  it(`the sharp entrance is K = 0.5 (Crane TP-410 via ${library} entrance_sharp)`, () => {
    expect(fittingLossCoefficient("entrance-sharp", 3)).toBe(reference.entranceSharp);
  });

  it("fittings add to the pipe's minor loss", () => {
    const edge = checkedEdge({
      kind: "pipe",
      length: "20 m",
      size: "2 in",
      schedule: "40",
      minorLoss: 1,
      fittings: [{ type: "elbow-90", count: 3 }, { type: "gate-valve" }, { type: "exit" }],
    });
    const expected =
      1 + 3 * fittingLossCoefficient("elbow-90", 2) + fittingLossCoefficient("gate-valve", 2);
    expect(edge?.minorLoss).toBeCloseTo(expected, 14);
  });
});

describe("components are read to SI with their defaults", () => {
  it("an orifice and a nozzle, with the default discharge coefficients of the physics", () => {
    expect(DEFAULT_DISCHARGE_COEFFICIENT.orifice).toBe(ORIFICE_DISCHARGE_COEFFICIENT);
    expect(DEFAULT_DISCHARGE_COEFFICIENT.nozzle).toBe(NOZZLE_DISCHARGE_COEFFICIENT);
    const orifice = checkedEdge({
      kind: "orifice",
      boreDiameter: "30 mm",
      pipeDiameter: "77.92 mm",
    });
    expect((orifice as CheckedComponentEdge).component).toEqual({
      kind: "orifice",
      boreDiameter: 0.03,
      pipeDiameter: 0.07792,
      dischargeCoefficient: 0.6,
    });
    expect(orifice?.length).toBe(0);
    expect(orifice?.diameter).toBe(0.07792);
    const nozzle = checkedEdge({ kind: "nozzle", boreDiameter: "12 mm" });
    expect((nozzle as CheckedComponentEdge).component).toMatchObject({
      pipeDiameter: Number.NaN,
      dischargeCoefficient: 0.985,
    });
  });

  it("a valve by Cv gets Kv = 0.865 Cv and the defaults opening 1, linear, xT 0.70", () => {
    const valve = checkedEdge({ kind: "valve", cv: 100 });
    expect((valve as CheckedComponentEdge).component).toMatchObject({
      kind: "valve",
      flowCoefficient: 100 * KV_PER_CV,
      opening: 1,
      characteristic: "linear",
      rangeability: 50,
      pressureDifferentialRatioFactor: 0.7,
    });
  });

  it(`a check valve by its loss coefficient gets Kv = 36000 A sqrt(2/K), as ${library} K_to_Kv to its rounding`, () => {
    const { K, D, kv } = reference.kToKv;
    const check = checkedEdge({ kind: "check", lossCoefficient: K, pipeDiameter: D });
    const component = (check as CheckedComponentEdge).component;
    if (component.kind !== "check") throw new Error("not a check valve");
    expect(component.flowCoefficient).toBeCloseTo(
      36000 * 0.25 * Math.PI * D * D * Math.sqrt(2 / K),
      10,
    );
    // fluids writes Kv = D^2 sqrt(1.6e9 / K) = 40000 D^2 / sqrt(K), a rounding of the exact
    // 36000 (pi / 4) sqrt(2) = 39985.8: 3.5e-4 apart.
    expect(Math.abs(component.flowCoefficient / kv - 1)).toBeLessThan(4e-4);
  });

  it("a regulator's setpoint in gauge units and its default band of 1 % of the absolute setpoint", () => {
    const regulator = checkedEdge({ kind: "regulator", kv: 10, setpoint: "4 bar(g)" });
    expect((regulator as CheckedComponentEdge).component).toMatchObject({
      kind: "regulator",
      setpoint: 501325,
      proportionalBand: 5013.25,
    });
  });
});

describe("bad values of the new fields are refused with their JSON path", () => {
  const cases: [string, Record<string, unknown>, string, RegExp][] = [
    ["an unknown edge kind", { kind: "pump" }, "/edges/0/kind", /must be one of "pipe", "orifice"/],
    [
      "an orifice without a bore",
      { kind: "orifice", pipeDiameter: "50 mm" },
      "/edges/0",
      /missing required field "boreDiameter"/,
    ],
    [
      "a negative bore",
      { kind: "orifice", boreDiameter: "-3 mm" },
      "/edges/0/boreDiameter",
      /must be greater than 0/,
    ],
    [
      "a bore too large for its pipe",
      { kind: "orifice", boreDiameter: "45 mm", pipeDiameter: "52.5 mm" },
      "/edges/0/boreDiameter",
      /diameter ratio of 0.857; ISO 5167-2 covers orifice plates up to 0.75/,
    ],
    [
      "a discharge coefficient above 1",
      { kind: "nozzle", boreDiameter: "10 mm", dischargeCoefficient: 1.2 },
      "/edges/0/dischargeCoefficient",
      /must be <= 1/,
    ],
    [
      "a valve without a flow coefficient",
      { kind: "valve" },
      "/edges/0",
      /needs its flow coefficient: give "kv" or "cv"/,
    ],
    [
      "a valve with both kv and cv",
      { kind: "valve", kv: 10, cv: 12 },
      "/edges/0",
      /give only one of "kv" or "cv" \(got kv and cv\)/,
    ],
    ["a zero kv", { kind: "valve", kv: 0 }, "/edges/0/kv", /must be > 0/],
    [
      "an opening above 1",
      { kind: "valve", kv: 10, opening: 1.5 },
      "/edges/0/opening",
      /must be <= 1/,
    ],
    [
      "an unknown characteristic",
      { kind: "valve", kv: 10, characteristic: "quick" },
      "/edges/0/characteristic",
      /must be one of "linear", "equal-percentage"/,
    ],
    [
      "a rangeability of 1",
      { kind: "valve", kv: 10, rangeability: 1 },
      "/edges/0/rangeability",
      /must be > 1/,
    ],
    ["an xT above 1", { kind: "valve", kv: 10, xT: 1.3 }, "/edges/0/xT", /must be <= 1/],
    [
      "a valve larger than its pipe",
      { kind: "valve", kv: 10, valveDiameter: "80 mm", pipeDiameter: "50 mm" },
      "/edges/0/valveDiameter",
      /larger than its pipeDiameter/,
    ],
    [
      "an outlet pipe without an inlet pipe",
      { kind: "valve", kv: 10, outletPipeDiameter: "80 mm" },
      "/edges/0/outletPipeDiameter",
      /give "pipeDiameter"/,
    ],
    [
      "a regulator without a setpoint",
      { kind: "regulator", kv: 10 },
      "/edges/0",
      /missing required field "setpoint"/,
    ],
    [
      "a setpoint in the wrong unit",
      { kind: "regulator", kv: 10, setpoint: "4 kg" },
      "/edges/0/setpoint",
      /./,
    ],
    [
      "a band larger than the setpoint",
      { kind: "regulator", kv: 10, setpoint: "2 bar", proportionalBand: "3 bar" },
      "/edges/0/proportionalBand",
      /must be smaller than the absolute setpoint/,
    ],
    [
      "a check valve loss coefficient without a pipe diameter",
      { kind: "check", lossCoefficient: 2 },
      "/edges/0",
      /give "pipeDiameter" with "lossCoefficient"/,
    ],
    [
      "a field of another kind",
      { kind: "check", kv: 10, setpoint: "4 bar(g)" },
      "/edges/0/setpoint",
      /a check has no field "setpoint"; a check takes: id, kind, description, from, to, kv/,
    ],
    [
      "a pipe field on an orifice",
      { kind: "orifice", boreDiameter: "10 mm", length: "1 m" },
      "/edges/0/length",
      /an? orifice has no field "length"/,
    ],
    [
      "a pipe without diameter or size",
      { kind: "pipe", length: "10 m" },
      "/edges/0",
      /missing required field "diameter" \(or give "size" and "schedule"\)/,
    ],
    [
      "a size without a schedule",
      { kind: "pipe", length: "10 m", size: "DN50" },
      "/edges/0",
      /missing required field "schedule"/,
    ],
    [
      "a schedule without a size",
      { kind: "pipe", length: "10 m", diameter: 0.05, schedule: "40" },
      "/edges/0/schedule",
      /needs a nominal "size"/,
    ],
    [
      "both a diameter and a size",
      { kind: "pipe", length: "10 m", diameter: 0.05, size: "DN50", schedule: "40" },
      "/edges/0/diameter",
      /give either "diameter" or "size"/,
    ],
    [
      "a size that is not one",
      { kind: "pipe", length: "10 m", size: "fifty", schedule: "40" },
      "/edges/0/size",
      /not a nominal size \(got "fifty"\)/,
    ],
    [
      "an unknown schedule",
      { kind: "pipe", length: "10 m", size: "DN50", schedule: "41" },
      "/edges/0/schedule",
      /unknown schedule "41"; known schedules: 10, 20/,
    ],
    [
      "a size the schedule lacks",
      { kind: "pipe", length: "10 m", size: "DN50", schedule: "100" },
      "/edges/0/size",
      /schedule 100 has no DN50 pipe; its sizes: DN200/,
    ],
    [
      "an unknown material",
      { kind: "pipe", length: "10 m", diameter: 0.05, material: "unobtainium" },
      "/edges/0/material",
      /must be one of "carbon-steel"/,
    ],
    [
      "a material with a roughness",
      { kind: "pipe", length: "10 m", diameter: 0.05, material: "pvc", roughness: "0.1 mm" },
      "/edges/0/material",
      /give either "material" or "roughness"/,
    ],
    [
      "an unknown fitting",
      { kind: "pipe", length: "10 m", diameter: 0.05, fittings: [{ type: "elbow" }] },
      "/edges/0/fittings/0/type",
      /must be one of "elbow-90-threaded"/,
    ],
    [
      "a fitting count of 0",
      { kind: "pipe", length: "10 m", diameter: 0.05, fittings: [{ type: "tee-run", count: 0 }] },
      "/edges/0/fittings/0/count",
      /must be >= 1/,
    ],
    [
      "a fractional fitting count",
      { kind: "pipe", length: "10 m", diameter: 0.05, fittings: [{ type: "tee-run", count: 1.5 }] },
      "/edges/0/fittings/0/count",
      /integer/,
    ],
    // Found untested while checking issue #4's list: every remaining component field.
    ["a negative cv", { kind: "valve", cv: -3 }, "/edges/0/cv", /must be > 0/],
    [
      "a negative opening",
      { kind: "valve", kv: 10, opening: -0.1 },
      "/edges/0/opening",
      /must be >= 0/,
    ],
    ["an xT of 0", { kind: "valve", kv: 10, xT: 0 }, "/edges/0/xT", /must be > 0/],
    [
      "a negative valve pipe diameter",
      { kind: "valve", kv: 10, pipeDiameter: "-5 mm" },
      "/edges/0/pipeDiameter",
      /must be greater than 0 \(got "-5 mm"\)/,
    ],
    [
      "a zero outlet pipe diameter",
      { kind: "valve", kv: 10, pipeDiameter: "50 mm", outletPipeDiameter: "0 mm" },
      "/edges/0/outletPipeDiameter",
      /must be greater than 0 \(got "0 mm"\)/,
    ],
    [
      "a negative valve diameter",
      { kind: "valve", kv: 10, valveDiameter: "-1 mm" },
      "/edges/0/valveDiameter",
      /must be greater than 0/,
    ],
    [
      "a loss coefficient of 0",
      { kind: "check", lossCoefficient: 0, pipeDiameter: "50 mm" },
      "/edges/0/lossCoefficient",
      /must be > 0/,
    ],
    [
      "a check valve with kv and a loss coefficient",
      { kind: "check", kv: 10, lossCoefficient: 2, pipeDiameter: "50 mm" },
      "/edges/0",
      /give only one of "kv", "cv" or "lossCoefficient" \(got kv and lossCoefficient\)/,
    ],
    [
      "a loss coefficient on a regulator",
      { kind: "regulator", lossCoefficient: 3, setpoint: "4 bar(g)" },
      "/edges/0/lossCoefficient",
      /a regulator has no field "lossCoefficient"/,
    ],
    [
      "a zero proportional band",
      { kind: "regulator", kv: 10, setpoint: "4 bar(g)", proportionalBand: "0 bar" },
      "/edges/0/proportionalBand",
      /must be greater than 0/,
    ],
    [
      "a setpoint below vacuum",
      { kind: "regulator", kv: 10, setpoint: "-2 bar(g)" },
      "/edges/0/setpoint",
      /absolute pressure must be greater than 0 Pa \(got "-2 bar\(g\)"/,
    ],
    [
      "a nozzle throat too large for its pipe",
      { kind: "nozzle", boreDiameter: "45 mm", pipeDiameter: "52.5 mm" },
      "/edges/0/boreDiameter",
      /diameter ratio of 0.857; ISO 5167-3 covers nozzles up to 0.8/,
    ],
    [
      "a negative orifice pipe diameter",
      { kind: "orifice", boreDiameter: "10 mm", pipeDiameter: "-5 mm" },
      "/edges/0/pipeDiameter",
      /must be greater than 0/,
    ],
    [
      "a discharge coefficient of 0",
      { kind: "orifice", boreDiameter: "10 mm", dischargeCoefficient: 0 },
      "/edges/0/dischargeCoefficient",
      /must be > 0/,
    ],
    [
      "a size that is a number",
      { kind: "pipe", length: "10 m", size: 80, schedule: "40" },
      "/edges/0/size",
      /must be of type string/,
    ],
  ];
  for (const [what, edge, path, message] of cases) {
    it(`refuses ${what} at ${path}`, () => {
      const issues = issuesOf(edge);
      const found = issues.find((issue) => issue.path === path && message.test(issue.message));
      expect(found, JSON.stringify(issues)).toBeDefined();
    });
  }
});
