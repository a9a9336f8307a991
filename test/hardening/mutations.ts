/**
 * Random mutations of valid network documents, as fast-check arbitraries: deleted and duplicated
 * fields, wrong types, negative, zero, huge, NaN-like and Infinity-like numbers, unknown units,
 * dangling and unicode ids, empty lists, deeply nested junk and very long strings. Shared by the
 * property tests (test/hardening/input-mutations.test.ts) and `npm run fuzz`.
 *
 * JSON cannot hold NaN or Infinity. A mutated document is therefore used in two forms: as an
 * object (where NaN and Infinity are plain values) and as JSON text, where a marker string
 * `"__raw__1e400"` is replaced by the raw token 1e400 (which JSON.parse reads as Infinity),
 * `"__raw__-0"` by -0, `"__raw__1e-400"` by a number that underflows to 0.
 */
import fc from "fast-check";
import type { NetworkDocument } from "../../src/index.js";
import { corpusCase } from "./corpus.js";

/** Small valid networks with every kind of field: quantity strings, gases, settings. */
export const BASE_DOCUMENTS: readonly NetworkDocument[] = [
  {
    name: "receiver and two consumers",
    gas: { preset: "air" },
    ambient: { pressure: "1.013 bar(a)", temperature: "15 degC" },
    settings: { tolerance: 1e-9, maxIterations: 100, timeLimit: 2, limits: { maxMach: 0.5 } },
    nodes: [
      { id: "REC", kind: "reservoir", pressure: "7 bar(g)", temperature: "25 degC" },
      { id: "TEE", kind: "junction", description: "tee" },
      { id: "SHOP", kind: "junction", demand: "300 kg/h" },
      { id: "PAINT", kind: "junction", demand: "150 Nm3/h" },
    ],
    edges: [
      { id: "MAIN", kind: "pipe", from: "REC", to: "TEE", length: "60 m", diameter: "52.5 mm" },
      {
        id: "B1",
        kind: "pipe",
        from: "TEE",
        to: "SHOP",
        length: "25 m",
        diameter: "40.9 mm",
        roughness: "0.05 mm",
        minorLoss: 1.5,
      },
      {
        id: "B2",
        kind: "pipe",
        from: "TEE",
        to: "PAINT",
        length: "35 m",
        diameter: "1.049 in",
        frictionFactor: 0.025,
      },
    ],
  },
  {
    name: "nitrogen loop with an injection",
    gas: { preset: "nitrogen" },
    settings: { pipeModel: "isothermal", timeLimit: 2, limits: { maxVelocity: "30 m/s" } },
    nodes: [
      { id: "TANK", kind: "reservoir", pressure: "10 bar(a)", temperature: "20 degC" },
      { id: "A", kind: "junction" },
      { id: "B", kind: "junction", demand: "0.1 kg/s" },
      { id: "C", kind: "junction", demand: "-0.02 kg/s", temperature: "60 degC" },
      { id: "DEAD", kind: "junction" },
    ],
    edges: [
      { id: "P1", kind: "pipe", from: "TANK", to: "A", length: 20, diameter: 0.0525 },
      {
        id: "P2",
        kind: "pipe",
        from: "A",
        to: "B",
        length: 40,
        diameter: 0.0409,
        model: "adiabatic",
      },
      { id: "P3", kind: "pipe", from: "B", to: "C", length: 30, diameter: 0.0409 },
      { id: "P4", kind: "pipe", from: "C", to: "A", length: 50, diameter: 0.0409 },
      { id: "P5", kind: "pipe", from: "B", to: "DEAD", length: 5, diameter: 0.0266 },
    ],
  },
  {
    name: "custom gas vent",
    gas: {
      name: "dry process gas",
      molarMass: "28 g/mol",
      gamma: 1.38,
      viscosity: {
        referenceViscosity: "17.2 uPa s",
        referenceTemperature: "273.15 K",
        sutherlandConstant: "110 K",
      },
    },
    settings: { timeLimit: 2 },
    nodes: [
      { id: "HP", kind: "reservoir", pressure: "8 bar(a)", temperature: "20 degC" },
      { id: "ATM", kind: "reservoir", pressure: "1.01325 bar(a)", temperature: "20 degC" },
    ],
    edges: [{ id: "VENT", kind: "pipe", from: "HP", to: "ATM", length: "2 m", diameter: "25 mm" }],
  },
  {
    name: "fuel-gas mixture header",
    gas: {
      components: [
        { preset: "methane", moleFraction: 0.9 },
        { preset: "nitrogen", moleFraction: 0.1 },
      ],
    },
    settings: { timeLimit: 2, limits: { minPressure: "1 bar(g)", maxMomentumFlux: 150000 } },
    nodes: [
      { id: "KO", kind: "reservoir", pressure: "4 bar(g)", temperature: "30 degC" },
      { id: "H", kind: "junction" },
      { id: "B1", kind: "junction", demand: "200 kg/h" },
      { id: "B2", kind: "junction", demand: "80 Sm3/h" },
    ],
    edges: [
      { id: "HDR", kind: "pipe", from: "KO", to: "H", length: "100 ft", diameter: "3 in" },
      { id: "L1", kind: "pipe", from: "H", to: "B1", length: "10 m", diameter: "1.5 in" },
      { id: "L2", kind: "pipe", from: "B2", to: "H", length: "12 m", diameter: "1 in" },
    ],
  },
  // Small generated networks in SI numbers: a tree and a grid.
  corpusCase(10).document,
  corpusCase(12).document,
];

