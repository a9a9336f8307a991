import { describe, expect, it } from "vitest";
import type { NozzleElement } from "../../../src/physics/components/component-elements.js";
import { componentDetails } from "../../../src/physics/components/component-flow.js";
import {
  NOZZLE_DISCHARGE_COEFFICIENT,
  nozzleCriticalPressureRatio,
  nozzleExpansibility,
  nozzleMassFlow,
} from "../../../src/physics/components/nozzle.js";
import { pressureLossRatio } from "../../../src/physics/components/restriction.js";
import { air, evaluate, reference, relativeError } from "./reference.js";

const library = `python3-fluids ${reference.fluids}`;

describe("ISO 5167-3 nozzle relations", () => {
  it(`nozzleExpansibility matches ${library} nozzle_expansibility (its doctest 0.994570 among them)`, () => {
    for (const c of reference.nozzleExpansibility) {
      const value = nozzleExpansibility(c.Do / c.D, c.P2 / c.P1, c.k);
      expect(relativeError(value, c.value)).toBeLessThan(1e-13); // the same closed form
    }
    expect(nozzleExpansibility(0.0222 / 0.0739, 0.99, 1.4)).toBeCloseTo(0.994570234, 8);
  });

  it(`nozzleCriticalPressureRatio is where the flow of ${library} nozzle_expansibility peaks (scipy ${reference.scipy} minimize_scalar)`, () => {
    for (const c of reference.nozzleCriticalPressureRatio) {
      // scipy's bounded search stops at xatol 1e-12 but a maximum is flat: its position is known
      // to about sqrt(machine epsilon), 1e-8.
      expect(
        Math.abs(nozzleCriticalPressureRatio(c.beta, c.k) - c.criticalPressureRatio),
      ).toBeLessThan(2e-8);
    }
    // beta = 0 is the isentropic critical pressure ratio (PRACTICE.md 7.2, CALC: 0.52828).
    expect(nozzleCriticalPressureRatio(0, 1.4)).toBeCloseTo(0.52828179, 8);
  });

  it("nozzleMassFlow from a plenum at critical flow is the choked isentropic flux (PRACTICE.md 7.2: 1652.3 kg/(s m2) at 700 kPa, 293.15 K)", () => {
    const c = reference.plenumNozzleChoked;
    const area = 0.25 * Math.PI * c.boreDiameter ** 2;
    const rho = c.upstreamPressure / (air.specificGasConstant * c.temperature);
    const flow = nozzleMassFlow(1, c.boreDiameter, 0, c.upstreamPressure, rho, 1e5, 1.4);
    // The fixture's R of air (8.314462618 / 28.96442e-3 in Python) is 2e-11 from machnet's: 1e-10.
    expect(relativeError(flow, c.closedForm)).toBeLessThan(1e-10); // closed form
    expect(relativeError(flow, c.massFlow)).toBeLessThan(1e-10); // fluids flow_meter_discharge
    // PRACTICE.md's value is printed to 5 digits (it uses R of air 287.05 or so): 1e-4.
    expect(relativeError(flow / area, 1652.3)).toBeLessThan(1e-4);
  });

  it(`the default discharge coefficient lies in the ISO 5167-3 ranges of long-radius and ISA 1932 nozzles (${library})`, () => {
    for (const [low, high] of [reference.longRadiusNozzleRange, reference.isa1932NozzleRange]) {
      expect(NOZZLE_DISCHARGE_COEFFICIENT).toBeGreaterThanOrEqual(low);
      expect(NOZZLE_DISCHARGE_COEFFICIENT).toBeLessThanOrEqual(high);
    }
  });
});

describe("a nozzle between two nodes", () => {
  const element = (c: (typeof reference.restrictionBetweenReservoirs)[number]): NozzleElement => ({
    kind: "nozzle",
    boreDiameter: c.boreDiameter,
    pipeDiameter: c.pipeDiameter,
    dischargeCoefficient: c.dischargeCoefficient,
  });
  const cases = reference.restrictionBetweenReservoirs.filter((c) => c.kind === "nozzle");

  it(`passes the ISO 5167 flow at the tap pressure whose permanent loss is the node drop (${library}, scipy brentq)`, () => {
    for (const c of cases) {
      const result = evaluate(element(c), c.upstreamPressure, c.temperature, c.downstreamPressure);
      expect(relativeError(result.massFlow, c.massFlow)).toBeLessThan(1e-9); // brentq to 1e-10 Pa
      const details = componentDetails(
        element(c),
        air,
        c.upstreamPressure,
        c.downstreamPressure,
        true,
        result,
      );
      if (details.kind !== "nozzle") throw new Error("not a nozzle");
      expect(relativeError(details.pressureRatio, c.tapPressure / c.upstreamPressure)).toBeLessThan(
        1e-12,
      );
      expect(relativeError(details.expansibility, c.expansibility)).toBeLessThan(1e-11);
    }
  });

  it("chokes at its critical pressure ratio with zero slope: flow and its derivative are continuous there", () => {
    const c = cases[1] as (typeof cases)[number];
    const nozzle = element(c);
    const beta = c.boreDiameter / c.pipeDiameter;
    const p1 = 5e5;
    const t1 = 300;
    const critical = nozzleCriticalPressureRatio(beta, 1.4);
    const chokePoint = p1 * (1 - pressureLossRatio(beta, c.dischargeCoefficient) * (1 - critical));
    const choked = evaluate(nozzle, p1, t1, 0.9 * chokePoint);
    const lower = evaluate(nozzle, p1, t1, 0.3 * chokePoint);
    expect(choked.choked).toBe(true);
    expect(lower.massFlow).toBe(choked.massFlow);
    const expected = nozzleMassFlow(
      c.dischargeCoefficient,
      c.boreDiameter,
      beta,
      p1,
      p1 / (air.specificGasConstant * t1),
      0,
      1.4,
    );
    expect(relativeError(choked.massFlow, expected)).toBeLessThan(1e-13);
    const justAbove = evaluate(nozzle, p1, t1, 1.0001 * chokePoint);
    expect(justAbove.choked).toBe(false);
    // The flux peaks at tau*: 1e-4 above it the flow differs by O(1e-8), and so does the slope
    // relative to its size away from the peak.
    expect(relativeError(justAbove.massFlow, expected)).toBeLessThan(1e-6);
    const away = evaluate(nozzle, p1, t1, 1.1 * chokePoint);
    expect(Math.abs(justAbove.dMassFlowdDownstreamPressure)).toBeLessThan(
      0.01 * Math.abs(away.dMassFlowdDownstreamPressure),
    );
  });
});
