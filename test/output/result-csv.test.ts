import { describe, expect, test } from "vitest";
import { csvField, resultCsv } from "../../src/output/result-csv.js";
import { notConvergedResult, sampleResult } from "./result-sample.js";

describe("resultCsv", () => {
  test("edges, SI: the header of the @example and one row per edge", () => {
    const rows = resultCsv(sampleResult(), { units: "si" }).split("\n");
    expect(rows[0]).toBe(
      "id,from,to,mass flow [kg/s],inlet pressure [Pa],outlet pressure [Pa],pressure drop [Pa],inlet velocity [m/s],outlet velocity [m/s],inlet Mach,outlet Mach,rho v2 [Pa],Reynolds,Darcy friction factor,choke ratio,status",
    );
    // SI values pass through unchanged, at full precision; the id with a comma is quoted.
    expect(rows[1]).toBe(
      '"main, north",SUPPLY,J1,0.125,800000,700000,100000,10,12,0.03,0.035,1195.2,123456.7,0.0213,0.25,',
    );
    expect(rows[2]?.endsWith(",CHOKED")).toBe(true);
    expect(rows).toHaveLength(4);
    expect(rows[3]).toBe("");
  });

  test("metric is the default unit set and edges the default table", () => {
    const rows = resultCsv(sampleResult()).split("\n");
    expect(rows[0]).toMatch(/^id,from,to,mass flow \[kg\/h\],inlet pressure \[bar\(a\)\],/);
    // 0.125 kg/s x 3600 s/h = 450 kg/h; 800000 Pa / 1e5 Pa/bar = 8 bar.
    const cells = rows[1]?.split(/,(?=(?:[^"]*"[^"]*")*[^"]*$)/) ?? [];
    expect(Number(cells[3])).toBeCloseTo(450, 10);
    expect(Number(cells[4])).toBeCloseTo(8, 12);
  });

  test("nodes: gauge pressure against the result's ambient", () => {
    const rows = resultCsv(sampleResult(), { table: "nodes", units: "si" }).split("\n");
    expect(rows[0]).toBe(
      "id,kind,pressure [Pa],gauge pressure [Pa(g)],temperature [K],demand [kg/s]",
    );
    expect(rows[1]).toBe("SUPPLY,reservoir,801325,700000,293.15,-0.25");
  });

  test("a result that is not a solution starts with a comment line", () => {
    const rows = resultCsv(notConvergedResult()).split("\n");
    expect(rows[0]).toBe(
      "# NOT A SOLUTION: not converged after 4 iterations (iterations); largest scaled residual 1.00e-2",
    );
    expect(rows[1]).toMatch(/^id,from,to,/);
  });
});

describe("csvField", () => {
  test.each([
    ["plain", "plain"],
    ["a,b", '"a,b"'],
    ['say "hi"', '"say ""hi"""'],
    ["two\nlines", '"two\nlines"'],
    ["#1", '"#1"'],
  ])("%j is written %j (RFC 4180 quoting)", (text, field) => {
    expect(csvField(text)).toBe(field);
  });
});
