/**
 * Networks with heat-transfer pipes: a hot vent header losing heat to winter air through a loop
 * with a riser, its first-law balance, consistency with the single-pipe relation, reversed
 * declared directions, a dead-end riser at rest (hydrostatic), and refused inputs.
 */
import { describe, expect, it } from "vitest";
import {
  checkNetwork,
  gasPreset,
  type NetworkDocument,
  type NetworkResult,
  pipeFlow,
  solveNetwork,
} from "../../src/index.js";
import { STANDARD_GRAVITY } from "../../src/physics/heat-transfer-pipe.js";

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

// Invented demo data: a header from a hot source through a loop, up a 15 m riser, to a vent.
const header: NetworkDocument = {
  name: "hot header in winter air",
  ambient: { temperature: "-10 degC" },
  settings: { pipeModel: "heat-transfer" },
  nodes: [
    { id: "SOURCE", kind: "reservoir", pressure: "3 bar(g)", temperature: "180 degC" },
    { id: "A", kind: "junction" },
    { id: "B", kind: "junction", demand: "0.05 kg/s" },
    { id: "C", kind: "junction", elevation: "15 m" },
    { id: "SIDE", kind: "junction", demand: "-0.02 kg/s", temperature: "60 degC" },
    {
      id: "VENT",
      kind: "reservoir",
      pressure: "0.2 bar(g)",
      temperature: "-10 degC",
      elevation: "15 m",
    },
  ],
  edges: [
    {
      id: "P1",
      kind: "pipe",
      from: "SOURCE",
      to: "A",
      length: "60 m",
      diameter: "80 mm",
      heatTransferCoefficient: "6 W/(m2 K)",
    },
    {
      id: "P2",
      kind: "pipe",
      from: "A",
      to: "B",
      length: "40 m",
      diameter: "50 mm",
      heatTransferPerLength: "1.2 W/(m K)",
    },
    {
      id: "P3",
      kind: "pipe",
      from: "A",
      to: "C",
      length: "45 m",
      diameter: "50 mm",
      heatTransferCoefficient: "6 W/(m2 K)",
    },
    {
      id: "P4",
      kind: "pipe",
      from: "B",
      to: "C",
      length: "30 m",
      diameter: "50 mm",
      heatTransferCoefficient: "6 W/(m2 K)",
    },
    { id: "P5", kind: "pipe", from: "SIDE", to: "B", length: "20 m", diameter: "25 mm" },
    {
      id: "P6",
      kind: "pipe",
      from: "C",
      to: "VENT",
      length: "25 m",
      diameter: "80 mm",
      heatTransferCoefficient: "6 W/(m2 K)",
      surroundingTemperature: "-20 degC",
    },
  ],
};

describe("a network of heat-transfer pipes", () => {
  const result = solveNetwork(header);

  it("converges and closes its first-law balance to 1e-9", () => {
    expect(result.status).toBe("converged");
    const b = result.balance;
    expect(Math.abs(b.energyImbalance)).toBeLessThan(1e-9);
    // Recomputed here from the reported numbers: the same balance, independently summed.
    const first = (b.enthalpyIn + b.heatIn - b.potentialEnergyGain - b.enthalpyOut) / b.enthalpyIn;
    expect(Math.abs(first)).toBeLessThan(1e-9);
    // The gas loses heat to winter air and rises 15 m.
    expect(b.heatIn).toBeLessThan(0);
    const ventFlow = -nodeOf(result, "VENT").demand;
    expect(ventFlow).toBeLessThan(0); // the vent reservoir takes flow: demand positive
    const riseFlow = nodeOf(result, "VENT").demand;
    expect(b.potentialEnergyGain / (riseFlow * STANDARD_GRAVITY * 15)).toBeCloseTo(1, 9);
  });

  it("sums the pipes' heat flows to the balance's heat in", () => {
    const sum = result.edges.reduce((total, edge) => total + edge.heatFlow, 0);
    expect(sum / result.balance.heatIn).toBeCloseTo(1, 12);
    for (const edge of result.edges) expect(edge.model).toBe("heat-transfer");
  });

  it("gives each pipe the flow the single-pipe relation gives for its end states", () => {
    // P1 alone: from the reservoir state to A's pressure, with its heat exchange.
    const air = gasPreset("air");
    const p1 = edgeOf(result, "P1");
    const single = pipeFlow(
      air,
      {
        length: 60,
        diameter: 0.08,
        model: "heat-transfer",
        heatTransferPerArea: 6,
        surroundingTemperature: 263.15,
      },
      { pressure: nodeOf(result, "SOURCE").pressure, temperature: 453.15 },
      nodeOf(result, "A").pressure,
    );
    // Same relation, same states: to the network's convergence (1e-9 of the throughput).
    expect(Math.abs(single.massFlow / p1.massFlow - 1)).toBeLessThan(1e-7);
    expect(single.outlet.temperature).toBeCloseTo(p1.outlet.temperature, 5);
    expect(single.heatFlow / p1.heatFlow).toBeCloseTo(1, 6);
  });

  it("gives the same flows when a pipe's declared direction is reversed", () => {
    const flipped: NetworkDocument = structuredClone(header);
    const edge = flipped.edges[3];
    if (!edge) throw new Error("no P4");
    [edge.from, edge.to] = [edge.to, edge.from];
    const again = solveNetwork(flipped);
    expect(again.status).toBe("converged");
    expect(edgeOf(again, "P4").massFlow / -edgeOf(result, "P4").massFlow).toBeCloseTo(1, 7);
    expect(nodeOf(again, "C").temperature).toBeCloseTo(nodeOf(result, "C").temperature, 6);
  });
});

