// Study benchmark: a 1,000-case sweep of the workshop ring main (docs/examples), 10 supply
// pressures x 100 demand scales. Measures cases per second in one thread and on worker threads
// (one per core, the study's own piscina worker from dist/), and the average Newton iterations
// per case with warm starts (continuation from the nearest solved case) and without. Prints a
// table and writes JSON to benchmarks/results/ so that runs can be compared.
//
//   npm run build && node benchmarks/study-sweep.js [cases-per-axis-2]
//
// Timing lives here, never in tests.
import { mkdirSync, readFileSync, writeFileSync } from "node:fs";
import os from "node:os";
import { fileURLToPath } from "node:url";
import { Piscina } from "piscina";
import { blockCount, caseCount } from "../dist/src/study/cases.js";
import { readStudyDocument } from "../dist/src/study/read-study.js";
import { averageIterations, solveStudyBlock } from "../dist/src/study/run-study.js";

const scales = Number(process.argv[2] ?? 100);
const network = JSON.parse(
  readFileSync(new URL("../docs/examples/workshop-ring-main.json", import.meta.url), "utf8"),
);

function prepare(warmStart) {
  const read = readStudyDocument({
    network,
    warmStart,
    inputs: [
      {
        name: "supply",
        path: "/nodes/R-101/pressure",
        range: { from: "6.5 bar(g)", to: "8 bar(g)", steps: 9 },
      },
      { group: "demands", range: { from: 0.5, to: 1.5, steps: scales - 1 } },
    ],
    outputs: ["network/minPressure", "edges/FEED/velocity", "nodes/CNC-BAY/pressure"],
  });
  if (!read.ok) throw new Error(JSON.stringify(read.issues));
  return read.study;
}

function serial(study) {
  const started = performance.now();
  const rows = [];
  for (let block = 0; block < blockCount(study); block++)
    rows.push(...solveStudyBlock(study, block));
  const seconds = (performance.now() - started) / 1000;
  return { rows, seconds };
}

async function pooled(study, threads) {
  const filename = fileURLToPath(new URL("../dist/src/cli/study-worker.js", import.meta.url));
  const started = performance.now();
  const pool = new Piscina({
    filename,
    workerData: { study },
    minThreads: threads,
    maxThreads: threads,
  });
  const blocks = Array.from({ length: blockCount(study) }, (_, i) => i);
  const firstRound = await Promise.all(blocks.map((block) => pool.run(block)));
  const withStart = (performance.now() - started) / 1000;
  // Again on the warm pool: the rate once every thread has loaded machnet.
  const again = performance.now();
  await Promise.all(blocks.map((block) => pool.run(block)));
  const steady = (performance.now() - again) / 1000;
  await pool.destroy();
  return { rows: firstRound.flat(), withStart, steady };
}

const warmStudy = prepare(true);
const coldStudy = prepare(false);
const cases = caseCount(warmStudy);
const threads = os.availableParallelism();

serial(prepare(true)); // warm up the JIT in this thread
const warm = serial(warmStudy);
const cold = serial(coldStudy);
const pool = await pooled(warmStudy, threads);
const identical = JSON.stringify(pool.rows) === JSON.stringify(warm.rows);

const result = {
  machine: `${os.cpus()[0]?.model ?? "cpu"} x${os.cpus().length}, node ${process.version}`,
  network: "docs/examples/workshop-ring-main.json",
  cases,
  blocks: blockCount(warmStudy),
  oneThread: {
    casesPerSecond: cases / warm.seconds,
    averageIterations: averageIterations(warm.rows),
  },
  oneThreadColdStarts: {
    casesPerSecond: cases / cold.seconds,
    averageIterations: averageIterations(cold.rows),
  },
  allCores: {
    threads,
    casesPerSecondIncludingStart: cases / pool.withStart,
    casesPerSecondWarmPool: cases / pool.steady,
    rowsIdenticalToOneThread: identical,
  },
};

const line = (label, value) => console.log(`${label.padEnd(52)} ${value}`);
console.log(`study sweep: ${cases} cases (${result.blocks} blocks) of ${result.network}\n`);
line("1 thread, warm starts: cases/s", result.oneThread.casesPerSecond.toFixed(0));
line(
  "1 thread, warm starts: Newton iterations per case",
  result.oneThread.averageIterations.toFixed(2),
);
line("1 thread, cold starts: cases/s", result.oneThreadColdStarts.casesPerSecond.toFixed(0));
line(
  "1 thread, cold starts: Newton iterations per case",
  result.oneThreadColdStarts.averageIterations.toFixed(2),
);
line(
  `${threads} worker threads, pool start included: cases/s`,
  result.allCores.casesPerSecondIncludingStart.toFixed(0),
);
line(
  `${threads} worker threads, warm pool: cases/s`,
  result.allCores.casesPerSecondWarmPool.toFixed(0),
);
line("rows on worker threads identical to one thread", String(identical));
mkdirSync(new URL("./results/", import.meta.url), { recursive: true });
const stamp = new Date().toISOString().replace(/[:.]/g, "-");
const file = new URL(`./results/study-sweep-${stamp}.json`, import.meta.url);
writeFileSync(file, `${JSON.stringify(result, null, 2)}\n`);
console.log(`\nmachine: ${result.machine}\nwritten ${fileURLToPath(file)}`);
if (!identical) process.exitCode = 1;
