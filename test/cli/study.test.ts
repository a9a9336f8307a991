/**
 * `machnet study` and `machnet merge`, run in memory: the rows in CSV and JSON lines, progress on
 * standard error, shards merged into the bytes of a single run, worker threads giving the bytes
 * of a serial run, design questions, and every problem as a line with the file and JSON path.
 */
import { Writable } from "node:stream";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { completeIo } from "../../src/cli/cli-io.js";
import { studyCommand } from "../../src/cli/study-command.js";
import { readStudyDocument, type StudyRow, studyRows, studyWriter } from "../../src/study/index.js";
import { BRANCH_SI, RING } from "../study/networks.js";
import { lines, runCli } from "./run-cli.js";
import { bundleStudyWorker } from "./study-worker-bundle.js";

const SWEEP = {
  name: "ring: supply pressure and demand",
  network: "ring.json",
  units: "metric",
  blockSize: 4,
  inputs: [
    {
      name: "supply",
      path: "/nodes/REC/pressure",
      values: ["6.5 bar(g)", "7 bar(g)", "7.5 bar(g)"],
    },
    { group: "demands", range: { from: 0.6, to: 1.4, steps: 4 } },
  ],
  outputs: [
    "network/minPressure",
    "edges/FEED/mach",
    "nodes/TOOL/gaugePressure",
    "edges/DROP/choked",
  ],
};

const FILES = {
  "work/ring.json": JSON.stringify(RING),
  "work/sweep.json": JSON.stringify(SWEEP),
  "work/sweep-jsonl.json": JSON.stringify({ ...SWEEP, units: "si" }),
};

let worker: { file: string; remove: () => void } | undefined;

beforeAll(async () => {
  worker = await bundleStudyWorker();
}, 60_000);

afterAll(() => worker?.remove());

