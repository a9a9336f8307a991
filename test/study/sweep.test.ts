/**
 * Sweeps: every row equals an independent solve of its case, cases come in a fixed order, a case
 * that fails is a row that says why, and warm starts lower the Newton iterations.
 */
import { describe, expect, it } from "vitest";
import { generateNetwork } from "../../benchmarks/generate-network.js";
import { solveNetwork } from "../../src/index.js";
import {
  averageIterations,
  type PreparedStudy,
  readStudyDocument,
  type StudyRow,
  studyRows,
} from "../../src/study/index.js";
import { readField, withDemandsScaled, withValue } from "./helpers.js";
import { BRANCH_SI } from "./networks.js";

function prepare(document: object): PreparedStudy {
  const read = readStudyDocument(document);
  if (!read.ok) throw new Error(JSON.stringify(read.issues));
  return read.study;
}

async function rowsOf(study: PreparedStudy, options = {}): Promise<StudyRow[]> {
  const rows: StudyRow[] = [];
  for await (const row of studyRows(study, options)) rows.push(row);
  return rows;
}

const OUTPUTS = [
  "nodes/PAINT/pressure",
  "nodes/TEE/temperature",
  "edges/MAIN/massFlow",
  "edges/B2/mach",
  "edges/B2/velocity",
  "edges/B1/pressureDrop",
];
const SUPPLY = [701325, 801325, 900000];
const SCALES = [0.5, 0.75, 1, 1.25, 1.5];
const DEMANDS = [0, 0, 300 / 3600, 150 / 3600];

/** The network of a case, written out independently of src/study. */
function caseNetwork(supply: number, scale: number): object {
  return withDemandsScaled(withValue(BRANCH_SI, "/nodes/0/pressure", supply), DEMANDS, scale);
}

function sweepDocument(warmStart: boolean) {
  return {
    network: BRANCH_SI,
    warmStart,
    inputs: [
      { name: "supply", path: "/nodes/0/pressure", values: SUPPLY },
      { group: "demands", range: { from: 0.5, to: 1.5, steps: 4 } },
    ],
    outputs: OUTPUTS,
  };
}

