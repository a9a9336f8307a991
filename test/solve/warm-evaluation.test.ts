// Issue 8: the per-edge inversions of a residual evaluation (inlet Mach number, Fanno exit offset,
// Colebrook-White, capacity) start from the roots of the previous evaluation on the same edge.
// A warm-started evaluation must give what a cold one gives, to the tolerances the inversions
// stop at.
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { generateNetwork } from "../../benchmarks/generate-network.js";
import { solveNetwork } from "../../src/index.js";
import { readNetworkDocument } from "../../src/input/read-document.js";
import { buildNetwork } from "../../src/model/build-network.js";
import { PipeFlowEvaluation } from "../../src/physics/pipe-flow.js";
import {
  createNetworkSystem,
  edgeEndsAt,
  emptyEdgeEnds,
  evaluateEdgeWarm,
  evaluateSystem,
  type NetworkSystem,
  pressureUnknown,
} from "../../src/solve/network-system.js";

/** A generated mixed network solved, its model, and its converged state as scaled unknowns. */
function solvedNetwork(edges: number, seed: number) {
  return solvedDocument(generateNetwork({ edges, seed, topology: "mixed" }));
}

/** A network document solved, its model, and its converged state as scaled unknowns. */
function solvedDocument(document: unknown) {
  const result = solveNetwork(document);
  const read = readNetworkDocument(document);
  if (!read.ok) throw new Error("the generated network does not read");
  const built = buildNetwork(read.document);
  if (!built.ok) throw new Error("the generated network does not build");
  const model = built.model;
  const byId = new Map(result.nodes.map((node) => [node.id, node]));
  /** The converged state with every junction pressure scaled by (1 + fraction_j). */
  const stateOf = (system: NetworkSystem, fraction: (j: number) => number = () => 0) => {
    const x = new Float64Array(2 * system.junctionCount);
    for (let j = 0; j < system.junctionCount; j++) {
      const node = byId.get(read.document.nodes[model.junctionNodes[j] as number]?.id as string);
      if (node === undefined) throw new Error("missing node");
      x[2 * j] = pressureUnknown(system, j, node.pressure * (1 + fraction(j)));
      x[2 * j + 1] = node.temperature / system.temperatureScale;
    }
    return x;
  };
  return { result, model, stateOf };
}

describe("a warm-started residual evaluation equals a cold one (generated 1,000-edge network)", () => {
  const { result, model, stateOf } = solvedNetwork(1000, 4);

  it("converges, with choked vents among its edges", () => {
    expect(result.status).toBe("converged");
    expect(result.edges.some((edge) => edge.choked)).toBe(true);
  });

  for (const spread of [1e-6, 1e-3, 3e-2]) {
    it(`after evaluations at states up to ${spread} away in pressure: the same flows, residuals and Jacobian`, () => {
      const cold = createNetworkSystem(model);
      const warm = createNetworkSystem(model);
      const x = stateOf(cold, () => 0);
      // Two earlier evaluations at other states leave warm starts at other roots.
      evaluateSystem(
        warm,
        stateOf(warm, (j) => spread * Math.sin(7.1 * j + 1)),
        true,
      );
      evaluateSystem(
        warm,
        stateOf(warm, (j) => -spread * Math.cos(3.3 * j)),
        true,
      );
      const fromWarm = evaluateSystem(warm, x, true);
      const fromCold = evaluateSystem(cold, x, true, fromWarm.throughput);
      // Each inversion stops at 1e-13 of ln(-ln(p_exit/p0)) or of M1 (the inlet Mach number),
      // at 1e-15 of the Fanno offset and at rounding level of Colebrook-White, so a flow is fixed
      // to about 1e-13 of itself (5e-14 measured): 1e-12 relative (or 1e-15 kg/s for a flow near
      // zero) leaves a margin of ten.
      let flowScale = 0;
      for (const flow of fromCold.massFlow) flowScale = Math.max(flowScale, Math.abs(flow));
      fromCold.massFlow.forEach((flow, e) => {
        const difference = Math.abs((fromWarm.massFlow[e] as number) - flow);
        expect(difference, `edge ${e}`).toBeLessThanOrEqual(1e-12 * Math.abs(flow) + 1e-15);
      });
      expect([...fromWarm.choked]).toEqual([...fromCold.choked]);
      fromCold.residual.forEach((value, i) => {
        // Residuals are flows over the throughput (and temperatures over T_ref): 1e-12 of the
        // largest flow at a node over W bounds their difference.
        expect(Math.abs((fromWarm.residual[i] as number) - value), `residual ${i}`).toBeLessThan(
          (1e-12 * 4 * flowScale) / fromCold.throughput,
        );
      });
      // The derivatives of a pipe with a small drop are differences of terms of order 1/M that
      // cancel to order drop/p, so the 1e-13 of M1 shows in them magnified by up to p/drop: the
      // Jacobian entries agree to 1e-6 of the largest (2.9e-7 measured, as much as between a
      // cold evaluation and the warm start of M1 that predates issue 8).
      const jacobianCold = fromCold.jacobian as Float64Array;
      const jacobianWarm = fromWarm.jacobian as Float64Array;
      let jacobianScale = 0;
      for (const entry of jacobianCold) jacobianScale = Math.max(jacobianScale, Math.abs(entry));
      jacobianCold.forEach((entry, i) => {
        expect(Math.abs((jacobianWarm[i] as number) - entry), `entry ${i}`).toBeLessThanOrEqual(
          1e-6 * jacobianScale,
        );
      });
    });
  }
});

