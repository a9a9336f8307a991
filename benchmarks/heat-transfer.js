// Heat-transfer pipe benchmark: the same generated networks solved with every pipe adiabatic
// (closed-form Fanno) and with every pipe on the heat-transfer model (integrated along the pipe,
// with heat exchange to winter air), printing the slowdown factor and the integration counts.
//
//   npm run bench:heat
//
// Kept apart from benchmarks/run.js so that the two can change independently. Timing lives here,
// never in tests; on a shared machine take the minimum of several runs.
import { generateNetwork } from "./generate-network.js";

const { solveNetwork } = await import("../dist/src/index.js");
const { readNetworkDocument } = await import("../dist/src/input/read-document.js");
const { buildNetwork } = await import("../dist/src/model/build-network.js");
const { createNetworkSystem, evaluateSystem, pressureUnknown } = await import(
  "../dist/src/solve/network-system.js"
);

/** The document with every pipe on the heat-transfer model, losing heat to -10 degC air. */
function withHeatTransfer(document) {
  const copy = structuredClone(document);
  copy.ambient = { ...(copy.ambient ?? {}), temperature: "-10 degC" };
  copy.settings = { ...(copy.settings ?? {}), pipeModel: "heat-transfer" };
  for (const edge of copy.edges) {
    if (edge.kind === "pipe") {
      delete edge.model;
      edge.heatTransferCoefficient = "5 W/(m2 K)";
    }
  }
  return copy;
}

function minimumSolveMs(document, repeats) {
  let best = Number.POSITIVE_INFINITY;
  let result;
  for (let k = 0; k < repeats; k++) {
    const started = performance.now();
    result = solveNetwork(document);
    best = Math.min(best, performance.now() - started);
  }
  return { best, result };
}

/** Integration counts of one residual evaluation at the solution. */
function integrationCounts(document, result) {
  const read = readNetworkDocument(document);
  const built = buildNetwork(read.document);
  const system = createNetworkSystem(built.model);
  const x = new Float64Array(2 * system.junctionCount);
  const byId = new Map(result.nodes.map((node) => [node.id, node]));
  for (let j = 0; j < system.junctionCount; j++) {
    const node = byId.get(read.document.nodes[built.model.junctionNodes[j]].id);
    x[2 * j] = pressureUnknown(system, j, node.pressure);
    x[2 * j + 1] = node.temperature / system.temperatureScale;
  }
  evaluateSystem(system, x, false); // cold: from no warm start
  // Every edge is evaluated into the system's one record, which holds the integration counts.
  const counts = () => {
    const scratch = system.edgeEvaluation.heatTransfer;
    return { runs: scratch?.runs ?? 0, steps: scratch?.acceptedSteps ?? 0 };
  };
  const before = counts();
  evaluateSystem(system, x, false); // warm: as in later Newton iterations
  const after = counts();
  const pipes = system.elements.filter(
    (element) => element.kind === "pipe" && element.model === "heat-transfer",
  ).length;
  const runs = after.runs - before.runs;
  const steps = after.steps - before.steps;
  return { runsPerPipe: runs / pipes, stepsPerRun: steps / runs };
}

// Warm the engine (JIT, schema compilation) on another network first.
solveNetwork(withHeatTransfer(generateNetwork({ edges: 50, seed: 99, topology: "mixed" })));
console.log(
  "edges topology  adiabatic ms  heat-transfer ms  slowdown  iterations (a/h)  runs/pipe  steps/run",
);
for (const edges of [30, 300, 1000]) {
  for (const topology of ["tree", "mixed"]) {
    const adiabatic = generateNetwork({ edges, seed: 1, topology });
    const heated = withHeatTransfer(adiabatic);
    const repeats = edges <= 300 ? 3 : 1;
    const a = minimumSolveMs(adiabatic, repeats);
    const h = minimumSolveMs(heated, repeats);
    const counts = integrationCounts(heated, h.result);
    console.log(
      [
        String(edges).padStart(5),
        topology.padEnd(8),
        a.best.toFixed(0).padStart(13),
        h.best.toFixed(0).padStart(17),
        (h.best / a.best).toFixed(1).padStart(9),
        `${a.result.iterations}/${h.result.iterations} ${h.result.status}`.padStart(17),
        counts.runsPerPipe.toFixed(1).padStart(10),
        counts.stepsPerRun.toFixed(1).padStart(10),
      ].join(" "),
    );
  }
}
console.log(
  "\nruns/pipe: integrations per pipe in one warm residual evaluation; steps/run: accepted steps per integration in it",
);
