import { describe, expect, it } from "vitest";
import { gasPreset, type Pipe, pipeFlow, pipeOutlet } from "../../src/index.js";
import { pipeGas, pipeGeometry } from "../../src/physics/pipe.js";
import {
  evaluatePipeFlow,
  PipeFlowEvaluation,
  type PipeGeometry,
} from "../../src/physics/pipe-flow.js";

const air = gasPreset("air");
const upstream = { pressure: 7e5, temperature: 293.15 };

const pipes: [string, Pipe][] = [
  ["adiabatic, Colebrook-White", { length: 50, diameter: 0.0525, roughness: 4.5e-5 }],
  [
    "adiabatic, fixed friction factor and fittings",
    { length: 12, diameter: 0.0266, frictionFactor: 0.024, minorLoss: 3.5 },
  ],
  [
    "isothermal, Colebrook-White",
    { length: 800, diameter: 0.1023, roughness: 5e-5, model: "isothermal" },
  ],
  [
    "isothermal, fixed friction factor",
    { length: 60, diameter: 0.0409, frictionFactor: 0.02, model: "isothermal" },
  ],
];

describe("pipeFlow and pipeOutlet are inverses", () => {
  for (const [name, pipe] of pipes) {
    it(`gives the outlet pressure back from the flow (${name})`, () => {
      for (const fraction of [0.999, 0.97, 0.8, 0.5]) {
        const flow = pipeFlow(air, pipe, upstream, fraction * upstream.pressure);
        if (flow.choked) continue;
        const back = pipeOutlet(air, pipe, upstream, flow.massFlow);
        expect(back.ok).toBe(true);
        if (back.ok) {
          expect(
            Math.abs(back.flow.outlet.pressure / (fraction * upstream.pressure) - 1),
          ).toBeLessThan(1e-10);
          expect(back.flow.outlet.mach).toBeCloseTo(flow.outlet.mach, 10);
        }
      }
    });

    it(`says a flow above the capacity cannot pass and gives the capacity (${name})`, () => {
      const choked = pipeFlow(air, pipe, upstream, 1000);
      expect(choked.choked).toBe(true);
      const result = pipeOutlet(air, pipe, upstream, 1.05 * choked.capacity);
      expect(result.ok).toBe(false);
      if (!result.ok) {
        expect(result.capacity).toBeCloseTo(choked.capacity, 12);
        expect(result.chokedOutletPressure).toBeCloseTo(choked.outlet.pressure, 6);
        expect(result.message).toMatch(/cannot pass: the pipe chokes at/);
      }
    });
  }

  it("refuses impossible pipes and states with a message naming the value", () => {
    expect(() => pipeFlow(air, { length: 0, diameter: 0.05 }, upstream, 6e5)).toThrow(
      /length must be > 0 m \(got 0\)/,
    );
    expect(() =>
      pipeFlow(air, { length: 5, diameter: 0.05 }, { pressure: 7e5, temperature: -3 }, 6e5),
    ).toThrow(/upstream temperature must be > 0 K/);
    expect(() => pipeFlow(air, { length: 5, diameter: 0.05 }, upstream, 8e5)).toThrow(
      /above the upstream pressure/,
    );
  });
});

