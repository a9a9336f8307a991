/**
 * A seeded corpus of invented networks for the hardening tests: trees, rings, meshed grids with
 * several reservoirs, reverse flows, mixed temperatures, near-choked and choked edges, tiny and
 * huge pipes side by side, and demands beyond what the supply can give. 5 to 40 edges each.
 *
 * `corpusCase(seed)` always gives the same document for the same seed (mulberry32 generator, no
 * clock, no Math.random). The family is `familyOf(seed)`: every run of 18 consecutive seeds
 * holds two networks of each family but one "overload" and three "near-choke". Overloaded
 * networks are the slow ones (their no-solution diagnosis runs a continuation down to its
 * smallest step, about a thousand Newton iterations), so they are fewer and smaller (5 to 12
 * edges), with at most 25 iterations per Newton run; so are the tiny-huge networks (5 to 20
 * edges, 40 iterations).
 */
import { gasPreset, type NetworkDocument, type NodeInput, pipeFlow } from "../../src/index.js";
import { seededRandom } from "../seeded-random.js";

export { seededRandom };

/** The network families of the corpus. */
export const FAMILIES = [
  "tree",
  "ring",
  "grid",
  "reverse",
  "mixed-temperature",
  "near-choke",
  "choke",
  "tiny-huge",
  "overload",
] as const;

export type CorpusFamily = (typeof FAMILIES)[number];

/** The family of a seed: in every 18 seeds, two of each but one overload and three near-choke. */
export function familyOf(seed: number): CorpusFamily {
  const slot = seed % 18;
  if (slot === 17) return "near-choke";
  return FAMILIES[slot % FAMILIES.length] as CorpusFamily;
}

/** One network of the corpus. */
export interface CorpusCase {
  seed: number;
  family: CorpusFamily;
  document: NetworkDocument;
}

/**
 * Inside diameters [m], DN 6 to DN 600, roughly ASME B36.10M Sch 40 (invented networks: the
 * exact bores do not matter here).
 */
const BORES = [
  0.00684, 0.01253, 0.0158, 0.02093, 0.02664, 0.03505, 0.04089, 0.0525, 0.06271, 0.07793, 0.10226,
  0.15405, 0.20272, 0.25451, 0.30323, 0.381, 0.47788, 0.57455,
];

const GASES = ["air", "nitrogen", "methane", "natural-gas", "carbon-dioxide", "helium", "hydrogen"];

/** A pipe as the corpus writes it: SI numbers only. */
interface Pipe {
  id: string;
  kind: "pipe";
  from: string;
  to: string;
  length: number;
  diameter: number;
  roughness?: number;
  frictionFactor?: number;
  minorLoss?: number;
  model?: "adiabatic" | "isothermal";
}

/** Builds one document: nodes, pipes, and the random choices of one seed. */
class Builder {
  readonly random: () => number;
  readonly nodes: NodeInput[] = [];
  readonly edges: Pipe[] = [];
  /** Flip the declared direction of this fraction of the pipes (their flows run "backwards"). */
  flipShare = 0;

  constructor(seed: number) {
    this.random = seededRandom(seed);
  }

  uniform(low: number, high: number): number {
    return low + (high - low) * this.random();
  }

  logUniform(low: number, high: number): number {
    return low * (high / low) ** this.random();
  }

  integer(low: number, high: number): number {
    return low + Math.floor(this.random() * (high - low + 1));
  }

  pick<T>(list: readonly T[]): T {
    return list[Math.floor(this.random() * list.length)] as T;
  }

  chance(probability: number): boolean {
    return this.random() < probability;
  }

  bore(lowest: number, highest: number): number {
    return BORES[this.integer(lowest, highest)] as number;
  }

  reservoir(id: string, pressure: number, temperature = this.uniform(280, 320)): string {
    this.nodes.push({ id, kind: "reservoir", pressure, temperature });
    return id;
  }

  junction(id: string, demand = 0, injectionTemperature?: number): string {
    const node: NodeInput = { id, kind: "junction" };
    if (demand !== 0) node.demand = demand;
    if (demand < 0) node.temperature = injectionTemperature ?? this.uniform(280, 330);
    this.nodes.push(node);
    return id;
  }

