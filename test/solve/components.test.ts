/**
 * Components in networks: each alone between two reservoirs against its standard's equations
 * (reference values from python3-fluids, see test/fixtures/components/), choking of each kind, a
 * restriction orifice as the bottleneck, a regulator with its supply swept through the setpoint, a
 * check valve that closes, and catalog pipes with fittings.
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import {
  criticalPressureRatio,
  type EdgeResult,
  type NetworkDocument,
  type NetworkResult,
  solveNetwork,
} from "../../src/index.js";
import { fittingLossCoefficient } from "../../src/input/fittings.js";
import { orificeMassFlow } from "../../src/physics/components/orifice.js";
import { pressureLossRatio } from "../../src/physics/components/restriction.js";
import { reference, relativeError } from "../physics/components/reference.js";

const library = `python3-fluids ${reference.fluids}`;
const AMBIENT = 101325;

function edge(result: NetworkResult, id: string): EdgeResult {
  const found = result.edges.find((candidate) => candidate.id === id);
  if (!found) throw new Error(`no edge ${id}`);
  return found;
}

function pressureOf(result: NetworkResult, id: string): number {
  const found = result.nodes.find((candidate) => candidate.id === id);
  if (!found) throw new Error(`no node ${id}`);
  return found.pressure;
}

/** Mass balance recomputed here from the result's edges and nodes (over the throughput). */
function largestMassImbalance(result: NetworkResult): number {
  const net = new Map<string, number>();
  for (const n of result.nodes) net.set(n.id, 0);
  for (const e of result.edges) {
    net.set(e.from, (net.get(e.from) ?? 0) - e.massFlow);
    net.set(e.to, (net.get(e.to) ?? 0) + e.massFlow);
  }
  let throughput = 0;
  for (const n of result.nodes) throughput += Math.abs(n.demand);
  throughput = Math.max(throughput / 2, 1e-12);
  let worst = 0;
  for (const n of result.nodes) {
    worst = Math.max(worst, Math.abs((net.get(n.id) ?? 0) - n.demand) / throughput);
  }
  return worst;
}

function twoReservoirs(
  component: Record<string, unknown>,
  upstreamPressure: number,
  downstreamPressure: number,
  temperature: number,
): NetworkDocument {
  return {
    gas: { preset: "air" },
    nodes: [
      { id: "UP", kind: "reservoir", pressure: upstreamPressure, temperature },
      { id: "DOWN", kind: "reservoir", pressure: downstreamPressure, temperature },
    ],
    edges: [{ id: "C", from: "UP", to: "DOWN", ...component } as NetworkDocument["edges"][number]],
  };
}