/** Replacement values: wrong types, edge numbers, NaN- and Infinity-like text, bad units. */
const SPECIAL_VALUES: readonly unknown[] = [
  true,
  false,
  null,
  0,
  -0,
  -1,
  1e-320,
  5e-324,
  1e308,
  -1e308,
  Number.MAX_VALUE,
  Number.NaN,
  Number.POSITIVE_INFINITY,
  Number.NEGATIVE_INFINITY,
  "",
  " ",
  "NaN",
  "NaN bar",
  "Infinity m",
  "-Infinity K",
  "1e400 mm",
  "1e400",
  "1e-400 m",
  "-0 m",
  "0x1F m",
  "1,5 bar",
  "7 bar(g) and more",
  "7 bar(g)(g)",
  "5 furlongs",
  "3 kg",
  "20 degC/s",
  "\u22125 m",
  "\u0663 m",
  "5 \u339c",
  "0 K",
  "-300 degC",
  "2 K",
  "1e6 K",
  "-7 bar(g)",
  "1e-30 Pa",
  "1e30 bar",
  "1e30 kg/s",
  "-1e30 kg/s",
  "1 m^-1",
  "kg/s",
  "5 Nm3/h/h",
  "__raw__1e400",
  "__raw__-1e400",
  "__raw__-0",
  "__raw__1e-400",
  [],
  {},
  [1, 2, 3],
  { value: 5, unit: "m" },
];

/** Nested arrays and objects `depth` levels deep. */
function nested(depth: number, asObject: boolean): unknown {
  let value: unknown = "bottom";
  for (let level = 0; level < depth; level++) value = asObject ? { junk: value } : [value];
  return value;
}

/** A value to put where a valid one was. */
export const junkValue: fc.Arbitrary<unknown> = fc.oneof(
  { weight: 6, arbitrary: fc.constantFrom(...SPECIAL_VALUES) },
  { weight: 2, arbitrary: fc.double() },
  { weight: 1, arbitrary: fc.integer() },
  { weight: 2, arbitrary: fc.string({ unit: "grapheme", maxLength: 12 }) },
  { weight: 1, arbitrary: fc.string({ unit: "binary", maxLength: 12 }) },
  {
    weight: 1,
    arbitrary: fc
      .tuple(fc.double({ noNaN: true }), fc.constantFrom("m", "bar(g)", "kg/s", "degC", "Pa s"))
      .map(([number, unit]) => `${number} ${unit}`),
  },
  {
    weight: 1,
    arbitrary: fc
      .tuple(fc.integer({ min: 1, max: 1500 }), fc.boolean())
      .map(([depth, asObject]) => nested(depth, asObject)),
  },
  {
    weight: 1,
    arbitrary: fc
      .integer({ min: 100, max: 200_000 })
      .map((length) => `${"9".repeat(Math.min(length, 400))} ${"x".repeat(length)}`),
  },
  { weight: 1, arbitrary: fc.anything({ maxDepth: 3 }) },
);

