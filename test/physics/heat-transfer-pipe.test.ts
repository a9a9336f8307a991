import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { gasPreset, type Pipe, pipeFlow, pipeOutlet } from "../../src/index.js";
import { INTEGRATION_TOLERANCE, STANDARD_GRAVITY } from "../../src/physics/heat-transfer-pipe.js";
import { pipeGas, pipeGeometry } from "../../src/physics/pipe.js";
import { evaluatePipeFlow, PipeFlowEvaluation } from "../../src/physics/pipe-flow.js";

const air = gasPreset("air");
const upstream = { pressure: 7e5, temperature: 293.15 };

describe("heat-transfer pipe without heat exchange or elevation is Fanno flow", () => {
  // The adiabatic model is the closed-form Fanno solution (validated against published Fanno
  // tables in test/physics/fanno.test.ts). The integration's local error is 1e-10 of the drop per
  // step; over the few hundred steps of a run the outlet pressure carries at most about 1e-8 of the
  // drop, which at these drops is 1e-8 of the flow: 1e-7 relative leaves a factor 10 of margin.
  const cases: [string, Pipe, number][] = [
    ["turbulent, Colebrook-White", { length: 50, diameter: 0.0525, roughness: 4.5e-5 }, 6.2e5],
    [
      "fixed f and fittings",
      { length: 12, diameter: 0.0266, frictionFactor: 0.024, minorLoss: 3.5 },
      5e5,
    ],
    ["high Mach, near choke", { length: 30, diameter: 0.0409, frictionFactor: 0.021 }, 3.2e5],
  ];
  for (const [name, pipe, pd] of cases) {
    it(`matches the adiabatic model's flow and exit state (${name})`, () => {
      const fanno = pipeFlow(air, pipe, upstream, pd);
      const general = pipeFlow(air, { ...pipe, model: "heat-transfer" }, upstream, pd);
      expect(general.choked).toBe(fanno.choked);
      expect(Math.abs(general.massFlow / fanno.massFlow - 1)).toBeLessThan(1e-7);
      expect(Math.abs(general.outlet.mach / fanno.outlet.mach - 1)).toBeLessThan(1e-6);
      expect(Math.abs(general.outlet.temperature / fanno.outlet.temperature - 1)).toBeLessThan(
        1e-8,
      );
      // No heat in: the stagnation temperature arrives unchanged (first law, exactly).
      expect(
        Math.abs(general.outlet.stagnationTemperature / upstream.temperature - 1),
      ).toBeLessThan(1e-8);
      expect(general.heatFlow).toBe(0);
    });
  }

  it("chokes at the Fanno capacity with the sonic exit pressure", () => {
    const pipe: Pipe = { length: 12, diameter: 0.0266, frictionFactor: 0.024, minorLoss: 3.5 };
    const fanno = pipeFlow(air, pipe, upstream, 1e5);
    const general = pipeFlow(air, { ...pipe, model: "heat-transfer" }, upstream, 1e5);
    expect(fanno.choked).toBe(true);
    expect(general.choked).toBe(true);
    // The sonic point is found by extrapolating (1 - M^2)^2 linearly from 1 - M^2 = 1e-4: its
    // error is of order (1e-4)^2 of the friction length, far below 1e-6 in the capacity.
    expect(Math.abs(general.capacity / fanno.capacity - 1)).toBeLessThan(1e-6);
    expect(Math.abs(general.outlet.pressure / fanno.outlet.pressure - 1)).toBeLessThan(1e-4);
    expect(general.outlet.mach).toBe(1);
  });
});

describe("heat-transfer pipe with a very large heat-transfer coefficient is isothermal", () => {
  it("approaches the isothermal model when the surroundings are at the inlet temperature", () => {
    // The isothermal model holds the static temperature at the plenum temperature T0 from the
    // inlet on (its entrance neglects the velocity head). With U' huge and Ts = T0 the integrated
    // static temperature is pinned at Ts; the remaining difference is the entrance (inlet Mach
    // 0.1 here: velocity head about 0.7 % of p0, so flows agree to about 1e-2).
    const pipe: Pipe = { length: 800, diameter: 0.1023, roughness: 5e-5 };
    const isothermal = pipeFlow(air, { ...pipe, model: "isothermal" }, upstream, 5.5e5);
    const general = pipeFlow(
      air,
      {
        ...pipe,
        model: "heat-transfer",
        heatTransferPerLength: 5000,
        surroundingTemperature: upstream.temperature,
      },
      upstream,
      5.5e5,
    );
    expect(Math.abs(general.outlet.temperature / upstream.temperature - 1)).toBeLessThan(1e-4);
    expect(Math.abs(general.massFlow / isothermal.massFlow - 1)).toBeLessThan(1e-2);
    expect(general.heatFlow).toBeGreaterThan(0); // the expanding gas takes heat in
  });
});

