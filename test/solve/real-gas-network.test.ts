/**
 * Networks of heat-transfer pipes with cp(T) (NASA polynomials) and a real gas (Peng-Robinson):
 * junction mixing by enthalpy, the Joule-Thomson drop of a long adiabatic line, the network
 * first-law balance; and networks mixing adiabatic and isothermal pipes with components.
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
function tee(heatCapacity: "constant" | "nasa7", preset = "nitrogen"): NetworkDocument {
  return {
    name: `${preset} tee`,
    settings: { pipeModel: "heat-transfer" },
    gas: { preset, heatCapacity },
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

  it("mixes natural gas (nasa7: its alkanes' fitted cp(T)) above the constant-cp mean, closing to 1e-9", () => {
    // Natural gas is 96.5 % methane, whose cp rises by half between 250 and 600 K (34.2 to
    // 52.7 J/(mol K)): the hot stream carries more enthalpy per kelvin, and the mixed
    // temperature lies well above the flow-weighted mean (about 15 K for equal flows with cp
    // linear in T; bound 5 K).
    const result = solved(tee("nasa7", "natural-gas"));
    const cold = edgeOf(result, "C").massFlow;
    const hot = edgeOf(result, "H").massFlow;
    const mean = (cold * 250 + hot * 600) / (cold + hot);
    expect(nodeOf(result, "TEE").temperature - mean).toBeGreaterThan(5);
    expect(Math.abs(result.balance.energyImbalance)).toBeLessThan(1e-9);
    expect(result.balance.largestEnergyImbalance).toBeLessThan(1e-9);
  });

  it("mixes at the flow-weighted mean temperature with constant cp", () => {
    const result = solved(tee("constant"));
    const cold = edgeOf(result, "C").massFlow;
    const hot = edgeOf(result, "H").massFlow;
    const mean = (cold * 250 + hot * 600) / (cold + hot);
    expect(Math.abs(nodeOf(result, "TEE").temperature - mean)).toBeLessThan(1e-3);
  });
});

interface FlashPoint {
  p2: number;
  T2: number;
  cp2_J_per_kgK: number;
}
// Isenthalpic flash of Peng-Robinson methane from 60 bar and 300 K, by scipy brentq in an
// implementation sharing no code with machnet: test/fixtures/gas/make-peng-robinson-reference.py.
const flash = (
  JSON.parse(
    readFileSync(new URL("../fixtures/gas/peng-robinson-reference.json", import.meta.url), "utf8"),
  ) as { isenthalpicFlash: Record<string, FlashPoint[]> }
).isenthalpicFlash["methane from 60 bar, 300 K"] as FlashPoint[];

/** The flash point at p2 between 39 and 41 bar, interpolated linearly in the 0.1 bar table. */
function flashAt(pressure: number): { temperature: number; cp: number } {
  for (let k = 0; k + 1 < flash.length; k++) {
    const a = flash[k] as FlashPoint;
    const b = flash[k + 1] as FlashPoint;
    if (pressure >= a.p2 && pressure <= b.p2) {
      const w = (pressure - a.p2) / (b.p2 - a.p2);
      return {
        temperature: a.T2 + w * (b.T2 - a.T2),
        cp: a.cp2_J_per_kgK + w * (b.cp2_J_per_kgK - a.cp2_J_per_kgK),
      };
    }
  }
  throw new Error(`no flash point near ${pressure} Pa`);
}

// Invented data: 5 km of 100 mm line from 60 bar to 40 bar, no heat exchange, level; a short
// wide pipe into the 40 bar reservoir, so the junction J sees the long line's arrival.
const methaneLine: NetworkDocument = {
  name: "methane line",
  settings: { pipeModel: "heat-transfer" },
  gas: { preset: "methane", heatCapacity: "nasa7", equationOfState: "peng-robinson" },
  nodes: [
    { id: "A", kind: "reservoir", pressure: "60 bar", temperature: "300 K" },
    { id: "J", kind: "junction" },
    { id: "B", kind: "reservoir", pressure: "40 bar", temperature: "300 K" },
  ],
  edges: [
    { id: "P", kind: "pipe", from: "A", to: "J", length: "5 km", diameter: "100 mm" },
    { id: "Q", kind: "pipe", from: "J", to: "B", length: "10 m", diameter: "200 mm" },
  ],
} as NetworkDocument;