/** Ids to give a node or an edge, or to name in from/to: dangling, unicode, long, escaped. */
const idValue: fc.Arbitrary<string> = fc.oneof(
  fc.constantFrom(
    "",
    " ",
    "J9",
    "UNKNOWN",
    "a/b",
    "~0",
    "~1",
    "é",
    "e\u0301",
    "\u6cf5\u7ad9",
    "\ud83d\udd25",
    "\u202eRTL",
    "\u0000",
    "\ud800",
    "__proto__",
    "constructor",
    "toString",
    "x".repeat(200),
    "x".repeat(201),
    "x".repeat(100_000),
  ),
  fc.string({ unit: "grapheme", minLength: 1, maxLength: 8 }),
);

/** Field names to add as unknown fields. */
const fieldName = fc.oneof(
  fc.constantFrom("lenght", "__proto__", "constructor", "", "id ", "Kind", "$ref"),
  fc.string({ maxLength: 6 }),
);

/** One mutation; applied to a copy of a base document by {@link applyMutation}. */
export type Mutation =
  | { kind: "delete"; at: number }
  | { kind: "replace"; at: number; value: unknown }
  | { kind: "duplicate"; at: number; field: string }
  | { kind: "set-id"; at: number; value: string }
  | { kind: "empty-list"; list: "nodes" | "edges" }
  | { kind: "swap-kind"; at: number }
  | { kind: "scale"; at: number; factor: number }
  /** Valid-keeping changes, so that the solver gets varied documents too. */
  | { kind: "perturb"; at: number; factor: number }
  | { kind: "flip-edge"; at: number }
  | { kind: "reverse-list"; list: "nodes" | "edges" };

export const mutation: fc.Arbitrary<Mutation> = fc.oneof(
  { weight: 3, arbitrary: fc.record({ kind: fc.constant("delete"), at: fc.nat() }) },
  {
    weight: 6,
    arbitrary: fc.record({ kind: fc.constant("replace"), at: fc.nat(), value: junkValue }),
  },
  {
    weight: 2,
    arbitrary: fc.record({ kind: fc.constant("duplicate"), at: fc.nat(), field: fieldName }),
  },
  {
    weight: 3,
    arbitrary: fc.record({ kind: fc.constant("set-id"), at: fc.nat(), value: idValue }),
  },
  {
    weight: 1,
    arbitrary: fc.record({
      kind: fc.constant("empty-list"),
      list: fc.constantFrom("nodes", "edges"),
    }),
  },
  { weight: 1, arbitrary: fc.record({ kind: fc.constant("swap-kind"), at: fc.nat() }) },
  {
    weight: 3,
    arbitrary: fc.record({
      kind: fc.constant("scale"),
      at: fc.nat(),
      factor: fc.constantFrom(0, -1, 1e-300, 1e-12, 1e-6, 1e3, 1e6, 1e12, 1e300, 1.000001),
    }),
  },
  {
    weight: 6,
    arbitrary: fc.record({
      kind: fc.constant("perturb"),
      at: fc.nat(),
      factor: fc.double({ min: 0.3, max: 3, noNaN: true }),
    }),
  },
  { weight: 2, arbitrary: fc.record({ kind: fc.constant("flip-edge"), at: fc.nat() }) },
  {
    weight: 1,
    arbitrary: fc.record({
      kind: fc.constant("reverse-list"),
      list: fc.constantFrom("nodes", "edges"),
    }),
  },
) as fc.Arbitrary<Mutation>;

/** A mutated document: which base, which mutations, and whether it goes in as JSON text. */
export interface MutatedCase {
  base: number;
  mutations: Mutation[];
  asText: boolean;
}

export const mutatedCase: fc.Arbitrary<MutatedCase> = fc.record({
  base: fc.nat({ max: BASE_DOCUMENTS.length - 1 }),
  mutations: fc.array(mutation, { minLength: 1, maxLength: 4 }),
  asText: fc.boolean(),
});

type Container = Record<string, unknown> | unknown[];

/** How deep mutations look into a document: documents are shallow, deeper is junk. */
const PLACE_DEPTH = 12;

/** Every place in a value: [container, key] pairs, depth first, in a fixed order. */
function places(value: unknown, out: [Container, string | number][] = [], depth = 0) {
  if (depth > PLACE_DEPTH) return out;
  if (Array.isArray(value)) {
    value.forEach((item, index) => {
      out.push([value, index]);
      places(item, out, depth + 1);
    });
  } else if (typeof value === "object" && value !== null) {
    for (const key of Object.keys(value)) {
      out.push([value as Record<string, unknown>, key]);
      places((value as Record<string, unknown>)[key], out, depth + 1);
    }
  }
  return out;
}