describe("hydrostatic column", () => {
  it("gives p2 = p1 exp(-g dz / (R T)) at vanishing flow in an isothermal vertical pipe", () => {
    // Closed form of an isothermal ideal-gas column (any fluid-statics text, e.g. F. M. White,
    // Fluid Mechanics, 7th ed., McGraw-Hill 2011, eq. 2.27). A tiny flow (Mach about 1e-7) with
    // Ts = T0 keeps the gas within ell g / cp of T0 (ell = m cp / U' = 1 cm: 1e-4 K, a relative
    // 3e-7 in R T and so 4e-9 in p2); laminar friction then costs 4e-10 of the pressure.
    const rise = 100;
    const pipe: Pipe = {
      length: rise,
      diameter: 0.1,
      frictionFactor: 0.02,
      model: "heat-transfer",
      heatTransferPerLength: 0.1,
      surroundingTemperature: upstream.temperature,
      rise,
    };
    const back = pipeOutlet(air, pipe, upstream, 1e-6);
    expect(back.ok).toBe(true);
    if (!back.ok) return;
    const expected =
      upstream.pressure *
      Math.exp((-STANDARD_GRAVITY * rise) / (air.specificGasConstant * upstream.temperature));
    expect(Math.abs(back.flow.outlet.pressure / expected - 1)).toBeLessThan(1e-8);
  });

  it("gives the isentropic column p2 = p1 (1 - g dz / (cp T0))^(cp/R) without heat exchange", () => {
    // At rest without heat exchange dh = dp / rho = -g dz (the adiabatic lapse rate g / cp):
    // closed form for a perfect gas (J. M. Wallace and P. V. Hobbs, Atmospheric Science, 2nd ed.,
    // Academic Press 2006, section 3.3, dry adiabatic lapse rate).
    const rise = 300;
    const pipe: Pipe = {
      length: rise,
      diameter: 0.1,
      frictionFactor: 0.02,
      model: "heat-transfer",
      rise,
    };
    const back = pipeOutlet(air, pipe, upstream, 1e-6);
    expect(back.ok).toBe(true);
    if (!back.ok) return;
    const cp = air.specificHeatCp;
    const ratio = 1 - (STANDARD_GRAVITY * rise) / (cp * upstream.temperature);
    const expected = upstream.pressure * ratio ** (cp / air.specificGasConstant);
    // Laminar friction at Mach 1e-7: 1e-9 of p (300 m); the integration 1e-10 of the drop.
    expect(Math.abs(back.flow.outlet.pressure / expected - 1)).toBeLessThan(3e-9);
    expect(back.flow.outlet.temperature).toBeCloseTo(upstream.temperature * ratio, 6);
  });
});

describe("heated and cooled pipe at low Mach", () => {
  it("approaches the surroundings as T_out - Ts = (T_in - Ts) exp(-U' L / (m cp))", () => {
    // F. P. Incropera, D. P. DeWitt, T. L. Bergman, A. S. Lavine, Fundamentals of Heat and Mass
    // Transfer, 6th ed., Wiley 2007, eq. 8.42b (constant surface temperature, with U for h and
    // per unit length). At Mach 0.01 the kinetic energy and friction heating are 1e-5 of cp T:
    // the relation then holds to that order of the temperature difference.
    const pipe: Pipe = {
      length: 200,
      diameter: 0.1,
      frictionFactor: 0.018,
      model: "heat-transfer",
      heatTransferPerLength: 2,
      surroundingTemperature: 263.15,
    };
    const hot = { pressure: 3e5, temperature: 353.15 };
    const massFlow = 0.012;
    const result = pipeOutlet(air, pipe, hot, massFlow);
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    expect(result.flow.inlet.mach).toBeLessThan(0.01);
    const cp = air.specificHeatCp;
    const expected = 263.15 + (353.15 - 263.15) * Math.exp((-2 * 200) / (massFlow * cp));
    const difference = 353.15 - 263.15;
    expect(Math.abs(result.flow.outlet.temperature - expected) / difference).toBeLessThan(1e-4);
    // Heat lost: m cp (T_out - T_in) to the same order; negative (out of the gas).
    const heat = massFlow * cp * (result.flow.outlet.stagnationTemperature - 353.15);
    expect(result.flow.heatFlow).toBeLessThan(0);
    expect(Math.abs(result.flow.heatFlow / heat - 1)).toBeLessThan(1e-6);
  });
});

