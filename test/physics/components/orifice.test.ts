import { describe, expect, it } from "vitest";
import { criticalPressureRatio } from "../../../src/index.js";
import type { OrificeElement } from "../../../src/physics/components/component-elements.js";
import { componentDetails } from "../../../src/physics/components/component-flow.js";
import {
  ORIFICE_DISCHARGE_COEFFICIENT,
  orificeExpansibility,
  orificeMassFlow,
} from "../../../src/physics/components/orifice.js";
import { pressureLossRatio } from "../../../src/physics/components/restriction.js";
import { air, evaluate, reference, relativeError } from "./reference.js";

const library = `python3-fluids ${reference.fluids}`;

describe("ISO 5167-2 orifice relations", () => {
  it(`orificeExpansibility matches ${library} orifice_expansibility (its doctest 0.997474 among them)`, () => {
    for (const c of reference.orificeExpansibility) {
      const value = orificeExpansibility(c.Do / c.D, c.P2 / c.P1, c.k);
      // The same closed form: only rounding separates the two.
      expect(relativeError(value, c.value)).toBeLessThan(1e-13);
    }
    expect(orificeExpansibility(0.0222 / 0.0739, 0.99, 1.4)).toBeCloseTo(0.997474, 6);
  });

  it(`pressureLossRatio times the differential is ${library} dP_orifice (ISO 5167-2 sec. 5.4)`, () => {
    for (const c of reference.orificePressureLoss) {
      const loss = pressureLossRatio(c.Do / c.D, c.C) * (c.P1 - c.P2);
      expect(relativeError(loss, c.value)).toBeLessThan(1e-13); // closed form
    }
    // fluids' doctest: 9069.47 Pa of a 17 kPa differential.
    expect(pressureLossRatio(0.05 / 0.07366, 0.61512) * 17000).toBeCloseTo(9069.4747, 3);
  });

  it(`orificeMassFlow is ISO 5167-1 eq. 1, as ${library} flow_meter_discharge`, () => {
    for (const c of reference.orificeDischarge) {
      const flow = orificeMassFlow(c.C, c.Do, c.Do / c.D, c.P1, c.rho, c.P2, c.k);
      expect(relativeError(flow, c.massFlow)).toBeLessThan(1e-13); // closed form
    }
  });

  it(`the default discharge coefficient lies in the Reader-Harris/Gallagher range of ISO 5167-2 (${library})`, () => {
    const [low, high] = reference.readerHarrisGallagherRange;
    expect(ORIFICE_DISCHARGE_COEFFICIENT).toBeGreaterThanOrEqual(low);
    expect(ORIFICE_DISCHARGE_COEFFICIENT).toBeLessThanOrEqual(high);
  });
});

describe("an orifice between two nodes", () => {
  const element = (c: (typeof reference.restrictionBetweenReservoirs)[number]): OrificeElement => ({
    kind: "orifice",
    boreDiameter: c.boreDiameter,
    pipeDiameter: c.pipeDiameter,
    dischargeCoefficient: c.dischargeCoefficient,
  });
  const cases = reference.restrictionBetweenReservoirs.filter((c) => c.kind === "orifice");

  it(`passes the flow of ISO 5167 at the tap pressure whose permanent loss is the node drop (${library}, scipy ${reference.scipy} brentq)`, () => {
    for (const c of cases) {
      const result = evaluate(element(c), c.upstreamPressure, c.temperature, c.downstreamPressure);
      // fluids' tap pressure is solved to 1e-10 Pa: the flow follows to about 1e-12.
      expect(relativeError(result.massFlow, c.massFlow)).toBeLessThan(1e-9);
      expect(result.choked).toBe(false);
      const details = componentDetails(
        element(c),
        air,
        c.upstreamPressure,
        c.downstreamPressure,
        true,
        result,
      );
      expect(details.kind).toBe("orifice");
      if (details.kind === "orifice") {
        expect(
          relativeError(details.pressureRatio, c.tapPressure / c.upstreamPressure),
        ).toBeLessThan(1e-12);
        expect(relativeError(details.expansibility, c.expansibility)).toBeLessThan(1e-11);
        expect(details.permanentPressureLoss).toBe(c.upstreamPressure - c.downstreamPressure);
      }
    }
  });

  it("chokes when the tap pressure ratio reaches the critical pressure ratio, and its flow then stays put", () => {
    const c = cases[0] as (typeof cases)[number];
    const orifice = element(c);
    const p1 = 6e5;
    const t1 = 293.15;
    const beta = c.boreDiameter / c.pipeDiameter;
    const critical = criticalPressureRatio(1.4);
    // The node pressure at which the tap ratio is critical: p1 (1 - L (1 - r*)).
    const loss = pressureLossRatio(beta, c.dischargeCoefficient);
    const chokePoint = p1 * (1 - loss * (1 - critical));
    const expected = orificeMassFlow(
      c.dischargeCoefficient,
      c.boreDiameter,
      beta,
      p1,
      p1 / (air.specificGasConstant * t1),
      critical * p1,
      1.4,
    );
    for (const pd of [0.999 * chokePoint, 0.8 * chokePoint, 0.2 * chokePoint, 1e3]) {
      const result = evaluate(orifice, p1, t1, pd);
      expect(result.choked).toBe(true);
      expect(result.dMassFlowdDownstreamPressure).toBe(0);
      expect(relativeError(result.massFlow, expected)).toBeLessThan(1e-14);
      expect(relativeError(result.capacity, expected)).toBeLessThan(1e-14);
    }
    const justAbove = evaluate(orifice, p1, t1, 1.001 * chokePoint);
    expect(justAbove.choked).toBe(false);
    expect(justAbove.massFlow).toBeLessThan(expected);
    // Continuous through the choke point: 0.1 % above it in pressure, the flow is within 0.1 %.
    expect(relativeError(justAbove.massFlow, expected)).toBeLessThan(1e-3);
  });

  it("from a plenum (no pipe diameter) recovers no pressure: the tap ratio is the node ratio", () => {
    const orifice: OrificeElement = {
      kind: "orifice",
      boreDiameter: 0.01,
      pipeDiameter: Number.NaN,
      dischargeCoefficient: 0.6,
    };
    const result = evaluate(orifice, 3e5, 300, 2.7e5);
    const expected = orificeMassFlow(
      0.6,
      0.01,
      0,
      3e5,
      3e5 / (air.specificGasConstant * 300),
      2.7e5,
      1.4,
    );
    expect(relativeError(result.massFlow, expected)).toBeLessThan(1e-14);
    expect(result.inletMach).toBe(0);
    expect(result.outletMach).toBe(0);
  });
});
