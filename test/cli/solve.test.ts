import { describe, expect, test } from "vitest";
import { solveNetwork } from "../../src/index.js";
import type { NetworkResult } from "../../src/results/result-types.js";
import { json, ONE_ITERATION, OVERLOADED, TWO_CONSUMERS, VENT } from "./networks.js";
import { lines, runCli } from "./run-cli.js";

const CAUTION =
  "Results are engineering estimates; pressure and relief systems are designed and checked to the applicable codes by qualified engineers.";

const files = {
  "two.json": json(TWO_CONSUMERS),
  "vent.json": json(VENT),
  "stuck.json": json(ONE_ITERATION),
  "overloaded.json": json(OVERLOADED),
};

/** Definition of the bar (BIPM SI Brochure, Table 8): 1 bar = 1e5 Pa. */
const BAR = 1e5;

describe("machnet solve --format table", () => {
  test("prints a node table with absolute and gauge pressure, an edge table, the summary and the caution", async () => {
    const run = await runCli(["solve", "two.json"], files);
    expect(run.code).toBe(0);
    expect(run.stderr).toBe("");
    const out = lines(run.stdout);
    expect(out[0]).toBe(
      'network "receiver and two consumers": gas air; ambient 1.01325 bar(a), 20.000 °C; 4 nodes, 3 edges',
    );
    expect(out).toContain("Nodes");
    expect(out).toContain("Edges");
    // Headers carry the units of the default (metric) set.
    for (const unit of ["[bar(a)]", "[bar(g)]", "[°C]", "[kg/h]", "[bar]", "[m/s]", "[Pa]"]) {
      expect(run.stdout).toContain(unit);
    }
    // The receiver: 7 bar(g) with the default ambient 1.01325 bar(a) is 8.01325 bar(a).
    const receiver = out.find((line) => line.startsWith("REC "));
    expect(receiver?.split(/\s+/).slice(0, 5)).toEqual([
      "REC",
      "reservoir",
      "8.01325",
      "7.00000",
      "25.000",
    ]);
    // The reservoir supplies both demands: 300 + 150 kg/h.
    expect(receiver?.split(/\s+/)[5]).toBe("-450.00");
    expect(out.at(-2)).toMatch(
      /^solver: converged in \d+ iterations; largest scaled residual .*; throughput 450.00 kg\/h$/,
    );
    expect(out.at(-1)).toBe(CAUTION);
    expect(run.stdout).not.toContain("CHOKED");
    expect(run.stdout).not.toContain("NOT A SOLUTION");
  });

  test("marks a choked edge CHOKED in the status column and lists the choke warning", async () => {
    const run = await runCli(["solve", "vent.json"], files);
    expect(run.code).toBe(0);
    const row = lines(run.stdout).find((line) => line.startsWith("VENT "));
    expect(row?.trim().endsWith("CHOKED")).toBe(true);
    expect(run.stdout).toMatch(/^warning: edge VENT is choked/m);
  });

  test("shows US units with --units us", async () => {
    const run = await runCli(["solve", "vent.json", "--units", "us"], files);
    expect(run.code).toBe(0);
    for (const unit of ["[psia]", "[psig]", "[°F]", "[lb/h]", "[ft/s]"])
      expect(run.stdout).toContain(unit);
    // 1.01325 bar(a) is 14.6959 psia (1 psi = 6894.757 Pa: 1 lbf/in2 from the 1959 yard and pound).
    expect(run.stdout).toContain("ambient 14.6959 psia");
  });

  test("--table edges leaves out the node table", async () => {
    const run = await runCli(["solve", "two.json", "--table", "edges"], files);
    expect(run.code).toBe(0);
    expect(lines(run.stdout)).not.toContain("Nodes");
    expect(lines(run.stdout)).toContain("Edges");
  });

  test("prints a bare-bar note on standard error as a note line", async () => {
    const bare = {
      ...VENT,
      nodes: [{ ...VENT.nodes[0], pressure: "8 bar" }, VENT.nodes[1]],
    };
    const run = await runCli(["solve", "bare.json"], { "bare.json": json(bare) });
    expect(run.code).toBe(0);
    expect(lines(run.stderr)).toEqual([
      expect.stringMatching(
        /^note: bare\.json: \/nodes\/0\/pressure: "8 bar" was read as an absolute pressure/,
      ),
    ]);
    expect(run.stdout).not.toContain("was read as an absolute pressure");
  });
});

