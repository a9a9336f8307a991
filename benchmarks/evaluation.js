// Cost of one residual evaluation of the network, per edge: the unit that a Newton solve spends
// (each iteration evaluates the residuals and the Jacobian at least once). Generated networks
// (benchmarks/generate-network.js, seed 1) of 10,000 edges by default, each topology:
//
//   npm run bench:evaluation
//   node benchmarks/evaluation.js --edges 100000 --topologies mixed
//
// Per topology, microseconds per edge of
//   cold      the first evaluation of a fresh system at the solution (no warm starts yet),
//   newton    evaluations with the Jacobian that alternate between the solution and a state whose
//             junction pressures are moved by up to 1e-4 of themselves (as late Newton iterations
//             and line-search trials move them): warm starts from a nearby state,
//   warm      evaluations at the same state again (warm starts already at their roots),
// and the solve time over one `newton` evaluation. Each figure is the minimum of several runs,
// in process CPU time (user + system, all threads: garbage collection included), which a shared
// machine disturbs far less than wall-clock time. Run after `npm run build`. Timing lives here, never in tests.
import { generateNetwork } from "./generate-network.js";

const { solveNetwork } = await import("../dist/src/index.js");
const { readNetworkDocument } = await import("../dist/src/input/read-document.js");
const { buildNetwork } = await import("../dist/src/model/build-network.js");
const { createNetworkSystem, evaluateSystem, pressureUnknown } = await import(
  "../dist/src/solve/network-system.js"
);

function option(name, fallback) {
  const at = process.argv.indexOf(name);
  return at >= 0 ? process.argv[at + 1] : fallback;
}

const edges = Number(option("--edges", "10000"));
const topologies = option("--topologies", "tree,mixed,grid").split(",");
const repeats = Number(option("--repeats", "5"));

/** Scaled unknowns of a result, as the solver holds them. */
function stateOf(system, document, model, result) {
  const x = new Float64Array(2 * system.junctionCount);
  const byId = new Map(result.nodes.map((node) => [node.id, node]));
  for (let j = 0; j < system.junctionCount; j++) {
    const node = byId.get(document.nodes[model.junctionNodes[j]].id);
    x[2 * j] = pressureUnknown(system, j, node.pressure);
    x[2 * j + 1] = node.temperature / system.temperatureScale;
  }
  return x;
}

/** The state with every junction pressure moved by a deterministic fraction up to 1e-4. */
function nearby(x) {
  const moved = Float64Array.from(x);
  for (let j = 0; 2 * j < x.length; j++) {
    const fraction = 1e-4 * Math.sin(12.9898 * (j + 1));
    moved[2 * j] = (1 + x[2 * j]) * (1 + fraction) - 1;
  }
  return moved;
}

/** Process CPU time [ms] since `since` (a process.cpuUsage() reading). */
function cpuMs(since) {
  const used = process.cpuUsage(since);
  return (used.user + used.system) / 1000;
}

function minimumMs(repeatCount, run) {
  let best = Number.POSITIVE_INFINITY;
  for (let k = 0; k < repeatCount; k++) {
    const started = process.cpuUsage();
    run();
    best = Math.min(best, cpuMs(started));
  }
  return best;
}

// Warm the process (JIT, schema compilation) on another network.
solveNetwork(generateNetwork({ edges: 300, seed: 1001, topology: "mixed" }));

console.log(`${edges} edges, us per edge evaluation (minimum of ${repeats} runs)`);
console.log(
  [
    "topology".padEnd(8),
    "cold".padStart(7),
    "newton".padStart(7),
    "warm".padStart(7),
    "solve ms".padStart(9),
    "solve/newton".padStart(13),
  ].join(" "),
);
for (const topology of topologies) {
  const document = generateNetwork({ edges, seed: 1, topology });
  const solveMs = minimumMs(Math.min(repeats, 3), () => solveNetwork(document));
  const result = solveNetwork(document);
  const read = readNetworkDocument(document);
  const built = buildNetwork(read.document);
  const edgeCount = read.document.edges.length;
  const x = stateOf(createNetworkSystem(built.model), read.document, built.model, result);
  const moved = nearby(x);
  // A fresh system each run, so that its evaluation starts from no warm start (the system is
  // built before the clock starts).
  let coldBest = Number.POSITIVE_INFINITY;
  for (let k = 0; k < repeats; k++) {
    const system = createNetworkSystem(built.model);
    const started = process.cpuUsage();
    evaluateSystem(system, x, false);
    coldBest = Math.min(coldBest, cpuMs(started));
  }
  const system = createNetworkSystem(built.model);
  evaluateSystem(system, x, true);
  let flip = false;
  const newton = minimumMs(repeats * 4, () => {
    flip = !flip;
    evaluateSystem(system, flip ? moved : x, true);
  });
  evaluateSystem(system, x, true);
  const warm = minimumMs(repeats * 4, () => evaluateSystem(system, x, true));
  const perEdge = (ms) => ((1000 * ms) / edgeCount).toFixed(2).padStart(7);
  console.log(
    [
      topology.padEnd(8),
      perEdge(coldBest),
      perEdge(newton),
      perEdge(warm),
      solveMs.toFixed(0).padStart(9),
      (solveMs / newton).toFixed(1).padStart(13),
    ].join(" "),
  );
}