describe("heat-transfer pipe round trip and sonic detection", () => {
  const pipe: Pipe = {
    length: 40,
    diameter: 0.05,
    roughness: 5e-5,
    model: "heat-transfer",
    heatTransferPerArea: 15,
    surroundingTemperature: 253.15,
    rise: 12,
  };
  it("gives the outlet pressure back from the flow", () => {
    for (const pd of [6.9e5, 6e5, 4e5]) {
      const flow = pipeFlow(air, pipe, upstream, pd);
      if (flow.choked) continue;
      const back = pipeOutlet(air, pipe, upstream, flow.massFlow);
      expect(back.ok).toBe(true);
      if (back.ok) {
        // Both integrate the same ODE to 1e-10 of the drop per step.
        expect(Math.abs(back.flow.outlet.pressure / pd - 1)).toBeLessThan(1e-9);
      }
    }
  });
  it("reports choke when the flow reaches Mach 1 before the end and a larger flow cannot pass", () => {
    const flow = pipeFlow(air, pipe, upstream, 1e5);
    expect(flow.choked).toBe(true);
    expect(flow.outlet.mach).toBe(1);
    expect(flow.outlet.pressure).toBeGreaterThan(1e5);
    const over = pipeOutlet(air, pipe, upstream, 1.01 * flow.capacity);
    expect(over.ok).toBe(false);
    // Just below the capacity the exit is nearly sonic: 1 - M^2 falls as the square root of the
    // distance to the sonic point, so 1e-4 below the capacity leaves M about 0.95.
    const under = pipeOutlet(air, pipe, upstream, 0.9999 * flow.capacity);
    expect(under.ok).toBe(true);
    if (under.ok) expect(under.flow.outlet.mach).toBeGreaterThan(0.9);
  });
  it("uses the integration tolerance it documents", () => {
    expect(INTEGRATION_TOLERANCE).toBe(1e-10);
  });
});

describe("derivatives of the heat-transfer pipe", () => {
  const kernelGas = pipeGas(air);
  const geometry = pipeGeometry({
    length: 60,
    diameter: 0.05,
    roughness: 5e-5,
    model: "heat-transfer",
    heatTransferPerLength: 3,
    surroundingTemperature: 263.15,
    rise: -8,
  });
  const evaluate = (p0: number, t0: number, pd: number) =>
    evaluatePipeFlow(geometry, kernelGas, p0, t0, pd, new PipeFlowEvaluation());
  for (const pd of [6.5e5, 4e5, 1e5]) {
    it(`match central differences of flow and arrival temperature (pd ${pd} Pa)`, () => {
      const p0 = upstream.pressure;
      const t0 = upstream.temperature;
      const base = evaluate(p0, t0, pd);
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
        // The differences carry the integration's own noise (1e-9 of the drop over a step of 1e-4
        // of it: 1e-5 relative) plus truncation of the same order; the analytic (sensitivity)
        // value agrees to about 1e-4 of the larger of the two.
        const scale = Math.max(Math.abs(difference), Math.abs(analytic), 1e-12);
        expect(Math.abs(analytic - difference) / scale).toBeLessThan(base.choked ? 1e-2 : 1e-3);
      }
    });
  }
});

