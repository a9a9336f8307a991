// Solve-time benchmark: generated networks (benchmarks/generate-network.js) at growing sizes,
// each solved cold in a fresh child process (so that its peak memory is its own), printed as a
// table and written as JSON to benchmarks/results/ so that runs can be compared.
//
//   npm run bench                 sizes 10 .. 10,000
//   npm run bench -- --large      adds 100,000
//   npm run bench -- --sizes 1000,10000 --topologies mixed
//   npm run bench -- --repeat 5   each measurement in 5 processes (default 3), median shown
//
// Per size and topology: Newton iterations, cold solve time (the whole solveNetwork: reading,
// model, structure, first guess, Newton, results and their independent check), ms per 1,000
// edges, peak resident memory, the solve time over one full residual evaluation, and the speed
// ratio against a generic approach on the same network: Newton with a dense finite-difference
// Jacobian (one residual evaluation per unknown) and the dense LU of ml-matrix, run up to the
// size where it still finishes within GENERIC_LIMIT_MS. At 10,000 edges also a warm start: the
// same network re-solved from its solution after every demand grew by 1 %, in three ways, each
// in a process of its own (warmChild).
//
// This machine's timings vary by up to 45 % from one process to the next, so every measurement is
// taken in REPEATS processes of its own and the median is shown, with the range in the JSON
// (`solveMsRuns`); the generic approach runs once.
//
// Run after `npm run build` (npm run bench does that). Timing lives here, never in tests.
import { execFileSync } from "node:child_process";
import { mkdirSync, writeFileSync } from "node:fs";
import os from "node:os";
import { fileURLToPath } from "node:url";

/** A generic run is stopped once it has taken this long (ms). */
const GENERIC_LIMIT_MS = 60_000;
/** Largest size at which the generic approach is tried at all. */
const GENERIC_MAX_EDGES = 1000;
/** The size at which the warm start is measured. */
const WARM_START_EDGES = 10_000;

/** Processes per measurement, unless --repeat says otherwise (the median is reported). */
const DEFAULT_REPEATS = 3;

/** The ways a warm start is measured, each in a process of its own (see warmChild). */
const WARM_VARIANTS = ["plain", "reuse", "study"];

if (process.argv[2] === "--child") {
  await child(
    Number(process.argv[3]),
    process.argv[4],
    Number(process.argv[5]),
    !process.argv.includes("--no-generic"),
  );
} else if (process.argv[2] === "--warm-child") {
  await warmChild(
    Number(process.argv[3]),
    process.argv[4],
    Number(process.argv[5]),
    process.argv[6],
  );
} else {
  await parent();
}

function option(name) {
  const at = process.argv.indexOf(name);
  return at >= 0 ? process.argv[at + 1] : undefined;
}