describe("an independent integration of adiabatic flow with friction", () => {
  // dM/dx and dp/dx of Fanno flow (A. H. Shapiro, The Dynamics and Thermodynamics of Compressible
  // Fluid Flow, 1953, Table 8.1, Darcy f = 4 f_Fanning), integrated here by classical fourth-order
  // Runge-Kutta with 20,000 steps, from the inlet state pipeFlow reports to the pipe's end.
  it("arrives at the downstream pressure and exit Mach number pipeFlow reports", () => {
    const g = 1.4;
    const pipe: Pipe = { length: 30, diameter: 0.0409, frictionFactor: 0.021 };
    const flow = pipeFlow(air, pipe, upstream, 5.2e5);
    const f = 0.021;
    const d = 0.0409;
    const rhs = (m: number, p: number): [number, number] => {
      const common = ((g * m * m) / (2 * (1 - m * m))) * (f / d);
      return [m * (1 + 0.5 * (g - 1) * m * m) * common, -p * (1 + (g - 1) * m * m) * common];
    };
    let m = flow.inlet.mach;
    let p = flow.inlet.pressure;
    const steps = 20000;
    const h = pipe.length / steps;
    for (let i = 0; i < steps; i++) {
      const k1 = rhs(m, p);
      const k2 = rhs(m + 0.5 * h * k1[0], p + 0.5 * h * k1[1]);
      const k3 = rhs(m + 0.5 * h * k2[0], p + 0.5 * h * k2[1]);
      const k4 = rhs(m + h * k3[0], p + h * k3[1]);
      m += (h / 6) * (k1[0] + 2 * k2[0] + 2 * k3[0] + k4[0]);
      p += (h / 6) * (k1[1] + 2 * k2[1] + 2 * k3[1] + k4[1]);
    }
    expect(Math.abs(p / 5.2e5 - 1)).toBeLessThan(1e-9);
    expect(Math.abs(m / flow.outlet.mach - 1)).toBeLessThan(1e-9);
  });
});

describe("derivatives of the pipe flow used by the network Jacobian", () => {
  const kernelGas = pipeGas(air);
  function evaluate(pipe: PipeGeometry, p0: number, t0: number, pd: number) {
    return evaluatePipeFlow(pipe, kernelGas, p0, t0, pd, new PipeFlowEvaluation());
  }
  const states: [string, Pipe, number][] = [
    ["adiabatic subsonic, turbulent", pipes[0]?.[1] as Pipe, 6.2e5],
    ["adiabatic subsonic, fixed f", pipes[1]?.[1] as Pipe, 5.0e5],
    ["adiabatic choked", pipes[1]?.[1] as Pipe, 1.0e5],
    ["adiabatic, transition Re", { length: 400, diameter: 0.0266, roughness: 5e-5 }, 6.99999e5],
    [
      "adiabatic, laminar (Re about 740)",
      { length: 2000, diameter: 0.0266, roughness: 5e-5 },
      6.999e5,
    ],
    ["isothermal subsonic", pipes[2]?.[1] as Pipe, 5.5e5],
    ["isothermal choked", pipes[3]?.[1] as Pipe, 1.0e5],
  ];
  for (const [name, pipe, pd] of states) {
    it(`match central differences of the flow (${name})`, () => {
      const geometry = pipeGeometry(pipe);
      const p0 = upstream.pressure;
      const t0 = upstream.temperature;
      const base = evaluate(geometry, p0, t0, pd);
      // Pressure steps: small against the pressure drop, but not below 1e-9 of the pressure, where
      // the flow's own round-off would swamp the difference.
      const step = Math.max(1e-4 * (p0 - pd), 1e-9 * p0);
      const checks: [number, (h: number) => number, number][] = [
        [base.dMassFlowdUpstreamPressure, (h) => evaluate(geometry, p0 + h, t0, pd).massFlow, step],
        [
          base.dMassFlowdUpstreamTemperature,
          (h) => evaluate(geometry, p0, t0 + h, pd).massFlow,
          1e-3,
        ],
        [
          base.dMassFlowdDownstreamPressure,
          (h) => evaluate(geometry, p0, t0, pd + h).massFlow,
          step,
        ],
      ];
      for (const [analytic, at, h] of checks) {
        const difference = (at(h) - at(-h)) / (2 * h);
        // Central differences are good to about 1e-6 relative here; 1e-5 of the flow's scale.
        const scale = Math.max(Math.abs(difference), (1e-6 * base.massFlow) / h);
        expect(Math.abs(analytic - difference) / scale).toBeLessThan(1e-4);
      }
      if (base.choked) expect(base.dMassFlowdDownstreamPressure).toBe(0);
    });
  }

  it("is the Hagen-Poiseuille conductance at zero flow (common practice, no source)", () => {
    const geometry = pipeGeometry({ length: 40, diameter: 0.0525, roughness: 5e-5 });
    const zero = evaluate(geometry, 5e5, 300, 5e5);
    const density = 5e5 / (air.specificGasConstant * 300);
    const viscosity = (1.458e-6 * 300 ** 1.5) / (300 + 110.4); // US Standard Atmosphere 1976 law
    const area = (Math.PI / 4) * 0.0525 ** 2;
    const expected = (density * 0.0525 ** 2 * area) / (32 * viscosity * 40);
    expect(zero.massFlow).toBe(0);
    expect(zero.dMassFlowdUpstreamPressure / expected).toBeCloseTo(1, 9);
    expect(zero.dMassFlowdDownstreamPressure / -expected).toBeCloseTo(1, 9);
    // and a tiny pressure difference gives that linear flow
    const tiny = evaluate(geometry, 5e5 + 1e-4, 300, 5e5);
    expect(tiny.massFlow / (1e-4 * expected)).toBeCloseTo(1, 4);
  });
});