function copy<T>(value: T): T {
  return structuredClone(value);
}

/** Replace the raw-token markers by the numbers they stand for (an object can hold them). */
function withRawNumbers(value: unknown, depth = 0): unknown {
  if (typeof value === "string" && value.startsWith("__raw__")) return Number(value.slice(7));
  if (depth > PLACE_DEPTH) return value;
  if (Array.isArray(value)) return value.map((item) => withRawNumbers(item, depth + 1));
  if (typeof value === "object" && value !== null) {
    const out: Record<string, unknown> = {};
    for (const [key, item] of Object.entries(value)) {
      Object.defineProperty(out, key, {
        value: withRawNumbers(item, depth + 1),
        enumerable: true,
        configurable: true,
        writable: true,
      });
    }
    return out;
  }
  return value;
}

/** Apply one mutation to `doc` in place (doc is a copy). */
export function applyMutation(doc: Record<string, unknown>, m: Mutation): void {
  const all = places(doc);
  if (m.kind === "empty-list") {
    doc[m.list] = [];
    return;
  }
  if (m.kind === "set-id") {
    const ids = all.filter(([, key]) => key === "id" || key === "from" || key === "to");
    const place = ids[m.at % Math.max(ids.length, 1)];
    if (place) (place[0] as Record<string, unknown>)[place[1] as string] = m.value;
    return;
  }
  if (m.kind === "reverse-list") {
    const list = doc[m.list];
    if (Array.isArray(list)) list.reverse();
    return;
  }
  if (m.kind === "flip-edge") {
    const edges = doc.edges;
    if (!Array.isArray(edges) || edges.length === 0) return;
    const edge = edges[m.at % edges.length] as Record<string, unknown> | null;
    if (typeof edge === "object" && edge !== null) [edge.from, edge.to] = [edge.to, edge.from];
    return;
  }
  if (m.kind === "perturb") {
    // A number, or the number of a quantity, times a factor near 1: the document stays valid
    // (mostly) and the physics changes.
    const numbers = all.filter(([container, key]) => {
      const value = (container as Record<string | number, unknown>)[key];
      return typeof value === "number" || (typeof value === "string" && /^\d/.test(value));
    });
    const place = numbers[m.at % Math.max(numbers.length, 1)];
    if (place) applyMutation(doc, { kind: "scale", at: all.indexOf(place), factor: m.factor });
    return;
  }
  if (m.kind === "swap-kind") {
    const kinds = all.filter(([, key]) => key === "kind");
    const place = kinds[m.at % Math.max(kinds.length, 1)];
    if (place) {
      const container = place[0] as Record<string, unknown>;
      container.kind = container.kind === "reservoir" ? "junction" : "reservoir";
    }
    return;
  }
  if (all.length === 0) return;
  const [container, key] = all[m.at % all.length] as [Container, string | number];
  const get = () => (container as Record<string | number, unknown>)[key];
  const set = (value: unknown) => {
    (container as Record<string | number, unknown>)[key] = value;
  };
  switch (m.kind) {
    case "delete":
      if (Array.isArray(container)) container.splice(key as number, 1);
      else delete container[key as string];
      return;
    case "replace":
      // A copy: later mutations must not change the generated value (the case is built again
      // for each check and for the report of a failure).
      set(copy(m.value));
      return;
    case "duplicate":
      if (Array.isArray(container)) container.splice(key as number, 0, copy(get()));
      else
        Object.defineProperty(container, m.field, {
          value: copy(get()),
          enumerable: true,
          configurable: true,
          writable: true,
        });
      return;
    case "scale": {
      const value = get();
      if (typeof value === "number") set(value * m.factor);
      else if (typeof value === "string") {
        set(
          value.replace(/^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?/, (text) =>
            String(Number(text) * m.factor),
          ),
        );
      }
      return;
    }
  }
}

/** The mutated document as an object, and as the JSON text a file would hold. */
export function buildCase(c: MutatedCase): { document: unknown; text: string } {
  const doc = copy(BASE_DOCUMENTS[c.base] as NetworkDocument) as unknown as Record<string, unknown>;
  for (const m of c.mutations) applyMutation(doc, m);
  // In text, NaN and Infinity become null (JSON.stringify), the markers raw tokens.
  const text = JSON.stringify(doc).replace(/"__raw__([-+0-9.e]+)"/g, "$1");
  return { document: c.asText ? text : withRawNumbers(doc), text };
}
