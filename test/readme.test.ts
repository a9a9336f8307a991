import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { checkNetwork, gasPreset, pipeFlow, solveNetwork } from "../src/index.js";

const readme = readFileSync(new URL("../README.md", import.meta.url), "utf8");

describe("README", () => {
  it("opens with the job paragraph, then the two set-up commands", () => {
    const lines = readme.split("\n");
    expect(lines[0]).toBe("# machnet");
    const firstCode = readme.indexOf("```sh");
    const block = readme.slice(firstCode, readme.indexOf("```", firstCode + 5));
    expect(block).toContain("npm ci && npx machnet solve docs/examples/workshop-ring-main.json");
    expect(block).toContain("npm ci && npm test");
  });

  it("names the test command that .ci/run runs", () => {
    const ci = readFileSync(new URL("../.ci/run", import.meta.url), "utf8");
    expect(ci).toMatch(/npm ci/);
    expect(ci).toMatch(/npm test/);
  });

  it("has an example network that checks and solves", () => {
    const start = readme.indexOf("```json");
    const text = readme.slice(start + 7, readme.indexOf("```", start + 7));
    expect(checkNetwork(text).ok).toBe(true);
    const result = solveNetwork(text);
    expect(result.converged).toBe(true);
    // the injection mixes in: the tee is between the receiver's 30 degC and the 60 degC blowdown
    const tee = result.nodes.find((n) => n.id === "TEE-1");
    expect(tee?.temperature).toBeGreaterThan(303.15);
    expect(tee?.temperature).toBeLessThan(333.15);
  });

  it("has a library snippet whose single-pipe call runs", () => {
    const flow = pipeFlow(
      gasPreset("air"),
      { length: 50, diameter: 0.0525 },
      { pressure: 7e5, temperature: 293.15 },
      6.5e5,
    );
    expect(flow.massFlow).toBeGreaterThan(0);
    expect(flow.choked).toBe(false);
  });
});