describe("a dead-end riser at rest", () => {
  it("holds the hydrostatic pressure p2 = p1 exp(-g dz / (R Ts)) with no flow", () => {
    // Isothermal column at the surrounding temperature (F. M. White, Fluid Mechanics, 7th ed.,
    // 2011, eq. 2.27): at zero flow the gas in a heat-exchanging pipe is at the surroundings.
    const doc: NetworkDocument = {
      ambient: { temperature: "15 degC" },
      nodes: [
        { id: "S", kind: "reservoir", pressure: "5 bar(a)", temperature: "15 degC" },
        { id: "TOP", kind: "junction", elevation: "80 m" },
      ],
      edges: [
        {
          id: "R",
          kind: "pipe",
          from: "S",
          to: "TOP",
          length: "80 m",
          diameter: "50 mm",
          model: "heat-transfer",
          heatTransferCoefficient: "5 W/(m2 K)",
        },
      ],
    };
    const result = solveNetwork(doc);
    expect(result.status).toBe("converged");
    const air = gasPreset("air");
    const expected = 5e5 * Math.exp((-STANDARD_GRAVITY * 80) / (air.specificGasConstant * 288.15));
    // Junction pressure to the solver's tolerance: the creeping law holds within 1e-10 of p.
    expect(Math.abs(nodeOf(result, "TOP").pressure / expected - 1)).toBeLessThan(1e-9);
    expect(Math.abs(edgeOf(result, "R").massFlow)).toBeLessThan(1e-9);
  });
});

describe("inputs of heat-transfer pipes and elevations", () => {
  const base = (patch: (doc: NetworkDocument) => void): NetworkDocument => {
    const doc: NetworkDocument = structuredClone(header);
    patch(doc);
    return doc;
  };
  it("refuses a pipe between different elevations on a model without gravity", () => {
    const check = checkNetwork(
      base((doc) => {
        doc.settings = {};
        for (const edge of doc.edges)
          if (edge.kind === "pipe") {
            delete edge.heatTransferCoefficient;
            delete edge.heatTransferPerLength;
            delete edge.surroundingTemperature;
          }
      }),
    );
    expect(check.ok).toBe(false);
    if (check.ok) return;
    const issue = check.issues.find((i) => i.path === "/edges/2/model");
    expect(issue?.code).toBe("value");
    expect(issue?.message).toMatch(/15 m apart in elevation.*"model": "heat-transfer"/);
  });
  it("refuses heat-exchange fields on an adiabatic pipe", () => {
    const check = checkNetwork(
      base((doc) => {
        const edge = doc.edges[4];
        if (edge?.kind === "pipe") {
          edge.model = "adiabatic";
          edge.heatTransferPerLength = "1 W/(m K)";
        }
      }),
    );
    expect(check.ok).toBe(false);
    if (check.ok) return;
    expect(check.issues).toContainEqual(
      expect.objectContaining({ path: "/edges/4/heatTransferPerLength", code: "value" }),
    );
  });
  it("refuses bad values with their JSON paths", () => {
    const check = checkNetwork(
      base((doc) => {
        const first = doc.edges[0];
        if (first?.kind === "pipe") first.heatTransferCoefficient = "-3 W/(m2 K)";
        const second = doc.edges[1];
        if (second?.kind === "pipe") second.heatTransferPerLength = "2 m";
        const third = doc.edges[2];
        if (third?.kind === "pipe") third.surroundingTemperature = "-400 degC";
        const node = doc.nodes[3];
        if (node) node.elevation = "40 km";
      }),
    );
    expect(check.ok).toBe(false);
    if (check.ok) return;
    const paths = check.issues.map((issue) => issue.path);
    expect(paths).toContain("/edges/0/heatTransferCoefficient");
    expect(paths).toContain("/edges/1/heatTransferPerLength");
    expect(paths).toContain("/edges/2/surroundingTemperature");
    expect(paths).toContain("/nodes/3/elevation");
    const negative = check.issues.find((i) => i.path === "/edges/0/heatTransferCoefficient");
    expect(negative?.message).toMatch(/outside the range of overall heat-transfer coefficients/);
  });
  it("refuses both coefficients on one pipe", () => {
    const check = checkNetwork(
      base((doc) => {
        const first = doc.edges[0];
        if (first?.kind === "pipe") first.heatTransferPerLength = "1 W/(m K)";
      }),
    );
    expect(check.ok).toBe(false);
    if (check.ok) return;
    expect(check.issues).toContainEqual(
      expect.objectContaining({
        path: "/edges/0",
        message: expect.stringMatching(/heatTransferCoefficient.*heatTransferPerLength.*not both/),
      }),
    );
  });
});
