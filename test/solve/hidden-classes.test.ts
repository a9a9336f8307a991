// Objects the solver's hot code reads on every solve (the model's document, the sparse
// structure, the network system) must have one hidden class whatever has run before: built by a
// spread or gaining properties later, their class changed once the engine had optimized the
// building code, and the first large solve of a process threw the optimized first guess and
// residual evaluation away ("wrong map" deoptimizations; 10 % of a 10,000-edge cold solve).
// V8's own test hook %HaveSameMap tells, in a child process of the built code (dist/, made by
// `npm ci` through "prepare").
import { spawnSync } from "node:child_process";
import { existsSync } from "node:fs";
import { describe, expect, it } from "vitest";

const root = new URL("../../", import.meta.url);
const built = existsSync(new URL("dist/src/index.js", root));

const probe = `
const root = ${JSON.stringify(root.href)};
const { generateNetwork } = await import(root + "benchmarks/generate-network.js");
const { checkedDocumentOrThrow } = await import(root + "dist/src/input/read-document.js");
const { buildNetwork } = await import(root + "dist/src/model/build-network.js");
const { createNetworkSystem } = await import(root + "dist/src/solve/network-system.js");
const { initialGuess } = await import(root + "dist/src/solve/initial-guess.js");
// A structure gains the working memory of its factorizations on first use: a fresh one must
// already have the class of one that has been used (\`used\`: the last one, after its first guess).
let used;
let structureStable = true;
const make = (seed) => {
  const model = buildNetwork(checkedDocumentOrThrow(generateNetwork({ edges: 60, seed, topology: "mixed" }))).model;
  const system = createNetworkSystem(model);
  if (used !== undefined && !%HaveSameMap(system.structure, used)) structureStable = false;
  initialGuess(system);
  used = system.structure;
  return { document: model.document, system };
};
// The very first object of a literal gets its class by transitions, every later one the class
// the engine then settles on: compare the second solve's with the fortieth's.
make(1);
const first = make(2);
let last = first;
for (let seed = 3; seed <= 40; seed++) last = make(seed);
console.log(JSON.stringify({
  document: %HaveSameMap(first.document, last.document),
  structure: structureStable,
  system: %HaveSameMap(first.system, last.system),
}));
`;

describe("hidden classes of the solver's objects", () => {
  it.skipIf(!built)("stay the same from the second solve of a process to the fortieth", () => {
    const run = spawnSync(
      process.execPath,
      ["--allow-natives-syntax", "--input-type=module", "--eval", probe],
      { encoding: "utf8" },
    );
    expect(run.stderr).toBe("");
    expect(JSON.parse(run.stdout)).toEqual({ document: true, structure: true, system: true });
  });
});