  pipe(from: string, to: string, length: number, diameter: number, extra: Partial<Pipe> = {}) {
    const flip = this.chance(this.flipShare);
    const pipe: Pipe = {
      id: `E${this.edges.length + 1}`,
      kind: "pipe",
      from: flip ? to : from,
      to: flip ? from : to,
      length,
      diameter,
      ...extra,
    };
    // Some pipes with a fixed friction factor or minor losses, as real inputs have.
    if (pipe.frictionFactor === undefined && pipe.roughness === undefined) {
      if (this.chance(0.15)) pipe.frictionFactor = this.uniform(0.012, 0.04);
      else if (this.chance(0.3)) pipe.roughness = this.logUniform(1e-6, 5e-4);
    }
    if (pipe.minorLoss === undefined && this.chance(0.3)) pipe.minorLoss = this.uniform(0, 8);
    this.edges.push(pipe);
    return pipe.id;
  }

  /** A consumer's demand [kg/s] for gas at about (p, T) moving at `velocity` in a bore. */
  demandFor(diameter: number, pressure: number, velocity: number, gas: string): number {
    const r = gasPreset(gas as Parameters<typeof gasPreset>[0]).specificGasConstant;
    const density = pressure / (r * 300);
    return density * velocity * 0.25 * Math.PI * diameter * diameter;
  }
}

/** The largest flow a pipe passes from a plenum at (p, T) into a vacuum-like back-pressure. */
function capacityOf(gas: string, pipe: Pipe, pressure: number, temperature: number): number {
  const flow = pipeFlow(
    gasPreset(gas as Parameters<typeof gasPreset>[0]),
    {
      length: pipe.length,
      diameter: pipe.diameter,
      ...(pipe.frictionFactor !== undefined ? { frictionFactor: pipe.frictionFactor } : {}),
      ...(pipe.roughness !== undefined ? { roughness: pipe.roughness } : {}),
      minorLoss: pipe.minorLoss ?? 0,
      model: pipe.model ?? "adiabatic",
    },
    { pressure, temperature },
    1e-3 * pressure,
  );
  return flow.capacity;
}

/** A tree: one supply, branches of falling bore, consumers at the leaves. */
function tree(b: Builder, gas: string, edges: number): void {
  const supplyPressure = b.uniform(3e5, 12e5);
  const ids = [b.reservoir("SUPPLY", supplyPressure)];
  const bores = new Map<string, number>([["SUPPLY", b.integer(10, 15)]]);
  const children = new Map<string, number>();
  for (let k = 1; k <= edges; k++) {
    const parent = b.pick(ids);
    const parentBore = bores.get(parent) as number;
    const bore = Math.max(1, parentBore - b.integer(0, 2));
    const id = b.junction(`T${k}`);
    ids.push(id);
    bores.set(id, bore);
    children.set(parent, (children.get(parent) ?? 0) + 1);
    b.pipe(parent, id, b.logUniform(2, 150), BORES[bore] as number);
  }
  // Leaves take gas at 1 to 12 m/s in their own bore.
  for (const node of b.nodes) {
    if (node.kind !== "junction" || children.has(node.id)) continue;
    const bore = BORES[bores.get(node.id) as number] as number;
    node.demand = b.demandFor(bore, 0.8 * supplyPressure, b.uniform(1, 12), gas);
  }
}

/** A ring main with laterals and a chord or two; one or two supplies. */
function ring(b: Builder, gas: string, edges: number): void {
  const size = b.integer(4, Math.max(4, Math.min(12, Math.floor(edges / 2))));
  const main = b.bore(9, 14);
  const supplyPressure = b.uniform(4e5, 10e5);
  const ringNodes: string[] = [];
  for (let k = 0; k < size; k++) ringNodes.push(b.junction(`R${k}`));
  for (let k = 0; k < size; k++) {
    b.pipe(ringNodes[k] as string, ringNodes[(k + 1) % size] as string, b.uniform(10, 200), main);
  }
  const supplies = b.integer(1, 2);
  for (let s = 0; s < supplies; s++) {
    const id = b.reservoir(`S${s}`, supplyPressure * b.uniform(0.97, 1.03));
    b.pipe(id, b.pick(ringNodes), b.uniform(5, 30), main, { minorLoss: 1.5 });
  }
  if (b.chance(0.5)) b.pipe(ringNodes[0] as string, b.pick(ringNodes.slice(2)), 80, main);
  let k = 0;
  while (b.edges.length < edges) {
    const bore = b.bore(2, 8);
    const id = b.junction(
      `L${k++}`,
      b.demandFor(bore, 0.8 * supplyPressure, b.uniform(1, 15), gas),
    );
    b.pipe(b.pick(ringNodes), id, b.uniform(3, 40), bore);
  }
}