describe("Peng-Robinson methane through a long adiabatic heat-transfer pipe", () => {
  const result = solved(methaneLine);

  it("arrives at the isenthalpic (Joule-Thomson) temperature of the scipy flash", () => {
    const junction = nodeOf(result, "J");
    expect(junction.pressure).toBeGreaterThan(39e5);
    expect(junction.pressure).toBeLessThan(41e5);
    const expected = flashAt(junction.pressure).temperature;
    // The junction holds the arriving stagnation enthalpy, h(T_J, p_J) = h(300 K, 60 bar).
    // Tolerance 1 mK: Newton's accepted temperature error (1e-6 T_ref, 0.3 mK), the fixture's
    // quadrature and brentq (below 1e-6 K) and the 0.1 bar interpolation (about 1e-5 K).
    expect(Math.abs(junction.temperature - expected)).toBeLessThan(1e-3);
    // A Joule-Thomson drop of about 9 K, which an ideal gas (h independent of p) would not have.
    expect(300 - junction.temperature).toBeGreaterThan(8);
  });

  it("leaves the long pipe with h(p, T) + v^2/2 = h0: the flash temperature less v^2/(2 cp)", () => {
    const outlet = edgeOf(result, "P").outlet;
    const point = flashAt(outlet.pressure);
    const kinetic = (0.5 * outlet.velocity * outlet.velocity) / point.cp;
    expect(kinetic).toBeGreaterThan(0.02); // about 40 mK at 14 m/s: the check can see it
    // Tolerance 0.1 mK: the 0.1 bar interpolation of the fixture (about 1e-5 K) and the
    // integration (about 1e-8 K). (The pipe's entrance closes the first law with the real gas's
    // enthalpy; the isentropic form alone was off by about 4 J/kg, 1.6 mK.)
    expect(Math.abs(outlet.temperature - (point.temperature - kinetic))).toBeLessThan(1e-4);
    // Reported density is the real gas's: Z = 0.91 at the outlet (fixture), not 1.
    const z = outlet.pressure / (outlet.density * (8.314462618 / 0.016043) * outlet.temperature);
    expect(z).toBeCloseTo(0.9103, 2);
  });

  it("closes the network's first law to 1e-9", () => {
    expect(Math.abs(result.balance.energyImbalance)).toBeLessThan(1e-9);
    expect(result.balance.heatIn).toBe(0);
  });
});

// Invented data: a fuel-gas header at 40 bar, two supplies at different temperatures mixing,
// an injection, a line up a 30 m structure losing heat to cold air, and a consumer.
const fuelGas = (gas: NetworkDocument["gas"]): NetworkDocument =>
  ({
    name: "fuel gas up a structure",
    settings: { pipeModel: "heat-transfer" },
    ambient: { temperature: "0 degC" },
    gas,
    nodes: [
      { id: "S1", kind: "reservoir", pressure: "42 bar", temperature: "15 degC" },
      { id: "S2", kind: "reservoir", pressure: "42 bar", temperature: "60 degC" },
      { id: "MIX", kind: "junction" },
      { id: "SIDE", kind: "junction", demand: "-0.2 kg/s", temperature: "30 degC" },
      { id: "TOP", kind: "junction", elevation: "30 m", demand: "1.5 kg/s" },
      {
        id: "FLARE",
        kind: "reservoir",
        pressure: "38 bar",
        temperature: "0 degC",
        elevation: "30 m",
      },
    ],
    edges: [
      { id: "L1", kind: "pipe", from: "S1", to: "MIX", length: "300 m", diameter: "80 mm" },
      { id: "L2", kind: "pipe", from: "S2", to: "MIX", length: "300 m", diameter: "80 mm" },
      { id: "L3", kind: "pipe", from: "MIX", to: "SIDE", length: "100 m", diameter: "100 mm" },
      {
        id: "RISER",
        kind: "pipe",
        from: "SIDE",
        to: "TOP",
        length: "60 m",
        diameter: "100 mm",
        heatTransferCoefficient: "8 W/(m2 K)",
      },
      { id: "L5", kind: "pipe", from: "TOP", to: "FLARE", length: "50 m", diameter: "50 mm" },
    ],
  }) as NetworkDocument;

