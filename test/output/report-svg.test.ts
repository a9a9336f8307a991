/**
 * The network drawing (drawNetworkSvg) of the three example networks: every pipe and node is
 * drawn, pipe colours and widths follow the rules documented in docs/_drafts/report.md (the
 * expected colour is worked out here from those rules, not read from the code), choked pipes are
 * marked, the legend carries the units, and user strings are escaped.
 */
import { describe, expect, it } from "vitest";
import { emberColor } from "../../src/output/report/color-scale.js";
import { escapeMarkup } from "../../src/output/report/escape-markup.js";
import { drawNetworkSvg } from "../../src/output/report/network-svg.js";
import type { EdgeResult } from "../../src/results/result-types.js";
import {
  drawnElements,
  EXAMPLE_NAMES,
  example,
  exampleJson,
  solved,
  tagWithClass,
  unescapeMarkup,
} from "./report-examples.js";

/**
 * The ember scale as docs/_drafts/report.md gives it: nine sRGB anchors at t = 0, 1/8, ..., 1,
 * each 8-bit channel interpolated linearly between neighbours and rounded.
 */
const ANCHORS = [
  "#f9f1cb",
  "#f4d68b",
  "#f1b459",
  "#ea9039",
  "#d96e34",
  "#c34f39",
  "#a53741",
  "#812843",
  "#5e1a3e",
];

/** The anchors' documented OKLCH coordinates (L, C, hue in degrees). */
const ANCHORS_OKLCH: [number, number, number][] = [
  [0.955, 0.05, 98.0],
  [0.885, 0.1, 88.7],
  [0.81, 0.128, 75.3],
  [0.733, 0.147, 60.5],
  [0.655, 0.152, 46.4],
  [0.576, 0.154, 32.5],
  [0.498, 0.144, 19.0],
  [0.42, 0.124, 5.7],
  [0.34, 0.105, 352.0],
];

function rgb(hex: string): [number, number, number] {
  return [1, 3, 5].map((start) => Number.parseInt(hex.slice(start, start + 2), 16)) as [
    number,
    number,
    number,
  ];
}

function expectedColor(position: number): string {
  const t = Math.min(1, Math.max(0, position)) * 8;
  const index = Math.min(7, Math.floor(t));
  const fraction = t - index;
  const low = rgb(ANCHORS[index] as string);
  const high = rgb(ANCHORS[index + 1] as string);
  return `#${low
    .map((channel, which) => Math.round(channel + fraction * ((high[which] as number) - channel)))
    .map((channel) => channel.toString(16).padStart(2, "0"))
    .join("")}`;
}

/**
 * OKLab to gamma-encoded sRGB (0-1): the matrices of B. Ottosson, "A perceptual color space for
 * image processing" (2020), and the sRGB transfer function of IEC 61966-2-1.
 */
function oklabToSrgb(lightness: number, a: number, b: number): [number, number, number] {
  const l = (lightness + 0.3963377774 * a + 0.2158037573 * b) ** 3;
  const m = (lightness - 0.1055613458 * a - 0.0638541728 * b) ** 3;
  const s = (lightness - 0.0894841775 * a - 1.291485548 * b) ** 3;
  const linear = [
    4.0767416621 * l - 3.3077115913 * m + 0.2309699292 * s,
    -1.2684380046 * l + 2.6097574011 * m - 0.3413193965 * s,
    -0.0041960863 * l - 0.7034186147 * m + 1.707614701 * s,
  ];
  return linear.map((value) =>
    value <= 0.0031308 ? 12.92 * value : 1.055 * value ** (1 / 2.4) - 0.055,
  ) as [number, number, number];
}

/** sRGB (0-255) to OKLab, the inverse of the above (same source). */
function srgbToOklab(color: [number, number, number]): [number, number, number] {
  const [r, g, b] = color.map((channel) => {
    const value = channel / 255;
    return value <= 0.04045 ? value / 12.92 : ((value + 0.055) / 1.055) ** 2.4;
  }) as [number, number, number];
  const l = Math.cbrt(0.4122214708 * r + 0.5363288741 * g + 0.0514459929 * b);
  const m = Math.cbrt(0.2119034982 * r + 0.6806995451 * g + 0.1073969566 * b);
  const s = Math.cbrt(0.0883024619 * r + 0.2817188376 * g + 0.6299787005 * b);
  return [
    0.2104542553 * l + 0.793617785 * m - 0.0040720468 * s,
    1.9779984951 * l - 2.428592205 * m + 0.4505937099 * s,
    0.0259040371 * l + 0.7827717662 * m - 0.808675766 * s,
  ];
}

