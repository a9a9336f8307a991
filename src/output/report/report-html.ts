/**
 * The report as one self-contained HTML page: the network drawing, the profile charts along a
 * path, the tables and the provenance of the numbers. Inline SVG, CSS and a small script (the
 * details panel on hover and click); nothing loaded from anywhere else, and every value also
 * printed in a table, so that the page reads the same printed and without script.
 */

import type { CheckedDocument } from "../../input/document-types.js";
import type { NetworkResult } from "../../results/result-types.js";
import { displayUnit, type UnitSetName } from "../display-units.js";
import { formatNumber } from "../format-number.js";
import { NOT_A_SOLUTION, notASolutionReason } from "../result-table.js";
import { type ColorQuantity, colorScaleFor, edgeColorValue } from "./color-scale.js";
import { escapeMarkup } from "./escape-markup.js";
import { networkSvgMarkup } from "./network-svg.js";
import { findProfilePath, type ProfilePath } from "./profile-path.js";
import { profilePoints } from "./profile-points.js";
import { profileChartsSvg } from "./profile-svg.js";
import { REPORT_SCRIPT, REPORT_STYLE } from "./report-assets.js";
import {
  definitionListHtml,
  edgesTableHtml,
  nodesTableHtml,
  pipeInputTableHtml,
  profileTableHtml,
  solverEntries,
  warningsHtml,
} from "./report-tables.js";

/** The engineering caution at the foot of every report. */
export const REPORT_CAUTION =
  "Results are engineering estimates. Pressure and relief systems are designed and checked to the applicable codes by qualified engineers.";

/** Options of {@link renderReportHtml}. */
export interface ReportOptions {
  /** What the pipes are coloured by. @defaultValue "mach" */
  colorBy?: ColorQuantity;
  /** Unit set of every number shown. @defaultValue "metric" */
  units?: UnitSetName;
  /** Id of the node the profile runs to. @defaultValue the lowest-pressure node gas flows into */
  profileTo?: string;
  /** Id of the node the profile starts from (a reservoir, usually). @defaultValue found upstream */
  profileFrom?: string;
  /** Name of the input file, as the user gave it. */
  sourceName?: string;
  /** SHA-256 of the input file's bytes, hex. */
  sourceHash?: string;
  /** machnet version. */
  version?: string;
}

function section(id: string, title: string, body: string): string {
  return `<section id="${id}"><h2>${escapeMarkup(title)}</h2>\n${body}\n</section>`;
}

/** Headline figures: lowest pressure, fastest pipe, choked pipes, throughput. */
function keyFigures(
  document: CheckedDocument,
  result: NetworkResult,
  units: UnitSetName,
): [string, string][] {
  const pressure = displayUnit(units, "pressure");
  const velocity = displayUnit(units, "velocity");
  const flow = displayUnit(units, "massFlow");
  const entries: [string, string][] = [];
  const junctions = result.nodes.filter(
    (node) => node.kind === "junction" && Number.isFinite(node.pressure),
  );
  const lowest = junctions.reduce<(typeof junctions)[number] | undefined>(
    (best, node) => (best === undefined || node.pressure < best.pressure ? node : best),
    undefined,
  );
  if (lowest)
    entries.push([
      "lowest junction pressure",
      `${formatNumber(pressure.fromSI(lowest.pressure), 6)} ${pressure.label} at ${lowest.id}`,
    ]);
  const fastest = result.edges.reduce<(typeof result.edges)[number] | undefined>(
    (best, edge) =>
      best === undefined || edgeColorValue(edge, "mach") > edgeColorValue(best, "mach")
        ? edge
        : best,
    undefined,
  );
  if (fastest) {
    entries.push([
      "highest Mach number",
      `${formatNumber(edgeColorValue(fastest, "mach"), 4)} in ${fastest.id} (${formatNumber(velocity.fromSI(edgeColorValue(fastest, "velocity")), 4)} ${velocity.label})`,
    ]);
  }
  const choked = result.edges.filter((edge) => edge.choked).map((edge) => edge.id);
  entries.push(["choked pipes", choked.length === 0 ? "none" : choked.join(", ")]);
  entries.push([
    "throughput",
    `${formatNumber(flow.fromSI(result.balance.throughput))} ${flow.label}`,
  ]);
  entries.push(["pipes, nodes", `${document.edges.length}, ${document.nodes.length}`]);
  return entries;
}

