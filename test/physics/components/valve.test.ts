import { describe, expect, it } from "vitest";
import { KV_PER_CV } from "../../../src/input/read-components.js";
import type {
  CheckValveElement,
  ValveElement,
} from "../../../src/physics/components/component-elements.js";
import { componentDetails } from "../../../src/physics/components/component-flow.js";
import {
  regularisedRoot,
  regularisedRootSlope,
} from "../../../src/physics/components/small-difference.js";
import {
  pipingGeometryFactor,
  pressureDifferentialRatioFactorWithFittings,
  valveCharacteristicRatio,
  valveExpansionFactor,
  valveGasMassFlow,
} from "../../../src/physics/components/valve.js";
import { air, evaluate, reference, relativeError } from "./reference.js";

const library = `python3-fluids ${reference.fluids}`;

function valve(kv: number, xT: number, extra: Partial<ValveElement> = {}): ValveElement {
  return {
    kind: "valve",
    flowCoefficient: kv,
    opening: 1,
    characteristic: "linear",
    rangeability: 50,
    pressureDifferentialRatioFactor: xT,
    valveDiameter: Number.NaN,
    inletPipeDiameter: Number.NaN,
    outletPipeDiameter: Number.NaN,
    ...extra,
  };
}

describe("IEC 60534-2-1 relations", () => {
  it(`Kv = 0.865 Cv from the unit definitions is ${library} Cv_to_Kv`, () => {
    expect(relativeError(KV_PER_CV, reference.cvToKv)).toBeLessThan(1e-12);
    expect(KV_PER_CV).toBeCloseTo(0.865, 3);
  });

  it("the inherent characteristics are h and R^(h-1) (IEC 60534-2-4), 0 when shut", () => {
    expect(valveCharacteristicRatio(0.3, "linear", 50)).toBe(0.3);
    expect(valveCharacteristicRatio(0.5, "equal-percentage", 50)).toBeCloseTo(
      1 / Math.sqrt(50),
      14,
    );
    expect(valveCharacteristicRatio(1, "equal-percentage", 30)).toBe(1);
    expect(valveCharacteristicRatio(0, "equal-percentage", 30)).toBe(0);
  });

  it("Y falls linearly from 1 to 2/3 at x = Fgamma xT and stays there (IEC 60534-2-1)", () => {
    expect(valveExpansionFactor(0, 1.4, 0.7)).toBe(1);
    expect(valveExpansionFactor(0.5, 1.4, 0.7)).toBeCloseTo(1 - 0.5 / 2.1, 14);
    expect(valveExpansionFactor(0.7, 1.4, 0.7)).toBeCloseTo(2 / 3, 14);
    expect(valveExpansionFactor(0.9, 1.4, 0.7)).toBeCloseTo(2 / 3, 14);
    // Fgamma = gamma / 1.4 moves the choke point: argon (5/3) chokes at x = 0.833 for xT 0.7.
    expect(valveExpansionFactor(0.8, 5 / 3, 0.7)).toBeGreaterThan(2 / 3);
  });

  it(`reproduces Example 3 of IEC 60534-2-1 (CO2 through a valve between reducers) with ${library}'s constants`, () => {
    const example = reference.valveExample3;
    const converged = reference.valveExample3Converged;
    const input = example.inputs as Record<string, number>;
    const d = input.d as number;
    const d1 = input.D1 as number;
    const d2 = input.D2 as number;
    // Fp and xTP at the standard's equations' own fixed point (fluids' constants, scipy brentq):
    // the same closed forms, so to rounding.
    const fp = pipingGeometryFactor(converged.kv, d, d1, d2);
    expect(relativeError(fp, converged.pipingFactor)).toBeLessThan(1e-12);
    const xtp = pressureDifferentialRatioFactorWithFittings(
      input.xT as number,
      converged.kv,
      fp,
      d,
      d1,
    );
    expect(relativeError(xtp, converged.xTP)).toBeLessThan(1e-12);
    // The flow at that Kv: the example's 3800 m3/h (0 degC, 1 atm) of CO2. The standard's N9 =
    // 24.6 is rounded (exact 24.58 from N6 = 3.1623), so 0.1 % apart.
    const flow = valveGasMassFlow(
      converged.kv,
      fp,
      xtp,
      input.gamma as number,
      input.P1 as number,
      example.inletDensity,
      input.P2 as number,
    );
    expect(relativeError(flow, example.massFlow)).toBeLessThan(1.5e-3);
    // Not choked: x = 0.544 < Fgamma xTP = 0.58.
    expect(example.choked).toBe(false);
    const p1 = input.P1 as number;
    expect((p1 - (input.P2 as number)) / p1).toBeLessThan((1.3 / 1.4) * xtp);
  });

  it(`a valve between two nodes passes the flow ${library} size_control_valve_g sizes it for (inverted with scipy brentq)`, () => {
    for (const c of reference.valveBetweenReservoirs) {
      const result = evaluate(
        valve(c.kv, c.xT),
        c.upstreamPressure,
        c.temperature,
        c.downstreamPressure,
      );
      // N9 = 24.6 (the standard's rounding) against machnet's exact 3600 sqrt(1000)/36000: 8e-4.
      expect(relativeError(result.massFlow, c.massFlow)).toBeLessThan(1.5e-3);
      const x = (c.upstreamPressure - c.downstreamPressure) / c.upstreamPressure;
      expect(result.choked).toBe(x >= c.xT);
    }
  });

  it("a shut valve passes only its leakage and reports it", () => {
    const shut = valve(10, 0.7, { opening: 0 });
    const result = evaluate(shut, 7e5, 293.15, 6e5);
    const open = evaluate(valve(10, 0.7), 7e5, 293.15, 6e5);
    expect(result.massFlow).toBeGreaterThan(0);
    expect(result.massFlow).toBeLessThan(1e-11 * open.massFlow);
    // The documented seat leakage: 1e-12 (Kv / 36000) (p1 - p2) / sqrt(R T1).
    const leakage = (1e-12 * (10 / 36000) * 1e5) / Math.sqrt(air.specificGasConstant * 293.15);
    expect(relativeError(result.massFlow, leakage)).toBeLessThan(1e-14);
    const details = componentDetails(shut, air, 7e5, 6e5, true, result);
    expect(details).toMatchObject({ kind: "valve", state: "shut", leakage: result.massFlow });
  });

  it("reducers in reverse flow swap the inlet and outlet pipes", () => {
    const reducer = valve(40, 0.7, {
      valveDiameter: 0.05,
      inletPipeDiameter: 0.08,
      outletPipeDiameter: 0.1,
    });
    const forward = evaluate(reducer, 5e5, 300, 4e5, true);
    const reverse = evaluate(reducer, 5e5, 300, 4e5, false);
    const fpForward = pipingGeometryFactor(40, 0.05, 0.08, 0.1);
    const fpReverse = pipingGeometryFactor(40, 0.05, 0.1, 0.08);
    expect(fpForward).not.toBeCloseTo(fpReverse, 3);
    expect(relativeError(forward.massFlow / reverse.massFlow, fpForward / fpReverse)).toBeLessThan(
      0.01,
    );
  });

  it("a check valve is open forward and closed backward (leakage only)", () => {
    const check: CheckValveElement = {
      kind: "check",
      flowCoefficient: 10,
      pressureDifferentialRatioFactor: 0.7,
      pipeDiameter: 0.0525,
    };
    const open = evaluate(check, 7e5, 293.15, 6e5, true);
    const asValve = evaluate(valve(10, 0.7), 7e5, 293.15, 6e5, true);
    expect(open.massFlow).toBe(asValve.massFlow);
    const closed = evaluate(check, 7e5, 293.15, 6e5, false);
    expect(closed.massFlow).toBeLessThan(1e-11 * open.massFlow);
    expect(closed.choked).toBe(false);
    expect(componentDetails(check, air, 7e5, 6e5, false, closed)).toMatchObject({
      kind: "check",
      state: "closed",
      leakage: closed.massFlow,
    });
  });
});

