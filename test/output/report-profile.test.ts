/**
 * The profile of the report: the path it follows on the example networks (checked against the
 * flows that docs/examples/README.md describes), its points, and the charts' choke limits.
 */

import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { findProfilePath, type ProfilePath } from "../../src/output/report/profile-path.js";
import { interiorState, profilePoints } from "../../src/output/report/profile-points.js";
import { profileChartsSvg } from "../../src/output/report/profile-svg.js";
import type { EdgeResult } from "../../src/results/result-types.js";
import { example, exampleJson, solved } from "./report-examples.js";

function pathOf(
  name: Parameters<typeof example>[0],
  options: { to?: string; from?: string } = {},
): ProfilePath {
  const { document, result } = example(name);
  const found = findProfilePath(document, result, options);
  if (!found.ok) throw new Error(found.message);
  return found.path;
}

/** Length of an example's pipe in metres, from its text "35 m". */
function lengthOf(name: Parameters<typeof example>[0], id: string): number {
  const text = exampleJson(name).edges.find((edge) => edge.id === id)?.length ?? "";
  const match = text.match(/^([\d.]+) m$/);
  if (!match) throw new Error(`length of ${id} is not in metres: ${text}`);
  return Number(match[1]);
}

describe("findProfilePath", () => {
  it("runs to the worst consumer of the workshop ring, upstream along the largest inflows", () => {
    // README: the CNC bay is the worst consumer; it hangs from RC, which RING-BC feeds from RB,
    // which RING-AB feeds from the feed tee RA.
    const path = pathOf("workshop-ring-main");
    expect(path.nodes).toEqual(["R-101", "RA", "RB", "RC", "CNC-BAY"]);
    expect(path.steps.map((step) => step.edgeId)).toEqual([
      "FEED",
      "RING-AB",
      "RING-BC",
      "DROP-CNC",
    ]);
    expect(path.followsFlow).toBe(true);
  });

  it("runs from the largest relief valve to the atmosphere in the vent header", () => {
    // README: RV-101 (1.4 kg/s) outweighs RV-102 (0.8) at HDR-1, and RV-101 + RV-102 (2.2)
    // outweigh RV-103 (0.45) at HDR-2; the stack discharges into the reservoir ATMOSPHERE.
    const path = pathOf("vent-collection-header");
    expect(path.nodes).toEqual(["RV-101", "LAT-101", "HDR-1", "HDR-2", "STACK-BASE", "ATMOSPHERE"]);
    expect(path.steps.map((step) => step.edgeId)).toEqual([
      "TAIL-101",
      "LAT-101-RUN",
      "HDR-12",
      "HDR-STACK",
      "STACK",
    ]);
  });

  it("follows a pipe against its declared direction when the flow runs that way", () => {
    // README: HDR-34 has a negative flow: it brings the east gas from H4 to H3.
    const path = pathOf("nitrogen-tank-header", { from: "PCV-2", to: "TK-404" });
    expect(path.nodes).toEqual(["PCV-2", "H4", "H3", "SPUR", "TK-404"]);
    expect(path.steps.map((step) => [step.edgeId, step.alongFlow])).toEqual([
      ["EAST-TIE", true],
      ["HDR-34", true],
      ["SPUR-RUN", true],
      ["BR-404", true],
    ]);
    expect(path.followsFlow).toBe(true);
  });

  it("takes the path with the fewest pipes when the flow from the start does not reach the end", () => {
    // Both tank-header reservoirs supply: no gas flows into PCV-2.
    const path = pathOf("nitrogen-tank-header", { from: "VAP-1", to: "PCV-2" });
    expect(path.nodes).toEqual(["VAP-1", "H1", "H2", "H3", "H4", "PCV-2"]);
    expect(path.followsFlow).toBe(false);
    expect(path.steps.map((step) => step.alongFlow)).toEqual([true, true, true, false, false]);
  });

  it("names an unknown node and lists the defined ones", () => {
    const { document, result } = example("workshop-ring-main");
    const found = findProfilePath(document, result, { to: "CNC" });
    expect(found).toMatchObject({ ok: false, code: "unknown-node", option: "to" });
    if (!found.ok)
      expect(found.message).toMatch(/^no node "CNC" in the network; nodes are R-101, RA, RB/);
    expect(findProfilePath(document, result, { from: "RA", to: "RA" })).toMatchObject({
      ok: false,
      code: "same-node",
    });
  });
});