async function parent() {
  let sizes = [10, 100, 1000, 10000];
  if (process.argv.includes("--large")) sizes.push(100000);
  if (option("--sizes")) sizes = option("--sizes").split(",").map(Number);
  const topologies = (option("--topologies") ?? "tree,mixed,grid").split(",");
  const repeats = Math.max(1, Number(option("--repeat") ?? DEFAULT_REPEATS));
  const rows = [];
  const header = [
    "edges".padStart(7),
    "topology".padEnd(8),
    "nodes".padStart(7),
    "loops".padStart(6),
    "status".padEnd(10),
    "iter".padStart(4),
    "solve ms".padStart(9),
    "ms/1000e".padStart(9),
    "peak MB".padStart(8),
    "t/eval".padStart(7),
    "generic ms".padStart(11),
    "speed-up".padStart(9),
  ].join(" ");
  console.log(header);
  for (const edges of sizes) {
    for (const topology of topologies) {
      const runs = [childResult("--child", edges, topology)];
      for (let k = 1; k < repeats; k++) {
        runs.push(childResult("--child", edges, topology, "--no-generic"));
      }
      const row = medianRow(runs);
      rows.push(row);
      console.log(formatRow(row));
      if (edges === WARM_START_EDGES) {
        row.warmStart = {};
        for (const variant of WARM_VARIANTS) {
          const warmRuns = [];
          for (let k = 0; k < repeats; k++) {
            warmRuns.push(childResult("--warm-child", edges, topology, variant));
          }
          // The run of median share of its own cold solve, with every run's share beside it.
          const share = (warm) => warm.solveMs / warm.coldMs;
          const sorted = [...warmRuns].sort((a, b) => share(a) - share(b));
          row.warmStart[variant] = {
            ...sorted[Math.floor((sorted.length - 1) / 2)],
            shareRuns: warmRuns.map(share),
          };
        }
        console.log(
          "        warm start after +1 % on every demand (ms, iterations, share of the cold solve in the same process): " +
            WARM_VARIANTS.map((variant) => {
              const warm = row.warmStart[variant];
              return `${variant} ${warm.solveMs.toFixed(0)}, ${warm.iterations}, ${(warm.solveMs / warm.coldMs).toFixed(2)}`;
            }).join("; "),
        );
      }
    }
  }
  const machine = machineDescription();
  const growth = growthExponents(rows);
  mkdirSync(new URL("./results/", import.meta.url), { recursive: true });
  const stamp = new Date().toISOString().replace(/[:.]/g, "-");
  const file = new URL(`./results/solve-${stamp}.json`, import.meta.url);
  const loadAverage = os.loadavg();
  writeFileSync(
    file,
    `${JSON.stringify({ machine, loadAverage, repeats, growthExponents: growth, rows }, null, 2)}\n`,
  );
  console.log(`\ngrowth of solve time from 1,000 to 100,000 edges (exponent of n):`);
  for (const [topology, exponent] of Object.entries(growth)) {
    console.log(`  ${topology}: n^${exponent.toFixed(2)}`);
  }
  console.log(
    `\ncolumns: edges, topology, nodes, loops (edges - nodes + 1), status, Newton iterations,`,
  );
  console.log(
    `solve ms (cold, whole solveNetwork; the median of ${repeats} processes), ms per 1000 edges, peak RSS MB (the largest), solve time / one residual evaluation (medians),`,
  );
  console.log(
    `generic approach ms (dense finite-difference Jacobian + ml-matrix LU; "-" not run, ">60000" stopped), its time / ours; "stalled": no decrease of the residual along its Newton step`,
  );
  console.log(
    `machine: ${machine}; load average at the end ${loadAverage.map((v) => v.toFixed(1)).join(" ")}`,
  );
  console.log(`written ${fileURLToPath(file)}`);
}

/** The median of a list of numbers. */
function median(values) {
  const sorted = [...values].sort((a, b) => a - b);
  const middle = Math.floor(sorted.length / 2);
  return sorted.length % 2 === 1 ? sorted[middle] : 0.5 * (sorted[middle - 1] + sorted[middle]);
}

/**
 * One row from the processes of a measurement: the median solve time and residual evaluation,
 * the largest peak memory, the first run's generic approach; the runs' times kept in the JSON.
 */
function medianRow(runs) {
  const solveMs = median(runs.map((run) => run.solveMs));
  const evaluationMs = median(runs.map((run) => run.evaluationMs));
  return {
    ...runs[0],
    iterations: median(runs.map((run) => run.iterations)),
    solveMs,
    solveMsRuns: runs.map((run) => run.solveMs),
    msPer1000Edges: (1000 * solveMs) / runs[0].edges,
    peakMb: Math.max(...runs.map((run) => run.peakMb)),
    evaluationMs,
    evaluationRatio: solveMs / evaluationMs,
  };
}

function formatRow(row) {
  const generic =
    row.generic === undefined
      ? "-"
      : row.generic.finished
        ? row.generic.solveMs.toFixed(0)
        : row.generic.stalled
          ? "stalled"
          : `>${GENERIC_LIMIT_MS}`;
  const speedUp =
    row.generic === undefined || row.generic.stalled
      ? "-"
      : `${row.generic.finished ? "" : ">"}${(row.generic.solveMs / row.solveMs).toFixed(0)}`;
  return [
    String(row.edges).padStart(7),
    row.topology.padEnd(8),
    String(row.nodes).padStart(7),
    String(row.loops).padStart(6),
    row.status.padEnd(10),
    String(row.iterations).padStart(4),
    row.solveMs.toFixed(0).padStart(9),
    row.msPer1000Edges.toFixed(1).padStart(9),
    row.peakMb.toFixed(0).padStart(8),
    row.evaluationRatio.toFixed(1).padStart(7),
    generic.padStart(11),
    speedUp.padStart(9),
  ].join(" ");
}

