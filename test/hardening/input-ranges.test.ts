/**
 * Physically impossible inputs are input errors that name the value, its place and the range
 * (INPUT_RANGES in src/input/input-ranges.ts, reasons in its comment and docs/hardening.md): a reservoir at 2 K, a pressure of 2000 bar, a barometric pressure given in
 * mbar as Pa, a molar mass in g/mol as kg/mol, a viscosity in uPa s as Pa s, a demand of 1e6
 * kg/s. Values at the ends of each range are accepted.
 */
import { describe, expect, it } from "vitest";
import { checkNetwork, InputError, type NetworkDocument, solveNetwork } from "../../src/index.js";
import { INPUT_RANGES } from "../../src/input/read-document.js";

/** A reservoir feeding one consumer, with fields of the reservoir, the junction or the whole
 * document replaced. */
function network(
  parts: {
    reservoir?: Record<string, unknown>;
    junction?: Record<string, unknown>;
    document?: Partial<NetworkDocument>;
  } = {},
): NetworkDocument {
  return {
    nodes: [
      {
        id: "R",
        kind: "reservoir",
        pressure: "6 bar(g)",
        temperature: "20 degC",
        ...parts.reservoir,
      },
      { id: "J", kind: "junction", demand: "0.1 kg/s", ...parts.junction },
    ],
    edges: [{ id: "P", kind: "pipe", from: "R", to: "J", length: "20 m", diameter: "52.5 mm" }],
    ...parts.document,
  } as NetworkDocument;
}

function issuesOf(doc: NetworkDocument) {
  const checked = checkNetwork(doc);
  expect(checked.ok).toBe(false);
  return checked.issues;
}