/** The value each pipe is coloured by, and the scale position, as documented. */
const RULES = {
  mach: (edge: EdgeResult) => Math.max(edge.inlet.mach, edge.outlet.mach),
  pressure: (edge: EdgeResult) => 0.5 * (edge.inlet.pressure + edge.outlet.pressure),
  velocity: (edge: EdgeResult) => Math.max(edge.inlet.velocity, edge.outlet.velocity),
  flow: (edge: EdgeResult) => Math.abs(edge.massFlow),
} as const;

function expectedPositions(quantity: keyof typeof RULES, edges: readonly EdgeResult[]): number[] {
  const values = edges.map(RULES[quantity]);
  if (quantity === "mach") return values.map((value) => Math.sqrt(Math.min(1, value)));
  const low = quantity === "pressure" ? Math.min(...values) : 0;
  const high = Math.max(...values);
  return values.map((value) => (value - low) / (high - low));
}

describe("the ember colour scale", () => {
  it("its anchors are the documented OKLCH colours", () => {
    ANCHORS_OKLCH.forEach(([lightness, chroma, hue], index) => {
      const radians = (hue * Math.PI) / 180;
      const expected = oklabToSrgb(
        lightness,
        chroma * Math.cos(radians),
        chroma * Math.sin(radians),
      );
      const actual = rgb(ANCHORS[index] as string);
      // Tolerance 2 of 255: 8-bit rounding (0.5) plus the OKLCH coordinates printed to 3 digits.
      expected.forEach((channel, which) => {
        expect(Math.abs(channel * 255 - (actual[which] as number))).toBeLessThan(2);
      });
    });
  });

  it("gives the documented examples: emberColor(0.5) and escapeMarkup", () => {
    expect(emberColor(0.5)).toBe(ANCHORS[4]);
    expect(emberColor(0.5)).toBe("#d96e34");
    expect(emberColor(Number.NaN)).toBe("#9aa0a6");
    expect(escapeMarkup('<A&"B">')).toBe("&lt;A&amp;&quot;B&quot;&gt;");
    expect(escapeMarkup("a\u0001b")).toBe("a\ufffdb");
  });

  it("falls in lightness at every step, by near-equal perceptual steps", () => {
    const lab = ANCHORS.map((hex) => srgbToOklab(rgb(hex)));
    for (let index = 1; index < lab.length; index++) {
      const previous = lab[index - 1] as [number, number, number];
      const current = lab[index] as [number, number, number];
      expect(current[0]).toBeLessThan(previous[0] - 0.05);
      const distance = Math.hypot(
        current[0] - previous[0],
        current[1] - previous[1],
        current[2] - previous[2],
      );
      // Equal spacing by design (0.086); 0.08-0.093 allows for 8-bit rounding of the anchors.
      expect(distance).toBeGreaterThan(0.08);
      expect(distance).toBeLessThan(0.093);
    }
  });
});