describe("machnet study: a sweep", () => {
  it("writes one CSV row per case in case order, as the library writes them", async () => {
    const run = await runCli(
      ["study", "work/sweep.json", "--workers", "1", "-o", "work/out.csv"],
      FILES,
    );
    expect(run.code).toBe(0);
    expect(run.stdout).toBe("");
    const text = run.written.get("work/out.csv") as string;
    const read = readStudyDocument(SWEEP, { network: RING });
    if (!read.ok) throw new Error("the study should read");
    const writer = studyWriter(read.study, "csv");
    const expected: string[] = [writer.header() as string];
    for await (const row of studyRows(read.study)) expected.push(writer.row(row as StudyRow));
    expect(text).toBe(`${expected.join("\n")}\n`);
    expect(lines(text)[0]).toBe(
      "case,supply [bar(a)],demand scale,status,iterations,warm start from,network/minPressure [bar(a)],edges/FEED/mach,nodes/TOOL/gaugePressure [bar(g)],edges/DROP/choked,message",
    );
    expect(lines(text)).toHaveLength(1 + 15);
    // Standard error: a plain progress line per tenth (not a terminal), then the summary.
    const errors = lines(run.stderr);
    expect(errors.at(-1)).toMatch(
      /^study: 15 cases, 15 converged, 0 not \(see the status column\); \d+\.\d\d Newton iterations per case on average \(warm starts\); \d+\.\d s on 1 thread$/,
    );
    expect(errors[0]).toMatch(/^study: \d+\/15 cases \(\d+ %\), \d+\.\d cases\/s, about .* left$/);
  });

  it("writes JSON lines to standard output, and nothing on standard error with --quiet", async () => {
    const run = await runCli(
      ["study", "work/sweep-jsonl.json", "--format", "jsonl", "--workers", "1", "--quiet"],
      FILES,
    );
    expect(run.code).toBe(0);
    expect(run.stderr).toBe("");
    const rows = lines(run.stdout).map((line) => JSON.parse(line));
    expect(rows.map((row) => row.case)).toEqual(Array.from({ length: 15 }, (_, i) => i + 1));
    // SI: 6.5 bar(g) on the default ambient, 6.5e5 + 101325 Pa.
    expect(rows[0].inputs).toEqual({ supply: 751325, "demand scale": 0.6 });
    expect(rows[0].status).toBe("converged");
  });

  it("gives the same bytes on two worker threads as in one thread", async () => {
    const env = { MACHNET_STUDY_WORKER: worker?.file };
    const serial = await runCli(["study", "work/sweep.json", "--workers", "1", "-q"], FILES);
    const parallel = await runCli(["study", "work/sweep.json", "--workers", "2"], FILES, env);
    expect(parallel.code).toBe(0);
    expect(lines(parallel.stderr).at(-1)).toMatch(/ on 2 threads$/);
    expect(parallel.stdout).toBe(serial.stdout);
    const jsonSerial = await runCli(
      ["study", "work/sweep-jsonl.json", "--workers", "1", "-q", "--format", "jsonl"],
      FILES,
    );
    const jsonParallel = await runCli(
      ["study", "work/sweep-jsonl.json", "--workers", "3", "-q", "--format", "jsonl"],
      FILES,
      env,
    );
    expect(jsonParallel.stdout).toBe(jsonSerial.stdout);
  }, 60_000);

  for (const format of ["csv", "jsonl"] as const) {
    it(`merges shards (${format}), given in any order, into the bytes of a single run`, async () => {
      const whole = await runCli(
        ["study", "work/sweep.json", "--workers", "1", "-q", "-o", `work/all.${format}`],
        FILES,
      );
      const files: Record<string, string> = { ...FILES };
      for (const shard of ["1/3", "2/3", "3/3"]) {
        const name = `work/part-${shard[0]}.${format}`;
        const run = await runCli(
          ["study", "work/sweep.json", "--shard", shard, "-q", "-o", name],
          FILES,
          {
            MACHNET_STUDY_WORKER: worker?.file,
          },
        );
        expect(run.code).toBe(0);
        files[name] = run.written.get(name) as string;
      }
      // A shard's output starts with its header line.
      expect(files[`work/part-2.${format}`]).toMatch(
        format === "csv"
          ? /^# machnetShard \{"shard":2,"of":3,/
          : /^\{"machnetShard":\{"shard":2,"of":3,/,
      );
      const merged = await runCli(
        [
          "merge",
          `work/part-3.${format}`,
          `work/part-1.${format}`,
          `work/part-2.${format}`,
          "-o",
          `work/merged.${format}`,
        ],
        files,
      );
      expect(merged.code).toBe(0);
      expect(merged.written.get(`work/merged.${format}`)).toBe(
        whole.written.get(`work/all.${format}`),
      );
    }, 60_000);
  }

  it("draws a progress bar with count, rate and time left on a terminal", async () => {
    let drawn = "";
    const stream = Object.assign(
      new Writable({
        write(chunk, _encoding, done) {
          drawn += String(chunk);
          done();
        },
      }),
      {
        isTTY: true,
        columns: 120,
        cursorTo: () => true,
        clearLine: () => true,
        moveCursor: () => true,
      },
    );
    const io = completeIo({
      stdout: () => {},
      stderr: () => {},
      readFile: async (path) => (FILES as Record<string, string>)[path] ?? "",
      writeFile: async () => {},
    });
    const code = await studyCommand("work/sweep.json", { workers: "1" }, io, {
      stderrIsTTY: true,
      progressStream: stream,
    });
    expect(code).toBe(0);
    expect(drawn).toMatch(/study \|.*\| 15\/15 cases \| \d+(\.\d)? cases\/s \| \S+ left/);
  });
});

describe("machnet study: problems", () => {
  it("lists every problem of the study with its file and JSON path, exit 2", async () => {
    const bad = {
      network: "ring.json",
      inputs: [
        { path: "/nodes/REC/demand", values: [1] },
        { path: "/edges/9/diameter", values: ["2 in"] },
      ],
      outputs: ["edges/FEED/speed"],
    };
    const run = await runCli(["study", "work/bad.json"], {
      ...FILES,
      "work/bad.json": JSON.stringify(bad),
    });
    expect(run.code).toBe(2);
    expect(run.stdout).toBe("");
    expect(lines(run.stderr)).toEqual([
      'work/bad.json: /inputs/0/path: node "REC": a reservoir takes no demand: its flow follows from the network',
      "work/bad.json: /inputs/1/path: the network has 6 edges (indices 0 to 5); there is no edge 9",
      expect.stringMatching(
        /^work\/bad\.json: \/outputs\/0: "edges\/FEED\/speed" names no edge field; fields are massFlow, /,
      ),
    ]);
  });

  it("names the network file in its problems, relative to the study's folder", async () => {
    const brokenRing = {
      ...RING,
      edges: [{ ...RING.edges[0], length: "-3 m" }, ...RING.edges.slice(1)],
    };
    const missing = await runCli(["study", "work/s.json"], {
      "work/s.json": JSON.stringify({ ...SWEEP, network: "nets/none.json" }),
    });
    expect(missing.code).toBe(2);
    expect(missing.stderr).toBe("work/s.json: /network: work/nets/none.json: no such file\n");
    const broken = await runCli(["study", "work/sweep.json"], {
      ...FILES,
      "work/ring.json": JSON.stringify(brokenRing),
    });
    expect(broken.code).toBe(2);
    expect(broken.stderr).toBe(
      'work/ring.json: /edges/0/length: must be greater than 0 (got "-3 m")\n',
    );
  });

  it("refuses bad options with a line that says what is expected", async () => {
    const shard = await runCli(["study", "work/sweep.json", "--shard", "4/3"], FILES);
    expect(shard.code).toBe(2);
    expect(shard.stderr).toBe(
      "--shard 4/3: expected K/N with whole numbers 1 <= K <= N, e.g. --shard 3/8 for the third of eight slices\n",
    );
    const workers = await runCli(["study", "work/sweep.json", "--workers", "0"], FILES);
    expect(workers.stderr).toBe("--workers 0: expected a whole number of threads from 1 to 1024\n");
    const format = await runCli(
      ["study", "work/sweep.json", "--format", "jsonl", "-o", "x.csv"],
      FILES,
    );
    expect(format.stderr).toBe("--format jsonl does not match the output file x.csv (csv)\n");
    const missingWorker = await runCli(["study", "work/sweep.json", "--workers", "2"], FILES, {
      MACHNET_STUDY_WORKER: "/nowhere/study-worker.js",
    });
    expect(missingWorker.code).toBe(2);
    expect(missingWorker.stderr).toBe(
      "--workers 2: the worker file /nowhere/study-worker.js is missing; build machnet (npm run build) or use --workers 1\n",
    );
  });
});

describe("machnet study: design questions", () => {
  const network = JSON.stringify(BRANCH_SI);

  it("answers a target question in text, exit 0, and in JSON", async () => {
    const study = {
      network: "branch.json",
      units: "metric",
      question: "target",
      target: {
        input: { path: "/nodes/0/pressure" },
        output: "network/minPressure",
        value: "6.5 bar(g)",
      },
    };
    const files = { "branch.json": network, "target.json": JSON.stringify(study) };
    const text = await runCli(["study", "target.json"], files);
    expect(text.code).toBe(0);
    const out = lines(text.stdout);
    expect(out[0]).toBe("target network/minPressure = 7.51325 bar(a)");
    expect(out[1]).toMatch(
      /^found: \/nodes\/0\/pressure = \d\.\d+ bar\(a\) gives network\/minPressure = 7\.51325 bar\(a\)$/,
    );
    const json = await runCli(["study", "target.json", "-o", "answer.json"], files);
    const answer = JSON.parse(json.written.get("answer.json") as string);
    expect(answer).toMatchObject({ question: "target", found: true, target: 751325 });
    expect(answer.result).toBeUndefined();
  });

  it("exits 1 when the target cannot be bracketed, saying so", async () => {
    const study = {
      network: "branch.json",
      question: "target",
      target: {
        input: { path: "/nodes/0/pressure", bracket: ["6 bar(g)", "7 bar(g)"] },
        output: "network/minPressure",
        value: "8 bar(g)",
      },
    };
    const run = await runCli(["study", "t.json"], {
      "branch.json": network,
      "t.json": JSON.stringify(study),
    });
    expect(run.code).toBe(1);
    expect(lines(run.stdout)[0]).toBe(
      "target network/minPressure = 901325 Pa: not found (not-bracketed)",
    );
    expect(lines(run.stdout)[1]).toMatch(/^the target cannot be bracketed: /);
  });

  it("answers capacity, sensitivities and sizing", async () => {
    const files: Record<string, string> = { "branch.json": network };
    const questions = {
      capacity: { question: "capacity" },
      sensitivities: {
        question: "sensitivities",
        sensitivities: {
          inputs: [{ path: "/edges/B2/diameter" }],
          outputs: ["nodes/PAINT/pressure"],
        },
      },
      sizing: { question: "sizing", sizing: { limits: { maxVelocity: "15 m/s" } } },
    };
    const first: Record<string, string> = {};
    for (const [name, block] of Object.entries(questions)) {
      files[`${name}.json`] = JSON.stringify({ network: "branch.json", ...block });
      const run = await runCli(["study", `${name}.json`], files);
      expect(run.code, name).toBe(0);
      first[name] = lines(run.stdout)[0] as string;
    }
    expect(first.capacity).toMatch(
      /^capacity: \d+\.\d+ times the network's values \(demand scale\)$/,
    );
    expect(first.sensitivities).toBe(
      "derivatives at the network's solution (SI units: output unit per input unit)",
    );
    expect(first.sizing).toBe("sizing: every limit is met");
    const shard = await runCli(["study", "capacity.json", "--shard", "1/2"], files);
    expect(shard.code).toBe(2);
    expect(shard.stderr).toBe(
      '--shard and --workers apply to sweeps; question "capacity" runs its solves one after the other\n',
    );
  });
});

describe("machnet merge: problems", () => {
  async function shards(): Promise<Record<string, string>> {
    const files: Record<string, string> = { ...FILES };
    for (const shard of ["1/2", "2/2"]) {
      const name = `s${shard[0]}.csv`;
      const run = await runCli(
        ["study", "work/sweep.json", "--shard", shard, "--workers", "1", "-q", "-o", name],
        FILES,
      );
      files[name] = run.written.get(name) as string;
    }
    return files;
  }

  it("refuses a file that is not a shard output, a missing shard and a shard given twice", async () => {
    const files = await shards();
    const notShard = await runCli(["merge", "work/sweep.json", "s1.csv"], files);
    expect(notShard.code).toBe(2);
    expect(notShard.stderr).toBe(
      'work/sweep.json: not the output of a "machnet study --shard K/N" run (its first line is not a shard header); only shard outputs can be merged\n',
    );
    const missing = await runCli(["merge", "s2.csv"], files);
    expect(missing.stderr).toBe("shard 1 of 2 missing: give every shard's output\n");
    const twice = await runCli(["merge", "s1.csv", "s1.csv", "s2.csv"], files);
    expect(twice.stderr).toBe("s1.csv: shard 1/2 is given twice (also s1.csv)\n");
  });

  it("refuses an incomplete shard and shards of different studies", async () => {
    const files = await shards();
    const cut = (files["s2.csv"] as string).split("\n").slice(0, -3).join("\n");
    const incomplete = await runCli(["merge", "s1.csv", "cut.csv"], {
      ...files,
      "cut.csv": `${cut}\n`,
    });
    expect(incomplete.code).toBe(2);
    expect(incomplete.stderr).toMatch(
      /^cut\.csv: shard 2\/2 holds cases \d+ to 15 \(\d+ rows\) but the file has \d+: it is incomplete; run the shard again\n$/,
    );
    const other = { ...SWEEP, outputs: ["network/maxMach"] };
    const otherRun = await runCli(
      ["study", "o.json", "--shard", "2/2", "--workers", "1", "-q", "-o", "o2.csv"],
      {
        ...FILES,
        "work/o.json": JSON.stringify(other),
        "o.json": JSON.stringify({ ...other, network: "work/ring.json" }),
      },
    );
    const mixed = await runCli(["merge", "s1.csv", "o2.csv"], {
      ...files,
      "o2.csv": otherRun.written.get("o2.csv") as string,
    });
    expect(mixed.code).toBe(2);
    expect(mixed.stderr).toMatch(/^o2\.csv: from another study or another split than s1\.csv /);
  });
});

describe("machnet report", () => {
  it("is registered: it writes the HTML report of a network", async () => {
    const run = await runCli(
      ["report", "ring.json", "--output", "ring.html", "--color", "pressure"],
      {
        "ring.json": JSON.stringify(RING),
      },
    );
    expect(run.code).toBe(0);
    expect(run.written.get("ring.html")).toMatch(/^<!DOCTYPE html>/i);
  });
});
