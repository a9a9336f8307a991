/**
 * The component tables of the table and CSV outputs: each component with the figures of its own
 * kind, in display units. The result is hand-made (round SI numbers worked out by hand), so the
 * formatters are tested on their own.
 */
import { describe, expect, test } from "vitest";
import { resultCsv } from "../../src/output/result-csv.js";
import { componentTables, resultReport } from "../../src/output/result-table.js";
import type {
  ComponentDetails,
  EdgeResult,
  NetworkResult,
} from "../../src/results/result-types.js";
import { sampleResult } from "./result-sample.js";

// Unit definitions (not from the code under test): 1 bar = 1e5 Pa (BIPM SI Brochure, Table 8);
// 1 psi = 0.45359237 kg x 9.80665 m/s2 / 0.0254^2 m2; 1 h = 3600 s.
const PSI = (0.45359237 * 9.80665) / 0.0254 ** 2;

function componentEdge(id: string, component: ComponentDetails, choked = false): EdgeResult {
  const pipe = sampleResult().edges[0] as EdgeResult;
  return { ...pipe, id, kind: component.kind, from: "J1", to: "ATM", choked, component };
}

/** The sample network with one component of each kind after its two pipes. */
function resultWithComponents(): NetworkResult {
  const result = sampleResult();
  result.edges.push(
    componentEdge(
      "RO-1",
      {
        kind: "orifice",
        diameterRatio: 0.25,
        dischargeCoefficient: 0.6,
        pressureRatio: 0.5283,
        criticalPressureRatio: 0.5283,
        differentialPressure: 330000,
        permanentPressureLoss: 600000,
        expansibility: 0.875,
      },
      true,
    ),
    componentEdge("PCV-1", {
      kind: "regulator",
      state: "regulating",
      setpoint: 501325,
      setpointDeviation: -2500,
      opening: 0.5,
      pressureDifferentialRatio: 0.25,
      chokedPressureDifferentialRatio: 0.7,
      expansionFactor: 0.875,
      leakage: 0,
    }),
    componentEdge("FN-1", {
      kind: "nozzle",
      diameterRatio: 0.5,
      dischargeCoefficient: 0.985,
      pressureRatio: 0.75,
      criticalPressureRatio: 0.5,
      differentialPressure: 100000,
      permanentPressureLoss: 50000,
      expansibility: 0.9,
    }),
    componentEdge("FCV-1", {
      kind: "valve",
      state: "open",
      opening: 0.75,
      flowCoefficient: 40,
      pipingGeometryFactor: 0.98,
      pressureDifferentialRatio: 0.125,
      chokedPressureDifferentialRatio: 0.7,
      expansionFactor: 0.9375,
      leakage: 0,
    }),
    componentEdge("NRV-1", {
      kind: "check",
      state: "closed",
      pressureDifferentialRatio: 0.0625,
      chokedPressureDifferentialRatio: 0.7,
      expansionFactor: 0.97,
      leakage: -3.6e-10,
    }),
  );
  return result;
}

function labels(table: { columns: { label: string; unit: string }[] }): string[] {
  return table.columns.map((column) =>
    column.unit === "" ? column.label : `${column.label} [${column.unit}]`,
  );
}