/** Exponent b of t ~ n^b between the 1,000- and 100,000-edge rows of each topology. */
function growthExponents(rows) {
  const growth = {};
  for (const topology of new Set(rows.map((row) => row.topology))) {
    const small = rows.find((row) => row.topology === topology && row.edges === 1000);
    const large = rows.find((row) => row.topology === topology && row.edges >= 100000);
    if (small && large) {
      growth[topology] =
        Math.log(large.solveMs / small.solveMs) / Math.log(large.edges / small.edges);
    }
  }
  return growth;
}

/** Run this script as a child process (seed 1) and return the JSON of its last line. */
function childResult(mode, edges, topology, ...rest) {
  const output = execFileSync(
    process.execPath,
    [
      "--max-old-space-size=4096",
      fileURLToPath(import.meta.url),
      mode,
      String(edges),
      topology,
      "1",
      ...rest,
    ],
    { encoding: "utf8", maxBuffer: 1 << 24 },
  );
  return JSON.parse(output.trim().split("\n").pop());
}

function machineDescription() {
  const cpus = os.cpus();
  return `${cpus[0]?.model ?? "cpu"}, ${cpus.length} logical cores (os.availableParallelism ${os.availableParallelism()}), ${(os.totalmem() / 2 ** 30).toFixed(0)} GiB, ${os.platform()} ${os.release()}, node ${process.version}`;
}

async function child(edges, topology, seed, withGeneric = true) {
  const { generateNetwork } = await import("./generate-network.js");
  const { solveNetwork } = await import("../dist/src/index.js");
  const { readNetworkDocument } = await import("../dist/src/input/read-document.js");
  const { buildNetwork } = await import("../dist/src/model/build-network.js");
  const system = await import("../dist/src/solve/network-system.js");
  const document = generateNetwork({ edges, seed, topology });
  // Warm the process (JIT) on other networks, as an app or a study that solves many networks
  // is: nine of 2,000 edges, three of each topology with other seeds. "Cold" below means a
  // solve from no previous solution, not a cold JavaScript engine (whose first large solve
  // takes about 1.5 times as long while the engine still compiles).
  warmUp(solveNetwork, generateNetwork, seed);
  const started = performance.now();
  const result = solveNetwork(document);
  const solveMs = performance.now() - started;
  // Peak resident memory of this child process so far (the kernel's high-water mark, in KiB):
  // generating the document, the warm-up and the solve. A timer sampling memoryUsage() would
  // never fire during a solve that does not yield.
  const peak = process.resourceUsage().maxRSS * 1024;

  // One full residual evaluation at the solution, warm (the unit of the cost ratio): every
  // edge's flow relation and the node balances, as Newton's line search needs it.
  const read = readNetworkDocument(document);
  const built = buildNetwork(read.document);
  const networkSystem = system.createNetworkSystem(built.model);
  const x = stateOf(system, networkSystem, result, read.document, built.model);
  system.evaluateSystem(networkSystem, x, false);
  const repeats = 5;
  let evaluationMs = Number.POSITIVE_INFINITY;
  for (let k = 0; k < repeats; k++) {
    const evaluationStart = performance.now();
    system.evaluateSystem(networkSystem, x, false);
    evaluationMs = Math.min(evaluationMs, performance.now() - evaluationStart);
  }

  let generic;
  if (withGeneric && edges <= GENERIC_MAX_EDGES) {
    generic = await genericSolve(system, networkSystem, read.document.settings.tolerance);
  }

  const nodes = document.nodes.length;
  console.log(
    JSON.stringify({
      edges: document.edges.length,
      topology,
      nodes,
      loops: document.edges.length - nodes + 1,
      status: result.status,
      iterations: result.iterations,
      solveMs,
      msPer1000Edges: (1000 * solveMs) / document.edges.length,
      peakMb: peak / 2 ** 20,
      evaluationMs,
      evaluationRatio: solveMs / evaluationMs,
      ...(generic ? { generic } : {}),
    }),
  );
}

