/**
 * Reading `gas.heatCapacity`, `gas.equationOfState` and a custom gas's critical constants: the
 * data built for each form of gas, every bad combination with its JSON path, and the refusal of
 * a network whose edges cannot use the models (closed-form pipes and components).
 */
import { describe, expect, it } from "vitest";
import type { Gas } from "../../src/gas/gas-types.js";
import { checkNetwork, type InputIssue, type NetworkDocument } from "../../src/index.js";
import type { GasInput } from "../../src/input/document-types.js";
import type { InputIssue as Issue } from "../../src/input/issues.js";
import { parseQuantity, type QuantityKind } from "../../src/input/quantity.js";
import type { ValueReader } from "../../src/input/read-components.js";
import { readGas } from "../../src/input/read-gas.js";

function network(gas: GasInput): NetworkDocument {
  return {
    gas,
    nodes: [
      { id: "A", kind: "reservoir", pressure: "6 bar(g)", temperature: "20 degC" },
      { id: "B", kind: "reservoir", pressure: "5 bar(g)", temperature: "20 degC" },
    ],
    edges: [{ id: "P1", kind: "pipe", from: "A", to: "B", length: "100 m", diameter: "50 mm" }],
  } as NetworkDocument;
}

function issuesOf(gas: GasInput): InputIssue[] {
  const result = checkNetwork(network(gas));
  return result.ok ? [] : [...result.issues];
}

/** readGas with a reader that converts quantities as the document reader does. */
function read(gas: GasInput): { gas: Gas | undefined; issues: Issue[] } {
  const issues: Issue[] = [];
  const reader: ValueReader = {
    quantity(input, kind: QuantityKind, path) {
      if (input === undefined) return undefined;
      const result = parseQuantity(input, kind, { path });
      if (!result.ok) {
        issues.push(result.issue);
        return undefined;
      }
      return result.value;
    },
    positive(input, kind, path) {
      const value = this.quantity(input, kind, path);
      if (value !== undefined && !(value > 0)) {
        issues.push({ code: "value", path, value: input as number, message: "must be > 0" });
        return undefined;
      }
      return value;
    },
    fail(issue) {
      issues.push(issue);
    },
  };
  return { gas: readGas(gas, reader), issues };
}

