import { describe, expect, it } from "vitest";
import type {
  RegulatorElement,
  ValveElement,
} from "../../../src/physics/components/component-elements.js";
import { componentDetails } from "../../../src/physics/components/component-flow.js";
import {
  regulatorOpening,
  regulatorOpeningSlope,
} from "../../../src/physics/components/regulator.js";
import { air, evaluate, relativeError } from "./reference.js";

const regulator: RegulatorElement = {
  kind: "regulator",
  setpoint: 5e5,
  proportionalBand: 1e4,
  flowCoefficient: 12,
  pressureDifferentialRatioFactor: 0.7,
  pipeDiameter: 0.0525,
};
const wideOpen: ValveElement = {
  kind: "valve",
  flowCoefficient: 12,
  opening: 1,
  characteristic: "linear",
  rangeability: 50,
  pressureDifferentialRatioFactor: 0.7,
  valveDiameter: Number.NaN,
  inletPipeDiameter: 0.0525,
  outletPipeDiameter: 0.0525,
};

describe("regulatorOpening", () => {
  it("is 0 at and above the setpoint, z (2 - z) inside the band and 1 below it", () => {
    expect(regulatorOpening(5.1e5, 5e5, 1e4)).toBe(0);
    expect(regulatorOpening(5e5, 5e5, 1e4)).toBe(0);
    expect(regulatorOpening(4.95e5, 5e5, 1e4)).toBeCloseTo(0.75, 14);
    expect(regulatorOpening(4.9e5, 5e5, 1e4)).toBe(1);
    expect(regulatorOpening(3e5, 5e5, 1e4)).toBe(1);
  });

  it("joins wide open with zero slope (C1) and closes with a finite slope", () => {
    expect(regulatorOpeningSlope(4.9e5 + 1e-6, 5e5, 1e4)).toBeCloseTo(0, 12);
    expect(regulatorOpeningSlope(5e5 - 1e-6, 5e5, 1e4)).toBeCloseTo(-2 / 1e4, 9);
    const h = 1;
    const p = 4.97e5;
    const difference =
      (regulatorOpening(p + h, 5e5, 1e4) - regulatorOpening(p - h, 5e5, 1e4)) / (2 * h);
    expect(relativeError(regulatorOpeningSlope(p, 5e5, 1e4), difference)).toBeLessThan(1e-9);
  });
});

describe("a regulator between two nodes", () => {
  it("wide open below its band, it is a valve of its Kv", () => {
    const result = evaluate(regulator, 6e5, 293.15, 4e5);
    const valve = evaluate(wideOpen, 6e5, 293.15, 4e5);
    // Its seat leakage (1e-12 of the trim's flow scale) is the only difference.
    expect(relativeError(result.massFlow, valve.massFlow)).toBeLessThan(1e-11);
    expect(componentDetails(regulator, air, 6e5, 4e5, true, result)).toMatchObject({
      state: "wide-open",
      opening: 1,
      setpointDeviation: -1e5,
    });
  });

  it("inside its band it passes the opening times the wide-open flow and reports regulating", () => {
    const pd = 4.97e5;
    const result = evaluate(regulator, 20e5, 293.15, pd);
    const valve = evaluate(wideOpen, 20e5, 293.15, pd);
    const opening = regulatorOpening(pd, 5e5, 1e4);
    expect(relativeError(result.massFlow, opening * valve.massFlow)).toBeLessThan(1e-11);
    // The trim is at critical flow (x = 0.75 > xT = 0.7), yet the flow follows p_d through the
    // opening, so the regulator is not reported choked.
    expect(valve.choked).toBe(true);
    expect(result.choked).toBe(false);
    expect(result.dMassFlowdDownstreamPressure).toBeLessThan(0);
    expect(componentDetails(regulator, air, 20e5, pd, true, result)).toMatchObject({
      state: "regulating",
    });
  });

  it("is closed at or above its setpoint and against reverse flow, passing only leakage", () => {
    const open = evaluate(wideOpen, 9e5, 293.15, 5.5e5);
    const above = evaluate(regulator, 9e5, 293.15, 5.5e5);
    expect(above.massFlow).toBeGreaterThan(0);
    expect(above.massFlow).toBeLessThan(1e-11 * open.massFlow);
    expect(componentDetails(regulator, air, 9e5, 5.5e5, true, above)).toMatchObject({
      state: "closed",
      leakage: above.massFlow,
    });
    const reverse = evaluate(regulator, 9e5, 293.15, 3e5, false);
    expect(reverse.massFlow).toBeLessThan(1e-11 * open.massFlow);
    expect(componentDetails(regulator, air, 9e5, 3e5, false, reverse)).toMatchObject({
      state: "closed",
    });
  });

  it("its flow is continuous and monotone in the downstream pressure across all three states", () => {
    let previous = Number.POSITIVE_INFINITY;
    for (let pd = 4.8e5; pd <= 5.1e5; pd += 250) {
      const flow = evaluate(regulator, 7e5, 293.15, pd).massFlow;
      expect(flow).toBeLessThanOrEqual(previous);
      if (Number.isFinite(previous)) {
        // 250 Pa steps: the steepest part (2/band times the trim flow) moves it by 5 % at most.
        expect(previous - flow).toBeLessThan(0.06 * evaluate(wideOpen, 7e5, 293.15, pd).massFlow);
      }
      previous = flow;
    }
  });
});