function profileSection(
  document: CheckedDocument,
  result: NetworkResult,
  options: ReportOptions,
  units: UnitSetName,
): string {
  const found = findProfilePath(document, result, {
    ...(options.profileTo !== undefined ? { to: options.profileTo } : {}),
    ...(options.profileFrom !== undefined ? { from: options.profileFrom } : {}),
  });
  if (!found.ok) {
    if (options.profileTo !== undefined || options.profileFrom !== undefined) {
      throw new RangeError(`profile: ${found.message}`);
    }
    return section(
      "profile",
      "Profile",
      `<p class="mn-none">No profile: ${escapeMarkup(found.message)}.</p>`,
    );
  }
  const path: ProfilePath = found.path;
  const points = profilePoints(document, result, path);
  const charts = profileChartsSvg(points, document, result, { units, standalone: false });
  const length = displayUnit(units, "length");
  const total = points.length > 0 ? (points[points.length - 1]?.distance ?? 0) : 0;
  const first = path.nodes[0] ?? "";
  const last = path.nodes[path.nodes.length - 1] ?? "";
  const route = path.nodes
    .map((node, index) => {
      const step = path.steps[index];
      return step
        ? `<span class="mn-route-node">${escapeMarkup(node)}</span> → <span class="mn-route-pipe">${escapeMarkup(step.edgeId)}</span> →`
        : `<span class="mn-route-node">${escapeMarkup(node)}</span>`;
    })
    .join(" ");
  const how =
    options.profileTo === undefined
      ? "to the lowest-pressure node that gas flows into"
      : `to the chosen node ${options.profileTo}`;
  const rule = path.followsFlow
    ? "following upstream the pipe that brings each node its largest inflow"
    : "by the path with the fewest pipes, since the flow from the start does not reach the end; parts of it run against the flow";
  const intro = `<p>From <strong>${escapeMarkup(first)}</strong> ${escapeMarkup(how)}, <strong>${escapeMarkup(last)}</strong>, ${escapeMarkup(rule)}: ${path.steps.length} pipes, ${escapeMarkup(formatNumber(length.fromSI(total)))} ${escapeMarkup(length.label)}. Points inside each pipe from the ${result.edges.some((edge) => edge.model === "isothermal") ? "Fanno and isothermal" : "Fanno"} relations from its inlet state (minor losses spread evenly along the pipe); nodes are plenums, gas at rest.</p>`;
  const routeHtml = `<p class="mn-route" data-path="${escapeMarkup(path.nodes.join(" "))}" data-pipes="${escapeMarkup(path.steps.map((step) => step.edgeId).join(" "))}">${route}</p>`;
  return section(
    "profile",
    "Profile along a path",
    `${intro}\n${routeHtml}\n<figure class="mn-figure">${charts.pressure}</figure>\n<figure class="mn-figure">${charts.mach}</figure>\n${profileTableHtml(points, units)}`,
  );
}

/**
 * The report as one self-contained HTML page.
 *
 * @param document - the checked document the result was solved from
 * @param result - the solve result
 * @param options - colour quantity, unit set, profile ends, provenance (file name, hash, version)
 * @returns HTML text: no external scripts, styles, fonts, images or links
 * @throws RangeError when `profileTo` or `profileFrom` names no node, or no path joins them
 * @remarks Pure and deterministic (no clock: the hash and the version date the numbers). A result
 *   that is not a solution gets a NOT A SOLUTION banner at the top and on the drawing.
 */