describe("each component alone between two reservoirs", () => {
  for (const c of reference.restrictionBetweenReservoirs) {
    it(`a ${c.kind} (d ${c.boreDiameter} m in D ${c.pipeDiameter} m) passes the ISO 5167 flow for its node pressures (${library})`, () => {
      const result = solveNetwork(
        twoReservoirs(
          {
            kind: c.kind,
            boreDiameter: c.boreDiameter,
            pipeDiameter: c.pipeDiameter,
            dischargeCoefficient: c.dischargeCoefficient,
          },
          c.upstreamPressure,
          c.downstreamPressure,
          c.temperature,
        ),
      );
      expect(result.status).toBe("converged");
      const component = edge(result, "C");
      // fluids' tap pressure is found to 1e-10 Pa (brentq); the flow to ~1e-12.
      expect(relativeError(component.massFlow, c.massFlow)).toBeLessThan(1e-9);
      expect(component.kind).toBe(c.kind);
      expect(component.component).toMatchObject({
        kind: c.kind,
        permanentPressureLoss: c.upstreamPressure - c.downstreamPressure,
      });
      if (component.component?.kind === "orifice" || component.component?.kind === "nozzle") {
        expect(
          relativeError(component.component.pressureRatio, c.tapPressure / c.upstreamPressure),
        ).toBeLessThan(1e-12);
        expect(
          relativeError(
            component.component.differentialPressure,
            c.upstreamPressure - c.tapPressure,
          ),
        ).toBeLessThan(1e-9);
      }
    });
  }

  for (const c of reference.valveBetweenReservoirs) {
    const x = (c.upstreamPressure - c.downstreamPressure) / c.upstreamPressure;
    it(`a valve of Kv ${c.kv} at x = ${x.toFixed(3)} passes the flow ${library} size_control_valve_g sizes it for`, () => {
      const result = solveNetwork(
        twoReservoirs(
          { kind: "valve", kv: c.kv, xT: c.xT },
          c.upstreamPressure,
          c.downstreamPressure,
          c.temperature,
        ),
      );
      expect(result.status).toBe("converged");
      const valve = edge(result, "C");
      // IEC's N9 = 24.6 is rounded (machnet's exact value 24.58): 8e-4 apart.
      expect(relativeError(valve.massFlow, c.massFlow)).toBeLessThan(1.5e-3);
      expect(valve.choked).toBe(x >= c.xT);
      expect(valve.component).toMatchObject({ kind: "valve", state: "open" });
    });
  }

  it("a check valve open forward is the valve of its Kv; a regulator below its setpoint is wide open", () => {
    const c = reference
      .valveBetweenReservoirs[0] as (typeof reference.valveBetweenReservoirs)[number];
    const flowOf = (component: Record<string, unknown>) =>
      edge(
        solveNetwork(
          twoReservoirs(component, c.upstreamPressure, c.downstreamPressure, c.temperature),
        ),
        "C",
      );
    const valve = flowOf({ kind: "valve", kv: c.kv });
    const check = flowOf({ kind: "check", kv: c.kv });
    const regulator = flowOf({ kind: "regulator", kv: c.kv, setpoint: 1.2 * c.downstreamPressure });
    expect(check.massFlow).toBe(valve.massFlow);
    expect(check.component).toMatchObject({ state: "open", leakage: 0 });
    // The regulator's seat leakage, 1e-12 of its flow scale, is the only difference.
    expect(relativeError(regulator.massFlow, valve.massFlow)).toBeLessThan(1e-11);
    expect(regulator.component).toMatchObject({ kind: "regulator", state: "wide-open" });
  });
});

describe("a check valve and a regulator alone between two reservoirs against the library", () => {
  // Found while checking issue #4's list: the check valve and the regulator were compared with
  // machnet's own valve only. Here each is compared with the flow python3-fluids'
  // size_control_valve_g (IEC 60534-2-1) sizes its Kv for.
  for (const c of reference.valveBetweenReservoirs) {
    const x = (c.upstreamPressure - c.downstreamPressure) / c.upstreamPressure;
    const solve = (component: Record<string, unknown>) => {
      const result = solveNetwork(
        twoReservoirs(component, c.upstreamPressure, c.downstreamPressure, c.temperature),
      );
      expect(result.status).toBe("converged");
      return edge(result, "C");
    };
    it(`at x = ${x.toFixed(3)}: an open check valve, a wide-open regulator and one inside its band (${library})`, () => {
      // IEC's N9 = 24.6 is rounded (machnet's exact value 24.58): 8e-4 apart.
      const check = solve({ kind: "check", kv: c.kv, xT: c.xT });
      expect(relativeError(check.massFlow, c.massFlow)).toBeLessThan(1.5e-3);
      const setpoint = 1.2 * c.downstreamPressure;
      const wideOpen = solve({ kind: "regulator", kv: c.kv, xT: c.xT, setpoint });
      expect(relativeError(wideOpen.massFlow, c.massFlow)).toBeLessThan(1.5e-3);
      // Inside the band: z = (p_set - p2) / band = 0.5, so the opening is z (2 - z) = 0.75 of
      // the wide-open trim (docs/model.md, "Regulator").
      const band = 2 * (setpoint - c.downstreamPressure);
      const regulating = solve({
        kind: "regulator",
        kv: c.kv,
        xT: c.xT,
        setpoint,
        proportionalBand: band,
      });
      expect(regulating.component).toMatchObject({ state: "regulating" });
      expect(relativeError(regulating.massFlow, 0.75 * c.massFlow)).toBeLessThan(1.5e-3);
    });
  }
});

