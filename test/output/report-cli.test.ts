/**
 * `machnet report` (runReport), run in memory: where the report goes, the hash and version it
 * carries, and the exit codes of the rest of the command line (0, 1, 2, 3).
 */
import { createHash } from "node:crypto";
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { type ReportArguments, runReport } from "../../src/cli/report-command.js";
import { exampleText } from "./report-examples.js";

interface Run {
  code: number;
  stdout: string;
  stderr: string;
  written: Map<string, string>;
}

function fileSystemError(code: string, path: string): Error {
  return Object.assign(new Error(`${code}: ${path}`), { code });
}

async function run(
  args: ReportArguments,
  files: Record<string, string | Uint8Array>,
  writeFile?: (path: string, text: string) => Promise<void>,
): Promise<Run> {
  let stdout = "";
  let stderr = "";
  const written = new Map<string, string>();
  const code = await runReport(args, {
    stdout: (text) => {
      stdout += text;
    },
    stderr: (text) => {
      stderr += text;
    },
    readFile: async (path) => {
      const file = files[path];
      if (file === undefined) throw fileSystemError("ENOENT", path);
      return typeof file === "string" ? file : Buffer.from(file);
    },
    writeFile:
      writeFile ??
      (async (path, text) => {
        written.set(path, text);
      }),
  });
  return { code, stdout, stderr, written };
}

const WORKSHOP = exampleText("workshop-ring-main");
const VERSION = (
  JSON.parse(readFileSync(new URL("../../package.json", import.meta.url), "utf8")) as {
    version: string;
  }
).version;

describe("machnet report", () => {
  it("writes FILE.html next to the input by default and says where", async () => {
    const result = await run({ file: "plant/ring.json" }, { "plant/ring.json": WORKSHOP });
    expect(result.code).toBe(0);
    expect([...result.written.keys()]).toEqual(["plant/ring.html"]);
    expect(result.stdout).toBe("wrote plant/ring.html\n");
    expect(result.stderr).toBe("");
    expect(result.written.get("plant/ring.html")).toMatch(/^<!DOCTYPE html>/);
  });

  it("carries the SHA-256 of the file's bytes, the file name and machnet's version", async () => {
    // Bytes with a byte-order mark: the hash is of the file as stored, the mark included.
    const bytes = Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), Buffer.from(WORKSHOP, "utf8")]);
    const result = await run({ file: "ring.json", output: "out.html" }, { "ring.json": bytes });
    const html = result.written.get("out.html") ?? "";
    // node:crypto's SHA-256 of the same bytes (FIPS 180-4).
    expect(html).toContain(createHash("sha256").update(bytes).digest("hex"));
    expect(html).toContain(`<dt>machnet version</dt><dd>${VERSION}</dd>`);
    expect(html).toContain("<dt>input file</dt><dd>ring.json</dd>");
  });

  it("writes to standard output for --output -", async () => {
    const result = await run({ file: "ring.json", output: "-" }, { "ring.json": WORKSHOP });
    expect(result.code).toBe(0);
    expect(result.written.size).toBe(0);
    expect(result.stdout).toMatch(/^<!DOCTYPE html>[\s\S]*<\/html>\n$/);
  });

  it("writes the drawing alone as a standalone SVG with --format svg", async () => {
    const result = await run(
      { file: "ring", format: "svg", colorBy: "flow", units: "us" },
      { ring: WORKSHOP },
    );
    expect(result.code).toBe(0);
    const svg = result.written.get("ring.svg") ?? "";
    expect(svg).toMatch(
      /^<\?xml version="1.0" encoding="UTF-8"\?>\n<svg xmlns="http:\/\/www.w3.org\/2000\/svg"/,
    );
    expect(svg).toContain('data-color-by="flow"');
    expect(svg).toContain("mass flow [lb/h]");
  });

  it("refuses option values it does not know, naming the choices (exit 2)", async () => {
    const color = await run(
      { file: "ring.json", colorBy: "temperature" },
      { "ring.json": WORKSHOP },
    );
    expect(color.code).toBe(2);
    expect(color.stderr).toBe(
      '--color: must be one of mach, pressure, velocity, flow (got "temperature")\n',
    );
    const units = await run({ file: "ring.json", units: "imperial" }, { "ring.json": WORKSHOP });
    expect(units.stderr).toBe('--units: must be one of si, metric, us (got "imperial")\n');
    expect(color.written.size + units.written.size).toBe(0);
  });

  it("reports a missing file and an invalid document as FILE: lines (exit 2)", async () => {
    const missing = await run({ file: "none.json" }, {});
    expect(missing).toMatchObject({ code: 2, stderr: "none.json: no such file\n" });
    const broken = JSON.parse(WORKSHOP);
    broken.edges[0].diameter = "-80 mm";
    const invalid = await run({ file: "bad.json" }, { "bad.json": JSON.stringify(broken) });
    expect(invalid.code).toBe(2);
    expect(invalid.stderr).toMatch(/^bad\.json: \/edges\/0\/diameter: /);
    expect(invalid.written.size).toBe(0);
  });

  it("reports an unknown profile node (exit 2)", async () => {
    const result = await run({ file: "ring.json", to: "CNC" }, { "ring.json": WORKSHOP });
    expect(result.code).toBe(2);
    expect(result.stderr).toMatch(
      /^ring\.json: --to: no node "CNC" in the network; nodes are R-101, RA/,
    );
    const from = await run({ file: "ring.json", from: "R-1" }, { "ring.json": WORKSHOP });
    expect(from.stderr).toMatch(/^ring\.json: --from: no node "R-1"/);
  });

  it("writes the report of a result that is not a solution, marked, and exits 1", async () => {
    const document = {
      gas: { preset: "air" },
      nodes: [
        { id: "REC", kind: "reservoir", pressure: "3 bar(g)", temperature: "20 degC" },
        { id: "TOOL", kind: "junction", demand: "1 kg/s" },
      ],
      edges: [
        { id: "THIN", kind: "pipe", from: "REC", to: "TOOL", length: "100 m", diameter: "10 mm" },
      ],
    };
    const result = await run({ file: "thin.json" }, { "thin.json": JSON.stringify(document) });
    expect(result.code).toBe(1);
    expect(result.written.get("thin.html")).toContain("<strong>NOT A SOLUTION</strong>");
    expect(result.stderr).toMatch(/^thin\.json: NOT A SOLUTION: /);
  });

  it("refuses to write over the input file", async () => {
    const result = await run({ file: "ring.json", output: "ring.json" }, { "ring.json": WORKSHOP });
    expect(result.code).toBe(2);
    expect(result.stderr).toBe(
      "ring.json: the report would replace the input file; give --output\n",
    );
  });

  it("names the output file it cannot write (exit 2), and calls anything else internal (exit 3)", async () => {
    const denied = await run({ file: "ring.json" }, { "ring.json": WORKSHOP }, async (path) => {
      throw fileSystemError("EACCES", path);
    });
    expect(denied.code).toBe(2);
    expect(denied.stderr).toMatch(/^ring\.html: cannot write the report \(EACCES: /);
    const broken = await run({ file: "ring.json" }, { "ring.json": WORKSHOP }, async () => {
      throw new TypeError("something unexpected");
    });
    expect(broken.code).toBe(3);
    expect(broken.stderr).toBe("ring.json: internal error: TypeError: something unexpected\n");
  });
});