describe("heat-transfer pipe against an independent integration (scipy solve_ivp)", () => {
  // test/fixtures/heat-transfer/generate_heat_transfer_pipe.py: the same equations written for a
  // perfect gas and integrated by scipy's DOP853 at rtol 1e-12 (scipy version in the JSON).
  const fixture = JSON.parse(
    readFileSync(
      new URL("../fixtures/heat-transfer/heat-transfer-pipe.json", import.meta.url),
      "utf8",
    ),
  ) as {
    source: string;
    gasConstant: number;
    cases: {
      name: string;
      input: Record<string, number>;
      expected: Record<string, number>;
    }[];
  };
  it("uses the same gas constant as machnet's air", () => {
    expect(fixture.gasConstant / air.specificGasConstant).toBeCloseTo(1, 12);
  });
  for (const { name, input, expected } of fixture.cases) {
    it(`matches ${fixture.source} with friction, heat and elevation (${name})`, () => {
      const i = input as Record<string, number>;
      const result = pipeOutlet(
        air,
        {
          length: i.length as number,
          diameter: i.diameter as number,
          frictionFactor: i.frictionFactor as number,
          minorLoss: i.minorLoss as number,
          model: "heat-transfer",
          heatTransferPerLength: i.heatTransferPerLength as number,
          surroundingTemperature: i.surroundingTemperature as number,
          rise: i.rise as number,
        },
        { pressure: i.upstreamPressure as number, temperature: i.upstreamTemperature as number },
        i.massFlow as number,
      );
      expect(result.ok).toBe(true);
      if (!result.ok) return;
      const flow = result.flow;
      const e = expected as Record<string, number>;
      const drop = (e.inletPressure as number) - (e.outletPressure as number);
      // Both integrations hold about 1e-10 of the drop per step (scipy 1e-12): 1e-8 of the drop
      // leaves room for the few hundred steps of ours.
      expect(Math.abs(flow.inlet.pressure - (e.inletPressure as number)) / drop).toBeLessThan(
        1e-10,
      );
      expect(Math.abs(flow.outlet.pressure - (e.outletPressure as number)) / drop).toBeLessThan(
        1e-8,
      );
      expect(flow.outlet.temperature).toBeCloseTo(e.outletTemperature as number, 6);
      expect(flow.heatFlow / (e.heatFlow as number)).toBeCloseTo(1, 8);
      expect(flow.outlet.mach / (e.outletMach as number)).toBeCloseTo(1, 8);
    });
  }
});

describe("heat-transfer pipe many thermal relaxation lengths long", () => {
  it("reaches the surrounding temperature in a few steps and matches the isothermal model at Ts", () => {
    // U' L / (m cp) = 4e5: the gas is at Ts after the first few centimetres. The isothermal
    // model at T0 = Ts then describes the rest (the entrance velocity head is below 1e-6 of p
    // here, Mach 0.002), so the outlet pressures agree closely.
    const pipe: Pipe = { length: 2000, diameter: 0.05, frictionFactor: 0.02 };
    const cold = { pressure: 3e5, temperature: 263.15 };
    const hot = { pressure: 3e5, temperature: 393.15 };
    const massFlow = 0.005;
    const general = pipeOutlet(
      air,
      {
        ...pipe,
        model: "heat-transfer",
        heatTransferPerLength: 1000,
        surroundingTemperature: 263.15,
      },
      hot,
      massFlow,
    );
    const isothermal = pipeOutlet(air, { ...pipe, model: "isothermal" }, cold, massFlow);
    expect(general.ok && isothermal.ok).toBe(true);
    if (!general.ok || !isothermal.ok) return;
    expect(Math.abs(general.flow.outlet.temperature - 263.15)).toBeLessThan(1e-3);
    const drop = cold.pressure - isothermal.flow.outlet.pressure;
    // The first centimetres at higher temperature (lower density, higher velocity) add a little
    // friction: of order 1e-5 of the length; 1e-3 of the drop.
    expect(
      Math.abs(general.flow.outlet.pressure - isothermal.flow.outlet.pressure) / drop,
    ).toBeLessThan(1e-3);
    // The heat is the whole enthalpy difference to the surroundings.
    const cp = air.specificHeatCp;
    expect(general.flow.heatFlow / (massFlow * cp * (263.15 - 393.15))).toBeCloseTo(1, 4);
  });
});