describe("choking in each component kind", () => {
  const kinds: [string, Record<string, unknown>][] = [
    ["orifice", { kind: "orifice", boreDiameter: "12 mm", pipeDiameter: "52.48 mm" }],
    ["nozzle", { kind: "nozzle", boreDiameter: "12 mm" }],
    ["valve", { kind: "valve", kv: 4 }],
    ["regulator", { kind: "regulator", kv: 4, setpoint: "6 bar(g)" }],
    ["check", { kind: "check", kv: 4 }],
  ];
  for (const [name, component] of kinds) {
    it(`a ${name} discharging to a low enough back-pressure is choked and its flow no longer depends on it (common practice, no source)`, () => {
      const flows = [1.5e5, 1.2e5, AMBIENT].map((back) => {
        const result = solveNetwork(twoReservoirs(component, 8e5, back, 293.15));
        expect(result.status).toBe("converged");
        const found = edge(result, "C");
        expect(found.choked).toBe(true);
        expect(found.chokeRatio).toBe(1);
        expect(result.warnings.some((w) => w.code === "choked" && w.edge === "C")).toBe(true);
        return found.massFlow;
      });
      // The choked flow is set by the upstream state alone: the same to rounding; a regulator's
      // seat leakage (1e-12 of its flow scale) still follows the back-pressure.
      const tolerance = name === "regulator" ? 1e-11 : 1e-12;
      for (const flow of flows)
        expect(relativeError(flow, flows[0] as number)).toBeLessThan(tolerance);
    });
  }
});

describe("a restriction orifice as the bottleneck of a vent line", () => {
  const vent = (back: number): NetworkDocument => ({
    gas: { preset: "nitrogen" },
    nodes: [
      { id: "VESSEL", kind: "reservoir", pressure: "8 bar(g)", temperature: "25 degC" },
      { id: "RO-IN", kind: "junction" },
      { id: "RO-OUT", kind: "junction" },
      { id: "STACK", kind: "reservoir", pressure: back, temperature: "25 degC" },
    ],
    edges: [
      {
        id: "INLET",
        kind: "pipe",
        from: "VESSEL",
        to: "RO-IN",
        length: "30 m",
        size: "DN80",
        schedule: "40",
      },
      {
        id: "RO",
        kind: "orifice",
        from: "RO-IN",
        to: "RO-OUT",
        boreDiameter: "14 mm",
        pipeDiameter: "77.92 mm",
      },
      {
        id: "TAIL",
        kind: "pipe",
        from: "RO-OUT",
        to: "STACK",
        length: "20 m",
        size: "DN80",
        schedule: "40",
      },
    ],
  });

  it("chokes at the orifice, not in the pipes, and passes ISO 5167's critical flow for its inlet pressure", () => {
    const result = solveNetwork(vent(AMBIENT));
    expect(result.status).toBe("converged");
    const ro = edge(result, "RO");
    expect(ro.choked).toBe(true);
    expect(edge(result, "INLET").choked).toBe(false);
    expect(edge(result, "TAIL").choked).toBe(false);
    expect(edge(result, "INLET").chokeRatio).toBeLessThan(0.1);
    expect(edge(result, "TAIL").chokeRatio).toBeLessThan(0.5);
    // The flow of ISO 5167-2 (checked against fluids in test/physics) at the critical ratio of
    // nitrogen, from the orifice's inlet node state in the result.
    const gamma = result.gas.heatCapacityRatio;
    const p1 = pressureOf(result, "RO-IN");
    const t1 = result.nodes.find((n) => n.id === "RO-IN")?.temperature as number;
    const rho1 = p1 / (result.gas.specificGasConstant * t1);
    const beta = 0.014 / 0.07792;
    const critical = criticalPressureRatio(gamma);
    const expected = orificeMassFlow(0.6, 0.014, beta, p1, rho1, critical * p1, gamma);
    expect(relativeError(ro.massFlow, expected)).toBeLessThan(1e-9);
    expect(ro.component).toMatchObject({ kind: "orifice", pressureRatio: critical });
    // The orifice takes nearly all of the 8 bar: well over 90 % of it.
    expect(ro.pressureDrop).toBeGreaterThan(0.9 * (pressureOf(result, "VESSEL") - AMBIENT));
    expect(largestMassImbalance(result)).toBeLessThan(1e-9);
  });

  it("a lower stack pressure leaves the flow unchanged; a higher one that unchokes it lowers it", () => {
    const base = edge(solveNetwork(vent(AMBIENT)), "RO").massFlow;
    const lower = edge(solveNetwork(vent(0.5 * AMBIENT)), "RO");
    expect(lower.choked).toBe(true);
    expect(relativeError(lower.massFlow, base)).toBeLessThan(1e-9);
    // Unchoked when the tap ratio is above critical: the recovered node ratio 1 - L (1 - r*).
    const loss = pressureLossRatio(0.014 / 0.07792, 0.6);
    const back = 9.01325e5 * (1 - 0.8 * loss * (1 - criticalPressureRatio(1.4)));
    const higher = edge(solveNetwork(vent(back)), "RO");
    expect(higher.choked).toBe(false);
    expect(higher.massFlow).toBeLessThan(base);
  });
});