describe("machnet solve --format json", () => {
  test("prints the result object as solveNetwork returns it, converged true, 2-space indent", async () => {
    const run = await runCli(["solve", "two.json", "--format", "json"], files);
    expect(run.code).toBe(0);
    const printed = JSON.parse(run.stdout) as NetworkResult;
    expect(printed.converged).toBe(true);
    expect(printed.status).toBe("converged");
    expect(printed).toEqual(solveNetwork(TWO_CONSUMERS));
    expect(run.stdout.split("\n")[1]).toBe('  "converged": true,');
    // SI: the receiver pressure is 7e5 Pa above the default ambient 101325 Pa.
    expect(printed.nodes[0]?.pressure).toBeCloseTo(7 * BAR + 101325, 6);
  });

  test("refuses --table, which json does not use", async () => {
    const run = await runCli(["solve", "two.json", "--format", "json", "--table", "nodes"], files);
    expect(run.code).toBe(2);
    expect(run.stderr).toBe(
      "--table applies to --format table and csv; --format json always holds the whole result\n",
    );
  });
});

describe("machnet solve --format csv", () => {
  test("writes one header row with units in brackets and one row per edge", async () => {
    const run = await runCli(["solve", "two.json", "--format", "csv"], files);
    expect(run.code).toBe(0);
    const rows = lines(run.stdout);
    expect(rows[0]).toBe(
      "id,from,to,mass flow [kg/h],inlet pressure [bar(a)],outlet pressure [bar(a)],pressure drop [bar],inlet velocity [m/s],outlet velocity [m/s],inlet Mach,outlet Mach,rho v2 [Pa],Reynolds,Darcy friction factor,choke ratio,status",
    );
    expect(rows).toHaveLength(4);
    expect(rows.slice(1).map((row) => row.split(",")[0])).toEqual(["MAIN", "B1", "B2"]);
    // 300 kg/h through B1, at full precision.
    expect(Number(rows[2]?.split(",")[3])).toBeCloseTo(300, 9);
  });

  test("--table nodes writes the nodes, in SI with --units si", async () => {
    const run = await runCli(
      ["solve", "two.json", "--format", "csv", "--table", "nodes", "--units", "si"],
      files,
    );
    expect(run.code).toBe(0);
    const rows = lines(run.stdout);
    expect(rows[0]).toBe(
      "id,kind,pressure [Pa],gauge pressure [Pa(g)],temperature [K],demand [kg/s]",
    );
    expect(rows[1]).toMatch(/^REC,reservoir,801325,700000,298.15,/);
  });

  test("marks the choked vent CHOKED and puts its warning on standard error", async () => {
    const run = await runCli(["solve", "vent.json", "--format", "csv"], files);
    expect(run.code).toBe(0);
    expect(lines(run.stdout)[1]?.endsWith(",CHOKED")).toBe(true);
    expect(run.stderr).toMatch(/^warning: edge VENT is choked/m);
  });
});