describe("component tables (table format)", () => {
  test("one table per group of kinds present, in a fixed order, pipes left out", () => {
    const tables = componentTables(resultWithComponents(), "metric");
    expect(tables.map((table) => [table.title, table.rows.map((row) => row[0])])).toEqual([
      ["Orifices and nozzles", ["RO-1", "FN-1"]],
      ["Control valves", ["FCV-1"]],
      ["Regulators", ["PCV-1"]],
      ["Check valves", ["NRV-1"]],
    ]);
    expect(componentTables(sampleResult(), "metric")).toEqual([]);
    expect(resultReport(sampleResult(), "metric").components).toEqual([]);
  });

  test("orifices and nozzles: ratios, choke limit, tap differential, permanent loss in bar, CHOKED", () => {
    const [restrictions] = componentTables(resultWithComponents(), "metric");
    expect(labels(restrictions as NonNullable<typeof restrictions>)).toEqual([
      "id",
      "kind",
      "from",
      "to",
      "d/D",
      "C",
      "p ratio",
      "critical",
      "Δp taps [bar]",
      "loss [bar]",
      "ε",
      "status",
    ]);
    // 330000 Pa = 3.3 bar, 600000 Pa = 6 bar.
    expect(restrictions?.rows[0]).toEqual([
      "RO-1",
      "orifice",
      "J1",
      "ATM",
      "0.2500",
      "0.6000",
      "0.5283",
      "0.5283",
      "3.3000",
      "6.0000",
      "0.8750",
      "CHOKED",
    ]);
    expect(restrictions?.rows[1]?.at(-1)).toBe("");
  });

  test("valves, regulators and check valves: state, opening, Kv, x against its choke limit, Y, leakage", () => {
    const [, valves, regulators, checks] = componentTables(resultWithComponents(), "metric");
    expect(labels(valves as NonNullable<typeof valves>)).toEqual([
      "id",
      "from",
      "to",
      "state",
      "opening",
      "Kv [m3/h]",
      "Fp",
      "x",
      "x choked",
      "Y",
      "leakage [kg/h]",
      "status",
    ]);
    expect(valves?.rows[0]).toEqual([
      "FCV-1",
      "J1",
      "ATM",
      "open",
      "0.7500",
      "40.000",
      "0.9800",
      "0.1250",
      "0.7000",
      "0.9375",
      "0",
      "",
    ]);
    expect(labels(regulators as NonNullable<typeof regulators>)).toEqual([
      "id",
      "from",
      "to",
      "state",
      "setpoint [bar(a)]",
      "deviation [bar]",
      "opening",
      "x",
      "x choked",
      "Y",
      "leakage [kg/h]",
      "status",
    ]);
    // 501325 Pa = 5.01325 bar(a); -2500 Pa = -0.025 bar.
    expect(regulators?.rows[0]?.slice(3, 7)).toEqual([
      "regulating",
      "5.01325",
      "-0.025000",
      "0.5000",
    ]);
    // -3.6e-10 kg/s = -1.296e-6 kg/h.
    expect(checks?.rows[0]).toEqual([
      "NRV-1",
      "J1",
      "ATM",
      "closed",
      "0.06250",
      "0.7000",
      "0.9700",
      "-1.2960e-6",
      "",
    ]);
  });

  test("us units: setpoint in psia, deviation in psi", () => {
    const regulators = componentTables(resultWithComponents(), "us")[2];
    expect(labels(regulators as NonNullable<typeof regulators>).slice(4, 6)).toEqual([
      "setpoint [psia]",
      "deviation [psi]",
    ]);
    // Printed to 6 (pressure) and 5 significant digits.
    expect(regulators?.rows[0]?.[4]).toBe((501325 / PSI).toPrecision(6));
    expect(regulators?.rows[0]?.[5]).toBe((-2500 / PSI).toPrecision(5));
  });
});

describe("component table (CSV)", () => {
  test("one row per component in result order, every figure a column, empty where the kind has none", () => {
    const rows = resultCsv(resultWithComponents(), { table: "components", units: "si" })
      .trimEnd()
      .split("\n");
    expect(rows[0]).toBe(
      "id,kind,from,to,state,diameter ratio,discharge coefficient,tap pressure ratio,critical pressure ratio,tap differential pressure [Pa],permanent pressure loss [Pa],expansibility,setpoint [Pa],setpoint deviation [Pa],opening,flow coefficient Kv [m3/h],piping geometry factor,pressure differential ratio,choked pressure differential ratio,expansion factor,leakage [kg/s],status",
    );
    expect(rows.slice(1).map((row) => row.split(",")[0])).toEqual([
      "RO-1",
      "PCV-1",
      "FN-1",
      "FCV-1",
      "NRV-1",
    ]);
    expect(rows[1]).toBe(
      "RO-1,orifice,J1,ATM,,0.25,0.6,0.5283,0.5283,330000,600000,0.875,,,,,,,,,,CHOKED",
    );
    expect(rows[2]).toBe(
      "PCV-1,regulator,J1,ATM,regulating,,,,,,,,501325,-2500,0.5,,,0.25,0.7,0.875,0,",
    );
    expect(rows[5]).toBe("NRV-1,check,J1,ATM,closed,,,,,,,,,,,,,0.0625,0.7,0.97,-3.6e-10,");
  });

  test("metric units: pressures in bar, leakage in kg/h; a network without components has the header only", () => {
    const rows = resultCsv(resultWithComponents(), { table: "components" }).split("\n");
    expect(rows[0]).toContain("setpoint [bar(a)],setpoint deviation [bar]");
    expect(rows[2]?.split(",").slice(12, 14).map(Number)).toEqual([5.01325, -0.025]);
    expect(Number(rows[5]?.split(",")[20])).toBeCloseTo(-3.6e-10 * 3600, 20);
    expect(resultCsv(sampleResult(), { table: "components" }).split("\n").length).toBe(2);
  });
});