describe("the network first law with cp(T) and with Peng-Robinson", () => {
  for (const gas of [
    { preset: "methane", heatCapacity: "nasa7" },
    { preset: "methane", equationOfState: "peng-robinson" },
    { preset: "methane", heatCapacity: "nasa7", equationOfState: "peng-robinson" },
    { preset: "natural-gas", heatCapacity: "nasa7" },
    { preset: "natural-gas", heatCapacity: "nasa7", equationOfState: "peng-robinson" },
  ] as NetworkDocument["gas"][]) {
    it(`closes to 1e-9 with mixing, an injection, heat loss and a rise (${JSON.stringify(gas)})`, () => {
      const result = solved(fuelGas(gas));
      const b = result.balance;
      expect(Math.abs(b.energyImbalance)).toBeLessThan(1e-9);
      expect(b.largestEnergyImbalance).toBeLessThan(1e-9);
      expect(b.heatIn).toBeLessThan(0); // the riser loses heat to 0 degC air
      expect(b.potentialEnergyGain).toBeGreaterThan(0);
    });
  }
});

// Invented data: a 60 bar methane supply through an adiabatic line and an isothermal line, an
// orifice plate, a regulator holding 20 bar for a 1 kg/s consumer, and a vent line to 5 bar.
const mixedModels = (gas: NetworkDocument["gas"]): NetworkDocument =>
  ({
    name: "closed-form pipes and components",
    gas,
    nodes: [
      { id: "S", kind: "reservoir", pressure: "60 bar", temperature: "300 K" },
      { id: "A", kind: "junction" },
      { id: "B", kind: "junction" },
      { id: "C", kind: "junction" },
      { id: "D", kind: "junction", demand: "1 kg/s" },
      { id: "E", kind: "reservoir", pressure: "5 bar", temperature: "300 K" },
    ],
    edges: [
      { id: "P1", kind: "pipe", from: "S", to: "A", length: "2 km", diameter: "100 mm" },
      {
        id: "P2",
        kind: "pipe",
        from: "A",
        to: "B",
        length: "1 km",
        diameter: "100 mm",
        model: "isothermal",
      },
      {
        id: "O1",
        kind: "orifice",
        from: "B",
        to: "C",
        boreDiameter: "40 mm",
        pipeDiameter: "100 mm",
      },
      { id: "R1", kind: "regulator", from: "C", to: "D", kv: 30, setpoint: "20 bar" },
      { id: "P3", kind: "pipe", from: "D", to: "E", length: "100 m", diameter: "50 mm" },
    ],
  }) as NetworkDocument;

