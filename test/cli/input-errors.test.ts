import { mkdtemp, rm, writeFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, test } from "vitest";
import { main } from "../../src/cli/main.js";
import { json, TWO_CONSUMERS } from "./networks.js";
import { lines, runCli } from "./run-cli.js";

/** Run with the real file system (the default readFile of main). */
async function runOnDisk(
  args: string[],
): Promise<{ code: number; stdout: string; stderr: string }> {
  let stdout = "";
  let stderr = "";
  const code = await main(args, {
    stdout: (text) => {
      stdout += text;
    },
    stderr: (text) => {
      stderr += text;
    },
  });
  return { code, stdout, stderr };
}

describe("files that cannot be read (real file system)", () => {
  let directory = "";
  beforeAll(async () => {
    directory = await mkdtemp(join(tmpdir(), "machnet-cli-"));
    // "é" as 0xC3 0xA9 is valid; 0xC3 followed by "(" (0x28) is not a UTF-8 sequence.
    await writeFile(
      join(directory, "latin.json"),
      Buffer.from([0x7b, 0x22, 0xc3, 0x28, 0x22, 0x7d]),
    );
    await writeFile(join(directory, "empty.json"), "");
    await writeFile(join(directory, "bom.json"), `\ufeff${json(TWO_CONSUMERS)}`, "utf8");
  });
  afterAll(async () => {
    await rm(directory, { recursive: true, force: true });
  });

  test("a missing file is exit 2: FILE: no such file", async () => {
    const file = join(directory, "missing.json");
    const run = await runOnDisk(["solve", file]);
    expect(run.code).toBe(2);
    expect(run.stderr).toBe(`${file}: no such file\n`);
    expect(run.stdout).toBe("");
  });

  test("a directory is exit 2 with one line", async () => {
    const run = await runOnDisk(["check", directory]);
    expect(run.code).toBe(2);
    expect(run.stderr).toBe(`${directory}: is a directory; give the path of a network JSON file\n`);
  });

  test("bytes that are not UTF-8 are exit 2: FILE: not valid UTF-8 text", async () => {
    const file = join(directory, "latin.json");
    const run = await runOnDisk(["solve", file]);
    expect(run.code).toBe(2);
    expect(run.stderr).toBe(`${file}: not valid UTF-8 text; save the file as UTF-8\n`);
  });

  test("an empty file is exit 2 with one line", async () => {
    const file = join(directory, "empty.json");
    const run = await runOnDisk(["check", file]);
    expect(run.code).toBe(2);
    expect(run.stderr).toBe(`${file}: the document is empty; expected a JSON object\n`);
  });

  test("a UTF-8 byte-order mark is accepted", async () => {
    const file = join(directory, "bom.json");
    const run = await runOnDisk(["check", file]);
    expect(run.code).toBe(0);
    expect(run.stdout).toBe(`${file}: ok (4 nodes, 3 edges)\n`);
  });
});

describe("documents that are not valid", () => {
  test("invalid JSON names line and column", async () => {
    // Line 2 is `  "nodes": [,]`: the comma is its 13th character.
    const run = await runCli(["solve", "bad.json"], { "bad.json": '{\n  "nodes": [,]\n}\n' });
    expect(run.code).toBe(2);
    expect(lines(run.stderr)).toHaveLength(1);
    expect(run.stderr).toMatch(/^bad\.json: invalid JSON at line 2, column 13: /);
  });

  test("valid JSON that is not an object is exit 2", async () => {
    const run = await runCli(["check", "list.json"], { "list.json": "[1, 2, 3]" });
    expect(run.code).toBe(2);
    expect(run.stderr).toBe(
      'list.json: a network document must be a JSON object with "nodes" and "edges" (got an array)\n',
    );
  });

  test("value problems come one per line with their JSON Pointer, sorted by path", async () => {
    const document = {
      ...TWO_CONSUMERS,
      edges: [
        TWO_CONSUMERS.edges[0],
        { ...TWO_CONSUMERS.edges[1], length: "0 m" },
        { ...TWO_CONSUMERS.edges[2], diameter: "-80 mm" },
      ],
    };
    for (const command of ["check", "solve"]) {
      const run = await runCli([command, "net.json"], { "net.json": json(document) });
      expect(run.code).toBe(2);
      expect(run.stdout).toBe("");
      expect(lines(run.stderr)).toEqual([
        'net.json: /edges/1/length: must be greater than 0 (got "0 m")',
        'net.json: /edges/2/diameter: must be greater than 0 (got "-80 mm")',
      ]);
    }
  });

  test("schema problems come one per line with their JSON Pointer", async () => {
    const { to: _dropped, ...withoutTo } = TWO_CONSUMERS.edges[1] as Record<string, unknown>;
    const document = {
      ...TWO_CONSUMERS,
      edges: [TWO_CONSUMERS.edges[0], withoutTo, { ...TWO_CONSUMERS.edges[2], colour: "red" }],
    };
    const run = await runCli(["check", "net.json"], { "net.json": json(document) });
    expect(run.code).toBe(2);
    const problems = lines(run.stderr);
    expect(problems).toHaveLength(2);
    expect(problems[0]).toBe('net.json: /edges/1: missing required field "to"');
    expect(problems[1]).toMatch(
      /^net\.json: \/edges\/2\/colour: unknown field "colour"; allowed fields here: /,
    );
  });

  test("a bad unit names its path", async () => {
    const document = {
      ...TWO_CONSUMERS,
      edges: [{ ...TWO_CONSUMERS.edges[0], length: "60 meeters" }, ...TWO_CONSUMERS.edges.slice(1)],
    };
    const run = await runCli(["check", "net.json"], { "net.json": json(document) });
    expect(run.code).toBe(2);
    expect(run.stderr).toMatch(/^net\.json: \/edges\/0\/length: unknown unit "meeters"/);
  });

  test("an edge to an unknown node is exit 2 from check and from solve", async () => {
    const document = {
      ...TWO_CONSUMERS,
      edges: [...TWO_CONSUMERS.edges.slice(0, 2), { ...TWO_CONSUMERS.edges[2], to: "J9" }],
    };
    for (const command of ["check", "solve"]) {
      const run = await runCli([command, "net.json"], { "net.json": json(document) });
      expect(run.code).toBe(2);
      const problems = lines(run.stderr);
      expect(problems[0]).toBe(
        'net.json: /edges/2/to: node "J9" is not defined; defined nodes are REC, TEE, SHOP, PAINT',
      );
    }
  });
});

describe("machnet check", () => {
  test("a valid document is FILE: ok (N nodes, M edges), exit 0", async () => {
    const run = await runCli(["check", "two.json"], { "two.json": json(TWO_CONSUMERS) });
    expect(run.code).toBe(0);
    expect(run.stdout).toBe("two.json: ok (4 nodes, 3 edges)\n");
    expect(run.stderr).toBe("");
  });

  test("passes input notes on as note lines", async () => {
    const document = {
      ...TWO_CONSUMERS,
      nodes: [{ ...TWO_CONSUMERS.nodes[0], pressure: "100 psi" }, ...TWO_CONSUMERS.nodes.slice(1)],
    };
    const run = await runCli(["check", "psi.json"], { "psi.json": json(document) });
    expect(run.code).toBe(0);
    expect(lines(run.stderr)).toEqual([
      expect.stringMatching(
        /^note: psi\.json: \/nodes\/0\/pressure: "100 psi" was read as an absolute pressure/,
      ),
    ]);
  });
});
