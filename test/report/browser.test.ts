/**
 * The report of each example network in a real browser: Debian's Chromium, headless, driven by
 * playwright-core. The page opens from a file:// URL with no console errors and no request for
 * anything but itself, draws one pipe per edge, shows a pipe's results on hover and a node's on
 * click, and leaves a screenshot in test-artifacts/ (gitignored) for a person to look at.
 *
 * Chromium is required: without /usr/bin/chromium these tests fail with how to install it
 * (`.ci/run` installs it with apt-get).
 */
import { existsSync, mkdirSync, mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { pathToFileURL } from "node:url";
import { type BrowserContext, chromium } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { drawNetworkSvg } from "../../src/output/report/network-svg.js";
import { renderReportHtml } from "../../src/output/report/report-html.js";
import { EXAMPLE_NAMES, example, exampleJson } from "../output/report-examples.js";

const CHROMIUM = "/usr/bin/chromium";
const ARGS = [
  "--headless",
  "--no-sandbox",
  "--disable-gpu",
  "--no-first-run",
  "--disable-background-networking",
  "--disable-component-update",
  "--disable-sync",
  "--disable-quic",
];
const ARTIFACTS = new URL("../../test-artifacts/", import.meta.url);

/** The parts of the page's DOM the test calls (the type check runs without the DOM library). */
interface PolylineInPage {
  getTotalLength(): number;
  getPointAtLength(distance: number): {
    matrixTransform(matrix: unknown): { x: number; y: number };
  };
  getScreenCTM(): unknown;
}
interface PageGlobals {
  DOMParser: new () => {
    parseFromString(
      text: string,
      type: string,
    ): {
      querySelector(selector: string): { textContent: string | null } | null;
      querySelectorAll(selector: string): { length: number };
    };
  };
}

let context: BrowserContext | undefined;
let launchError = "";
let workDirectory = "";

describe("the report in headless Chromium", () => {
  beforeAll(async () => {
    // A missing browser fails each test below (not this hook, which would only skip them).
    if (!existsSync(CHROMIUM)) return;
    workDirectory = mkdtempSync(join(tmpdir(), "machnet-browser-"));
    mkdirSync(ARTIFACTS, { recursive: true });
    try {
      context = await chromium.launchPersistentContext(join(workDirectory, "profile"), {
        executablePath: CHROMIUM,
        headless: true,
        args: ARGS,
        viewport: { width: 1280, height: 900 },
      });
    } catch (error) {
      launchError = error instanceof Error ? error.message : String(error);
    }
  }, 30_000);

  afterAll(async () => {
    await context?.close();
    if (workDirectory !== "") rmSync(workDirectory, { recursive: true, force: true });
  });

  for (const name of EXAMPLE_NAMES) {
    it(`${name}: opens cleanly, draws every pipe, and shows results on hover and click`, async () => {
      if (!existsSync(CHROMIUM)) {
        throw new Error(
          `Chromium is not installed at ${CHROMIUM}: the browser tests need it. Install it with "sudo apt-get install chromium" (Debian; .ci/run does this).`,
        );
      }
      if (!context) throw new Error(`Chromium did not start: ${launchError}`);
      const { document, result } = example(name);
      const json = exampleJson(name);
      const file = join(workDirectory, `${name}.html`);
      writeFileSync(
        file,
        renderReportHtml(document, result, { sourceName: `${name}.json`, version: "test" }),
      );
      const url = pathToFileURL(file).href;

      const page = await context.newPage();
      const errors: string[] = [];
      const requests: string[] = [];
      page.on("console", (message) => {
        if (message.type() === "error" || message.type() === "warning") errors.push(message.text());
      });
      page.on("pageerror", (error) => errors.push(error.message));
      page.on("request", (request) => requests.push(request.url()));
      await page.goto(url, { waitUntil: "load" });

      // Nothing but the page itself is fetched: the report is self-contained.
      expect(requests).toEqual([url]);
      expect(await page.locator("svg.mn-network g.mn-edge").count()).toBe(json.edges.length);
      expect(await page.locator("svg.mn-network g.mn-node").count()).toBe(json.nodes.length);
      expect(await page.locator("svg.mn-chart").count()).toBe(2);

      // Hover over the first pipe, a quarter of the way along its line.
      const edge = result.edges[0];
      if (!edge) throw new Error("no edge");
      const pipe = page.locator("svg.mn-network g.mn-edge").first().locator("polyline.mn-pipe");
      const point = await pipe.evaluate((line: PolylineInPage) => {
        const at = line.getPointAtLength(0.25 * line.getTotalLength());
        const matrix = line.getScreenCTM();
        if (!matrix) throw new Error("no screen transform");
        const screen = at.matrixTransform(matrix);
        return { x: screen.x, y: screen.y };
      });
      expect(await page.locator("#mn-details").isHidden()).toBe(true);
      await page.mouse.move(point.x, point.y);
      const panel = page.locator("#mn-details");
      await expect.poll(() => panel.isVisible()).toBe(true);
      expect(await panel.locator("h2").textContent()).toBe(`pipe ${edge.id}`);
      const terms = await panel.locator("dt").allTextContents();
      const values = await panel.locator("dd").allTextContents();
      const flowText = values[terms.indexOf("mass flow")] ?? "";
      // Metric units: kg/h; five significant digits in the panel.
      expect(flowText).toMatch(/ kg\/h$/);
      const flow = Number.parseFloat(flowText);
      expect(Math.abs(flow / (edge.massFlow * 3600) - 1)).toBeLessThan(1e-4);
      expect(values[terms.indexOf("status")]).toBe(edge.choked ? "CHOKED" : "subsonic");
      await page.screenshot({ path: new URL(`report-${name}-hover.png`, ARTIFACTS).pathname });

      // Click a node: the panel shows and pins it.
      const node = result.nodes[result.nodes.length - 1];
      if (!node) throw new Error("no node");
      await page.locator("svg.mn-network g.mn-node").last().locator(".mn-symbol").click();
      expect(await panel.locator("h2").textContent()).toMatch(
        new RegExp(`${node.id.replace(/[-]/g, "\\-")}$`),
      );
      expect(await panel.locator(".mn-hint").textContent()).toMatch(/^pinned/);

      // The standalone SVG parses as XML.
      const svg = drawNetworkSvg(document, result);
      const parsed = await page.evaluate((text) => {
        const { DOMParser } = globalThis as unknown as PageGlobals;
        const parsedDocument = new DOMParser().parseFromString(text, "image/svg+xml");
        return {
          error: parsedDocument.querySelector("parsererror")?.textContent ?? "",
          edges: parsedDocument.querySelectorAll("g.mn-edge").length,
        };
      }, svg);
      expect(parsed).toEqual({ error: "", edges: json.edges.length });

      await page.screenshot({
        path: new URL(`report-${name}.png`, ARTIFACTS).pathname,
        fullPage: true,
      });
      expect(errors).toEqual([]);
      await page.close();
    }, 30_000);
  }
});
