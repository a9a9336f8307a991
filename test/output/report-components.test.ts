import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { drawNetworkSvg } from "../../src/index.js";
import { solved } from "./report-examples.js";

const readExample = (name: string): unknown =>
  JSON.parse(readFileSync(new URL(`../../docs/examples/${name}.json`, import.meta.url), "utf8"));
const regulated = readExample("regulated-header");

describe("components on the drawing", () => {
  const { document, result } = solved(regulated);
  const svg = drawNetworkSvg(document, result);

  it("draws one lettered glyph per component, with its kind, and none for pipes", () => {
    const glyphs = [...svg.matchAll(/<g class="mn-component" data-component="(\w+)">/g)].map(
      (m) => m[1],
    );
    const components = document.edges
      .filter((edge) => edge.kind !== "pipe")
      .map((edge) => edge.kind);
    expect(components.length).toBeGreaterThan(0);
    // one glyph per component edge plus the one in the legend (a valve)
    expect(glyphs.length).toBe(components.length + 1);
    expect(glyphs.slice().sort()).toEqual([...components, "valve"].sort());
  });

  it("names the component's kind in its details", () => {
    const first = document.edges.find((edge) => edge.kind !== "pipe");
    expect(first).toBeDefined();
    expect(svg).toContain(`${first?.kind} ${first?.id}`);
  });

  it("explains the letters in the legend only when there are components", () => {
    expect(svg).toContain("component: O orifice, N nozzle, V valve, R regulator, C check valve");
    const plain = solved(readExample("workshop-ring-main"));
    expect(drawNetworkSvg(plain.document, plain.result)).not.toContain("data-component");
  });
});