describe("a regulator with its supply swept from above to below the setpoint", () => {
  const setpoint = 4e5 + AMBIENT; // 4 bar(g)
  const band = 0.01 * setpoint; // the default band
  const supplied = (supply: number): NetworkResult =>
    solveNetwork({
      gas: { preset: "air" },
      nodes: [
        { id: "MAIN", kind: "reservoir", pressure: supply, temperature: "20 degC" },
        { id: "LP", kind: "junction" },
        { id: "USER", kind: "junction", demand: "300 kg/h" },
      ],
      edges: [
        {
          id: "PRV",
          kind: "regulator",
          from: "MAIN",
          to: "LP",
          kv: 8,
          setpoint: "4 bar(g)",
          pipeDiameter: "52.48 mm",
        },
        {
          id: "LP-MAIN",
          kind: "pipe",
          from: "LP",
          to: "USER",
          length: "50 m",
          size: "2 in",
          schedule: "40",
        },
      ],
    });

  it("holds the regulated pressure within its band, then follows the supply, continuously", () => {
    const supplies: number[] = [];
    for (let gauge = 8; gauge >= 2 - 1e-9; gauge -= 0.125) supplies.push(gauge * 1e5 + AMBIENT);
    const regulated: number[] = [];
    const states: string[] = [];
    for (const supply of supplies) {
      const result = supplied(supply);
      expect(result.status, `supply ${supply}`).toBe("converged");
      expect(largestMassImbalance(result)).toBeLessThan(1e-9);
      const prv = edge(result, "PRV");
      const details = prv.component;
      if (details?.kind !== "regulator") throw new Error("not a regulator");
      states.push(details.state);
      const pressure = pressureOf(result, "LP");
      regulated.push(pressure);
      if (details.state === "regulating") {
        // Within one band below the setpoint (docs/model.md, "Regulator").
        expect(pressure).toBeLessThanOrEqual(setpoint);
        expect(pressure).toBeGreaterThanOrEqual(setpoint - band);
      } else {
        expect(details.state).toBe("wide-open");
        expect(pressure).toBeLessThan(setpoint - band + 1e-6);
        expect(pressure).toBeLessThan(supply);
      }
    }
    // Regulating first, wide open last, one switch.
    expect(states[0]).toBe("regulating");
    expect(states.at(-1)).toBe("wide-open");
    const switches = states.filter((state, i) => i > 0 && state !== states[i - 1]).length;
    expect(switches).toBe(1);
    // Continuous: a supply step of 0.125 bar moves the regulated pressure by at most 1.25 times
    // the step (wide open, the same mass flow needs a little more pressure drop at a lower
    // supply, so the downstream pressure falls slightly faster than the supply).
    for (let i = 1; i < regulated.length; i++) {
      const change = Math.abs((regulated[i] as number) - (regulated[i - 1] as number));
      expect(change).toBeLessThanOrEqual(1.25 * 0.125e5);
    }
    // And through the switch itself, in steps of 1 mbar: no jump there either.
    const switchAt = states.indexOf("wide-open");
    const high = supplies[switchAt - 1] as number;
    let previous = pressureOf(supplied(high), "LP");
    for (let supply = high - 100; supply >= high - 0.125e5; supply -= 100) {
      const pressure = pressureOf(supplied(supply), "LP");
      expect(Math.abs(pressure - previous)).toBeLessThanOrEqual(1.25 * 100);
      previous = pressure;
    }
    // While it regulates, the pressure moves by far less than the supply (a fraction of the band).
    const held = regulated.filter((_, i) => states[i] === "regulating");
    expect(Math.max(...held) - Math.min(...held)).toBeLessThan(band);
  });

  it("closes with no consumption downstream and says so; its leakage alone then sets that pressure", () => {
    const result = solveNetwork({
      gas: { preset: "air" },
      nodes: [
        { id: "MAIN", kind: "reservoir", pressure: "8 bar(g)", temperature: "20 degC" },
        { id: "SPARE", kind: "junction" },
      ],
      edges: [
        { id: "PRV", kind: "regulator", from: "MAIN", to: "SPARE", kv: 8, setpoint: "4 bar(g)" },
      ],
    });
    expect(result.status).toBe("converged");
    const prv = edge(result, "PRV");
    expect(prv.component).toMatchObject({ kind: "regulator", state: "closed" });
    expect(Math.abs(prv.massFlow)).toBeLessThan(1e-12);
    expect(result.warnings.some((w) => w.code === "closed" && w.edge === "PRV")).toBe(true);
  });
});