describe("the small-difference square root", () => {
  it("is sqrt(x) above 1e-6 and a cubic with the same value and slope there below it", () => {
    expect(regularisedRoot(0.25)).toBe(0.5);
    expect(regularisedRoot(0)).toBe(0);
    const threshold = 1e-6;
    expect(
      relativeError(regularisedRoot(threshold * (1 - 1e-12)), Math.sqrt(threshold)),
    ).toBeLessThan(1e-11);
    expect(
      relativeError(regularisedRootSlope(threshold * (1 - 1e-12)), 0.5 / Math.sqrt(threshold)),
    ).toBeLessThan(1e-11);
    expect(regularisedRootSlope(0)).toBeCloseTo(1.5 / Math.sqrt(threshold), 6);
    // Below sqrt(x) by at most 0.174 sqrt(x_t) (the documented bound; the maximum of
    // sqrt(u) - u (3 - u) / 2 on [0, 1] is 0.17404 at u = 0.134).
    let worst = 0;
    for (let i = 1; i < 1000; i++) {
      const x = (i / 1000) * threshold;
      worst = Math.max(worst, Math.sqrt(x) - regularisedRoot(x));
    }
    expect(worst / Math.sqrt(threshold)).toBeLessThan(0.17405);
    expect(worst / Math.sqrt(threshold)).toBeGreaterThan(0.174);
  });
});