describe("gas property models in the input document", () => {
  it("builds the data of a preset, a mixture of presets and a custom gas", () => {
    const preset = read({
      preset: "methane",
      heatCapacity: "nasa7",
      equationOfState: "peng-robinson",
    });
    expect(preset.issues).toEqual([]);
    expect(preset.gas?.heatCapacity?.species.map((s) => s.name)).toEqual(["CH4"]);
    expect(preset.gas?.equationOfState?.components[0]?.criticalTemperature).toBe(190.56);

    const mixture = read({
      components: [
        { preset: "methane", moleFraction: 0.9 },
        { preset: "nitrogen", moleFraction: 0.1 },
      ],
      equationOfState: "peng-robinson",
    });
    expect(mixture.issues).toEqual([]);
    expect(mixture.gas?.equationOfState?.components.map((c) => c.moleFraction)).toEqual([0.9, 0.1]);
    expect(mixture.gas?.heatCapacity).toBeUndefined();

    const custom = read({
      name: "ethane",
      molarMass: "30.07 g/mol",
      gamma: 1.19,
      viscosity: "9.4 uPa s",
      equationOfState: "peng-robinson",
      criticalTemperature: "32.17 degC",
      criticalPressure: "48.72 bar",
      acentricFactor: 0.099,
    });
    expect(custom.issues).toEqual([]);
    const component = custom.gas?.equationOfState?.components[0];
    expect(component?.criticalTemperature).toBeCloseTo(305.32, 10);
    expect(component?.criticalPressure).toBeCloseTo(48.72e5, 6);
    expect(component?.molarMass).toBeCloseTo(0.03007, 12);

    // Without the fields: today's gas, with no model data at all.
    const plain = read({ preset: "methane" });
    expect(plain.gas?.heatCapacity).toBeUndefined();
    expect(plain.gas?.equationOfState).toBeUndefined();
  });

  it("gives natural gas nasa7 (its alkanes' fitted polynomials), alone and in a mixture", () => {
    // Issue #5: natural gas was refused until its C2-C6 alkanes had NASA data.
    const natural = read({ preset: "natural-gas", heatCapacity: "nasa7" });
    expect(natural.issues).toEqual([]);
    const species = natural.gas?.heatCapacity?.species ?? [];
    expect(species.map((part) => part.name)).toEqual([
      "CH4",
      "N2",
      "CO2",
      "C2H6",
      "C3H8",
      "C4H10",
      "C4H10",
      "C5H12",
      "C5H12",
      "C6H14",
    ]);
    // Mole fractions of the AGA-8 Gulf Coast composition (96.5222 % methane), summing to 1.
    expect(species[0]?.moleFraction).toBeCloseTo(0.965222, 6);
    expect(species.reduce((sum, part) => sum + part.moleFraction, 0)).toBeCloseTo(1, 12);
    const mixture = read({
      components: [
        { preset: "air", moleFraction: 0.5 },
        { preset: "natural-gas", moleFraction: 0.5 },
      ],
      heatCapacity: "nasa7",
      equationOfState: "peng-robinson",
    });
    expect(mixture.issues).toEqual([]);
    expect(mixture.gas?.heatCapacity?.species.length).toBe(14);
    expect(issuesOf({ preset: "natural-gas", heatCapacity: "nasa7" })).toEqual([]);
  });

  it("refuses a model that the gas has no data for", () => {
    expect(
      read({ molarMass: 0.03, gamma: 1.2, viscosity: 1e-5, heatCapacity: "nasa7" }).issues,
    ).toEqual([
      expect.objectContaining({
        code: "value",
        path: "/gas/heatCapacity",
        message: expect.stringMatching(/a custom gas has no NASA 7-coefficient data/),
      }),
    ]);
  });

  it("checks a custom gas's critical constants: all three with peng-robinson, none without", () => {
    const base = { molarMass: 0.03, gamma: 1.2, viscosity: 1e-5 };
    expect(
      read({ ...base, equationOfState: "peng-robinson", criticalTemperature: 300 }).issues,
    ).toEqual([
      expect.objectContaining({
        code: "schema",
        path: "/gas",
        message: expect.stringMatching(/needs "criticalPressure"/),
      }),
      expect.objectContaining({
        code: "schema",
        path: "/gas",
        message: expect.stringMatching(/needs "acentricFactor"/),
      }),
    ]);
    expect(read({ ...base, criticalTemperature: 300 }).issues).toEqual([
      expect.objectContaining({
        code: "schema",
        path: "/gas/criticalTemperature",
        message: expect.stringMatching(/used only with "equationOfState": "peng-robinson"/),
      }),
    ]);
    const full = {
      ...base,
      equationOfState: "peng-robinson" as const,
      criticalTemperature: 300,
      criticalPressure: 4e6,
      acentricFactor: 0.1,
    };
    expect(read({ ...full, acentricFactor: 5 }).issues).toEqual([
      expect.objectContaining({ code: "value", path: "/gas/acentricFactor" }),
    ]);
    expect(read({ ...full, criticalPressure: "40 bar(g)" }).issues).toEqual([
      expect.objectContaining({
        code: "value",
        path: "/gas/criticalPressure",
        message: expect.stringMatching(/absolute/),
      }),
    ]);
    expect(read({ ...full, criticalTemperature: -5 }).issues).toEqual([
      expect.objectContaining({ code: "value", path: "/gas/criticalTemperature" }),
    ]);
    expect(
      read({ preset: "methane", equationOfState: "peng-robinson", acentricFactor: 0.01 }).issues,
    ).toEqual([
      expect.objectContaining({
        code: "schema",
        path: "/gas/acentricFactor",
        message: expect.stringMatching(/a preset carries its own critical constants/),
      }),
    ]);
  });

  it("accepts the models on every edge kind (adiabatic pipes here, the default model)", () => {
    // Until issue #5 was done these were refused with "unsupported"; every pipe model and
    // component now takes cp(T) and Peng-Robinson (docs/model.md).
    expect(
      issuesOf({ preset: "nitrogen", heatCapacity: "nasa7", equationOfState: "peng-robinson" }),
    ).toEqual([]);
    // The defaults spelled out are accepted as before.
    expect(
      checkNetwork(
        network({ preset: "nitrogen", heatCapacity: "constant", equationOfState: "ideal-gas" }),
      ).ok,
    ).toBe(true);
  });

  it("refuses values outside the schema's enumerations", () => {
    expect(issuesOf({ preset: "air", heatCapacity: "janaf" as "nasa7" })[0]).toMatchObject({
      code: "schema",
      path: "/gas/heatCapacity",
    });
    expect(
      issuesOf({ preset: "air", equationOfState: "van-der-waals" as "ideal-gas" })[0],
    ).toMatchObject({
      code: "schema",
      path: "/gas/equationOfState",
    });
  });
});