/**
 * A warm start, in a process of its own: the network solved cold, then again after every demand
 * grew by 1 %, from the first solution. Each way in its own process, because a full garbage
 * collection that the work before has made due (about 40 ms at 10,000 edges, a fifth of a warm
 * start) falls into whichever solve comes next; the share is of the cold solve in the same
 * process. The ways:
 * - plain: `solveNetwork(changed, { initialResult })`, the document read again;
 * - reuse: the same with the SolveReuse of the cold solve (the sparse analysis, each edge's last
 *   inner solution and, on large meshed networks, the last factors), as an app that solves again
 *   after an edit does;
 * - study: as a study case makes it, on the checked document (SI values, nothing read again)
 *   with the holder the case before left (src/study/run-study.ts).
 */
async function warmChild(edges, topology, seed, variant) {
  const { generateNetwork } = await import("./generate-network.js");
  const { solveNetwork, SolveReuse } = await import("../dist/src/index.js");
  const { readNetworkDocument } = await import("../dist/src/input/read-document.js");
  const { solveCheckedDocument } = await import("../dist/src/solve/solve-network.js");
  const document = generateNetwork({ edges, seed, topology });
  warmUp(solveNetwork, generateNetwork, seed);
  const withDemands = (doc) => ({
    ...doc,
    nodes: doc.nodes.map((node) =>
      typeof node.demand === "number" ? { ...node, demand: node.demand * 1.01 } : node,
    ),
  });
  let coldMs;
  let solveWarm;
  if (variant === "study") {
    const checked = readNetworkDocument(document).document;
    const structureHolder = {};
    const coldStarted = performance.now();
    const before = solveCheckedDocument(checked, { structureHolder });
    coldMs = performance.now() - coldStarted;
    const changed = withDemands(checked);
    solveWarm = () => solveCheckedDocument(changed, { initialResult: before, structureHolder });
  } else {
    const reuse = variant === "reuse" ? new SolveReuse() : undefined;
    const coldStarted = performance.now();
    const before = solveNetwork(document, reuse ? { reuse } : {});
    coldMs = performance.now() - coldStarted;
    const changed = withDemands(document);
    solveWarm = () => solveNetwork(changed, { initialResult: before, ...(reuse ? { reuse } : {}) });
  }
  const started = performance.now();
  const warm = solveWarm();
  const solveMs = performance.now() - started;
  console.log(
    JSON.stringify({ solveMs, coldMs, iterations: warm.iterations, status: warm.status }),
  );
}

/** Warm the engine (JIT) on nine other networks of 2,000 edges, three of each topology. */
function warmUp(solveNetwork, generateNetwork, seed) {
  for (const warmTopology of ["tree", "mixed", "grid"]) {
    for (let k = 0; k < 3; k++) {
      solveNetwork(generateNetwork({ edges: 2000, seed: seed + 1000 + k, topology: warmTopology }));
    }
  }
}

/** Scaled unknowns of a result (2 per junction), as the solver holds them. */
function stateOf(system, networkSystem, result, document, model) {
  const x = new Float64Array(2 * networkSystem.junctionCount);
  const byId = new Map(result.nodes.map((node) => [node.id, node]));
  for (let j = 0; j < networkSystem.junctionCount; j++) {
    const node = byId.get(document.nodes[model.junctionNodes[j]].id);
    x[2 * j] = system.pressureUnknown(networkSystem, j, node.pressure);
    x[2 * j + 1] = node.temperature / networkSystem.temperatureScale;
  }
  return x;
}

/**
 * The generic approach, for comparison: Newton on the same residuals (the same system, the same
 * first guess) with a dense Jacobian by forward differences, one residual evaluation per unknown,
 * and the dense LU of ml-matrix; a backtracking line search on the residual norm. Counted from
 * the first guess on (reading and model building are left to the fast solver's account).
 */
