/**
 * The HTML report (renderReportHtml): self-contained, deterministic, with the tables, the
 * provenance and the caution, and a prominent NOT A SOLUTION marker when the numbers are not one.
 */
import { describe, expect, it } from "vitest";
import { renderReportHtml } from "../../src/output/report/report-html.js";
import { EXAMPLE_NAMES, example, exampleJson, solved } from "./report-examples.js";

const CAUTION =
  "Results are engineering estimates. Pressure and relief systems are designed and checked to the applicable codes by qualified engineers.";

/** A receiver and a long DN 10 pipe asked for far more than it can pass: no solution. */
const TOO_MUCH = {
  name: "too much for the pipe",
  gas: { preset: "air" },
  nodes: [
    { id: "REC", kind: "reservoir", pressure: "3 bar(g)", temperature: "20 degC" },
    { id: "TOOL", kind: "junction", demand: "1 kg/s" },
  ],
  edges: [
    { id: "THIN", kind: "pipe", from: "REC", to: "TOOL", length: "100 m", diameter: "10 mm" },
  ],
};

function report(name: (typeof EXAMPLE_NAMES)[number]): string {
  const { document, result } = example(name);
  return renderReportHtml(document, result, {
    sourceName: `docs/examples/${name}.json`,
    sourceHash: "0".repeat(64),
    version: "9.8.7",
  });
}

describe("renderReportHtml", () => {
  for (const name of EXAMPLE_NAMES) {
    it(`${name}: refers to nothing outside the file`, () => {
      const html = report(name);
      expect(html).not.toMatch(/https?:/i);
      expect(html).not.toMatch(/\bsrc\s*=/i);
      expect(html).not.toMatch(/<link\b/i);
      expect(html).not.toMatch(/<(img|iframe|object|embed|audio|video)\b/i);
      expect(html).not.toMatch(/@import|@font-face/i);
      expect(html).not.toMatch(/\bhref\s*=/i);
      // url(...) only for the drawing's own gradient.
      for (const match of html.matchAll(/url\(([^)]*)\)/g)) expect(match[1]).toMatch(/^#mn-/);
      // One inline script, no other.
      expect(html.match(/<script\b[^>]*>/g)).toEqual(["<script>"]);
    });

    it(`${name}: holds the drawing, the profile, the tables, the provenance and the caution`, () => {
      const html = report(name);
      const json = exampleJson(name);
      expect(html.startsWith("<!DOCTYPE html>\n")).toBe(true);
      expect(html).toContain('<svg class="mn-network"');
      expect(html.match(/<svg class="mn-chart /g)).toHaveLength(2);
      for (const edge of json.edges)
        expect(html).toContain(`<th scope="row" class="mn-left">${edge.id}</th>`);
      expect(html).toContain(`<caption>Nodes</caption>`);
      expect(html).toContain(`<caption>Edges</caption>`);
      expect(html).toContain(`<caption>Pipes as given</caption>`);
      expect(html).toContain(`docs/examples/${name}.json`);
      expect(html).toContain("0".repeat(64));
      expect(html).toContain("9.8.7");
      expect(html).toContain(CAUTION);
      expect(html).not.toContain("NOT A SOLUTION");
      // Units in the table headers (metric by default).
      expect(html).toContain('p <span class="mn-unit">[bar(a)]</span>');
      expect(html).toContain('mass flow <span class="mn-unit">[kg/h]</span>');
    });

    it(`${name}: is deterministic`, () => {
      expect(report(name)).toBe(report(name));
    });
  }

  it("lists the design-check warnings of the vent header", () => {
    // README: the warnings name only TAIL-101: choked, Mach above 0.7, rho v^2 above 200000 Pa.
    const html = report("vent-collection-header");
    const rows = [
      ...html.matchAll(
        /<tr><th scope="row" class="mn-left">([\w-]+)<\/th><td class="mn-left">([^<]*)<\/td>/g,
      ),
    ]
      .filter((match) =>
        ["choked", "limit-mach", "limit-momentum-flux", "limit-velocity"].includes(match[1] ?? ""),
      )
      .map((match) => [match[1], match[2]]);
    expect(rows).toEqual([
      ["choked", "pipe TAIL-101"],
      ["limit-mach", "pipe TAIL-101"],
      ["limit-momentum-flux", "pipe TAIL-101"],
    ]);
    expect(html).toContain(
      '<tr class="mn-row-choked"><th scope="row" class="mn-left">TAIL-101</th>',
    );
  });

  it("says there are no warnings when there are none", () => {
    expect(report("workshop-ring-main")).toContain("No warnings");
  });

  it("shows the solver summary: status, iterations and residual", () => {
    const { document, result } = example("workshop-ring-main");
    const html = renderReportHtml(document, result);
    expect(html).toContain("<dt>status</dt><dd>converged</dd>");
    expect(html).toContain(`<dt>iterations</dt><dd>${result.iterations}</dd>`);
    expect(html).toContain(
      `<dt>largest scaled residual</dt><dd>${result.residual.toExponential(2)}</dd>`,
    );
  });

  it("marks a result that is not a solution, at the top and on the drawing, and still draws it", () => {
    const { document, result } = solved(TOO_MUCH);
    expect(result.converged).toBe(false);
    const html = renderReportHtml(document, result);
    expect(html).toMatch(/<title>NOT A SOLUTION: /);
    const banner = html.indexOf(
      '<div class="mn-not-solution" role="alert"><strong>NOT A SOLUTION</strong>',
    );
    expect(banner).toBeGreaterThan(0);
    expect(banner).toBeLessThan(html.indexOf('<section id="summary">'));
    expect(html).toContain('<g class="mn-not-a-solution">');
    expect(html).toContain('data-id="THIN"');
  });

  it("uses the chosen unit set and colour quantity", () => {
    const { document, result } = example("nitrogen-tank-header");
    const html = renderReportHtml(document, result, { units: "us", colorBy: "velocity" });
    expect(html).toContain('p <span class="mn-unit">[psia]</span>');
    expect(html).toContain("largest velocity in the pipe [ft/s]");
    expect(html).toContain('data-color-by="velocity"');
  });

  it("draws the profile to a chosen node and refuses an unknown one", () => {
    const { document, result } = example("nitrogen-tank-header");
    const html = renderReportHtml(document, result, { profileFrom: "PCV-2", profileTo: "TK-404" });
    expect(html).toContain('data-path="PCV-2 H4 H3 SPUR TK-404"');
    expect(() => renderReportHtml(document, result, { profileTo: "NOWHERE" })).toThrow(
      /profile: no node "NOWHERE" in the network/,
    );
  });

  it("escapes the network name and ids", () => {
    const { document, result } = solved({
      name: `<b>"Hall" & 'yard'</b>`,
      gas: { preset: "air" },
      nodes: [
        { id: "REC", kind: "reservoir", pressure: "7 bar(g)", temperature: "20 degC" },
        { id: "<T&1>", kind: "junction", demand: "100 kg/h" },
      ],
      edges: [
        {
          id: "</script>",
          kind: "pipe",
          from: "REC",
          to: "<T&1>",
          length: "20 m",
          diameter: "40 mm",
        },
      ],
    });
    const html = renderReportHtml(document, result, { sourceName: "<in>.json" });
    expect(html).not.toContain("<b>");
    expect(html).not.toContain("<T&1>");
    expect(html).not.toContain("<in>");
    expect(html.match(/<\/script>/g)).toHaveLength(1);
    expect(html).toContain("&lt;b&gt;&quot;Hall&quot; &amp; &#39;yard&#39;&lt;/b&gt;");
  });
});