describe("a check valve where flow would reverse", () => {
  // Two supplies into a header: the booster at 7 bar(g) through a check valve, the main
  // compressor at 8 bar(g) through a pipe. The header runs above the booster, so gas would flow
  // back into it: the check valve closes.
  const header = (withCheck: boolean): NetworkDocument => ({
    gas: { preset: "air" },
    nodes: [
      { id: "BOOSTER", kind: "reservoir", pressure: "7 bar(g)", temperature: "30 degC" },
      { id: "COMPRESSOR", kind: "reservoir", pressure: "8 bar(g)", temperature: "35 degC" },
      { id: "B-OUT", kind: "junction" },
      { id: "HEADER", kind: "junction", demand: "1500 kg/h" },
      { id: "END", kind: "junction", demand: "600 kg/h" },
    ],
    edges: [
      {
        id: "B-LINE",
        kind: "pipe",
        from: "BOOSTER",
        to: "B-OUT",
        length: "5 m",
        size: "DN50",
        schedule: "40",
      },
      withCheck
        ? {
            id: "NRV",
            kind: "check",
            from: "B-OUT",
            to: "HEADER",
            kv: 60,
            pipeDiameter: "52.48 mm",
          }
        : {
            id: "NRV",
            kind: "valve",
            from: "B-OUT",
            to: "HEADER",
            kv: 60,
            pipeDiameter: "52.48 mm",
          },
      {
        id: "C-LINE",
        kind: "pipe",
        from: "COMPRESSOR",
        to: "HEADER",
        length: "40 m",
        size: "DN80",
        schedule: "40",
      },
      {
        id: "H-LINE",
        kind: "pipe",
        from: "HEADER",
        to: "END",
        length: "60 m",
        size: "DN50",
        schedule: "40",
      },
    ],
  });

  it("closes, passes only its leakage, and the rest of the network solves", () => {
    const open = solveNetwork(header(false));
    expect(open.status).toBe("converged");
    // Without the check valve the flow runs back into the booster.
    expect(edge(open, "NRV").massFlow).toBeLessThan(-0.01);

    const result = solveNetwork(header(true));
    expect(result.status).toBe("converged");
    const check = edge(result, "NRV");
    expect(check.component).toMatchObject({ kind: "check", state: "closed" });
    // The leakage (1e-12 of the open valve's flow scale) is reported as the flow, back into B-OUT.
    expect(check.massFlow).toBeLessThanOrEqual(0);
    expect(Math.abs(check.massFlow)).toBeLessThan(1e-12);
    if (check.component?.kind === "check") expect(check.component.leakage).toBe(-check.massFlow);
    expect(result.warnings.some((w) => w.code === "closed" && w.edge === "NRV")).toBe(true);
    // The compressor now supplies all 2100 kg/h, the booster (to its leakage) nothing.
    const compressor = result.nodes.find((n) => n.id === "COMPRESSOR");
    expect(Math.abs((compressor?.demand ?? 0) + 2100 / 3600)).toBeLessThan(1e-9);
    // B-OUT, behind the closed valve, sits at the booster's pressure: only the leakage flows in
    // B-LINE. It is reported as a junction without flow.
    expect(Math.abs(pressureOf(result, "B-OUT") - pressureOf(result, "BOOSTER"))).toBeLessThan(
      1e-3,
    );
    expect(result.warnings.some((w) => w.code === "no-flow" && w.node === "B-OUT")).toBe(true);
    expect(largestMassImbalance(result)).toBeLessThan(1e-9);
  });
});

