/**
 * The junction pressure unknowns as offsets from per-group reference pressures (defect B3,
 * src/solve/network-system.ts withPressureReferences): moving the references keeps the state,
 * junctions at rest at one pressure differ by exactly 0, and a difference between two junctions
 * with different references is as exact as double rounding of the result allows. The exact
 * values are computed here independently, with Dekker's error-free product and Knuth's
 * error-free sum (T. J. Dekker, "A floating-point technique for extending the available
 * precision", Numer. Math. 18 (1971) 224-242; D. E. Knuth, TAOCP vol. 2, 4.2.2).
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { readNetworkDocument } from "../../src/input/read-document.js";
import { buildNetwork } from "../../src/model/build-network.js";
import { initialGuess } from "../../src/solve/initial-guess.js";
import {
  createNetworkSystem,
  type NetworkSystem,
  nodePressure,
  nodePressureDifference,
  REFERENCE_GROUP_DROP,
  withPressureReferences,
} from "../../src/solve/network-system.js";

function systemOf(fixture: string): NetworkSystem {
  const text = readFileSync(
    new URL(`../fixtures/hard-networks/${fixture}`, import.meta.url),
    "utf8",
  );
  const read = readNetworkDocument(JSON.parse(text));
  if (!read.ok) throw new Error(`${fixture} does not read`);
  const built = buildNetwork(read.document);
  if (!built.ok) throw new Error(`${fixture} does not build`);
  return createNetworkSystem(built.model);
}

/** a + b as an unevaluated pair [sum, error] (Knuth's TwoSum). */
function twoSum(a: number, b: number): [number, number] {
  const s = a + b;
  const bb = s - a;
  return [s, a - (s - bb) + (b - bb)];
}

/** Split of a double into two halves of 26 bits (Veltkamp, in Dekker 1971). */
function split(a: number): [number, number] {
  const c = 134217729 * a; // 2^27 + 1
  const high = c - (c - a);
  return [high, a - high];
}

/** a b as an unevaluated pair [product, error] (Dekker's TwoProduct). */
function twoProduct(a: number, b: number): [number, number] {
  const p = a * b;
  const [ah, al] = split(a);
  const [bh, bl] = split(b);
  return [p, ah * bh - p + ah * bl + al * bh + al * bl];
}

/** r_a (1 + x_a) - r_b (1 + x_b) to about 1e-30 of the terms (double-double sums). */
function exactDifference(ra: number, xa: number, rb: number, xb: number): number {
  const [pa, ea] = twoProduct(ra, xa);
  const [pb, eb] = twoProduct(rb, xb);
  const terms = [ra, pa, ea, -rb, -pb, -eb];
  let sum = 0;
  let error = 0;
  for (const term of terms) {
    const [s, e] = twoSum(sum, term);
    sum = s;
    error += e;
  }
  return sum + error;
}

describe("junction pressure references", () => {
  const system = systemOf("offsets-far-below-supply-736.json");
  const guess = initialGuess(system);
  const moved = withPressureReferences(system, guess);
  const { model } = system;

  it("keep every node pressure when they move (1 unit of rounding of p)", () => {
    for (let node = 0; node < model.document.nodes.length; node++) {
      const before = nodePressure(system, guess, node);
      const after = nodePressure(moved.system, moved.x, node);
      expect(Math.abs(after - before)).toBeLessThanOrEqual(Number.EPSILON * before);
    }
  });

  it("are shared by junctions joined by an edge with a small drop, and differ across a restriction", () => {
    let shared = 0;
    let distinct = 0;
    for (let e = 0; e < system.edgeCount; e++) {
      const a = model.unknownIndex[model.edgeFrom[e] as number] as number;
      const b = model.unknownIndex[model.edgeTo[e] as number] as number;
      if (a < 0 || b < 0) continue;
      const pa = nodePressure(system, guess, model.edgeFrom[e] as number);
      const pb = nodePressure(system, guess, model.edgeTo[e] as number);
      const ra = moved.system.pressureReference[a] as number;
      const rb = moved.system.pressureReference[b] as number;
      if (Math.abs(pa - pb) <= REFERENCE_GROUP_DROP * Math.max(pa, pb)) {
        expect(ra).toBe(rb);
        shared++;
      } else if (ra !== rb) {
        distinct++;
      }
      // A reference is the group's highest first-guess pressure: never below its own.
      expect(ra).toBeGreaterThanOrEqual(pa);
    }
    // The fixture has header junctions at 0.37 of the supply behind a DN 6 restriction.
    expect(shared).toBeGreaterThan(0);
    expect(distinct).toBeGreaterThan(0);
  });

  it("give the difference of two junctions with different references to 4 units of rounding of the difference", () => {
    const x = Float64Array.from(moved.x);
    // Small offsets, as Newton leaves them: pressures 1e-7 and 3e-8 from their references.
    for (let j = 0; j < system.junctionCount; j++) x[2 * j] = (j % 2 === 0 ? 1e-7 : -3e-8) / 3;
    let checked = 0;
    for (let e = 0; e < system.edgeCount; e++) {
      const from = model.edgeFrom[e] as number;
      const to = model.edgeTo[e] as number;
      const a = model.unknownIndex[from] as number;
      const b = model.unknownIndex[to] as number;
      if (a < 0 || b < 0) continue;
      const ra = moved.system.pressureReference[a] as number;
      const rb = moved.system.pressureReference[b] as number;
      const exact = exactDifference(ra, x[2 * a] as number, rb, x[2 * b] as number);
      const computed = nodePressureDifference(moved.system, x, from, to);
      // Two products, each rounded to 1e-16 of itself (1e-7 of p), and two sums: a few units
      // of rounding of the difference, plus 1e-16 of the offsets' parts.
      const offsets = Math.abs(ra * (x[2 * a] as number)) + Math.abs(rb * (x[2 * b] as number));
      expect(Math.abs(computed - exact)).toBeLessThanOrEqual(
        4 * Number.EPSILON * (Math.abs(exact) + offsets),
      );
      checked++;
    }
    expect(checked).toBeGreaterThan(0);
  });

  it("give a difference of exactly 0 between junctions at rest at one pressure", () => {
    const atRest = systemOf("at-rest-three-nodes.json");
    const start = withPressureReferences(atRest, initialGuess(atRest));
    for (let e = 0; e < atRest.edgeCount; e++) {
      const from = atRest.model.edgeFrom[e] as number;
      const to = atRest.model.edgeTo[e] as number;
      expect(nodePressureDifference(start.system, start.x, from, to)).toBe(0);
    }
  });
});
