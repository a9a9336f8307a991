/**
 * The heat-transfer example (docs/examples/winter-vent-riser.json) solves, and its results obey
 * checks computed here from the result's own nodes and edges and from the document.
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { checkNetwork, type NetworkDocument, solveNetwork } from "../../src/index.js";

const document = JSON.parse(
  readFileSync(new URL("../../docs/examples/winter-vent-riser.json", import.meta.url), "utf8"),
) as NetworkDocument;
const result = solveNetwork(document);
const STANDARD_GRAVITY = 9.80665; // m/s2, CGPM 1901

describe("example winter-vent-riser.json", () => {
  it("passes checkNetwork and solves with status converged", () => {
    expect(checkNetwork(document).issues).toEqual([]);
    expect(result.status).toBe("converged");
    expect(result.warnings.filter((warning) => warning.code === "continuation")).toEqual([]);
  });

  it("closes the first law of the whole network to 1e-9, recomputed from nodes and edges", () => {
    // Enthalpy flows cp T (calorically perfect gas, from the result's gas), injections and the
    // reservoir outflow; heat from the edges; lift m g dz from the node elevations.
    const gamma = result.gas.heatCapacityRatio;
    const cp = (gamma * result.gas.specificGasConstant) / (gamma - 1);
    const injectedTemperature: Record<string, number> = { "DRYER-OUT": 453.15, PURGE: 393.15 };
    let enthalpyIn = 0;
    let enthalpyOut = 0;
    for (const node of result.nodes) {
      if (node.demand < 0) {
        enthalpyIn += -node.demand * cp * (injectedTemperature[node.id] as number);
      }
    }
    const elevation = new Map(result.nodes.map((node) => [node.id, node.elevation]));
    let heat = 0;
    let lift = 0;
    for (const edge of result.edges) {
      heat += edge.heatFlow;
      const rise = (elevation.get(edge.to) ?? 0) - (elevation.get(edge.from) ?? 0);
      lift += edge.massFlow * STANDARD_GRAVITY * rise;
      // Gas arriving at the tip carries its stagnation enthalpy out of the network.
      if (edge.to === "TIP") enthalpyOut += edge.massFlow * cp * edge.outlet.stagnationTemperature;
    }
    const imbalance = (enthalpyIn + heat - lift - enthalpyOut) / enthalpyIn;
    // The outlet state's stagnation temperature is the integrated static one plus v^2/(2 cp),
    // the arrival temperature the first law's h0 + Q/m - g dz: both agree to the integration
    // tolerance (1e-10 of the temperature change, times the steps), far below 1e-9 of cp T.
    expect(Math.abs(imbalance)).toBeLessThan(1e-9);
    expect(Math.abs(result.balance.energyImbalance)).toBeLessThan(1e-9);
    expect(result.balance.heatIn / heat).toBeCloseTo(1, 12);
    expect(result.balance.potentialEnergyGain / lift).toBeCloseTo(1, 9);
  });

  it("cools the gas towards the surrounding air in every bare pipe, never below it", () => {
    for (const edge of result.edges) {
      expect(edge.heatFlow).toBeLessThan(0);
      expect(edge.outlet.temperature).toBeGreaterThan(253.15);
    }
    // The bare header loses far more than the insulated lateral (12 vs 0.8 W/(m2 K)).
    const header = result.edges.find((edge) => edge.id === "HEADER");
    const lateral = result.edges.find((edge) => edge.id === "LATERAL");
    expect(header && lateral && header.heatFlow < 50 * lateral.heatFlow).toBe(true);
  });

  it("cools the header as the exponential approach to the surroundings at its low Mach number", () => {
    // F. P. Incropera et al., Fundamentals of Heat and Mass Transfer, 6th ed., 2007, eq. 8.42b:
    // T_out - Ts = (T_in - Ts) exp(-U' L / (m cp)), U' = U pi D. At Mach 0.09 kinetic energy and
    // friction heating are below 1e-2 of the temperature drop: 2 % tolerance.
    const header = result.edges.find((edge) => edge.id === "HEADER");
    if (!header) throw new Error("no HEADER");
    const gamma = result.gas.heatCapacityRatio;
    const cp = (gamma * result.gas.specificGasConstant) / (gamma - 1);
    const diameter = 0.15408; // DN 150 Sch 40, ASME B36.10M
    const perLength = 12 * Math.PI * diameter;
    const surroundings = 258.15;
    const expected =
      surroundings +
      (header.inlet.temperature - surroundings) *
        Math.exp((-perLength * 120) / (header.massFlow * cp));
    const drop = header.inlet.temperature - expected;
    expect(Math.abs(header.outlet.temperature - expected) / drop).toBeLessThan(2e-2);
  });
});
