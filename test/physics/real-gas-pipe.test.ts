/**
 * The adiabatic and isothermal pipe models with cp(T) (NASA polynomials) and a real gas
 * (Peng-Robinson): src/physics/real-gas-pipe.ts and the dispatch in src/physics/pipe-flow.ts.
 * (The adiabatic route through the heat-transfer integrator agrees with Fanno for a perfect gas:
 * test/physics/heat-transfer-pipe.test.ts, "heat-transfer pipe without heat exchange or
 * elevation is Fanno flow".)
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import type { Gas } from "../../src/gas/gas-types.js";
import { gasState } from "../../src/gas/thermo.js";
import { gasPreset, pipeFlow, pipeOutlet } from "../../src/index.js";
import { pipeGas, pipeGeometry } from "../../src/physics/pipe.js";
import { evaluatePipeFlow, PipeFlowEvaluation } from "../../src/physics/pipe-flow.js";
import { isothermIntegrals, RealGasScratch } from "../../src/physics/real-gas-pipe.js";

const methane = gasPreset("methane");
const methanePr = gasPreset("methane", { equationOfState: "peng-robinson" });
const methaneNasa = gasPreset("methane", { heatCapacity: "nasa7" });
const methaneReal = gasPreset("methane", {
  heatCapacity: "nasa7",
  equationOfState: "peng-robinson",
});

interface IsothermalReference {
  temperature: number;
  p1: number;
  frictionFactor: number;
  length: number;
  diameter: number;
  subsonic: { p2: number; massFlux: number }[];
  choked: { p2: number; massFlux: number };
}
// scipy 1.10.1 quad of an independent Peng-Robinson density:
// test/fixtures/pipe/make-real-gas-isothermal-reference.py.
const reference = JSON.parse(
  readFileSync(
    new URL("../fixtures/pipe/real-gas-isothermal-reference.json", import.meta.url),
    "utf8",
  ),
) as IsothermalReference;

const referencePipe = {
  length: reference.length,
  diameter: reference.diameter,
  frictionFactor: reference.frictionFactor,
  model: "isothermal" as const,
};
const area = 0.25 * Math.PI * reference.diameter ** 2;
const upstream = { pressure: reference.p1, temperature: reference.temperature };

describe("isothermal pipe with Peng-Robinson methane", () => {
  it("passes the mass flux of the real-gas relation (scipy quad of an independent PR density)", () => {
    for (const { p2, massFlux } of reference.subsonic) {
      const flow = pipeFlow(methanePr, referencePipe, upstream, p2);
      expect(flow.choked).toBe(false);
      // 1e-9: the 8-point quadrature of the departure (exact to about 1e-13 here), the two
      // cubic solvers' rounding and quad's 1e-13.
      expect(Math.abs(flow.massFlow / area / massFlux - 1), `p2 ${p2}`).toBeLessThan(1e-9);
    }
    // The ideal gas passes less at 60 bar (Z < 1: denser), by several percent.
    const ideal = pipeFlow(methane, referencePipe, upstream, 40e5).massFlow / area;
    expect(
      ((reference.subsonic[2] as { massFlux: number }).massFlux - ideal) / ideal,
    ).toBeGreaterThan(0.03);
  });

  it("chokes where the exit velocity reaches the isothermal sound speed", () => {
    const flow = pipeFlow(methanePr, referencePipe, upstream, 1e5);
    expect(flow.choked).toBe(true);
    // 1e-7: the fixture's central difference of the density (1e-10) and brentq's p2 (1e-9 Pa).
    expect(Math.abs(flow.capacity / area / reference.choked.massFlux - 1)).toBeLessThan(1e-7);
    expect(Math.abs(flow.outlet.pressure / reference.choked.p2 - 1)).toBeLessThan(1e-7);
    // Just above p2* the pipe is subsonic with nearly the capacity.
    const near = pipeFlow(methanePr, referencePipe, upstream, reference.choked.p2 * 1.001);
    expect(near.choked).toBe(false);
    expect(near.massFlow / flow.capacity).toBeGreaterThan(0.99999);
  });

  it("has the perfect gas's relation at low pressure (to 1e-9)", () => {
    // 5 mPa: Z - 1 = B p/(Ru T) about 1e-10 (B = -43 cm3/mol); the flow is laminar there, the
    // same law for both.
    for (const ratio of [0.95, 0.6, 0.2]) {
      const low = { pressure: 0.005, temperature: 300 };
      const a = pipeFlow(methane, referencePipe, low, 0.005 * ratio);
      const b = pipeFlow(methanePr, referencePipe, low, 0.005 * ratio);
      expect(Math.abs(b.massFlow / a.massFlow - 1)).toBeLessThan(1e-9);
      expect(b.choked).toBe(a.choked);
    }
  });

  it("integrates rho dp exactly for an ideal gas and to 1e-12 of the departure against 16 nodes", () => {
    const scratch = new RealGasScratch();
    isothermIntegrals(methane, 30e5, 30e5, 300, scratch);
    const rt = methane.specificGasConstant * 300;
    expect(scratch.densityIntegral).toBe((60e5 ** 2 - 30e5 ** 2) / (2 * rt));
    // Composite 8-point rule on two halves (16 nodes) as the check of the single rule.
    isothermIntegrals(methanePr, 30e5, 30e5, 300, scratch);
    const single = scratch.densityIntegral;
    isothermIntegrals(methanePr, 30e5, 15e5, 300, scratch);
    const lower = scratch.densityIntegral;
    isothermIntegrals(methanePr, 45e5, 15e5, 300, scratch);
    const split = lower + scratch.densityIntegral;
    const departure = single - (60e5 ** 2 - 30e5 ** 2) / (2 * rt);
    expect(Math.abs(departure)).toBeGreaterThan(0.03 * single);
    expect(Math.abs(single - split)).toBeLessThan(1e-12 * Math.abs(departure));
  });

  it("takes in the heat of its enthalpy change: m (h(p2, T) + v2^2/2 - h(p1, T)) > 0", () => {
    const flow = pipeFlow(methanePr, referencePipe, upstream, 40e5);
    const h1 = gasState(methanePr, reference.p1, reference.temperature).enthalpy;
    const exit = gasState(methanePr, 40e5, reference.temperature);
    const v2 = flow.massFlow / area / exit.density;
    const expected = flow.massFlow * (exit.enthalpy + 0.5 * v2 * v2 - h1);
    // Expanding at constant T a real gas absorbs heat (h rises as p falls: (dh/dp)_T < 0).
    expect(expected).toBeGreaterThan(flow.massFlow * 0.5 * v2 * v2 * 10);
    expect(Math.abs(flow.heatFlow / expected - 1)).toBeLessThan(1e-12);
    // The outlet: static T throughout, the real density.
    expect(flow.outlet.temperature).toBe(reference.temperature);
    expect(Math.abs(flow.outlet.density / exit.density - 1)).toBeLessThan(1e-12);
  });

  it("inverts: pipeOutlet of the flow gives the exit pressure back", () => {
    for (const p2 of [58e5, 40e5, 5e5]) {
      const flow = pipeFlow(methaneReal, referencePipe, upstream, p2);
      const back = pipeOutlet(methaneReal, referencePipe, upstream, flow.massFlow);
      expect(back.ok).toBe(true);
      if (back.ok) expect(Math.abs(back.flow.outlet.pressure - p2)).toBeLessThan(1e-7 * p2);
    }
    expect(
      pipeOutlet(methaneReal, referencePipe, upstream, 1.01 * reference.choked.massFlux * area).ok,
    ).toBe(false);
  });
});

describe("derivatives of the real-gas pipes against central differences", () => {
  const cases: [string, Gas, "isothermal" | "adiabatic", number][] = [
    ["isothermal PR", methaneReal, "isothermal", 50e5],
    ["isothermal PR, near choke", methaneReal, "isothermal", 5e5],
    ["isothermal PR, choked", methaneReal, "isothermal", 1e5],
    ["isothermal nasa7", methaneNasa, "isothermal", 40e5],
    ["isothermal nasa7, choked", methaneNasa, "isothermal", 1e5],
  ];
  for (const [name, gas, model, pd] of cases) {
    it(`${name}: mass flow and arrival temperature`, () => {
      const geometry = pipeGeometry({ ...referencePipe, model });
      const kernel = pipeGas(gas);
      const at = (p0: number, t0: number, d: number) =>
        evaluatePipeFlow(geometry, kernel, p0, t0, d, new PipeFlowEvaluation());
      const p0 = 60e5;
      const t0 = 300;
      const base = at(p0, t0, pd);
      const hp = 1e-6 * p0;
      const ht = 1e-5 * t0;
      const plusP = at(p0 + hp, t0, pd);
      const minusP = at(p0 - hp, t0, pd);
      const plusT = at(p0, t0 + ht, pd);
      const minusT = at(p0, t0 - ht, pd);
      const plusD = at(p0, t0, pd + hp);
      const minusD = at(p0, t0, pd - hp);
      const m = base.massFlow;
      // Flow slopes to 1e-6 of m/p0 and m/T0 (the choked branch differences capacity solves
      // with a step of 1e-5: truncation 1e-10, the solves' rounding 1e-9); arrival slopes to
      // 1e-9 K/Pa and 1e-5 (the arrival's slope with respect to T0 is near 1).
      expect(
        Math.abs(base.dMassFlowdUpstreamPressure - (plusP.massFlow - minusP.massFlow) / (2 * hp)),
      ).toBeLessThan(1e-6 * (m / p0));
      expect(
        Math.abs(
          base.dMassFlowdUpstreamTemperature - (plusT.massFlow - minusT.massFlow) / (2 * ht),
        ),
      ).toBeLessThan(1e-6 * (m / t0));
      expect(
        Math.abs(base.dMassFlowdDownstreamPressure - (plusD.massFlow - minusD.massFlow) / (2 * hp)),
      ).toBeLessThan(1e-6 * (m / p0));
      const arrival = (e: PipeFlowEvaluation) => e.arrivalTemperature;
      expect(
        Math.abs(
          base.dArrivalTemperaturedUpstreamPressure - (arrival(plusP) - arrival(minusP)) / (2 * hp),
        ),
      ).toBeLessThan(1e-9);
      expect(
        Math.abs(
          base.dArrivalTemperaturedDownstreamPressure -
            (arrival(plusD) - arrival(minusD)) / (2 * hp),
        ),
      ).toBeLessThan(1e-9);
      expect(
        Math.abs(
          base.dArrivalTemperaturedUpstreamTemperature -
            (arrival(plusT) - arrival(minusT)) / (2 * ht),
        ),
      ).toBeLessThan(1e-5);
    });
  }
});

describe("isothermal pipe with cp(T) and an ideal gas", () => {
  it("has the perfect gas's flow bit for bit; the arrival carries h(T) + v2^2/2 with h of the polynomial", () => {
    for (const pd of [50e5, 20e5, 1e5]) {
      const a = pipeFlow(methane, referencePipe, upstream, pd);
      const b = pipeFlow(methaneNasa, referencePipe, upstream, pd);
      expect(b.massFlow).toBe(a.massFlow);
      expect(b.choked).toBe(a.choked);
      expect(b.outlet.pressure).toBe(a.outlet.pressure);
      // Heat: the kinetic energy the exit carries, m v2^2/2 (T is held: no enthalpy change).
      const v2 = b.massFlow / area / (b.outlet.pressure / (methane.specificGasConstant * 300));
      expect(Math.abs(b.heatFlow / (0.5 * b.massFlow * v2 * v2) - 1)).toBeLessThan(1e-9);
      expect(Math.abs(b.outlet.velocity / v2 - 1)).toBeLessThan(1e-12);
    }
  });
});

describe("adiabatic pipe with cp(T) or a real gas (heat-transfer integrator, no heat exchange)", () => {
  const pipe = { length: 20, diameter: 0.05, roughness: 4.5e-5, model: "adiabatic" as const };
  const hot = { pressure: 10e5, temperature: 500 };

  it("with cp(T) at 500 K: nearly the constant-cp flow, a smaller static temperature drop", () => {
    // Air's cp at 500 K is 1030 J/(kg K) (NASA polynomials), 2.5 % above the 298 K value the
    // constant model uses: the same kinetic energy v^2/2 = cp (T0 - T) costs a smaller drop.
    const air = gasPreset("air");
    const airNasa = gasPreset("air", { heatCapacity: "nasa7" });
    const a = pipeFlow(air, pipe, hot, 5e5);
    const b = pipeFlow(airNasa, pipe, hot, 5e5);
    expect(a.outlet.mach).toBeGreaterThan(0.3); // fast enough for the drop to show
    expect(Math.abs(b.massFlow / a.massFlow - 1)).toBeLessThan(0.01);
    const dropA = hot.temperature - a.outlet.temperature;
    const dropB = hot.temperature - b.outlet.temperature;
    expect(dropB).toBeLessThan(dropA);
    // The enthalpy of the polynomial pays the kinetic energy: h(T0) - h(T) = v^2/2 (the
    // entrance closes the first law, the integration conserves it). Tolerance 1e-6 of v^2/2:
    // the integration's error control.
    const h0 = gasState(airNasa, hot.pressure, hot.temperature).enthalpy;
    const h = gasState(airNasa, b.outlet.pressure, b.outlet.temperature).enthalpy;
    const kinetic = 0.5 * b.outlet.velocity ** 2;
    expect(Math.abs((h0 - h) / kinetic - 1)).toBeLessThan(1e-6);
    // About the ratio of the two cp: 1006 against 1030 J/(kg K).
    expect(dropB / dropA).toBeGreaterThan(0.97);
    expect(b.heatFlow).toBe(0);
  });

  it("with Peng-Robinson: stagnation enthalpy, not temperature, passes", () => {
    const flow = pipeFlow(methaneReal, pipe, { pressure: 60e5, temperature: 300 }, 40e5);
    const h0 = gasState(methaneReal, 60e5, 300).enthalpy;
    const out = flow.outlet;
    const exit = gasState(methaneReal, out.pressure, out.temperature);
    // h + v^2/2 at the exit equals h0: the entrance closes the first law (its temperature from
    // h + v^2/2 = h0 at the isentrope's pressure; the isentropic form alone would be off by
    // O(M^2 (1 - Z)), 380 J/kg here) and the integration conserves h + v^2/2 along the pipe.
    // Tolerance 1e-6 of v^2/2 = 8900 J/kg: the integration's error control (1e-10 of the
    // change scales) and the end-state conversion from Mach number.
    const kinetic = 0.5 * out.velocity ** 2;
    expect(Math.abs(exit.enthalpy + kinetic - h0)).toBeLessThan(1e-6 * kinetic);
    // The stagnation temperature falls (Joule-Thomson), by several kelvin over 20 bar.
    expect(300 - out.stagnationTemperature).toBeGreaterThan(5);
    expect(flow.heatFlow).toBe(0);
    // The evaluation's arrival holds h0 at the downstream pressure.
    const evaluation = evaluatePipeFlow(
      pipeGeometry(pipe),
      pipeGas(methaneReal),
      60e5,
      300,
      40e5,
      new PipeFlowEvaluation(),
    );
    const arriving = gasState(methaneReal, 40e5, evaluation.arrivalTemperature).enthalpy;
    expect(Math.abs(arriving - h0)).toBeLessThan(1e-6);
  });
});

describe("derivatives of the integrated pipe with Peng-Robinson (the entrance closing the first law)", () => {
  // As test/physics/heat-transfer-pipe.test.ts checks the perfect gas: methane at 60 bar, an
  // adiabatic pipe (integrated) and a heat-transfer pipe losing heat to 263 K.
  const pipes = [
    pipeGeometry({ length: 60, diameter: 0.05, roughness: 5e-5, model: "adiabatic" }),
    pipeGeometry({
      length: 60,
      diameter: 0.05,
      roughness: 5e-5,
      model: "heat-transfer",
      heatTransferPerLength: 30,
      surroundingTemperature: 263.15,
    }),
  ];
  const kernel = pipeGas(methaneReal);
  for (const geometry of pipes) {
    for (const pd of [55e5, 40e5]) {
      it(`match central differences of flow and arrival (${geometry.model}, pd ${pd} Pa)`, () => {
        const evaluate = (p0: number, t0: number, d: number) =>
          evaluatePipeFlow(geometry, kernel, p0, t0, d, new PipeFlowEvaluation());
        const p0 = 60e5;
        const t0 = 300;
        const base = evaluate(p0, t0, pd);
        expect(base.choked).toBe(false);
        const step = 1e-4 * (p0 - pd);
        const checks: [number, (h: number) => number, number][] = [
          [base.dMassFlowdUpstreamPressure, (h) => evaluate(p0 + h, t0, pd).massFlow, step],
          [base.dMassFlowdUpstreamTemperature, (h) => evaluate(p0, t0 + h, pd).massFlow, 1e-2],
          [base.dMassFlowdDownstreamPressure, (h) => evaluate(p0, t0, pd + h).massFlow, step],
          [
            base.dArrivalTemperaturedUpstreamPressure,
            (h) => evaluate(p0 + h, t0, pd).arrivalTemperature,
            step,
          ],
          [
            base.dArrivalTemperaturedUpstreamTemperature,
            (h) => evaluate(p0, t0 + h, pd).arrivalTemperature,
            1e-2,
          ],
          [
            base.dArrivalTemperaturedDownstreamPressure,
            (h) => evaluate(p0, t0, pd + h).arrivalTemperature,
            step,
          ],
        ];
        for (const [analytic, at, h] of checks) {
          const difference = (at(h) - at(-h)) / (2 * h);
          // The integration's noise over a step of 1e-4 of the drop (1e-5 relative) and
          // truncation of the same order, as for the perfect gas.
          const scale = Math.max(Math.abs(difference), Math.abs(analytic), 1e-12);
          expect(Math.abs(analytic - difference) / scale).toBeLessThan(1e-3);
        }
      });
    }
  }
});