describe("catalog pipes and fittings in a network", () => {
  it("a pipe by size, schedule, material and fittings solves as the same pipe written out", () => {
    const nodes: NetworkDocument["nodes"] = [
      { id: "R", kind: "reservoir", pressure: "7 bar(g)", temperature: "20 degC" },
      { id: "J", kind: "junction", demand: "900 kg/h" },
    ];
    const byCatalog = solveNetwork({
      nodes,
      edges: [
        {
          id: "P",
          kind: "pipe",
          from: "R",
          to: "J",
          length: "35 m",
          size: "DN50",
          schedule: "40",
          material: "galvanized-steel",
          fittings: [{ type: "elbow-90", count: 4 }, { type: "globe-valve" }],
        },
      ],
    });
    const written = solveNetwork({
      nodes,
      edges: [
        {
          id: "P",
          kind: "pipe",
          from: "R",
          to: "J",
          length: "35 m",
          diameter: 0.05248,
          roughness: 0.15e-3,
          minorLoss:
            4 * fittingLossCoefficient("elbow-90", 2) + fittingLossCoefficient("globe-valve", 2),
        },
      ],
    });
    expect(byCatalog.status).toBe("converged");
    expect(pressureOf(byCatalog, "J")).toBeCloseTo(pressureOf(written, "J"), 6);
    expect(edge(byCatalog, "P").catalog).toEqual({
      nominalPipeSize: 2,
      nominalDiameter: 50,
      schedule: "40",
    });
  });
});

describe("the example docs/examples/regulated-header.json", () => {
  it("solves with both regulators regulating, the orifice choked and the check valve closed", () => {
    const document = JSON.parse(
      readFileSync(new URL("../../docs/examples/regulated-header.json", import.meta.url), "utf8"),
    ) as NetworkDocument;
    const result = solveNetwork(document);
    expect(result.status).toBe("converged");
    expect(largestMassImbalance(result)).toBeLessThan(1e-9);
    for (const [id, setpoint] of [
      ["PCV-11", 6e5 + AMBIENT],
      ["PCV-12", 4e5 + AMBIENT],
    ] as const) {
      const regulator = edge(result, id);
      expect(regulator.component).toMatchObject({
        kind: "regulator",
        state: "regulating",
        setpoint,
      });
      const downstream = pressureOf(result, regulator.to);
      expect(downstream).toBeLessThanOrEqual(setpoint);
      expect(downstream).toBeGreaterThanOrEqual(0.99 * setpoint);
    }
    expect(edge(result, "RO-13").choked).toBe(true);
    expect(edge(result, "NRV-14").component).toMatchObject({ kind: "check", state: "closed" });
    // What the plant main supplies is what the consumers and the blow-off take.
    const main = result.nodes.find((n) => n.id === "MAIN");
    const taken = result.nodes
      .filter((n) => n.kind === "junction" || n.id === "ATM")
      .reduce((sum, n) => sum + Math.max(n.demand, 0), 0);
    expect(relativeError(-(main?.demand ?? 0), taken)).toBeLessThan(1e-9);
  });
});