describe("a sweep", () => {
  it("runs the grid in order, the last input fastest, with the values in SI", async () => {
    const rows = await rowsOf(prepare(sweepDocument(false)));
    expect(rows.map((row) => row.case)).toEqual(Array.from({ length: 15 }, (_, i) => i + 1));
    expect(rows.map((row) => row.values)).toEqual(
      SUPPLY.flatMap((supply) => SCALES.map((scale) => [supply, scale])),
    );
  });

  it("gives, from cold starts, exactly the numbers of independent single solves", async () => {
    const rows = await rowsOf(prepare(sweepDocument(false)));
    for (const row of rows) {
      const [supply, scale] = row.values as [number, number];
      const alone = solveNetwork(caseNetwork(supply, scale));
      expect(row.status).toBe("converged");
      expect(row.warmStartFrom).toBeUndefined();
      expect(row.iterations).toBe(alone.iterations);
      expect(row.outputs).toEqual(OUTPUTS.map((output) => readField(alone, output)));
    }
  });

  it("gives, from warm starts, the numbers of independent solves to the solver tolerance", async () => {
    const rows = await rowsOf(prepare(sweepDocument(true)));
    for (const row of rows) {
      const [supply, scale] = row.values as [number, number];
      const alone = solveNetwork(caseNetwork(supply, scale));
      // 1e-7 relative: both states meet the scaled residual tolerance 1e-9 from different
      // starts; on these small networks that moves no result by more than 1e-8 of itself.
      OUTPUTS.forEach((output, i) => {
        const expected = readField(alone, output);
        const found = row.outputs?.[i] as number;
        expect(Math.abs(found - expected), `case ${row.case} ${output}`).toBeLessThanOrEqual(
          1e-7 * Math.abs(expected),
        );
      });
    }
    // Each case starts from its nearest solved neighbour: the previous scale, or at the start of
    // a supply pressure the same scale at the previous pressure.
    expect(rows.map((row) => row.warmStartFrom)).toEqual([
      undefined,
      1,
      2,
      3,
      4,
      1,
      6,
      7,
      8,
      9,
      6,
      11,
      12,
      13,
      14,
    ]);
  });

  it("takes the i-th values together with combine zip", async () => {
    const study = prepare({
      network: BRANCH_SI,
      combine: "zip",
      inputs: [
        { path: "/nodes/0/pressure", values: SUPPLY },
        { group: "demands", values: [0.5, 1, 1.5] },
      ],
      outputs: ["nodes/PAINT/pressure"],
    });
    const rows = await rowsOf(study);
    expect(rows.map((row) => row.values)).toEqual([
      [701325, 0.5],
      [801325, 1],
      [900000, 1.5],
    ]);
  });

  it("writes a failed case as a row that says why, and goes on", async () => {
    const study = prepare({
      network: BRANCH_SI,
      inputs: [{ path: "/edges/2/diameter", values: [0.02664, -0.01, 0.004, 0.04089] }],
      outputs: ["nodes/PAINT/pressure"],
    });
    const rows = await rowsOf(study);
    expect(rows.map((row) => row.status)).toEqual([
      "converged",
      "invalid-input",
      expect.stringMatching(/^(no-solution|not-converged)$/),
      "converged",
    ]);
    expect(rows[1]?.message).toBe("edge B2: diameter -0.01 must be greater than 0");
    expect(rows[1]?.outputs).toBeUndefined();
    // 150 kg/h through 35 m of 4 mm bore: even the isentropic choked flow of the bore at the
    // supply state, about 0.0404 p0 A / sqrt(T0) = 0.0404 x 8.0e5 x 1.26e-5 / 17.3 = 0.024
    // kg/s (Fliegner's formula for air in SI units, common practice), is below the 0.042 kg/s
    // asked: no solution (the solver says so when it finds evidence, "not converged" otherwise).
    expect(rows[2]?.message).toMatch(/^(no solution|not converged)/);
    expect(rows[2]?.outputs).toBeUndefined();
    // The last case starts from the first (the nearest converged one): equal to an independent
    // solve to the solver tolerance (see above).
    expect(rows[3]?.warmStartFrom).toBe(1);
    const alone = solveNetwork(withValue(BRANCH_SI, "/edges/2/diameter", 0.04089));
    const expected = readField(alone, "nodes/PAINT/pressure");
    expect(Math.abs((rows[3]?.outputs?.[0] as number) - expected)).toBeLessThan(1e-7 * expected);
  });

  it("needs fewer Newton iterations per case with warm starts on a fine sweep", async () => {
    // A generated 100-edge network with loops, branches and choked vents: on a small ring the
    // first guess (Newton on the p-squared law) is already as close as the previous case, and
    // both start two iterations from the solution.
    const network = generateNetwork({ edges: 100, seed: 3, topology: "mixed" });
    const document = (warmStart: boolean) => ({
      network,
      warmStart,
      inputs: [{ group: "demands", range: { from: 0.8, to: 1.2, steps: 40 } }],
      outputs: ["network/minPressure"],
    });
    const warm = await rowsOf(prepare(document(true)));
    const cold = await rowsOf(prepare(document(false)));
    expect(averageIterations(warm)).toBeLessThan(averageIterations(cold));
    // Each block of 32 cases starts cold: cases 1 and 33.
    expect(warm.filter((row) => row.warmStartFrom === undefined).map((row) => row.case)).toEqual([
      1, 33,
    ]);
  });

  it("runs only its slice of blocks for a shard, with the rows of the whole run", async () => {
    const study = prepare({ ...sweepDocument(true), blockSize: 4 });
    const whole = await rowsOf(study);
    const parts: StudyRow[] = [];
    for (const index of [1, 2, 3]) {
      parts.push(...(await rowsOf(study, { shard: { index, count: 3 } })));
    }
    expect(parts).toEqual(whole);
    // 15 cases in 4 blocks over 3 shards: blocks [0, 1), [1, 2), [2, 4).
    expect((await rowsOf(study, { shard: { index: 3, count: 3 } })).map((row) => row.case)).toEqual(
      [9, 10, 11, 12, 13, 14, 15],
    );
  });

  it("stops between cases when its signal is aborted", async () => {
    const signal = { aborted: false };
    const seen: number[] = [];
    for await (const row of studyRows(prepare(sweepDocument(true)), { signal })) {
      seen.push(row.case);
      if (row.case === 3) signal.aborted = true;
    }
    expect(seen).toEqual([1, 2, 3]);
  });

  it("reads quantity strings in values and ranges against the network's ambient pressure", async () => {
    const study = prepare({
      network: { ...BRANCH_SI, ambient: { pressure: "0.95 bar(a)" } },
      inputs: [
        { path: "/nodes/0/pressure", values: ["6 bar(g)", "100 psia"] },
        { path: "/edges/0/diameter", range: { from: "2 in", to: "4 in", steps: 2 } },
      ],
      outputs: ["nodes/TEE/pressure"],
    });
    // bar = 1e5 Pa (BIPM SI Brochure, Table 8); psi = 6894.757293168 Pa and in = 0.0254 m
    // (NIST SP 811, appendix B): gauge values are added to the ambient 95000 Pa.
    expect(study.inputs[0]?.values).toEqual([695000, expect.closeTo(689475.7293168, 6)]);
    expect(study.inputs[1]?.values.map((value) => value / 0.0254)).toEqual([
      expect.closeTo(2, 12),
      expect.closeTo(3, 12),
      expect.closeTo(4, 12),
    ]);
    const rows = await rowsOf(study);
    expect(rows.every((row) => row.status === "converged")).toBe(true);
  });
});