/**
 * The small-drop law of the pipe kernel (below a pressure drop of 1e-10 of the pressure, with
 * the drop passed apart from the pressures): the incompressible plenum-to-plenum relation
 * p0 - pd = (1 + fD L/D + K) G^2 / (2 rho) (common practice, no source: Bernoulli with the
 * entry's dynamic head, Darcy-Weisbach friction and minor losses).
 */
describe("the small-drop law", () => {
  const kernelGas = pipeGas(air);
  const p0 = 1e6;
  const t0 = 300;
  const density = p0 / (air.specificGasConstant * t0);
  const viscosity = (1.458e-6 * t0 ** 1.5) / (t0 + 110.4); // US Standard Atmosphere 1976 law
  const flowAt = (pipe: PipeGeometry, p: number, t: number, drop: number) =>
    evaluatePipeFlow(pipe, kernelGas, p, t, p - drop, new PipeFlowEvaluation(), true, drop);

  it("is the laminar relation with entry head and minor losses, solved in closed form here", () => {
    // DN 600, 40 m, K = 2: Re about 100 at a drop of 2e-5 Pa (laminar, fD = 64/Re).
    const pipe = pipeGeometry({ length: 40, diameter: 0.6, roughness: 5e-5, minorLoss: 2 });
    const area = (Math.PI / 4) * 0.36;
    for (const drop of [1e-9, 2e-5, 1e-4]) {
      // drop = a G + b G^2, a = 32 mu L / (rho D^2), b = (1 + K) / (2 rho).
      const a = (32 * viscosity * 40) / (density * 0.36);
      const b = 3 / (2 * density);
      const flux = (-a + Math.sqrt(a * a + 4 * b * drop)) / (2 * b);
      const result = flowAt(pipe, p0, t0, drop);
      expect(result.reynolds).toBeLessThan(2300);
      // 1e-9: the closed form above loses digits to cancellation (-a + sqrt) at small drops.
      expect(Math.abs(result.massFlow / (flux * area) - 1)).toBeLessThan(1e-9);
    }
  });

  it("takes the drop as given, not the difference of the rounded pressures", () => {
    const pipe = pipeGeometry({ length: 40, diameter: 0.6, roughness: 5e-5 });
    // 1e-6 Pa at 10 bar is about 8 600 units in the last place of p0.
    const one = flowAt(pipe, p0, t0, 1e-6).massFlow;
    const more = flowAt(pipe, p0, t0, 1e-6 * (1 + 1e-9)).massFlow;
    expect(more / one - 1).toBeGreaterThan(0.9e-9);
    expect(more / one - 1).toBeLessThan(1.1e-9);
  });

  it("has derivatives that match central differences, laminar and turbulent", () => {
    const cases: [string, PipeGeometry, number][] = [
      [
        "laminar, K = 2",
        pipeGeometry({ length: 40, diameter: 0.6, roughness: 5e-5, minorLoss: 2 }),
        2e-5,
      ],
      // A fixed friction factor of 0.02 above the laminar value: Re far above 2300.
      [
        "fixed friction factor",
        pipeGeometry({ length: 3, diameter: 1.2, frictionFactor: 0.02 }),
        9e-5,
      ],
      ["Colebrook-White", pipeGeometry({ length: 2, diameter: 1.5, roughness: 4.5e-5 }), 9e-5],
    ];
    for (const [name, pipe, drop] of cases) {
      const base = flowAt(pipe, p0, t0, drop);
      if (name !== "laminar, K = 2") expect(base.reynolds, name).toBeGreaterThan(2300);
      const hp = 1e-3 * drop;
      const ht = 1e-6 * t0;
      const checks: [number, number][] = [
        [
          base.dMassFlowdDownstreamPressure,
          (flowAt(pipe, p0, t0, drop - hp).massFlow - flowAt(pipe, p0, t0, drop + hp).massFlow) /
            (2 * hp),
        ],
        [
          base.dMassFlowdUpstreamPressure,
          (flowAt(pipe, p0 + hp, t0, drop + hp).massFlow -
            flowAt(pipe, p0 - hp, t0, drop - hp).massFlow) /
            (2 * hp),
        ],
        [
          base.dMassFlowdUpstreamTemperature,
          (flowAt(pipe, p0, t0 + ht, drop).massFlow - flowAt(pipe, p0, t0 - ht, drop).massFlow) /
            (2 * ht),
        ],
      ];
      for (const [analytic, difference] of checks) {
        // Central differences with a relative step of 1e-3 in a smooth relation: 1e-5 relative.
        expect(Math.abs(analytic / difference - 1), name).toBeLessThan(1e-5);
      }
    }
  });

  it("meets the compressible relation where it takes over (1e-10 of the pressure)", () => {
    const pipe = pipeGeometry({ length: 40, diameter: 0.6, roughness: 5e-5, minorLoss: 2 });
    const below = flowAt(pipe, p0, t0, 0.999e-10 * p0).massFlow;
    const above = evaluatePipeFlow(
      pipe,
      kernelGas,
      p0,
      t0,
      p0 - 1.001e-10 * p0,
      new PipeFlowEvaluation(),
    ).massFlow;
    // Laminar (Re about 440): the ratio of the two flows is that of the closed form
    // a G + b G^2 = drop at the two drops. The compressible relation resolves ln(pd/p0) = -1e-10
    // to about 1e-6 of itself (rounding of pd): 1e-5.
    const a = (32 * viscosity * 40) / (density * 0.36);
    const b = 3 / (2 * density);
    const flux = (drop: number) => (-a + Math.sqrt(a * a + 4 * b * drop)) / (2 * b);
    const expected = flux(1.001e-10 * p0) / flux(0.999e-10 * p0);
    expect(Math.abs(above / below / expected - 1)).toBeLessThan(1e-5);
  });

  it("meets each model's own relation at the switch: the isothermal model has no entry head", () => {
    // Short wide pipes, where the entry head (1) is comparable with fD L/D + K: a law with the
    // wrong head jumps by a factor of up to about 5 at the switch. Across the switch the drop
    // grows by 0.2 %, so a continuous flow grows by less than that (flow ~ drop^0.5..1).
    const pipes: [string, PipeGeometry][] = [
      ["3 m DN 1200", pipeGeometry({ length: 3, diameter: 1.2, roughness: 4.5e-5 })],
      ["2 m DN 1500", pipeGeometry({ length: 2, diameter: 1.5, roughness: 4.5e-5 })],
      ["40 m DN 600, K = 2", pipeGeometry({ length: 40, diameter: 0.6, minorLoss: 2 })],
    ];
    for (const model of ["isothermal", "adiabatic"] as const) {
      for (const [name, shape] of pipes) {
        const pipe = { ...shape, model };
        const below = flowAt(pipe, p0, t0, 0.999e-10 * p0).massFlow;
        const above = evaluatePipeFlow(
          pipe,
          kernelGas,
          p0,
          t0,
          p0 - 1.001e-10 * p0,
          new PipeFlowEvaluation(),
        ).massFlow;
        const growth = above / below - 1;
        expect(growth, `${model}, ${name}`).toBeGreaterThan(0);
        // 2.5e-3: the 0.2 % growth of the drop plus the compressible relation's rounding of pd.
        expect(growth, `${model}, ${name}`).toBeLessThan(2.5e-3);
      }
    }
  });
});
