// Solve-time benchmark: generated networks (benchmarks/generate-network.js) at growing sizes,
// each solved cold in a fresh child process (so that its peak memory is its own), printed as a
// table and written as JSON to benchmarks/results/ so that runs can be compared.
//
//   npm run bench                 sizes 10 .. 10,000
//   npm run bench -- --large      adds 100,000
//
// Run after `npm run build` (npm run bench does that). Timing lives here, never in tests.
import { execFileSync } from "node:child_process";
import { mkdirSync, writeFileSync } from "node:fs";
import os from "node:os";
import { fileURLToPath } from "node:url";

const here = fileURLToPath(new URL(".", import.meta.url));

if (process.argv[2] === "--child") {
  await child(Number(process.argv[3]), process.argv[4], Number(process.argv[5]));
} else {
  await parent();
}

async function parent() {
  const sizes = [10, 100, 1000, 10000];
  if (process.argv.includes("--large")) sizes.push(100000);
  const topologies = ["tree", "mixed", "grid"];
  const rows = [];
  for (const edges of sizes) {
    for (const topology of topologies) {
      const output = execFileSync(
        process.execPath,
        [
          "--max-old-space-size=4096",
          fileURLToPath(import.meta.url),
          "--child",
          String(edges),
          topology,
          "1",
        ],
        { encoding: "utf8", maxBuffer: 1 << 24 },
      );
      const row = JSON.parse(output.trim().split("\n").pop());
      rows.push(row);
      console.log(
        [
          String(row.edges).padStart(7),
          row.topology.padEnd(6),
          String(row.nodes).padStart(7),
          String(row.loops).padStart(6),
          row.status.padEnd(10),
          String(row.iterations).padStart(4),
          row.solveMs.toFixed(0).padStart(8),
          row.msPer1000Edges.toFixed(1).padStart(9),
          row.peakMb.toFixed(0).padStart(7),
          row.evaluationRatio.toFixed(1).padStart(7),
        ].join(" "),
      );
    }
  }
  const machine = `${os.cpus()[0]?.model ?? "cpu"} x${os.cpus().length}, ${(os.totalmem() / 2 ** 30).toFixed(0)} GiB, node ${process.version}`;
  mkdirSync(new URL("./results/", import.meta.url), { recursive: true });
  const stamp = new Date().toISOString().replace(/[:.]/g, "-");
  const file = new URL(`./results/solve-${stamp}.json`, import.meta.url);
  writeFileSync(file, `${JSON.stringify({ machine, rows }, null, 2)}\n`);
  console.log(`\ncolumns: edges, topology, nodes, loops, status, Newton iterations,`);
  console.log(
    `solve ms (cold, whole solveNetwork), ms per 1000 edges, peak RSS MB, solve time / one residual evaluation`,
  );
  console.log(`machine: ${machine}\nwritten ${fileURLToPath(file)}`);
  void here;
}

async function child(edges, topology, seed) {
  const { generateNetwork } = await import("./generate-network.js");
  const { solveNetwork } = await import("../dist/src/index.js");
  const { readNetworkDocument } = await import("../dist/src/input/read-document.js");
  const { buildNetwork } = await import("../dist/src/model/build-network.js");
  const system = await import("../dist/src/solve/network-system.js");
  const document = generateNetwork({ edges, seed, topology });
  // Warm the process (JIT, schema compilation) on another network: "cold" below means a solve
  // from no previous solution, not a cold JavaScript engine.
  solveNetwork(generateNetwork({ edges: 300, seed: seed + 1000, topology: "mixed" }));
  let peak = process.memoryUsage().rss;
  const sampler = setInterval(() => {
    peak = Math.max(peak, process.memoryUsage().rss);
  }, 5);
  const started = performance.now();
  const result = solveNetwork(document);
  const solveMs = performance.now() - started;
  peak = Math.max(peak, process.memoryUsage().rss);
  clearInterval(sampler);
  // One full residual evaluation at the solution, warm (the unit of the cost ratio).
  const read = readNetworkDocument(document);
  const built = buildNetwork(read.document);
  const networkSystem = system.createNetworkSystem(built.model);
  const x = new Float64Array(2 * networkSystem.junctionCount);
  const byId = new Map(result.nodes.map((node) => [node.id, node]));
  for (let j = 0; j < networkSystem.junctionCount; j++) {
    const node = byId.get(read.document.nodes[built.model.junctionNodes[j]].id);
    x[2 * j] = node.pressure / networkSystem.pressureScale;
    x[2 * j + 1] = node.temperature / networkSystem.temperatureScale;
  }
  system.evaluateSystem(networkSystem, x, false);
  const evaluationStart = performance.now();
  const repeats = 3;
  for (let k = 0; k < repeats; k++) system.evaluateSystem(networkSystem, x, false);
  const evaluationMs = (performance.now() - evaluationStart) / repeats;
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
      evaluationRatio: solveMs / evaluationMs,
    }),
  );
}
