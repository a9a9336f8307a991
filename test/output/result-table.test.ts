import { describe, expect, test } from "vitest";
import { formatNumber } from "../../src/output/format-number.js";
import {
  ENGINEERING_CAUTION,
  edgeTable,
  nodeTable,
  resultReport,
} from "../../src/output/result-table.js";
import { notConvergedResult, sampleResult } from "./result-sample.js";

// Unit definitions (not from the code under test): 1 bar = 1e5 Pa (BIPM SI Brochure, Table 8);
// 1 psi = 1 lbf/in2 = 0.45359237 kg x 9.80665 m/s2 / 0.0254^2 m2 (1959 yard and pound, 3rd CGPM).
const PSI = (0.45359237 * 9.80665) / 0.0254 ** 2;

describe("formatNumber", () => {
  test.each([
    [7.013254, 6, "7.01325"],
    [165004.7, 4, "165000"],
    [165004.7, 6, "165005"],
    [-2468013, 3, "-2470000"],
    [0.0213, 4, "0.02130"],
    [0, 5, "0"],
    [-0, 5, "0"],
    [2.5e-13, 2, "2.5e-13"],
    [1.2345678e9, 5, "1.2346e+9"],
    [Number.NaN, 5, "n/a"],
    [Number.POSITIVE_INFINITY, 5, "inf"],
  ])("formatNumber(%d, %d) is %s", (value, digits, text) => {
    expect(formatNumber(value, digits)).toBe(text);
  });
});

describe("nodeTable", () => {
  test("metric: bar(a), bar(g) against the result's ambient, °C, kg/h", () => {
    const table = nodeTable(sampleResult(), "metric");
    expect(table.columns.map((column) => [column.label, column.unit])).toEqual([
      ["id", ""],
      ["kind", ""],
      ["p", "bar(a)"],
      ["p gauge", "bar(g)"],
      ["T", "°C"],
      ["demand", "kg/h"],
    ]);
    // 801325 Pa = 8.01325 bar(a) = 7 bar(g) with 101325 Pa ambient; 293.15 K = 20 °C;
    // -0.25 kg/s = -900 kg/h.
    expect(table.rows[0]).toEqual([
      "SUPPLY",
      "reservoir",
      "8.01325",
      "7.00000",
      "20.000",
      "-900.00",
    ]);
  });

  test("us: psia and psig", () => {
    const table = nodeTable(sampleResult(), "us");
    expect(table.rows[0]?.[2]).toBe(formatNumber(801325 / PSI, 6));
    expect(table.rows[0]?.[2]).toBe("116.222");
    expect(table.rows[0]?.[3]).toBe((700000 / PSI).toPrecision(6));
    expect(table.columns[3]?.unit).toBe("psig");
  });
});

describe("edgeTable", () => {
  test("metric cells: mass flow, pressures, drop, rho v^2 and the CHOKED marker", () => {
    const table = edgeTable(sampleResult(), "metric");
    expect(table.columns.map((column) => column.label)).toEqual([
      "id",
      "from",
      "to",
      "mass flow",
      "p in",
      "p out",
      "Δp",
      "v in",
      "v out",
      "Mach in",
      "Mach out",
      "ρv²",
      "Re",
      "fD",
      "choke ratio",
      "status",
    ]);
    const [main, vent] = table.rows;
    // 0.125 kg/s = 450 kg/h; 800000 Pa = 8 bar(a); 100000 Pa = 1 bar;
    // rho v^2 is the larger end value: 8.3 x 12^2 = 1195.2 Pa against 9.5 x 10^2 = 950 Pa.
    expect(main).toEqual([
      "main, north",
      "SUPPLY",
      "J1",
      "450.00",
      "8.00000",
      "7.00000",
      "1.0000",
      "10.000",
      "12.000",
      "0.03000",
      "0.03500",
      "1195.2",
      "123500",
      "0.02130",
      "0.2500",
      "",
    ]);
    expect(vent?.at(-1)).toBe("CHOKED");
    // The choked exit: 5 x 313^2 = 489845 Pa, shown to 5 significant digits.
    expect(vent?.[11]).toBe("489850");
  });
});

describe("resultReport", () => {
  test("a converged result has no marker; notes and warnings are kept apart", () => {
    const report = resultReport(sampleResult(), "metric");
    expect(report.marker).toBeUndefined();
    expect(report.heading).toBe(
      'network "sample": gas air; ambient 1.01325 bar(a), 20.000 °C; 3 nodes, 2 edges',
    );
    expect(report.notes).toEqual([
      '/nodes/0/pressure: "8.01325 bar" was read as an absolute pressure',
    ]);
    expect(report.warnings).toEqual(["warning: edge VENT is choked"]);
    expect(report.summary).toBe(
      "solver: converged in 4 iterations; largest scaled residual 2.5e-13; throughput 900.00 kg/h",
    );
    expect(report.caution).toBe(ENGINEERING_CAUTION);
    expect(ENGINEERING_CAUTION).toBe(
      "Results are engineering estimates; pressure and relief systems are designed and checked to the applicable codes by qualified engineers.",
    );
  });

  test("the @example: the mass-flow column of the edge table", () => {
    expect(resultReport(sampleResult(), "metric").edges.columns[3]).toEqual({
      label: "mass flow",
      unit: "kg/h",
      align: "right",
    });
  });

  test("a result that is not converged is marked NOT A SOLUTION with its reason", () => {
    const report = resultReport(notConvergedResult(), "si");
    expect(report.marker).toBe(
      "NOT A SOLUTION: not converged after 4 iterations (iterations); largest scaled residual 1.00e-2",
    );
    expect(report.warnings).toEqual(["warning: edge VENT is choked"]);
    expect(report.summary).toMatch(/^solver: NOT converged after 4 iterations;/);
  });

  test("a result with no solution is marked with the diagnosis message", () => {
    const result = sampleResult();
    result.converged = false;
    result.status = "no-solution";
    result.diagnosis = {
      largestFeasibleDemandScale: 0.5,
      limitingEdges: [{ id: "VENT", capacity: 0.125, massFlow: 0.125 }],
      openEquations: [],
      message: "no solution: the supplies can deliver only 50.0 % of the stated demands",
    };
    const report = resultReport(result, "metric");
    expect(report.marker).toBe(
      "NOT A SOLUTION: no solution: the supplies can deliver only 50.0 % of the stated demands",
    );
    expect(report.summary).toMatch(/^solver: no solution/);
  });
});
