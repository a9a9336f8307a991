/**
 * The heat columns of the edge table and CSV: shown when an edge exchanges heat, with the outlet
 * temperature and the heat flow in display units, and left out otherwise.
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { solveNetwork } from "../../src/index.js";
import { resultCsv } from "../../src/output/result-csv.js";
import { edgeTable } from "../../src/output/result-table.js";
import { sampleResult } from "./result-sample.js";

const riser = JSON.parse(
  readFileSync(new URL("../../docs/examples/winter-vent-riser.json", import.meta.url), "utf8"),
);

describe("heat columns", () => {
  const result = solveNetwork(riser);

  it("are shown for a network with heat-transfer pipes, in kW and degC (metric)", () => {
    expect(result.status).toBe("converged");
    const table = edgeTable(result, "metric");
    const labels = table.columns.map((column) => [column.label, column.unit]);
    expect(labels).toContainEqual(["T out", "°C"]);
    expect(labels).toContainEqual(["Q", "kW"]);
    const q = labels.findIndex(([label]) => label === "Q");
    // Each row's Q is the edge's heat flow in kW (1 kW = 1000 W, SI Brochure).
    result.edges.forEach((edge, row) => {
      const cell = Number(table.rows[row]?.[q]);
      expect(Math.abs(cell - edge.heatFlow / 1000)).toBeLessThanOrEqual(
        Math.abs(edge.heatFlow / 1000) * 1e-4 + 1e-9,
      );
    });
    // The vent loses heat to winter air: some pipe has Q < 0.
    expect(result.edges.some((edge) => edge.heatFlow < 0)).toBe(true);
  });

  it("are in the CSV header with their units (SI: K and W)", () => {
    const header = resultCsv(result, { units: "si" }).split("\n")[0] ?? "";
    expect(header).toContain("outlet temperature [K]");
    expect(header).toContain("heat flow [W]");
  });

  it("are left out when every pipe is adiabatic", () => {
    const adiabatic = sampleResult();
    expect(adiabatic.edges.every((edge) => edge.heatFlow === 0)).toBe(true);
    expect(edgeTable(adiabatic, "metric").columns.map((column) => column.label)).not.toContain("Q");
  });
});