export function renderReportHtml(
  document: CheckedDocument,
  result: NetworkResult,
  options: ReportOptions = {},
): string {
  const units = options.units ?? "metric";
  const colorBy = options.colorBy ?? "mach";
  const reason = notASolutionReason(result);
  const name = result.name === "" ? "Network" : result.name;
  const scale = colorScaleFor(colorBy, result, units);
  const pressure = displayUnit(units, "pressure");
  const temperature = displayUnit(units, "temperature");

  const banner =
    reason === undefined
      ? ""
      : `<div class="mn-not-solution" role="alert"><strong>${NOT_A_SOLUTION}</strong><span>${escapeMarkup(reason)}</span><span>The numbers below are the solver's last iterate: do not use them for design.</span></div>`;
  const drawing = networkSvgMarkup(document, result, {
    colorBy,
    units,
    standalone: false,
    idPrefix: "mn-net",
  });
  const provenance: [string, string][] = [
    ["input file", options.sourceName ?? "(not given)"],
    ["SHA-256 of the input file", options.sourceHash ?? "(not given)"],
    ["machnet version", options.version ?? "(not given)"],
    ["unit set", units],
    ["pipes coloured by", `${scale.title}${scale.unit === "-" ? "" : ` [${scale.unit}]`}`],
    [
      "gas",
      `${result.gas.name}; M ${formatNumber(result.gas.molarMass * 1000, 5)} kg/kmol, γ ${formatNumber(result.gas.heatCapacityRatio, 5)}`,
    ],
    [
      "ambient",
      `${formatNumber(pressure.fromSI(result.ambient.pressure), 6)} ${pressure.label}, ${formatNumber(temperature.fromSI(result.ambient.temperature))} ${temperature.label}`,
    ],
  ];

  const body = [
    `<header><p class="mn-kicker">machnet report</p><h1>${escapeMarkup(name)}</h1>`,
    `<p class="mn-meta">${escapeMarkup(`${result.gas.name} · ${document.nodes.length} nodes · ${document.edges.length} pipes · units ${units} · input ${options.sourceName ?? "(not given)"} · machnet ${options.version ?? "(version not given)"}`)}</p></header>`,
    banner,
    section(
      "summary",
      "Summary",
      definitionListHtml("mn-key", keyFigures(document, result, units)),
    ),
    section(
      "network",
      "Network",
      `<figure class="mn-figure mn-drawing-wrap">${drawing}<figcaption>Pipes coloured by ${escapeMarkup(scale.title)}; line width by mass flow; arrows point downstream. Hover over or click a pipe or a node for its full results (each also has a tooltip); the tables below hold every value for print.</figcaption></figure>`,
    ),
    profileSection(document, result, options, units),
    section(
      "results",
      "Results",
      `${nodesTableHtml(document, result, units)}\n${edgesTableHtml(result, units)}\n${pipeInputTableHtml(document, units)}`,
    ),
    section("warnings", "Design checks and warnings", warningsHtml(result)),
    section("solver", "Solver", definitionListHtml("mn-facts", solverEntries(result, units))),
    section("provenance", "Input and provenance", definitionListHtml("mn-facts", provenance)),
    `<footer><p class="mn-caution">${escapeMarkup(REPORT_CAUTION)}</p></footer>`,
  ].join("\n");

  const title = `${reason === undefined ? "" : `${NOT_A_SOLUTION}: `}${name}: machnet report`;
  return [
    "<!DOCTYPE html>",
    '<html lang="en">',
    "<head>",
    '<meta charset="utf-8">',
    `<meta http-equiv="Content-Security-Policy" content="default-src 'none'; style-src 'unsafe-inline'; script-src 'unsafe-inline'">`,
    '<meta name="viewport" content="width=device-width, initial-scale=1">',
    '<meta name="generator" content="machnet">',
    `<title>${escapeMarkup(title)}</title>`,
    `<style>${REPORT_STYLE}</style>`,
    "</head>",
    `<body data-status="${result.status}">`,
    '<main class="mn-report">',
    body,
    "</main>",
    '<aside id="mn-details" class="mn-details" hidden aria-live="polite"><h2></h2><p class="mn-hint"></p><dl></dl></aside>',
    `<script>${REPORT_SCRIPT}</script>`,
    "</body>",
    "</html>",
    "",
  ].join("\n");
}
