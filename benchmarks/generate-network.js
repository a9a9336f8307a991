// Seeded generator of invented test networks for benchmarks and the large-network tests.
//
// A network of about `edges` pipes: a meshed core (a grid of mains with many loops), branched
// headers (trees of several levels with consumers at their leaves) hanging off the core, several
// supply reservoirs (compressor stations) tied into the core, and a few vents: short small-bore
// pipes from the core to atmosphere that run choked. Sizes fall from DN 200 mains to DN 25 drops.
// Everything is drawn from a seeded generator, so a (edges, seed, topology) triple always gives
// the same document.

/** mulberry32: a small, fast, seeded generator of uniform numbers in [0, 1). */
function random(seed) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Inside diameters [m] of ASME B36.10M Sch 40 pipe, DN 25 to DN 200 (PRACTICE.md section 6). */
const SCH40 = [0.02664, 0.05248, 0.07792, 0.10226, 0.15408, 0.20274];

/**
 * @param {{ edges: number, seed?: number, topology?: "mixed" | "tree" | "grid" }} options
 * @returns {object} a network document (schemas/network.schema.json)
 */
export function generateNetwork({ edges, seed = 1, topology = "mixed" }) {
  const rand = random(seed);
  const pick = (list) => list[Math.floor(rand() * list.length)];
  const nodes = [];
  const pipes = [];
  let edgeCount = 0;
  const addNode = (node) => {
    nodes.push(node);
    return node.id;
  };
  const addPipe = (from, to, length, diameter, extra = {}) => {
    edgeCount++;
    pipes.push({
      id: `P${edgeCount}`,
      kind: "pipe",
      from,
      to,
      length: Math.round(length * 10) / 10,
      diameter,
      roughness: 5e-5,
      ...extra,
    });
  };

  const target = Math.max(edges, 8);
  const gridShare = topology === "tree" ? 0 : topology === "grid" ? 0.95 : 0.35;
  const ventCount = Math.max(1, Math.floor(target / 2500));
  const stationCount = Math.max(2, Math.floor(target / 4000));

  // Meshed core: rows x columns junctions, about 2 rows*columns edges.
  const gridEdges = Math.max(4, Math.floor(target * gridShare));
  const side = Math.max(2, Math.round(Math.sqrt(gridEdges / 2)));
  const rows = side;
  const columns = Math.max(2, Math.round(gridEdges / (2 * side)));
  const core = [];
  for (let r = 0; r < rows; r++) {
    for (let c = 0; c < columns; c++) core.push(addNode({ id: `G${r}_${c}`, kind: "junction" }));
  }
  const mainDiameter = target > 2000 ? SCH40[5] : SCH40[4];
  for (let r = 0; r < rows; r++) {
    for (let c = 0; c < columns; c++) {
      const here = core[r * columns + c];
      if (c + 1 < columns) addPipe(here, core[r * columns + c + 1], 20 + 60 * rand(), mainDiameter);
      if (r + 1 < rows) addPipe(here, core[(r + 1) * columns + c], 20 + 60 * rand(), mainDiameter);
    }
  }

  // Supply stations tied into the core, spread over it.
  for (let s = 0; s < stationCount; s++) {
    const id = addNode({
      id: `S${s}`,
      kind: "reservoir",
      pressure: 8.0e5 + 2e4 * rand(),
      temperature: 300 + 15 * rand(),
    });
    const at = core[Math.floor(((s + 0.5) / stationCount) * core.length)];
    addPipe(id, at, 10 + 10 * rand(), SCH40[5], { minorLoss: 1.5 });
  }

  // Vents: short DN 15 tails from the core to atmosphere, choked at 8 bar(a).
  const atmosphere = addNode({
    id: "ATM",
    kind: "reservoir",
    pressure: 101325,
    temperature: 293.15,
  });
  for (let v = 0; v < ventCount; v++) {
    addPipe(pick(core), atmosphere, 1 + rand(), 0.0158, { minorLoss: 1 });
  }

  // Branched headers off the core until the edge count is reached; consumers at the leaves.
  let header = 0;
  while (edgeCount < target) {
    let parent = pick(core);
    let level = 0;
    header++;
    const branchLength = 2 + Math.floor(rand() * 6);
    for (let step = 0; step < branchLength && edgeCount < target; step++) {
      const id = addNode({ id: `H${header}_${step}`, kind: "junction" });
      const diameter = SCH40[Math.max(0, 3 - Math.floor(level / 2))];
      addPipe(parent, id, 5 + 40 * rand(), diameter);
      // Side drops to consumers.
      const drops = Math.floor(rand() * 3);
      for (let k = 0; k < drops && edgeCount < target; k++) {
        const consumer = addNode({
          id: `C${header}_${step}_${k}`,
          kind: "junction",
          demand: Math.round((0.002 + 0.01 * rand()) * 1e6) / 1e6,
        });
        addPipe(id, consumer, 3 + 12 * rand(), SCH40[0]);
      }
      parent = id;
      level++;
    }
    // The branch end is a consumer too.
    const end = nodes[nodes.length - 1];
    if (end.kind === "junction" && end.demand === undefined) end.demand = 0.004;
  }

  return {
    name: `generated ${topology} network, ${edgeCount} edges, seed ${seed}`,
    gas: { preset: "air" },
    ambient: { pressure: 101325, temperature: 293.15 },
    settings: { limits: { maxMach: 2 } },
    nodes,
    edges: pipes,
  };
}