describe("profilePoints", () => {
  it("measures distance as the sum of the pipe lengths of the path", () => {
    const { document, result } = example("workshop-ring-main");
    const points = profilePoints(document, result, pathOf("workshop-ring-main"));
    const total = ["FEED", "RING-AB", "RING-BC", "DROP-CNC"].reduce(
      (sum, id) => sum + lengthOf("workshop-ring-main", id),
      0,
    );
    expect(total).toBe(119);
    expect(points[0]).toMatchObject({ place: "node", id: "R-101", distance: 0 });
    expect(points[points.length - 1]).toMatchObject({ place: "node", id: "CNC-BAY" });
    // Sums of lengths in SI: exact to rounding.
    expect(points[points.length - 1]?.distance).toBeCloseTo(119, 10);
    for (let index = 1; index < points.length; index++) {
      expect(points[index]?.distance).toBeGreaterThanOrEqual(points[index - 1]?.distance ?? 0);
    }
  });

  it("uses the result's pipe end states and node pressures", () => {
    const { document, result } = example("vent-collection-header");
    const points = profilePoints(document, result, pathOf("vent-collection-header"));
    const tail = result.edges.find((edge) => edge.id === "TAIL-101") as EdgeResult;
    const entry = points.find((point) => point.id === "TAIL-101" && point.place === "entry");
    const exit = points.find((point) => point.id === "TAIL-101" && point.place === "exit");
    expect(entry?.pressure).toBe(tail.inlet.pressure);
    expect(exit?.pressure).toBe(tail.outlet.pressure);
    expect(exit?.mach).toBe(tail.outlet.mach);
    const atmosphere = points[points.length - 1];
    expect(atmosphere?.pressure).toBe(
      result.nodes.find((node) => node.id === "ATMOSPHERE")?.pressure,
    );
  });

  it("puts interior points on the pipe's own Fanno line: their end reaches the outlet state", () => {
    // A consistency check: the Fanno relations from the inlet state over the whole friction
    // parameter fD L/D + K must land on the solver's outlet (which solved the same relation).
    // 1e-6 relative: the solver's tolerance (1e-9 scaled residual) leaves the states this close.
    for (const name of ["vent-collection-header", "nitrogen-tank-header"] as const) {
      const { document, result } = example(name);
      result.edges.forEach((edge, index) => {
        const input = document.edges[index];
        if (!input) throw new Error("edge without input");
        const end = interiorState(
          edge,
          input.length,
          input.diameter,
          input.minorLoss,
          result.gas.heatCapacityRatio,
          1,
        );
        expect(end, edge.id).toBeDefined();
        expect(Math.abs((end?.mach ?? 0) / edge.outlet.mach - 1), edge.id).toBeLessThan(1e-6);
        expect(Math.abs((end?.pressure ?? 0) / edge.outlet.pressure - 1), edge.id).toBeLessThan(
          1e-6,
        );
      });
    }
  });

  it("has pressure falling and Mach rising inside each subsonic pipe, in the direction of flow", () => {
    const { document, result } = example("vent-collection-header");
    const points = profilePoints(document, result, pathOf("vent-collection-header"));
    for (const id of ["TAIL-101", "LAT-101-RUN", "STACK"]) {
      const inPipe = points.filter((point) => point.id === id && point.place !== "node");
      expect(inPipe.length).toBeGreaterThan(5);
      for (let index = 1; index < inPipe.length; index++) {
        expect(inPipe[index]?.pressure).toBeLessThan(inPipe[index - 1]?.pressure ?? 0);
        expect(inPipe[index]?.mach).toBeGreaterThan(inPipe[index - 1]?.mach ?? 0);
      }
    }
  });
});

describe("profileChartsSvg", () => {
  it("draws the Mach 1 choke limit on the vent path, where the tailpipe reaches it", () => {
    const { document, result } = example("vent-collection-header");
    const points = profilePoints(document, result, pathOf("vent-collection-header"));
    const { mach, pressure } = profileChartsSvg(points, document, result, {
      units: "metric",
      standalone: true,
    });
    const limits = [...mach.matchAll(/class="mn-choke-limit" data-choke-limit="([^"]*)"/g)].map(
      (match) => match[1],
    );
    // One limit segment per pipe of the path, all adiabatic: Mach 1.
    expect(limits).toEqual(["1", "1", "1", "1", "1"]);
    expect(mach).toContain("choke limit: Mach 1 (adiabatic)");
    // The document's own design limit, Mach 0.7.
    expect(mach).toContain('data-design-limit="0.7"');
    expect(mach).toContain("Mach number [-]");
    expect(pressure).toContain("pressure [bar(a)]");
    expect(pressure).toContain("distance along the path [m]");
  });

  it("names the isothermal limit 1/sqrt(gamma) when the path has an isothermal pipe", () => {
    const { document, result } = example("nitrogen-tank-header");
    const path = pathOf("nitrogen-tank-header");
    expect(path.steps[0]?.edgeId).toBe("RACK-RUN");
    const points = profilePoints(document, result, path);
    const { mach, pressure } = profileChartsSvg(points, document, result, {
      units: "us",
      standalone: false,
    });
    const limit = (1 / Math.sqrt(result.gas.heatCapacityRatio)).toFixed(3);
    // Mach on this path stays below 0.03: the limits are far above the scale and named in a note.
    expect(mach).toContain("choke limit above this scale");
    expect(mach).toContain(`1/√γ = ${limit} (isothermal`);
    expect(mach).toContain("Mach 1 (adiabatic)");
    expect(pressure).toContain("pressure [psia]");
    expect(pressure).toContain("distance along the path [ft]");
    expect(pressure).not.toContain("xmlns");
  });
});

describe("profile of heat-transfer pipes", () => {
  it("draws only the two ends of a heat-transfer pipe: the closed forms do not apply inside", () => {
    const { document, result } = solved(
      JSON.parse(
        readFileSync(
          new URL("../../docs/examples/winter-vent-riser.json", import.meta.url),
          "utf8",
        ),
      ),
    );
    const found = findProfilePath(document, result, {});
    if (!found.ok) throw new Error(found.message);
    const points = profilePoints(document, result, found.path);
    const heatPipes = new Set(
      result.edges.filter((edge) => edge.model === "heat-transfer").map((edge) => edge.id),
    );
    const onPath = points.filter((point) => heatPipes.has(point.id));
    // The example's path runs through heat-transfer pipes (every pipe of it is one).
    expect(onPath.length).toBeGreaterThan(0);
    expect(onPath.some((point) => point.place === "interior")).toBe(false);
    expect(onPath.some((point) => point.place === "entry")).toBe(true);
    expect(onPath.some((point) => point.place === "exit")).toBe(true);
  });
});
