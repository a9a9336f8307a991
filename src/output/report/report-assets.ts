/**
 * The report page's style sheet and its one small script, as strings inlined into the page.
 */

/** The page's style: screen and print. */
export const REPORT_STYLE = `
:root{--ink:#1f2630;--muted:#5b6570;--paper:#f5f3ee;--rule:#d9d4c7;--head:#ebe6da;--alarm:#9b1028;--focus:#0a58ca}
*{box-sizing:border-box}
[hidden]{display:none!important}
html{background:var(--paper);color:var(--ink)}
body{margin:0;font:14px/1.45 system-ui,-apple-system,"Segoe UI",Roboto,"Noto Sans","DejaVu Sans",sans-serif}
.mn-report{max-width:1240px;margin:0 auto;padding:20px 24px 48px;background:#fff;min-height:100vh}
header{border-bottom:4px solid var(--ink);padding-bottom:10px;margin-bottom:18px}
.mn-kicker{margin:0;font-size:12px;letter-spacing:.12em;text-transform:uppercase;color:var(--muted)}
h1{margin:2px 0 4px;font-size:26px;line-height:1.2}
h2{font-size:17px;margin:28px 0 10px;padding-left:10px;border-left:6px solid #d96e34}
.mn-meta{margin:0;color:var(--muted);font-size:13px}
.mn-not-solution{display:flex;flex-direction:column;gap:4px;margin:14px 0 18px;padding:14px 18px;border:4px solid #000;background:var(--alarm);color:#fff;-webkit-print-color-adjust:exact;print-color-adjust:exact}
.mn-not-solution strong{font-size:26px;letter-spacing:.06em}
.mn-figure{margin:0 0 14px}
.mn-drawing-wrap{overflow:auto;border:1px solid var(--rule);max-height:85vh}
.mn-drawing-wrap svg,.mn-figure svg{display:block}
figcaption{font-size:12px;color:var(--muted);padding:6px 8px}
.mn-route{font-family:ui-monospace,"DejaVu Sans Mono",Menlo,Consolas,monospace;font-size:12px;background:var(--paper);padding:6px 8px;border-radius:3px}
.mn-route-node{font-weight:700}
.mn-table-wrap{overflow-x:auto;margin:0 0 16px}
table{border-collapse:collapse;font-size:12px;font-variant-numeric:tabular-nums}
caption{text-align:left;font-weight:700;padding:4px 0}
th,td{padding:3px 8px;border-bottom:1px solid var(--rule);white-space:nowrap}
thead th{background:var(--head);border-bottom:2px solid var(--ink);vertical-align:bottom}
tbody tr:nth-child(even){background:#faf9f5}
.mn-right{text-align:right}.mn-left{text-align:left}
.mn-unit{font-weight:400;color:var(--muted)}
tr.mn-row-choked{background:#f3dfe2!important;font-weight:700}
.mn-warnings-table td{white-space:normal}
dl.mn-key,dl.mn-facts{display:grid;grid-template-columns:max-content 1fr;gap:3px 16px;margin:0}
dl.mn-key dt,dl.mn-facts dt{color:var(--muted)}
dl.mn-key dd,dl.mn-facts dd{margin:0;font-variant-numeric:tabular-nums;overflow-wrap:anywhere}
.mn-none{color:var(--muted)}
.mn-caution{margin-top:28px;padding:10px 12px;border:1px solid var(--ink);font-weight:600}
.mn-details{position:fixed;right:14px;bottom:14px;width:360px;max-height:70vh;overflow:auto;background:#fff;border:2px solid var(--ink);box-shadow:0 6px 18px rgba(0,0,0,.18);padding:8px 12px;font-size:12px;z-index:10}
.mn-details h2{margin:0 0 2px;padding:0;border:0;font-size:14px}
.mn-details .mn-hint{margin:0 0 6px;color:var(--muted);font-size:11px}
.mn-details dl{display:grid;grid-template-columns:max-content 1fr;gap:1px 10px;margin:0}
.mn-details dt{color:var(--muted)}.mn-details dd{margin:0;font-variant-numeric:tabular-nums}
@media print{
  html,.mn-report{background:#fff}
  .mn-report{max-width:none;padding:0}
  .mn-details{display:none!important}
  .mn-drawing-wrap{overflow:visible;max-height:none;border:0}
  .mn-drawing-wrap svg,.mn-figure svg{max-width:100%;height:auto}
  section,figure,table{break-inside:auto}
  figure,tr{break-inside:avoid}
  h2{break-after:avoid}
  .mn-table-wrap{overflow:visible}
  th,td{white-space:normal}
}
@page{margin:12mm}
`;

/**
 * The details panel: hovering over or focusing an element with `data-details` shows the lines of
 * its SVG <title> in the panel; a click pins it (another click or Escape releases it). Text is
 * set with textContent only, so no id can inject markup.
 */
export const REPORT_SCRIPT = `
(function () {
  "use strict";
  var panel = document.getElementById("mn-details");
  if (!panel) return;
  var heading = panel.querySelector("h2");
  var hint = panel.querySelector("p");
  var list = panel.querySelector("dl");
  var pinned = null;
  var active = null;
  function titleOf(element) {
    for (var child = element.firstElementChild; child; child = child.nextElementSibling) {
      if (child.tagName.toLowerCase() === "title") return child.textContent || "";
    }
    return "";
  }
  function show(element) {
    if (active && active !== element) active.classList.remove("mn-active");
    active = element;
    element.classList.add("mn-active");
    var lines = titleOf(element).split("\\n");
    heading.textContent = lines[0] || "";
    while (list.firstChild) list.removeChild(list.firstChild);
    for (var index = 1; index < lines.length; index++) {
      var line = lines[index];
      var at = line.indexOf(": ");
      var term = document.createElement("dt");
      var value = document.createElement("dd");
      term.textContent = at < 0 ? line : line.slice(0, at);
      value.textContent = at < 0 ? "" : line.slice(at + 2);
      list.appendChild(term);
      list.appendChild(value);
    }
    hint.textContent = pinned === element ? "pinned: click again or press Escape to release" : "click to pin";
    panel.hidden = false;
  }
  function detailsTarget(event) {
    var target = event.target;
    return target && target.closest ? target.closest("[data-details]") : null;
  }
  document.addEventListener("mouseover", function (event) {
    var element = detailsTarget(event);
    if (element && !pinned) show(element);
  });
  document.addEventListener("focusin", function (event) {
    var element = detailsTarget(event);
    if (element && !pinned) show(element);
  });
  document.addEventListener("click", function (event) {
    var element = detailsTarget(event);
    if (!element) return;
    pinned = pinned === element ? null : element;
    show(element);
  });
  document.addEventListener("keydown", function (event) {
    if (event.key !== "Escape") return;
    pinned = null;
    panel.hidden = true;
    if (active) active.classList.remove("mn-active");
    active = null;
  });
})();
`;
