import { spawnSync } from "node:child_process";
import { existsSync, readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { describe, expect, test } from "vitest";
import { lines, runCli } from "./run-cli.js";

const root = fileURLToPath(new URL("../../", import.meta.url));
const manifest = JSON.parse(readFileSync(`${root}package.json`, "utf8")) as { version: string };

describe("help and version", () => {
  test("--version prints the version in package.json", async () => {
    const run = await runCli(["--version"]);
    expect(run.code).toBe(0);
    expect(run.stdout).toBe(`${manifest.version}\n`);
  });

  test("--help lists the commands and the exit codes", async () => {
    const run = await runCli(["--help"]);
    expect(run.code).toBe(0);
    for (const command of ["solve", "check", "state"]) {
      expect(run.stdout).toMatch(new RegExp(`^  ${command} `, "m"));
    }
    expect(run.stdout).toContain("Exit codes:");
    expect(run.stdout).toMatch(/^ {2}3 {2}internal error/m);
  });

  test.each(["solve", "check", "state"])(
    "machnet help %s shows that command's usage",
    async (command) => {
      const run = await runCli(["help", command]);
      expect(run.code).toBe(0);
      expect(lines(run.stdout)[0]).toMatch(new RegExp(`^Usage: machnet ${command} `));
    },
  );

  test("solve --help names every option", async () => {
    const run = await runCli(["solve", "--help"]);
    expect(run.code).toBe(0);
    for (const option of [
      "--format <format>",
      "--units <set>",
      "-o, --output <path>",
      "--table <table>",
    ]) {
      expect(run.stdout).toContain(option);
    }
  });

  test("no command prints the help on standard error and exits 2", async () => {
    const run = await runCli([]);
    expect(run.code).toBe(2);
    expect(run.stdout).toBe("");
    expect(run.stderr).toMatch(/^Usage: machnet /);
  });
});

describe("bad command lines exit 2", () => {
  test.each([
    [["frob"], "error: unknown command 'frob'"],
    [["solve"], "error: missing required argument 'file'"],
    [["solve", "a.json", "--colour"], "error: unknown option '--colour'"],
    [
      ["solve", "a.json", "--format", "xml"],
      "error: option '--format <format>' argument 'xml' is invalid. Allowed choices are table, json, csv.",
    ],
    [
      ["solve", "a.json", "--units", "imperial"],
      "error: option '--units <set>' argument 'imperial' is invalid. Allowed choices are si, metric, us.",
    ],
    [
      ["solve", "a.json", "--table", "pipes"],
      "error: option '--table <table>' argument 'pipes' is invalid. Allowed choices are edges, nodes, components.",
    ],
    [["check"], "error: missing required argument 'file'"],
  ])("%j", async (args, message) => {
    const run = await runCli(args);
    expect(run.code).toBe(2);
    expect(lines(run.stderr)[0]).toBe(message);
  });
});

const built = existsSync(`${root}dist/src/cli/main.js`);

describe("bin/machnet.js", () => {
  test.skipIf(!built)("runs the built command line and passes the exit code on", () => {
    const version = spawnSync(process.execPath, [`${root}bin/machnet.js`, "--version"], {
      encoding: "utf8",
    });
    expect(version.status).toBe(0);
    expect(version.stdout).toBe(`${manifest.version}\n`);
    const missing = spawnSync(
      process.execPath,
      [`${root}bin/machnet.js`, "check", `${root}no-such-file.json`],
      {
        encoding: "utf8",
      },
    );
    expect(missing.status).toBe(2);
    expect(missing.stderr).toBe(`${root}no-such-file.json: no such file\n`);
  });
});