async function genericSolve(system, networkSystem, tolerance) {
  const { Matrix, LuDecomposition } = await import("ml-matrix");
  const { createNetworkSystem, evaluateSystem } = system;
  const { initialGuess } = await import("../dist/src/solve/initial-guess.js");
  const fresh = createNetworkSystem(networkSystem.model);
  const started = performance.now();
  let x = initialGuess(fresh);
  // The first guess starts dead-end branches at exactly zero pressure drop, on the kink of the
  // flow law there, where finite differences do not give a usable Jacobian: the generic run
  // starts 1e-6 (seeded, relative) away from it in each pressure.
  let seed = 12345;
  for (let j = 0; j < x.length; j += 2) {
    seed = (seed * 1103515245 + 12345) % 2 ** 31;
    x[j] += 1e-6 * (seed / 2 ** 31 - 0.5) * (1 + x[j]);
  }
  const size = x.length;
  // Residuals with the mass scale W of the current iterate held fixed within an iteration (as
  // the fast solver's line search does), so that trial norms are comparable.
  let throughput;
  const residualOf = (state) => evaluateSystem(fresh, state, false, throughput).residual;
  const ownScale = (state) => {
    const evaluation = evaluateSystem(fresh, state, false);
    throughput = evaluation.throughput;
    return evaluation.residual;
  };
  // A trial outside the relations' range (the property functions throw) counts as no decrease.
  const residualAtTrial = (state) => {
    try {
      return residualOf(state);
    } catch (error) {
      if (error instanceof RangeError) return [Number.POSITIVE_INFINITY];
      throw error;
    }
  };
  const largest = (r) => r.reduce((m, v) => Math.max(m, Math.abs(v)), 0);
  const normOf = (r) => Math.hypot(...r);
  let residual = ownScale(x);
  let iterations = 0;
  let finished = false;
  let stalled = false;
  // Forward differences leave about sqrt(eps) of relative error in the Jacobian; the loop stops
  // at the solver's tolerance or when it no longer gets closer.
  while (performance.now() - started < GENERIC_LIMIT_MS && iterations < 100) {
    if (largest(residual) <= Math.max(tolerance, 1e-8)) {
      finished = true;
      break;
    }
    iterations++;
    // Forward differences first; where their step finds no decrease (they straddle the kinks of
    // zero flow and of choking that a first guess can start on), central differences once more.
    let accepted = false;
    for (const central of [false, true]) {
      const jacobian = new Matrix(size, size);
      const shifted = Float64Array.from(x);
      for (let column = 0; column < size; column++) {
        const h = 1e-7 * Math.max(1, Math.abs(x[column]));
        shifted[column] = x[column] + h;
        const r = residualOf(shifted);
        if (central) {
          shifted[column] = x[column] - h;
          const l = residualOf(shifted);
          for (let row = 0; row < size; row++)
            jacobian.set(row, column, (r[row] - l[row]) / (2 * h));
        } else {
          for (let row = 0; row < size; row++)
            jacobian.set(row, column, (r[row] - residual[row]) / h);
        }
        shifted[column] = x[column];
        if (performance.now() - started > GENERIC_LIMIT_MS) break;
      }
      if (performance.now() - started > GENERIC_LIMIT_MS) break;
      // A choked edge's flow does not depend on its downstream pressure, which can leave a column
      // of zeros: a diagonal shift of 1e-10 of each row's size keeps the LU defined.
      for (let row = 0; row < size; row++) {
        let rowSize = 0;
        for (let column = 0; column < size; column++)
          rowSize += Math.abs(jacobian.get(row, column));
        jacobian.set(row, row, jacobian.get(row, row) - 1e-10 * (rowSize || 1));
      }
      const step = new LuDecomposition(jacobian)
        .solve(Matrix.columnVector(Array.from(residual, (v) => -v)))
        .getColumn(0);
      let alpha = 1;
      // Pressure unknowns are offsets from a reference, p = p_ref (1 + x): no step may change a
      // pressure by more than half of itself.
      for (let j = 0; j < size; j += 2) {
        const half = 0.5 * (1 + x[j]);
        if (Math.abs(step[j]) > half) alpha = Math.min(alpha, half / Math.abs(step[j]));
        // Nor a temperature by more than 30 % of itself (the fast solver's own limit).
        const limit = 0.3 * x[j + 1];
        if (Math.abs(step[j + 1]) > limit) alpha = Math.min(alpha, limit / Math.abs(step[j + 1]));
      }
      const norm = normOf(residual);
      while (alpha > 1e-6) {
        const trial = x.map((v, i) => v + alpha * step[i]);
        if (normOf(residualAtTrial(trial)) < norm) {
          x = trial;
          residual = ownScale(trial);
          accepted = true;
          break;
        }
        alpha *= 0.5;
      }
      if (accepted) break;
    }
    if (!accepted) {
      stalled = true;
      break;
    }
  }
  return {
    finished,
    stalled,
    solveMs: performance.now() - started,
    iterations,
    finalResidual: largest(residual),
  };
}
