/**
 * Benchmark of the visual report on a generated 500-pipe network (not a test): time to solve it,
 * to build the HTML report (layout included) in Node, and to open it in headless Chromium, from
 * navigation to the load event and to the first frame after it.
 *
 * Run after `npm run build`: node benchmarks/report-render.js [repeats]
 * Needs Debian's Chromium at /usr/bin/chromium.
 *
 * The network (invented for this benchmark): a receiver feeds a DN 200 trunk of 20 tees; each tee
 * feeds a DN 80 header of 4 tees; each header tee has DN 25 drops to 5 consumers (4 at the header
 * end, which ties to the next header's end instead); a second receiver feeds the trunk's far end.
 * 20 + 80 + 380 + 19 + 1 = 500 pipes.
 */

import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { pathToFileURL } from "node:url";
import { chromium } from "playwright-core";
import { readNetworkDocument } from "../dist/src/input/read-document.js";
import { renderReportHtml } from "../dist/src/output/report/index.js";
import { solveCheckedDocument } from "../dist/src/solve/solve-network.js";

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

function generatedNetwork() {
  const nodes = [
    { id: "REC-W", kind: "reservoir", pressure: "7 bar(g)", temperature: "25 degC" },
    { id: "REC-E", kind: "reservoir", pressure: "6.9 bar(g)", temperature: "25 degC" },
  ];
  const edges = [];
  const pipe = (id, from, to, length, diameter) =>
    edges.push({ id, kind: "pipe", from, to, length: `${length} m`, diameter, minorLoss: 1 });
  for (let t = 0; t < 20; t++) {
    nodes.push({ id: `T${t}`, kind: "junction" });
    pipe(`TR${t}`, t === 0 ? "REC-W" : `T${t - 1}`, `T${t}`, 15, "154.08 mm");
    for (let h = 0; h < 4; h++) {
      const header = `H${t}-${h}`;
      nodes.push({ id: header, kind: "junction" });
      pipe(`HD${t}-${h}`, h === 0 ? `T${t}` : `H${t}-${h - 1}`, header, 8, "77.92 mm");
      const drops = h === 3 ? 4 : 5;
      for (let d = 0; d < drops; d++) {
        const consumer = `C${t}-${h}-${d}`;
        nodes.push({ id: consumer, kind: "junction", demand: `${8 + ((t + h + d) % 5) * 3} kg/h` });
        pipe(`D${t}-${h}-${d}`, header, consumer, 6 + d, "26.64 mm");
      }
    }
  }
  for (let t = 0; t < 19; t++) pipe(`TIE${t}`, `H${t}-3`, `H${t + 1}-3`, 12, "52.48 mm");
  pipe("TR-E", "REC-E", "T19", 40, "154.08 mm");
  return { name: "generated 500-pipe plant air network", gas: { preset: "air" }, nodes, edges };
}

function median(values) {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.floor(sorted.length / 2)];
}

const repeats = Math.max(1, Number(process.argv[2] ?? 3));
const read = readNetworkDocument(generatedNetwork());
if (!read.ok) throw new Error(read.issues.map((issue) => issue.message).join("\n"));
const document = read.document;

const timings = { solve: [], html: [], load: [], frame: [] };
let html = "";
let result;
for (let run = 0; run < repeats; run++) {
  let start = performance.now();
  result = solveCheckedDocument(document);
  timings.solve.push(performance.now() - start);
  start = performance.now();
  html = renderReportHtml(document, result, { sourceName: "generated", version: "benchmark" });
  timings.html.push(performance.now() - start);
}

const directory = mkdtempSync(join(tmpdir(), "machnet-bench-"));
const file = join(directory, "report.html");
writeFileSync(file, html);
const context = await chromium.launchPersistentContext(join(directory, "profile"), {
  executablePath: CHROMIUM,
  headless: true,
  args: ARGS,
  viewport: { width: 1280, height: 900 },
});
let drawnPipes = 0;
let svgSize = "";
try {
  for (let run = 0; run < repeats; run++) {
    const page = await context.newPage();
    const start = performance.now();
    await page.goto(pathToFileURL(file).href, { waitUntil: "load" });
    timings.load.push(performance.now() - start);
    await page.evaluate(
      () => new Promise((resolve) => requestAnimationFrame(() => requestAnimationFrame(resolve))),
    );
    timings.frame.push(performance.now() - start);
    drawnPipes = await page.locator("svg.mn-network g.mn-edge").count();
    svgSize = await page.evaluate(() => {
      const svg = document.querySelector("svg.mn-network");
      return svg ? `${svg.getAttribute("width")} x ${svg.getAttribute("height")} px` : "";
    });
    await page.close();
  }
} finally {
  await context.close();
  rmSync(directory, { recursive: true, force: true });
}

const rows = [
  ["solve (Node)", timings.solve],
  ["renderReportHtml, layout included (Node)", timings.html],
  ["Chromium: navigation to load event", timings.load],
  ["Chromium: navigation to first frame after load", timings.frame],
];
console.log(
  `network: ${document.nodes.length} nodes, ${document.edges.length} pipes; status ${result.status}`,
);
console.log(
  `report: ${(html.length / 1024).toFixed(0)} KiB of HTML, drawing ${svgSize}, ${drawnPipes} pipes drawn`,
);
console.log(`median of ${repeats} runs:`);
console.log("| step | ms |");
console.log("|---|---:|");
for (const [label, values] of rows) console.log(`| ${label} | ${median(values).toFixed(0)} |`);