/** A meshed grid with two to four reservoirs at different pressures: some take gas back. */
function grid(b: Builder, gas: string, edges: number): void {
  const columns = b.integer(2, 5);
  const rows = Math.max(2, Math.min(6, Math.floor(edges / (2 * columns))));
  const main = b.bore(8, 13);
  const level = b.uniform(3e5, 9e5);
  const at = (r: number, c: number) => `G${r}_${c}`;
  for (let r = 0; r < rows; r++) {
    for (let c = 0; c < columns; c++) {
      const demand = b.chance(0.4)
        ? b.demandFor(BORES[3] as number, 0.8 * level, b.uniform(1, 10), gas)
        : 0;
      b.junction(at(r, c), demand);
    }
  }
  for (let r = 0; r < rows; r++) {
    for (let c = 0; c < columns; c++) {
      if (c + 1 < columns) b.pipe(at(r, c), at(r, c + 1), b.uniform(10, 120), main);
      if (r + 1 < rows) b.pipe(at(r, c), at(r + 1, c), b.uniform(10, 120), main);
    }
  }
  const reservoirs = b.integer(2, 4);
  for (let s = 0; s < reservoirs; s++) {
    const id = b.reservoir(`S${s}`, level * b.uniform(0.9, 1.1));
    b.pipe(id, at(b.integer(0, rows - 1), b.integer(0, columns - 1)), b.uniform(5, 40), main);
  }
}

/**
 * Reverse flows: a line or loop between a high and a low reservoir, injections larger than the
 * local demand, and a third of the pipes declared against the flow.
 */
function reverse(b: Builder, gas: string, edges: number): void {
  b.flipShare = 0.35;
  const high = b.uniform(4e5, 10e5);
  const low = high * b.uniform(0.5, 0.97);
  const bore = b.bore(6, 12);
  const line: string[] = [b.reservoir("HIGH", high)];
  const count = Math.max(3, Math.floor(edges * 0.6));
  for (let k = 0; k < count; k++) {
    let demand = 0;
    if (b.chance(0.3)) demand = b.demandFor(bore, low, b.uniform(0.5, 4), gas);
    else if (b.chance(0.25)) demand = -b.demandFor(bore, low, b.uniform(0.5, 6), gas);
    line.push(b.junction(`N${k}`, demand));
  }
  line.push(b.reservoir("LOW", low));
  for (let k = 0; k + 1 < line.length; k++) {
    b.pipe(line[k] as string, line[k + 1] as string, b.uniform(5, 150), bore);
  }
  const inner = line.slice(1, -1);
  while (b.edges.length < edges) {
    b.pipe(b.pick(inner), b.pick(line), b.uniform(10, 200), b.bore(3, 10));
    const last = b.edges[b.edges.length - 1] as Pipe;
    if (last.from === last.to) b.edges.pop();
  }
}

/** Supplies and injections from 220 K to 480 K, some isothermal pipes, mixing at junctions. */
function mixedTemperature(b: Builder, gas: string, edges: number): void {
  const pressure = b.uniform(3e5, 10e5);
  const main = b.bore(8, 13);
  const hubs: string[] = [];
  const hubCount = b.integer(3, Math.max(3, Math.floor(edges / 3)));
  for (let k = 0; k < hubCount; k++) hubs.push(b.junction(`H${k}`));
  for (let k = 0; k + 1 < hubCount; k++) {
    b.pipe(hubs[k] as string, hubs[k + 1] as string, b.uniform(10, 100), main, {
      model: b.chance(0.4) ? "isothermal" : "adiabatic",
    });
  }
  const supplies = b.integer(1, 3);
  for (let s = 0; s < supplies; s++) {
    const id = b.reservoir(`S${s}`, pressure * b.uniform(0.95, 1.05), b.uniform(220, 480));
    b.pipe(id, b.pick(hubs), b.uniform(5, 50), main);
  }
  let k = 0;
  while (b.edges.length < edges) {
    const bore = b.bore(2, 8);
    const inject = b.chance(0.35);
    const flow = b.demandFor(bore, 0.8 * pressure, b.uniform(1, 10), gas);
    const id = b.junction(`C${k++}`, inject ? -flow : flow, b.uniform(220, 500));
    b.pipe(b.pick(hubs), id, b.uniform(2, 40), bore, {
      model: b.chance(0.3) ? "isothermal" : "adiabatic",
    });
  }
}