// Issue 8 (memory): Newton's line search lends the arrays of an evaluation it no longer needs to
// the next one (evaluateSystem's `retired`). The lent arrays must be overwritten completely:
// the same numbers to the bit as a fresh evaluation after the same history.
describe("an evaluation in a retired evaluation's arrays equals a fresh one", () => {
  const document = generateNetwork({ edges: 300, seed: 9, topology: "mixed" });
  const read = readNetworkDocument(document);
  if (!read.ok) throw new Error("the generated network does not read");
  const built = buildNetwork(read.document);
  if (!built.ok) throw new Error("the generated network does not build");
  const model = built.model;
  /** A state away from the solution, so that flows, chokes and residuals all differ. */
  const stateAt = (system: NetworkSystem, shift: number): Float64Array => {
    const x = new Float64Array(2 * system.junctionCount);
    for (let j = 0; j < system.junctionCount; j++) {
      x[2 * j] = -0.3 * (1 + Math.sin(1.7 * j + shift)) * 0.5;
      x[2 * j + 1] = 1 + 0.05 * Math.cos(2.3 * j + shift);
    }
    return x;
  };

  for (const lentWithJacobian of [true, false]) {
    it(`lent by an evaluation ${lentWithJacobian ? "with" : "without"} a Jacobian`, () => {
      const lending = createNetworkSystem(model);
      const fresh = createNetworkSystem(model);
      const retired = evaluateSystem(lending, stateAt(lending, 0), lentWithJacobian);
      evaluateSystem(fresh, stateAt(fresh, 0), lentWithJacobian);
      const x = stateAt(lending, 2);
      const reused = evaluateSystem(lending, x, true, undefined, retired);
      const expected = evaluateSystem(fresh, x, true);
      // The arrays are the lent ones (so nothing new was allocated for them) ...
      expect(reused.residual).toBe(retired.residual);
      expect(reused.massFlow).toBe(retired.massFlow);
      if (lentWithJacobian) expect(reused.jacobian).toBe(retired.jacobian);
      // ... and hold what a fresh evaluation holds, to the bit.
      expect(reused.throughput).toBe(expected.throughput);
      for (const key of [
        "residual",
        "jacobian",
        "massFlow",
        "choked",
        "nodeNetOutflow",
        "energyScale",
        "massNoise",
      ] as const) {
        expect(Array.from(reused[key] as ArrayLike<number>), key).toEqual(
          Array.from(expected[key] as ArrayLike<number>),
        );
      }
      // The state must differ from the lent one's, or the test could not fail.
      expect([...reused.massFlow]).not.toEqual([
        ...evaluateSystem(createNetworkSystem(model), stateAt(lending, 0), false).massFlow,
      ]);
    });
  }
});

// Issue 8 (memory): every edge is evaluated into the system's one PipeFlowEvaluation record, with
// its own warm starts moved in and out (EdgeWarmStarts). What the record holds from the edge
// evaluated before must not reach the next: an edge evaluated right after any other edge gives
// the same numbers to the bit as one evaluated into a fresh record.
const EXAMPLES = new URL("../../docs/examples/", import.meta.url);
/** Example networks with components, heat-transfer pipes, a real gas and rising pipes. */
const EXAMPLE_NETWORKS = ["regulated-header.json", "fuel-gas-riser.json", "winter-vent-riser.json"];