describe("machnet solve --output", () => {
  test("writes the output to the file and nothing to standard output", async () => {
    const run = await runCli(
      ["solve", "two.json", "--format", "csv", "--output", "out.csv"],
      files,
    );
    expect(run.code).toBe(0);
    expect(run.stdout).toBe("");
    expect(run.written.get("out.csv")?.startsWith("id,from,to,mass flow [kg/h]")).toBe(true);
  });

  test("a file that cannot be written is exit 2 with one line", async () => {
    const run = await runCli(["solve", "two.json", "-o", "/read-only/out.txt"], files);
    expect(run.code).toBe(2);
    expect(lines(run.stderr)).toEqual([
      expect.stringMatching(/^\/read-only\/out\.txt: cannot write the output \(EACCES/),
    ]);
  });
});

describe("results that are not a solution exit 1", () => {
  // With one Newton iteration allowed the solve cannot finish. Which of the two non-solution
  // statuses the solver reports is its own business; the command line must mark either.
  test("table output starts with NOT A SOLUTION and the reason is on standard error", async () => {
    const run = await runCli(["solve", "stuck.json"], files);
    expect(run.code).toBe(1);
    const first = lines(run.stdout)[0] ?? "";
    expect(first).toMatch(/^NOT A SOLUTION: (not converged|no solution)/);
    expect(lines(run.stderr)).toContain(`stuck.json: ${first.slice("NOT A SOLUTION: ".length)}`);
    expect(run.stdout).toMatch(/^solver: (NOT converged|no solution)/m);
  });

  test("json output has converged false and a status that is not converged", async () => {
    const run = await runCli(["solve", "stuck.json", "--format", "json"], files);
    expect(run.code).toBe(1);
    const printed = JSON.parse(run.stdout) as NetworkResult;
    expect(printed.converged).toBe(false);
    expect(printed.status).not.toBe("converged");
    expect(run.stderr).toMatch(/^stuck\.json: (not converged|no solution)/);
  });

  test("csv output starts with a comment line", async () => {
    const run = await runCli(["solve", "stuck.json", "--format", "csv"], files);
    expect(run.code).toBe(1);
    expect(lines(run.stdout)[0]).toMatch(/^# NOT A SOLUTION: /);
    expect(lines(run.stdout)[1]).toMatch(/^id,from,to,/);
  });

  test("a demand beyond what the pipe can pass is no solution, naming the limiting edge", async () => {
    const run = await runCli(["solve", "overloaded.json"], files);
    expect(run.code).toBe(1);
    const first = lines(run.stdout)[0] ?? "";
    expect(first).toMatch(/^NOT A SOLUTION: no solution: .*\bedge P\b/);
    expect(lines(run.stderr)).toEqual([
      `overloaded.json: ${first.slice("NOT A SOLUTION: ".length)}`,
    ]);
  });
});

describe("machnet solve: component tables", () => {
  // A restriction orifice venting 8 bar(a) to the atmosphere: the ratio 1.01325 / 8 = 0.127 is
  // far below the critical ratio 0.528 of air (common practice), so it chokes.
  const ORIFICE_VENT = {
    ...VENT,
    edges: [
      {
        id: "RO",
        kind: "orifice",
        from: "HP",
        to: "ATM",
        boreDiameter: "10 mm",
        pipeDiameter: "50 mm",
      },
    ],
  };
  const withOrifice = { ...files, "ro.json": json(ORIFICE_VENT) };

  test("the table format prints each component kind's own table after the edges", async () => {
    const run = await runCli(["solve", "ro.json"], withOrifice);
    expect(run.code).toBe(0);
    const output = lines(run.stdout);
    const title = output.indexOf("Orifices and nozzles");
    expect(title).toBeGreaterThan(output.indexOf("Edges"));
    expect(output[title + 1]).toMatch(
      /^id\s+kind\s+from\s+to\s+d\/D\s+C\s+p ratio\s+critical\s+Δp taps\s+loss\s+ε\s+status$/,
    );
    // d/D = 10 / 50 = 0.2; critical ratio of air (2 / 2.4)^3.5 = 0.5283.
    expect(output[title + 4]).toMatch(
      /^RO\s+orifice\s+HP\s+ATM\s+0\.2000\s+0\.6000\s+0\.5283\s+0\.5283\s.*CHOKED$/,
    );
  });

  test("--table components prints only the component tables, or says there are none", async () => {
    const run = await runCli(["solve", "ro.json", "--table", "components"], withOrifice);
    expect(run.code).toBe(0);
    expect(lines(run.stdout)).not.toContain("Edges");
    expect(lines(run.stdout)).toContain("Orifices and nozzles");
    const none = await runCli(["solve", "two.json", "--table", "components"], files);
    expect(lines(none.stdout)).toContain("no components in this network");
  });

  test("--format csv --table components writes one row per component with its own figures", async () => {
    const run = await runCli(
      ["solve", "ro.json", "--format", "csv", "--table", "components", "--units", "si"],
      withOrifice,
    );
    expect(run.code).toBe(0);
    const [header, row] = lines(run.stdout);
    expect(header).toMatch(
      /^id,kind,from,to,state,diameter ratio,discharge coefficient,tap pressure ratio,/,
    );
    const cells = (row as string).split(",");
    expect(cells.slice(0, 5)).toEqual(["RO", "orifice", "HP", "ATM", ""]);
    // d/D = 10 mm / 50 mm (0.2 to rounding: 0.01 / 0.05 in doubles), C 0.6, critical ratio of air.
    expect(Number(cells[5])).toBeCloseTo(0.2, 15);
    expect(Number(cells[6])).toBe(0.6);
    expect(Number(cells[8])).toBeCloseTo((2 / 2.4) ** 3.5, 14);
    expect(cells.at(-1)).toBe("CHOKED");
  });
});