describe("plausible ranges of the ideal-gas model", () => {
  it("refuses a reservoir at 2 K with its path, value and the range", () => {
    expect(issuesOf(network({ reservoir: { temperature: "2 K" } }))).toEqual([
      {
        code: "value",
        path: "/nodes/0/temperature",
        value: "2 K",
        message:
          '2 K is outside the range of the ideal-gas model\'s temperatures: 20 to 3000 K (got "2 K")',
      },
    ]);
  });

  it("accepts the ends of the temperature range, 20 K and 3000 K, and refuses just beyond", () => {
    for (const temperature of ["20 K", "3000 K", "-253 degC"]) {
      expect(checkNetwork(network({ reservoir: { temperature: temperature } })).ok).toBe(true);
    }
    for (const temperature of ["19.9 K", "3001 K", "-260 degC"]) {
      const issues = issuesOf(network({ reservoir: { temperature: temperature } }));
      expect(issues.map((issue) => issue.path)).toEqual(["/nodes/0/temperature"]);
    }
  });

  it("refuses an injection at 5000 K at the junction's temperature", () => {
    const issues = issuesOf(network({ junction: { demand: "-0.1 kg/s", temperature: "5000 K" } }));
    expect(issues[0]).toMatchObject({ code: "value", path: "/nodes/1/temperature" });
    expect(issues[0]?.message).toMatch(/^5000 K is outside the range/);
  });

  it("refuses reservoir pressures below 100 Pa and above 1000 bar", () => {
    for (const [pressure, shown] of [
      ["50 Pa", "50 Pa"],
      ["2000 bar(a)", "2e8 Pa"],
    ]) {
      const issues = issuesOf(network({ reservoir: { pressure: pressure } }));
      expect(issues[0]).toMatchObject({ code: "value", path: "/nodes/0/pressure" });
      expect(issues[0]?.message).toBe(
        `${shown} is outside the range of absolute pressures of the model: 100 to 1e8 Pa (got ${JSON.stringify(pressure)})`,
      );
    }
    for (const pressure of ["100 Pa", "1000 bar(a)"]) {
      expect(checkNetwork(network({ reservoir: { pressure: pressure } })).ok).toBe(true);
    }
  });

  it("refuses a barometric pressure written in mbar, kPa or bar but given as Pa", () => {
    for (const pressure of [1013.25, 101.325, 1.01325, "101325 kPa"]) {
      const issues = issuesOf(network({ document: { ambient: { pressure } } }));
      expect(issues[0]).toMatchObject({ code: "value", path: "/ambient/pressure" });
      expect(issues[0]?.message).toMatch(
        /is outside the range of barometric pressures: 1e4 to 1e6 Pa/,
      );
    }
    expect(checkNetwork(network({ document: { ambient: { pressure: "0.33 bar(a)" } } })).ok).toBe(
      true,
    );
  });

  it("refuses an ambient temperature outside the gas range", () => {
    const issues = issuesOf(network({ document: { ambient: { temperature: "10 K" } } }));
    expect(issues[0]).toMatchObject({ code: "value", path: "/ambient/temperature" });
  });

  it("refuses a demand or injection beyond 1e5 kg/s either way", () => {
    const issues = issuesOf(network({ junction: { demand: "1e6 kg/s" } }));
    expect(issues[0]).toMatchObject({ code: "value", path: "/nodes/1/demand" });
    expect(issues[0]?.message).toBe(
      '1e6 kg/s is outside the range of flows of gas networks: -1e5 to 1e5 kg/s (got "1e6 kg/s")',
    );
    const injection = issuesOf(network({ junction: { demand: -2e5, temperature: 300 } }));
    expect(injection.map((issue) => issue.path)).toEqual(["/nodes/1/demand"]);
    expect(checkNetwork(network({ junction: { demand: 1e5 } })).ok).toBe(true);
  });

  it("refuses a custom gas's molar mass given in g/mol as a plain number (kg/mol)", () => {
    const custom = (molarMass: number | string) =>
      network({ document: { gas: { molarMass, gamma: 1.4, viscosity: "18 uPa s" } } });
    const issues = issuesOf(custom(28.96));
    expect(issues).toEqual([
      {
        code: "value",
        path: "/gas/molarMass",
        value: 28.96,
        message:
          "28.96 kg/mol is outside the range of molar masses of gases: 0.001 to 1 kg/mol (got 28.96)",
      },
    ]);
    expect(issuesOf(custom("0.5 g/mol"))[0]?.path).toBe("/gas/molarMass");
    expect(checkNetwork(custom("2.016 g/mol")).ok).toBe(true);
  });

  it("refuses a viscosity in uPa s or cP given as Pa s, and a Sutherland law out of range", () => {
    const withViscosity = (viscosity: NonNullable<NetworkDocument["gas"]>["viscosity"]) =>
      network({ document: { gas: { molarMass: "28 g/mol", gamma: 1.4, viscosity } } });
    expect(issuesOf(withViscosity(18.2))[0]).toMatchObject({ path: "/gas/viscosity" });
    expect(issuesOf(withViscosity("18.2 cP"))[0]).toMatchObject({ path: "/gas/viscosity" });
    expect(checkNetwork(withViscosity("0.0182 cP")).ok).toBe(true);
    const sutherland = (referenceTemperature: string, sutherlandConstant: string) =>
      withViscosity({
        referenceViscosity: "17.2 uPa s",
        referenceTemperature,
        sutherlandConstant,
      });
    expect(issuesOf(sutherland("2 K", "110 K")).map((issue) => issue.path)).toEqual([
      "/gas/viscosity/referenceTemperature",
    ]);
    expect(issuesOf(sutherland("273.15 K", "1e5 K")).map((issue) => issue.path)).toEqual([
      "/gas/viscosity/sutherlandConstant",
    ]);
  });

  it("throws one InputError from solveNetwork, never a RangeError from the gas model", () => {
    let error: unknown;
    try {
      solveNetwork(
        network({ document: { gas: { molarMass: 815969247, gamma: 1.4, viscosity: 1.8e-5 } } }),
      );
    } catch (caught) {
      error = caught;
    }
    expect(error).toBeInstanceOf(InputError);
    expect((error as InputError).issues.map((issue) => issue.path)).toEqual(["/gas/molarMass"]);
  });

  it("refuses a pipe bore below 0.1 mm or above 10 m, accepts the ends", () => {
    const withDiameter = (diameter: string) =>
      ({
        ...network(),
        // Smooth: the default roughness is beyond the friction laws' range in a 0.1 mm bore.
        edges: [
          { id: "P", kind: "pipe", from: "R", to: "J", length: "20 m", diameter, roughness: 0 },
        ],
      }) as NetworkDocument;
    // A bore in m written as mm (0.05 mm), and one in mm written as m (52.5 m).
    for (const diameter of ["0.05 mm", "52.5 m"]) {
      const issues = issuesOf(withDiameter(diameter));
      expect(issues.map((issue) => issue.path)).toEqual(["/edges/0/diameter"]);
      expect(issues[0]?.message).toContain("inside diameters of gas pipes: 1e-4 to 10 m");
    }
    // The ends themselves are accepted.
    expect(checkNetwork(withDiameter("0.1 mm")).ok).toBe(true);
    expect(checkNetwork(withDiameter("10 m")).ok).toBe(true);
  });

  it("publishes its ranges (the numbers this file checks)", () => {
    expect(INPUT_RANGES.temperature).toMatchObject({ low: 20, high: 3000, unit: "K" });
    expect(INPUT_RANGES.pressure).toMatchObject({ low: 100, high: 1e8, unit: "Pa" });
    expect(INPUT_RANGES.ambientPressure).toMatchObject({ low: 1e4, high: 1e6 });
    expect(INPUT_RANGES.demand).toMatchObject({ low: -1e5, high: 1e5 });
    expect(INPUT_RANGES.molarMass).toMatchObject({ low: 1e-3, high: 1 });
    expect(INPUT_RANGES.viscosity).toMatchObject({ low: 1e-7, high: 1e-3 });
    expect(INPUT_RANGES.pipeDiameter).toMatchObject({ low: 1e-4, high: 10, unit: "m" });
  });
});