describe("an edge's evaluation does not depend on the edge evaluated before it", () => {
  const { model, stateOf } = solvedNetwork(300, 11);
  const fields = [
    "massFlow",
    "dMassFlowdUpstreamPressure",
    "dMassFlowdDownstreamPressure",
    "choked",
    "capacity",
    "inletMach",
    "outletMach",
    "outletPressure",
    "frictionFactor",
    "arrivalTemperature",
  ] as const;

  it("gives each edge, after a choked vent and after a creeping pipe, what it gives alone", () => {
    const shared = createNetworkSystem(model);
    const x = stateOf(shared);
    // Warm every edge's starts once, as Newton does, in both systems alike.
    evaluateSystem(shared, x, true);
    const edgeCount = shared.edgeCount;
    const atSolution = evaluateSystem(shared, x, false);
    const flows = atSolution.massFlow;
    const choked = atSolution.choked.indexOf(1);
    let quietest = 0;
    for (let e = 0; e < edgeCount; e++) {
      if (Math.abs(flows[e] as number) < Math.abs(flows[quietest] as number)) quietest = e;
    }
    expect(choked).toBeGreaterThanOrEqual(0);
    const ends = emptyEdgeEnds();
    // As Newton evaluates (without the capacity) and as the results do (with it).
    const evaluate = (system: NetworkSystem, e: number, needCapacity: boolean) => {
      edgeEndsAt(system, x, e, system.edgeEvaluation, ends);
      const out = evaluateEdgeWarm(system, e, ends, needCapacity);
      return fields.map((field) => out[field]);
    };
    for (const needCapacity of [false, true]) {
      for (const before of [choked, quietest]) {
        for (let e = 0; e < edgeCount; e++) {
          const alone = createNetworkSystem(model);
          evaluateSystem(alone, x, true);
          // A fresh record: nothing in it from another edge.
          alone.edgeEvaluation = new PipeFlowEvaluation();
          const expected = evaluate(alone, e, needCapacity);
          // The same history, then another edge's evaluation fills the shared record first.
          const after = createNetworkSystem(model);
          evaluateSystem(after, x, true);
          evaluate(after, before, needCapacity);
          expect(evaluate(after, e, needCapacity), `edge ${e} after edge ${before}`).toEqual(
            expected,
          );
        }
      }
    }
    // And each edge keeps its own roots for its next evaluation (the choked vent its choke).
    const kept = createNetworkSystem(model);
    evaluateSystem(kept, x, false);
    expect(kept.warmStarts.choked[choked]).toBe(1);
    for (let e = 0; e < edgeCount; e++) {
      evaluate(kept, e, false);
      const record = kept.edgeEvaluation;
      const starts = kept.warmStarts;
      expect(
        [
          starts.choked[e] === 1,
          starts.inletMach[e],
          starts.capacityInletMach[e],
          starts.exitOffset[e],
          starts.frictionInverseRoot[e],
        ],
        `edge ${e}`,
      ).toEqual([
        record.choked,
        record.lastInletMach,
        record.lastCapacityInletMach,
        record.lastExitOffset,
        record.friction.colebrook.inverseRoot,
      ]);
    }
  });

  for (const name of EXAMPLE_NETWORKS) {
    it(`gives each edge of ${name} what it gives alone, after every other edge`, () => {
      const example = solvedDocument(JSON.parse(readFileSync(new URL(name, EXAMPLES), "utf8")));
      const probe = createNetworkSystem(example.model);
      const x = example.stateOf(probe);
      const ends = emptyEdgeEnds();
      const evaluate = (system: NetworkSystem, e: number, needCapacity: boolean) => {
        edgeEndsAt(system, x, e, system.edgeEvaluation, ends);
        const out = evaluateEdgeWarm(system, e, ends, needCapacity);
        return [
          out.massFlow,
          out.dMassFlowdUpstreamPressure,
          out.choked,
          out.capacity,
          out.arrivalTemperature,
          out.heatFlow,
          out.outletPressure,
        ];
      };
      for (const needCapacity of [false, true]) {
        for (let e = 0; e < probe.edgeCount; e++) {
          const alone = createNetworkSystem(example.model);
          evaluateSystem(alone, x, true);
          alone.edgeEvaluation = new PipeFlowEvaluation();
          const expected = evaluate(alone, e, needCapacity);
          for (let before = 0; before < probe.edgeCount; before++) {
            // (Evaluating the edge itself first would move its own warm starts.)
            if (before === e) continue;
            const after = createNetworkSystem(example.model);
            evaluateSystem(after, x, true);
            evaluate(after, before, needCapacity);
            expect(evaluate(after, e, needCapacity), `edge ${e} after edge ${before}`).toEqual(
              expected,
            );
          }
        }
      }
    });
  }
});