describe("drawNetworkSvg on the example networks", () => {
  for (const name of EXAMPLE_NAMES) {
    it(`${name}: draws every pipe and every node, by id, once`, () => {
      const { document, result } = example(name);
      const svg = drawNetworkSvg(document, result);
      const json = exampleJson(name);
      const edges = drawnElements(svg, "edge").map((element) =>
        unescapeMarkup(element.attributes["data-id"] ?? ""),
      );
      const nodes = drawnElements(svg, "node").map((element) =>
        unescapeMarkup(element.attributes["data-id"] ?? ""),
      );
      expect(edges).toEqual(json.edges.map((edge) => edge.id));
      expect(nodes).toEqual(json.nodes.map((node) => node.id));
      expect(
        svg.startsWith(
          '<?xml version="1.0" encoding="UTF-8"?>\n<svg xmlns="http://www.w3.org/2000/svg"',
        ),
      ).toBe(true);
      expect(svg.endsWith("</svg>")).toBe(true);
    });

    for (const quantity of ["mach", "pressure", "velocity", "flow"] as const) {
      it(`${name}: pipe colours by ${quantity} follow the documented scale`, () => {
        const { document, result } = example(name);
        const svg = drawNetworkSvg(document, result, { colorBy: quantity, units: "si" });
        const positions = expectedPositions(quantity, result.edges);
        const drawn = drawnElements(svg, "edge");
        expect(drawn).toHaveLength(result.edges.length);
        drawn.forEach((element, index) => {
          const pipe = tagWithClass(element.markup, "mn-pipe");
          const expected = expectedColor(positions[index] as number);
          expect(pipe?.stroke, `${result.edges[index]?.id} by ${quantity}`).toBe(expected);
          expect(element.attributes["data-color"]).toBe(expected);
        });
      });
    }

    it(`${name}: line width grows with the square root of the mass flow`, () => {
      const { document, result } = example(name);
      const svg = drawNetworkSvg(document, result);
      const largest = Math.max(...result.edges.map((edge) => Math.abs(edge.massFlow)));
      drawnElements(svg, "edge").forEach((element, index) => {
        const edge = result.edges[index] as EdgeResult;
        const width = 1.5 + 8.5 * Math.sqrt(Math.abs(edge.massFlow) / largest);
        const pipe = tagWithClass(element.markup, "mn-pipe");
        // The drawing writes widths to 0.1 px.
        expect(Math.abs(Number(pipe?.["stroke-width"]) - width)).toBeLessThanOrEqual(0.05 + 1e-9);
      });
    });

    it(`${name}: gives every node the symbol of its kind`, () => {
      const { document, result } = example(name);
      const svg = drawNetworkSvg(document, result);
      const json = exampleJson(name);
      drawnElements(svg, "node").forEach((element, index) => {
        const node = json.nodes[index];
        const demand = result.nodes[index]?.demand ?? 0;
        const expected =
          node?.kind === "reservoir"
            ? "reservoir"
            : demand > 0
              ? "demand"
              : demand < 0
                ? "injection"
                : "junction";
        expect(element.attributes["data-symbol"]).toBe(expected);
      });
    });

    it(`${name}: puts each element's results in its <title>`, () => {
      const { document, result } = example(name);
      const svg = drawNetworkSvg(document, result, { units: "metric" });
      drawnElements(svg, "edge").forEach((element, index) => {
        const title = unescapeMarkup(element.markup.match(/<title>([^<]*)<\/title>/)?.[1] ?? "");
        const edge = result.edges[index] as EdgeResult;
        expect(title.split("\n")[0]).toBe(`pipe ${edge.id}`);
        const flow = Number(title.match(/\nmass flow: (\S+) kg\/h/)?.[1]);
        // Five significant digits in the title.
        expect(flow).toBeCloseTo(
          edge.massFlow * 3600,
          -Math.floor(Math.log10(Math.abs(edge.massFlow * 3600))) + 3,
        );
      });
    });
  }

  it("marks the choked tailpipe of the vent header, and only it", () => {
    // docs/examples/README.md: TAIL-101, the DN 50 tailpipe after RV-101, is choked.
    const { document, result } = example("vent-collection-header");
    const svg = drawNetworkSvg(document, result);
    for (const element of drawnElements(svg, "edge")) {
      const id = element.attributes["data-id"];
      const choked = id === "TAIL-101";
      expect(element.attributes["data-choked"], id).toBe(String(choked));
      expect(element.attributes.class?.includes("mn-choked"), id).toBe(choked);
      expect(element.markup.includes('class="mn-choke-core"'), id).toBe(choked);
      expect(element.markup.includes('class="mn-choke-mark"'), id).toBe(choked);
      expect(element.markup.includes(">CHOKED</text>"), id).toBe(choked);
      const casing = Number(tagWithClass(element.markup, "mn-casing")?.["stroke-width"]);
      const pipe = Number(tagWithClass(element.markup, "mn-pipe")?.["stroke-width"]);
      // A choked pipe's casing is 7 px wider than its line, a plain one's 2 px.
      expect(casing - pipe).toBeCloseTo(choked ? 7 : 2, 5);
    }
  });

  it("draws no choke marks where nothing chokes", () => {
    const { document, result } = example("workshop-ring-main");
    const svg = drawNetworkSvg(document, result);
    const drawing = svg.slice(svg.indexOf('<g class="mn-drawing"'));
    expect(drawing.includes("mn-choke-core")).toBe(false);
    expect(drawing.includes("mn-choke-mark")).toBe(false);
    expect(drawing.includes(">CHOKED</text>")).toBe(false);
  });

  it("writes the legend in the chosen units", () => {
    const { document, result } = example("workshop-ring-main");
    const legend = (
      quantity: "mach" | "pressure" | "velocity" | "flow",
      units: "si" | "metric" | "us",
    ) => {
      const svg = drawNetworkSvg(document, result, { colorBy: quantity, units });
      return svg.slice(svg.indexOf('<g class="mn-legend"'), svg.indexOf('<g class="mn-drawing"'));
    };
    expect(legend("velocity", "si")).toContain("largest velocity in the pipe [m/s]");
    expect(legend("velocity", "us")).toContain("largest velocity in the pipe [ft/s]");
    expect(legend("pressure", "metric")).toContain("mean static pressure in the pipe [bar(a)]");
    expect(legend("pressure", "us")).toContain("mean static pressure in the pipe [psia]");
    expect(legend("flow", "metric")).toContain("mass flow [kg/h]");
    expect(legend("mach", "us")).toContain(
      "largest Mach number in the pipe (square-root scale) [-]",
    );
    expect(legend("mach", "us")).toContain("Line width by mass flow [lb/h]");
    // The Mach design limit of the workshop (the default 0.5, docs/model.md) is marked.
    expect(legend("mach", "metric")).toContain(">limit 0.500<");
  });

  it("puts velocity ticks inside the range of the pipes' velocities", () => {
    const { document, result } = example("workshop-ring-main");
    const svg = drawNetworkSvg(document, result, { colorBy: "velocity", units: "si" });
    const largest = Math.max(
      ...result.edges.map((edge) => Math.max(edge.inlet.velocity, edge.outlet.velocity)),
    );
    const ticks = [
      ...svg.matchAll(
        /<text class="mn-tick" x="[^"]*" y="[^"]*" text-anchor="middle">([^<]*)<\/text>/g,
      ),
    ].map((match) => Number(match[1]));
    expect(ticks.length).toBeGreaterThanOrEqual(3);
    expect(ticks[0]).toBe(0);
    for (const tick of ticks) expect(tick).toBeLessThanOrEqual(largest);
  });

  it("escapes ids and names that hold markup characters", () => {
    const id = `A&<"1'>`;
    const { document, result } = solved({
      name: `<script>alert("x")</script> & co`,
      gas: { preset: "air" },
      nodes: [
        { id: "REC", kind: "reservoir", pressure: "7 bar(g)", temperature: "20 degC" },
        { id, kind: "junction", demand: "100 kg/h" },
      ],
      edges: [
        { id: `P<1>&"2"`, kind: "pipe", from: "REC", to: id, length: "20 m", diameter: "40 mm" },
      ],
    });
    const svg = drawNetworkSvg(document, result);
    expect(svg).not.toContain(id);
    expect(svg).not.toContain("<script");
    expect(svg).toContain("A&amp;&lt;&quot;1&#39;&gt;");
    expect(svg).toContain("P&lt;1&gt;&amp;&quot;2&quot;");
    expect(
      drawnElements(svg, "node").map((element) =>
        unescapeMarkup(element.attributes["data-id"] ?? ""),
      ),
    ).toEqual(["REC", id]);
  });

  it("is deterministic: the same input gives the same text", () => {
    const { document, result } = example("nitrogen-tank-header");
    expect(drawNetworkSvg(document, result, { colorBy: "pressure" })).toBe(
      drawNetworkSvg(document, result, { colorBy: "pressure" }),
    );
    const again = solved(JSON.parse(JSON.stringify(exampleJson("nitrogen-tank-header"))));
    expect(drawNetworkSvg(again.document, again.result)).toBe(drawNetworkSvg(document, result));
  });
});