/** Feed pipes loaded to 90 % .. 99.9 % of their capacity behind a small distribution net. */
function nearChoke(b: Builder, gas: string, edges: number, overload: boolean): void {
  const pressure = b.uniform(2e5, 10e5);
  const temperature = b.uniform(280, 320);
  const supply = b.reservoir("SUPPLY", pressure, temperature);
  const feedCount = b.integer(1, Math.max(1, Math.min(4, Math.floor(edges / 5))));
  for (let f = 0; f < feedCount; f++) {
    const boreIndex = b.integer(2, 9);
    const head = b.junction(`F${f}`);
    b.pipe(supply, head, b.uniform(2, 80), BORES[boreIndex] as number);
    const feed = b.edges[b.edges.length - 1] as Pipe;
    // The declared direction may have been flipped; the capacity is the same either way.
    const capacity = capacityOf(gas, feed, pressure, temperature);
    const share = overload ? b.uniform(1.02, 3) : 1 - b.logUniform(1e-3, 0.1);
    // Downstream of the head: short pipes four or more sizes up to a few consumers that share
    // the feed's flow, so that the feed is the bottleneck.
    const consumers = b.integer(1, 3);
    for (let c = 0; c < consumers; c++) {
      const id = b.junction(`F${f}C${c}`, (share * capacity) / consumers);
      b.pipe(head, id, b.uniform(1, 10), b.bore(boreIndex + 4, boreIndex + 6));
    }
  }
  while (b.edges.length < edges) {
    const a = b.pick(b.nodes.filter((node) => node.kind === "junction")).id;
    const c = b.pick(b.nodes).id;
    if (a === c) continue;
    b.pipe(a, c, b.uniform(5, 50), b.bore(0, 3));
  }
}

/** Vents to the atmosphere from a header, and injections through short tailpipes that choke. */
function choke(b: Builder, gas: string, edges: number): void {
  const pressure = b.uniform(3e5, 15e5);
  const main = b.bore(9, 14);
  const atmosphere = b.reservoir("ATM", 101325, 293.15);
  const headers: string[] = [];
  const headerCount = Math.max(2, Math.floor(edges / 3));
  for (let k = 0; k < headerCount; k++) headers.push(b.junction(`H${k}`));
  for (let k = 0; k + 1 < headerCount; k++) {
    b.pipe(headers[k] as string, headers[k + 1] as string, b.uniform(5, 60), main);
  }
  if (b.chance(0.5)) {
    // A supply on one end: the vents discharge it.
    b.pipe(b.reservoir("SUPPLY", pressure), headers[0] as string, b.uniform(5, 30), main);
  }
  // The last header runs to the atmosphere through a big main (a vent header).
  b.pipe(headers[headerCount - 1] as string, atmosphere, b.uniform(10, 60), main);
  let k = 0;
  while (b.edges.length < edges) {
    if (b.chance(0.5)) {
      // A vent: a short small-bore pipe from a header to the atmosphere.
      b.pipe(b.pick(headers), atmosphere, b.uniform(0.3, 3), b.bore(0, 4), { minorLoss: 1 });
    } else {
      // A relief valve's tailpipe: a fixed injection through a short small bore (it may choke).
      const bore = b.bore(1, 5);
      const flow = b.demandFor(bore, pressure, b.uniform(20, 200), gas);
      const id = b.junction(`RV${k++}`, -flow, b.uniform(250, 420));
      b.pipe(id, b.pick(headers), b.uniform(0.5, 5), bore);
    }
  }
}