describe("adiabatic and isothermal pipes, an orifice and a regulator with cp(T) and Peng-Robinson", () => {
  for (const gas of [
    { preset: "methane", heatCapacity: "nasa7" },
    { preset: "methane", equationOfState: "peng-robinson" },
    { preset: "methane", heatCapacity: "nasa7", equationOfState: "peng-robinson" },
    { preset: "natural-gas", heatCapacity: "nasa7" },
    { preset: "natural-gas", heatCapacity: "nasa7", equationOfState: "peng-robinson" },
  ] as NetworkDocument["gas"][]) {
    it(`converges and closes mass and energy to 1e-9 (${JSON.stringify(gas)})`, () => {
      const result = solved(mixedModels(gas));
      const b = result.balance;
      expect(Math.abs(b.energyImbalance)).toBeLessThan(1e-9);
      expect(b.largestEnergyImbalance).toBeLessThan(1e-9);
      expect(b.largestMassImbalance).toBeLessThan(1e-9);
      expect(Math.abs(b.massIn - b.massOut) / b.massIn).toBeLessThan(1e-9);
      expect(edgeOf(result, "P1").model).toBe("adiabatic");
      expect(edgeOf(result, "P2").model).toBe("isothermal");
      expect(edgeOf(result, "R1").component).toMatchObject({
        kind: "regulator",
        state: "regulating",
      });
      // Adiabatic pipes and components take in no heat; the isothermal pipe does.
      expect(edgeOf(result, "P1").heatFlow).toBe(0);
      expect(edgeOf(result, "R1").heatFlow).toBe(0);
      expect(edgeOf(result, "P2").heatFlow).toBeGreaterThan(0);
    });
  }

  it("cools the gas through the regulator with Peng-Robinson (Joule-Thomson), not with an ideal gas", () => {
    const real = solved(
      mixedModels({ preset: "methane", heatCapacity: "nasa7", equationOfState: "peng-robinson" }),
    );
    const ideal = solved(mixedModels({ preset: "methane", heatCapacity: "nasa7" }));
    const drop = (result: NetworkResult) =>
      nodeOf(result, "C").temperature - nodeOf(result, "D").temperature;
    // From 52 to 20 bar at 298 K: about 15 K with Peng-Robinson (0.5 K/bar), none ideal.
    expect(drop(real)).toBeGreaterThan(10);
    expect(Math.abs(drop(ideal))).toBeLessThan(1e-6);
    // The isothermal pipe holds its temperature; the heat it takes in is what a real gas needs
    // to expand at constant T, some 60 times the kinetic energy an ideal gas gains.
    expect(edgeOf(real, "P2").heatFlow).toBeGreaterThan(30 * edgeOf(ideal, "P2").heatFlow);
  });
});

describe("what is still refused with cp(T) or Peng-Robinson", () => {
  it("a closed-form pipe between nodes at different elevations (no gravity term in the model)", () => {
    const document = mixedModels({ preset: "methane", equationOfState: "peng-robinson" });
    const nodes = document.nodes.map((node) =>
      node.id === "B" ? { ...node, elevation: "20 m" } : node,
    );
    const issues = checkNetwork({ ...document, nodes } as NetworkDocument).issues;
    expect(issues).toEqual([
      expect.objectContaining({
        code: "value",
        path: "/edges/1/model",
        message: expect.stringMatching(/pipe P2 joins nodes 20 m apart .*"heat-transfer"/),
      }),
    ]);
  });
});

describe("a Peng-Robinson state inside the two-phase region", () => {
  // Invented data: carbon dioxide at 45 bar and 330 K cooled along 2 km of 50 mm line to 40 bar.
  const line = (surroundings: string): NetworkDocument =>
    ({
      settings: { pipeModel: "heat-transfer" },
      ambient: { temperature: surroundings },
      gas: { preset: "carbon-dioxide", heatCapacity: "nasa7", equationOfState: "peng-robinson" },
      nodes: [
        { id: "A", kind: "reservoir", pressure: "45 bar(a)", temperature: "330 K" },
        { id: "B", kind: "reservoir", pressure: "40 bar(a)", temperature: "330 K" },
      ],
      edges: [
        {
          id: "P",
          kind: "pipe",
          from: "A",
          to: "B",
          length: "2 km",
          diameter: "50 mm",
          heatTransferCoefficient: "50 W/(m2 K)",
        },
      ],
    }) as NetworkDocument;

  it("is reported with a condensing warning naming the pipe", () => {
    // Cooled towards -10 degC: CO2 saturates at 40 bar near 278 K (its vapour pressure is
    // 34.85 bar at 0 degC, NIST Chemistry WebBook, from memory), so the outlet is liquid-like.
    const result = solved(line("-10 degC"));
    expect(edgeOf(result, "P").outlet.temperature).toBeLessThan(270);
    expect(result.warnings).toContainEqual(
      expect.objectContaining({ code: "condensing", edge: "P" }),
    );
  });

  it("is not reported when the gas stays well above saturation", () => {
    const result = solved(line("60 degC"));
    expect(result.warnings.filter((warning) => warning.code === "condensing")).toEqual([]);
  });
});
