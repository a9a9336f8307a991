/**
 * Every component's flow derivatives with respect to p0, T0 and pd against central differences,
 * in each of its regimes (away from the kinks where a regime ends).
 */
import { describe, expect, it } from "vitest";
import type { ComponentElement } from "../../../src/physics/components/component-elements.js";
import { evaluate } from "./reference.js";

interface Case {
  name: string;
  element: ComponentElement;
  states: [p0: number, t0: number, pd: number, forward: boolean][];
}

const nan = Number.NaN;
const cases: Case[] = [
  {
    name: "orifice in a pipe",
    element: {
      kind: "orifice",
      boreDiameter: 0.03,
      pipeDiameter: 0.0779,
      dischargeCoefficient: 0.6,
    },
    states: [
      [6e5, 293.15, 5.99e5, true],
      [6e5, 293.15, 5e5, true],
      [6e5, 320, 4.5e5, true],
      [6e5, 293.15, 1e5, true], // choked
      [6e5, 293.15, 6e5 * (1 - 5e-7), true], // small-difference cubic
    ],
  },
  {
    name: "nozzle from a plenum",
    element: { kind: "nozzle", boreDiameter: 0.02, pipeDiameter: nan, dischargeCoefficient: 0.98 },
    states: [
      [3e5, 293.15, 2.9e5, true],
      [3e5, 293.15, 1.8e5, true],
      [3e5, 293.15, 1e5, true], // choked
      [3e5, 293.15, 3e5 * (1 - 2e-7), true],
    ],
  },
  {
    name: "nozzle in a pipe",
    element: {
      kind: "nozzle",
      boreDiameter: 0.045,
      pipeDiameter: 0.0779,
      dischargeCoefficient: 0.99,
    },
    states: [
      [3e5, 293.15, 2.5e5, true],
      [3e5, 293.15, 2.0e5, true],
    ],
  },
  {
    name: "valve with reducers, equal percentage",
    element: {
      kind: "valve",
      flowCoefficient: 60,
      opening: 0.6,
      characteristic: "equal-percentage",
      rangeability: 50,
      pressureDifferentialRatioFactor: 0.6,
      valveDiameter: 0.05,
      inletPipeDiameter: 0.08,
      outletPipeDiameter: 0.1,
    },
    states: [
      [7e5, 300, 6e5, true],
      [7e5, 300, 4e5, false],
      [7e5, 300, 1e5, true], // choked
    ],
  },
  {
    name: "shut valve (leakage)",
    element: {
      kind: "valve",
      flowCoefficient: 60,
      opening: 0,
      characteristic: "linear",
      rangeability: 50,
      pressureDifferentialRatioFactor: 0.7,
      valveDiameter: nan,
      inletPipeDiameter: nan,
      outletPipeDiameter: nan,
    },
    states: [[7e5, 300, 6e5, true]],
  },
  {
    name: "regulator",
    element: {
      kind: "regulator",
      setpoint: 5e5,
      proportionalBand: 1e4,
      flowCoefficient: 12,
      pressureDifferentialRatioFactor: 0.7,
      pipeDiameter: 0.0525,
    },
    states: [
      [8e5, 293.15, 4.95e5, true], // regulating
      [20e5, 293.15, 4.97e5, true], // regulating, trim at critical flow
      [8e5, 293.15, 4.5e5, true], // wide open
      [8e5, 293.15, 6e5, true], // closed above the setpoint
      [8e5, 293.15, 6e5, false], // closed against reverse flow
    ],
  },
  {
    name: "check valve",
    element: {
      kind: "check",
      flowCoefficient: 20,
      pressureDifferentialRatioFactor: 0.7,
      pipeDiameter: nan,
    },
    states: [
      [5e5, 293.15, 4e5, true],
      [5e5, 293.15, 4e5, false],
    ],
  },
];

describe("component flow derivatives agree with central differences", () => {
  for (const c of cases) {
    it(`${c.name}: dm/dp0, dm/dT0 and dm/dpd`, () => {
      for (const [p0, t0, pd, forward] of c.states) {
        const at = evaluate(c.element, p0, t0, pd, forward);
        // Steps of 1e-7 of the pressure (1e-2 of a difference below 1e-3 of it) keep every state
        // inside its regime; the central difference is then good to rounding over the step plus
        // O(h^2).
        const difference = p0 - pd;
        const hp = difference > 1e-3 * p0 ? 1e-7 * p0 : 1e-2 * difference;
        const ht = 1e-6 * t0;
        const flow = (p: number, t: number, d: number) =>
          evaluate(c.element, p, t, d, forward).massFlow;
        const dp0 = (flow(p0 + hp, t0, pd) - flow(p0 - hp, t0, pd)) / (2 * hp);
        const dt0 = (flow(p0, t0 + ht, pd) - flow(p0, t0 - ht, pd)) / (2 * ht);
        const dpd = (flow(p0, t0, pd + hp) - flow(p0, t0, pd - hp)) / (2 * hp);
        // Scale of the pressure slopes: the slope itself plus the secant flow / difference.
        const scale = Math.abs(at.dMassFlowdDownstreamPressure) + at.massFlow / difference;
        const label = `${c.name} at p0 ${p0}, T0 ${t0}, pd ${pd}, forward ${forward}`;
        expect(Math.abs(at.dMassFlowdUpstreamPressure - dp0), label).toBeLessThan(1e-6 * scale);
        expect(Math.abs(at.dMassFlowdDownstreamPressure - dpd), label).toBeLessThan(1e-6 * scale);
        expect(Math.abs(at.dMassFlowdUpstreamTemperature - dt0), label).toBeLessThan(
          1e-7 * (at.massFlow / t0),
        );
        // Zero flow has a finite, nonzero slope; choked flow none with respect to pd.
        if (at.choked) expect(at.dMassFlowdDownstreamPressure).toBe(0);
        else expect(at.dMassFlowdDownstreamPressure).toBeLessThan(0);
      }
    });
  }

  it("the slope at zero pressure difference is finite and nonzero for every restriction", () => {
    for (const c of cases) {
      const at = evaluate(c.element, 5e5, 293.15, 5e5, true);
      expect(at.massFlow).toBe(0);
      expect(Number.isFinite(at.dMassFlowdDownstreamPressure)).toBe(true);
      expect(at.dMassFlowdDownstreamPressure).toBeLessThan(0);
    }
  });
});