/**
 * DN 6 next to DN 600: parallel pairs and series changes of bore, 0.5 m to 2 km. Two thirds carry
 * real flows in the big bores with DN 6 taps and bypasses beside them; one third carries only
 * what DN 6 pipes pass, a few grams per second through DN 600 (where the pressure drops of the
 * big pipes fall to the rounding of the pressures: see test/fixtures/hard-networks).
 */
function tinyHuge(b: Builder, gas: string, edges: number): void {
  const pressure = b.uniform(2e5, 12e5);
  const bigFlows = b.chance(2 / 3);
  const chain: string[] = [b.reservoir("SUPPLY", pressure)];
  const steps = Math.max(2, Math.floor(edges / 2));
  for (let k = 0; k < steps; k++) chain.push(b.junction(`N${k}`));
  for (let k = 0; k + 1 < chain.length; k++) {
    const from = chain[k] as string;
    const to = chain[k + 1] as string;
    const tiny = !bigFlows && b.chance(0.5);
    b.pipe(from, to, b.logUniform(0.5, 2000), tiny ? (BORES[0] as number) : b.bore(14, 17));
    if (b.edges.length < edges && b.chance(0.7)) {
      // A parallel pipe of the other extreme between the same two nodes.
      b.pipe(from, to, b.logUniform(0.5, 2000), tiny ? b.bore(15, 17) : (BORES[0] as number));
    }
  }
  const junctions = chain.slice(1);
  while (b.edges.length < edges) {
    const id = b.junction(`D${b.edges.length}`);
    b.pipe(b.pick(junctions), id, b.logUniform(0.5, 50), b.pick([BORES[0], BORES[17]]) as number);
  }
  for (const node of b.nodes) {
    if (node.kind !== "junction" || !b.chance(0.5)) continue;
    // Consumers on the main take 1 to 10 m/s of a DN 300 bore; the rest what a DN 6 tap passes.
    const onMain = bigFlows && chain.includes(node.id);
    node.demand = onMain
      ? b.demandFor(BORES[14] as number, 0.5 * pressure, b.uniform(1, 10) / steps, gas)
      : b.demandFor(BORES[0] as number, 0.5 * pressure, b.uniform(0.5, 5), gas);
  }
  if (b.chance(0.3)) b.reservoir("OUT", 0.6 * pressure);
  const out = b.nodes.find((node) => node.id === "OUT");
  if (out) b.pipe(chain[chain.length - 1] as string, "OUT", b.logUniform(1, 500), b.bore(0, 17));
}

/** The network of one seed. */
export function corpusCase(seed: number): CorpusCase {
  const family = familyOf(seed);
  const b = new Builder(seed * 7919 + 17);
  const gas = b.pick(GASES);
  const slow = family === "overload" || family === "tiny-huge";
  const edges = b.integer(5, family === "overload" ? 12 : family === "tiny-huge" ? 20 : 40);
  switch (family) {
    case "tree":
      tree(b, gas, edges);
      break;
    case "ring":
      ring(b, gas, edges);
      break;
    case "grid":
      grid(b, gas, edges);
      break;
    case "reverse":
      reverse(b, gas, edges);
      break;
    case "mixed-temperature":
      mixedTemperature(b, gas, edges);
      break;
    case "near-choke":
      nearChoke(b, gas, edges, false);
      break;
    case "overload":
      nearChoke(b, gas, edges, true);
      break;
    case "choke":
      choke(b, gas, edges);
      break;
    case "tiny-huge":
      tinyHuge(b, gas, edges);
      break;
  }
  return {
    seed,
    family,
    document: {
      name: `corpus ${family} seed ${seed}`,
      gas: { preset: gas },
      settings: {
        pipeModel: b.chance(0.2) ? "isothermal" : "adiabatic",
        // A generous budget: no network of this size needs a second; a hang ends here.
        timeLimit: 20,
        // Fewer iterations per Newton run for the slow families (see the file comment); no
        // network of the corpus that converges needs more than about 35.
        ...(slow ? { maxIterations: family === "overload" ? 25 : 40 } : {}),
        limits: { maxMach: 2 },
      },
      nodes: b.nodes,
      edges: b.edges,
    },
  };
}

/** `count` networks from consecutive seeds. */
export function corpus(count: number, firstSeed = 1): CorpusCase[] {
  return Array.from({ length: count }, (_, k) => corpusCase(firstSeed + k));
}
