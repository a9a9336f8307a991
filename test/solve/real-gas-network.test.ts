/**
 * Networks of heat-transfer pipes with cp(T) (NASA polynomials) and a real gas (Peng-Robinson):
 * junction mixing by enthalpy, the Joule-Thomson drop of a long adiabatic line, the network
 * first-law balance, and the refusal of closed-form pipes and components.
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import {
  checkNetwork,
  type NetworkDocument,
  type NetworkResult,
  solveNetwork,
} from "../../src/index.js";

function edgeOf(result: NetworkResult, id: string) {
  const found = result.edges.find((edge) => edge.id === id);
  if (!found) throw new Error(`no edge ${id}`);
  return found;
}
function nodeOf(result: NetworkResult, id: string) {
  const found = result.nodes.find((node) => node.id === id);
  if (!found) throw new Error(`no node ${id}`);
  return found;
}
function solved(document: NetworkDocument): NetworkResult {
  const result = solveNetwork(document);
  expect(result.status).toBe("converged");
  return result;
}

// Invented data: a cold and a hot nitrogen stream meeting at a tee, through short pipes with no
// heat exchange (so each arrives with its own stagnation enthalpy).
function tee(heatCapacity: "constant" | "nasa7"): NetworkDocument {
  return {
    name: "nitrogen tee",
    settings: { pipeModel: "heat-transfer" },
    gas: { preset: "nitrogen", heatCapacity },
    nodes: [
      { id: "COLD", kind: "reservoir", pressure: "5 bar", temperature: "250 K" },
      { id: "HOT", kind: "reservoir", pressure: "5 bar", temperature: "600 K" },
      { id: "TEE", kind: "junction" },
      { id: "OUT", kind: "reservoir", pressure: "4 bar", temperature: "300 K" },
    ],
    edges: [
      { id: "C", kind: "pipe", from: "COLD", to: "TEE", length: "20 m", diameter: "50 mm" },
      { id: "H", kind: "pipe", from: "HOT", to: "TEE", length: "20 m", diameter: "50 mm" },
      { id: "O", kind: "pipe", from: "TEE", to: "OUT", length: "20 m", diameter: "80 mm" },
    ],
  } as NetworkDocument;
}

/**
 * Nitrogen's ideal-gas enthalpy over R [K] from the NASA 7-coefficient polynomial, low range
 * (200-1000 K): H/R = a1 T + a2 T^2/2 + a3 T^3/3 + a4 T^4/4 + a5 T^5/5 + a6. Coefficients of N2
 * as published by Burcat (Third Millennium Ideal Gas and Condensed Phase Thermochemical
 * Database, the set also in McBride, Zehe and Gordon, NASA TP-2002-211556), from memory;
 * confirmed below by cp(298.15 K) = 29.124 J/(mol K) of NIST-JANAF (Chase 1998).
 */
const N2_LOW = [3.53100528, -1.23660988e-4, -5.02999433e-7, 2.43530612e-9, -1.40881235e-12];
function n2CpOverR(t: number): number {
  const [a1, a2, a3, a4, a5] = N2_LOW as [number, number, number, number, number];
  return a1 + t * (a2 + t * (a3 + t * (a4 + t * a5)));
}
function n2EnthalpyOverR(t: number): number {
  const [a1, a2, a3, a4, a5] = N2_LOW as [number, number, number, number, number];
  return t * (a1 + t * (a2 / 2 + t * (a3 / 3 + t * (a4 / 4 + t * (a5 / 5)))));
}

describe("junction mixing by enthalpy with cp(T)", () => {
  it("the closed-form polynomial is the published one (NIST-JANAF cp of N2 at 298.15 K)", () => {
    // 29.124 J/(mol K) in the JANAF table; the fit reproduces it to its stated 0.1 %.
    expect(n2CpOverR(298.15) * 8.314462618).toBeCloseTo(29.124, 1);
  });

  it("mixes 250 K and 600 K nitrogen at the temperature of the enthalpy balance", () => {
    const result = solved(tee("nasa7"));
    const cold = edgeOf(result, "C").massFlow;
    const hot = edgeOf(result, "H").massFlow;
    expect(cold).toBeGreaterThan(0);
    expect(hot).toBeGreaterThan(0);
    // Solve m_c (H(250) - H(T)) + m_h (H(600) - H(T)) = 0 for T by bisection in the polynomial.
    const target = (cold * n2EnthalpyOverR(250) + hot * n2EnthalpyOverR(600)) / (cold + hot);
    let low = 250;
    let high = 600;
    for (let i = 0; i < 200; i++) {
      const mid = 0.5 * (low + high);
      if (n2EnthalpyOverR(mid) < target) low = mid;
      else high = mid;
    }
    const expected = 0.5 * (low + high);
    const constantCp = (cold * 250 + hot * 600) / (cold + hot);
    const junction = nodeOf(result, "TEE").temperature;
    // The solver accepts a junction temperature error of 1e-6 T_ref (0.6 mK at 600 K).
    expect(Math.abs(junction - expected)).toBeLessThan(1e-3);
    // cp rises from 29.1 to 30.1 J/(mol K) between the two: the hot stream carries more
    // enthalpy per kelvin, and the mixed temperature is higher than the constant-cp average.
    expect(expected - constantCp).toBeGreaterThan(0.5);
    expect(junction - constantCp).toBeGreaterThan(0.5);
    expect(Math.abs(result.balance.energyImbalance)).toBeLessThan(1e-9);
  });

  it("mixes at the flow-weighted mean temperature with constant cp", () => {
    const result = solved(tee("constant"));
    const cold = edgeOf(result, "C").massFlow;
    const hot = edgeOf(result, "H").massFlow;
    const mean = (cold * 250 + hot * 600) / (cold + hot);
    expect(Math.abs(nodeOf(result, "TEE").temperature - mean)).toBeLessThan(1e-3);
  });
});
