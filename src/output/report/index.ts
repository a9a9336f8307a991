/**
 * The visual report: the network drawing as SVG, and the whole report as one self-contained
 * HTML page. Browser-safe (no Node imports), pure and deterministic.
 */

export {
  COLOR_QUANTITIES,
  type ColorQuantity,
  type ColorScale,
  colorScaleFor,
  EMBER_ANCHORS,
  edgeColorValue,
  emberColor,
} from "./color-scale.js";
export { type DrawOptions, drawNetworkSvg } from "./network-svg.js";
export { pipeWidth } from "./pipe-style.js";
export {
  findProfilePath,
  type ProfilePath,
  type ProfilePathOptions,
  type ProfilePathResult,
  type ProfileStep,
} from "./profile-path.js";
export { interiorState, type ProfilePoint, profilePoints } from "./profile-points.js";
export { REPORT_CAUTION, type ReportOptions, renderReportHtml } from "./report-html.js";
