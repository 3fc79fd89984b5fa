/**
 * The sweep's HTML report: one self-contained file (no network: data, styles, script and charts inline).
 * A histogram of risk with the bands, a sortable and filterable table of apps whose rows expand to their
 * findings and what-if figures, and a heatmap of the permissions the sweep flagged most, by category,
 * against the baseline. Charts are inline SVG drawn by the page's own script.
 */
import type { Baseline } from "../baseline/rates.js";
import { CHECKS } from "../score/registry.js";
import type { SweepRow, SweepSummary } from "../ops/sweep/index.js";
import { TOOL_VERSION } from "../version.js";

export interface HtmlReportInput {
  summary: SweepSummary;
  baseline: Baseline;
  baselineName: string;
  caution: string;
  cutPoints?: { elevated?: number; high?: number };
  baseRate?: number;
  title?: string;
  createdAt?: Date;
}

const RATE_CHECKS = new Set(["uncommon-for-category", "sensitive-uncommon"]);

/** The permissions most often flagged as uncommon, with sweep and baseline rates per category. */
export function heatmapData(rows: SweepRow[], baseline: Baseline, top = 15) {
  const flagged = new Map<string, number>();
  for (const r of rows) for (const f of r.findings ?? []) if (RATE_CHECKS.has(f.checkId)) flagged.set(f.subject, (flagged.get(f.subject) ?? 0) + 1);
  const permissions = [...flagged.entries()].sort((a, b) => b[1] - a[1] || a[0].localeCompare(b[0])).slice(0, top).map(([p]) => p);
  // Apps judged against all categories pooled get a column of their own.
  const POOLED = "(pooled)";
  const scored = rows.filter((r) => r.status === "scored");
  const categories = [...new Set(scored.map((r) => r.category ?? POOLED))].sort((a, b) => (a === POOLED ? 1 : b === POOLED ? -1 : a.localeCompare(b)));
  const cells = permissions.map((p) =>
    categories.map((c) => {
      const inCat = scored.filter((r) => (r.category ?? POOLED) === c);
      const k = inCat.filter((r) => r.permissions?.includes(p)).length;
      const b = baseline.rate(c === POOLED ? undefined : c, p);
      return { sweep: inCat.length ? k / inCat.length : 0, sweepN: inCat.length, baseline: b.n ? b.k / b.n : 0, baselineN: b.n };
    }),
  );
  return { permissions, categories, cells, flaggedCounts: permissions.map((p) => flagged.get(p) ?? 0) };
}

function safeJson(value: unknown): string {
  return JSON.stringify(value).replace(/</g, "\\u003c").replace(/\u2028/g, "\\u2028").replace(/\u2029/g, "\\u2029");
}

function esc(s: string): string {
  return s.replace(/[&<>"]/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;" })[c]!);
}

export function sweepToHtml(input: HtmlReportInput): string {
  const { summary } = input;
  const rows = summary.rows();
  const data = {
    tool: `overask ${TOOL_VERSION}`,
    baseline: input.baselineName,
    caution: input.caution,
    cutPoints: input.cutPoints ?? {},
    baseRate: input.baseRate ?? null,
    checks: CHECKS.map((c) => ({ id: c.meta.id, title: c.meta.title })),
    rows: rows.map((r) => ({
      id: r.id,
      package: r.package ?? null,
      category: r.category ?? null,
      fallback: r.fallback ?? null,
      risk: r.risk ?? null,
      band: r.band ?? null,
      status: r.status,
      counts: r.counts ?? null,
      findings: r.findings ?? [],
      whatIf: r.whatIf ?? [],
      error: r.error?.message ?? null,
    })),
    heatmap: heatmapData(rows, input.baseline),
    totals: { inputs: summary.inputs, scored: summary.scored, failed: summary.failed, byBand: summary.byBand },
  };
  const title = input.title ?? "overask sweep report";
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>${esc(title)}</title>
<style>
  :root { --low: #4f7f5a; --elevated: #c28a1e; --high: #b23a3a; --ink: #1d232b; --muted: #5d6875; --rule: #d5dbe2; }
  * { box-sizing: border-box; }
  body { font: 14px/1.45 system-ui, -apple-system, "Segoe UI", sans-serif; color: var(--ink); margin: 0 auto; max-width: 1200px; padding: 24px; }
  h1 { font-size: 22px; margin: 0 0 4px; }
  h2 { font-size: 17px; margin: 28px 0 8px; border-bottom: 1px solid var(--rule); padding-bottom: 4px; }
  .meta, .caution { color: var(--muted); }
  .caution { border-left: 3px solid var(--elevated); padding: 6px 10px; background: #fbf6ea; margin: 12px 0; }
  .tiles { display: flex; gap: 12px; flex-wrap: wrap; margin: 12px 0; }
  .tile { border: 1px solid var(--rule); border-radius: 6px; padding: 8px 14px; min-width: 110px; }
  .tile b { display: block; font-size: 20px; }
  .band-low { color: var(--low); } .band-elevated { color: var(--elevated); } .band-high { color: var(--high); }
  .filters { display: flex; gap: 10px; flex-wrap: wrap; align-items: center; margin: 8px 0; }
  .filters label { color: var(--muted); font-size: 13px; }
  select, input[type=search] { font: inherit; padding: 3px 6px; }
  table { border-collapse: collapse; width: 100%; }
  th, td { text-align: left; padding: 5px 8px; border-bottom: 1px solid var(--rule); vertical-align: top; }
  th { cursor: pointer; user-select: none; white-space: nowrap; background: #f4f6f8; }
  th[aria-sort=ascending]::after { content: " ▲"; } th[aria-sort=descending]::after { content: " ▼"; }
  td.num { text-align: right; font-variant-numeric: tabular-nums; }
  tr.app { cursor: pointer; } tr.app:hover { background: #f7f9fb; }
  tr.details td { background: #fafbfc; }
  tr.details ul { margin: 4px 0 4px 18px; padding: 0; }
  .pill { display: inline-block; border-radius: 9px; padding: 0 8px; font-size: 12px; color: #fff; }
  .pill.low { background: var(--low); } .pill.elevated { background: var(--elevated); } .pill.high { background: var(--high); } .pill.failed { background: #6b7280; }
  .lvl-warning { color: var(--elevated); } .lvl-error { color: var(--high); } .lvl-note { color: var(--muted); }
  svg text { font: 11px system-ui, sans-serif; fill: var(--ink); }
  .heat td { text-align: center; font-size: 12px; font-variant-numeric: tabular-nums; }
  .heat th { cursor: default; }
  .legend { color: var(--muted); font-size: 12px; }
  @media print {
    body { max-width: none; padding: 0; }
    .filters, .noprint { display: none; }
    tr.details { display: table-row !important; }
    th { background: none; }
    a { color: inherit; }
  }
</style>
</head>
<body>
<h1>${esc(title)}</h1>
<div class="meta" id="meta"></div>
<div class="caution" id="caution"></div>
<div class="tiles" id="tiles"></div>

<h2>Risk across the inventory</h2>
<div id="histogram" role="img" aria-label="Histogram of the risk estimates, coloured by band"></div>
<div class="legend" id="histogram-legend"></div>

<h2>Apps</h2>
<div class="filters">
  <label>Category <select id="f-category"><option value="">all</option></select></label>
  <label>Band <select id="f-band"><option value="">all</option><option>high</option><option>elevated</option><option>low</option><option value="failed">could not be read</option></select></label>
  <label>Check <select id="f-check"><option value="">any</option></select></label>
  <label>Search <input type="search" id="f-text" placeholder="package or file"></label>
  <span class="legend" id="shown"></span>
</div>
<table id="apps">
  <thead><tr>
    <th data-key="app" aria-sort="none">App</th>
    <th data-key="category" aria-sort="none">Category</th>
    <th data-key="risk" aria-sort="descending">Risk</th>
    <th data-key="band" aria-sort="none">Band</th>
    <th data-key="warnings" aria-sort="none">Warnings</th>
    <th data-key="notes" aria-sort="none">Notes</th>
  </tr></thead>
  <tbody></tbody>
</table>
<p class="legend noprint">Click a row for its findings and for what removing a permission would do to its risk.</p>

<h2>Permissions flagged most, by category</h2>
<p class="legend">Each cell: share of swept apps of the category requesting the permission, and below it the share in the baseline. Darker: requested more often than the baseline would suggest.</p>
<div id="heatmap"></div>

<script type="application/json" id="data">${safeJson(data)}</script>
<script>
(function () {
  "use strict";
  var data = JSON.parse(document.getElementById("data").textContent);
  var pct = function (x) { return x == null ? "—" : (100 * x).toFixed(x < 0.1 ? 1 : 0) + "%"; };
  var el = function (tag, attrs, text) {
    var e = document.createElement(tag);
    if (attrs) Object.keys(attrs).forEach(function (k) { e.setAttribute(k, attrs[k]); });
    if (text != null) e.textContent = text;
    return e;
  };
  var short = function (p) { return p.replace(/^android\\.permission\\./, ""); };

  document.getElementById("meta").textContent = data.rows.length + " apps · baseline: " + data.baseline + " · " + data.tool;
  document.getElementById("caution").textContent = data.caution;
  var tiles = document.getElementById("tiles");
  [["scored", data.totals.scored, ""], ["could not be read", data.totals.failed, ""],
   ["high", data.totals.byBand.high || 0, "band-high"], ["elevated", data.totals.byBand.elevated || 0, "band-elevated"], ["low", data.totals.byBand.low || 0, "band-low"]]
    .forEach(function (t) { var d = el("div", { class: "tile" }); var b = el("b", { class: t[2] }, String(t[1])); d.appendChild(b); d.appendChild(document.createTextNode(t[0])); tiles.appendChild(d); });

  // Histogram: 20 bins over [0, 1], each bar stacked by the bands of the apps in it.
  (function () {
    var order = ["low", "elevated", "high"];
    var bins = []; for (var k = 0; k < 20; k++) bins.push({ low: 0, elevated: 0, high: 0 });
    data.rows.forEach(function (r) { if (r.risk != null) bins[Math.min(19, Math.floor(r.risk * 20))][r.band || "low"]++; });
    var totals = bins.map(function (b) { return b.low + b.elevated + b.high; });
    var max = Math.max.apply(null, totals.concat([1]));
    var W = 740, H = 200, L = 40, R = 30, B = 28, bw = (W - L - R) / 20;
    var cut = data.cutPoints || {};
    var colour = { low: "#4f7f5a", elevated: "#c28a1e", high: "#b23a3a" };
    var svg = '<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 ' + W + ' ' + H + '" width="100%" style="max-width:' + W + 'px">';
    for (var i = 0; i < 20; i++) {
      var y = H - B, x = L + i * bw;
      order.forEach(function (band) {
        var n = bins[i][band]; if (!n) return;
        var h = (H - B - 10) * n / max; y -= h;
        svg += '<rect x="' + (x + 1).toFixed(1) + '" y="' + y.toFixed(1) + '" width="' + (bw - 2).toFixed(1) + '" height="' + h.toFixed(1) + '" fill="' + colour[band] + '"><title>' + (i * 5) + "–" + (i * 5 + 5) + "%: " + n + " " + band + '</title></rect>';
      });
    }
    ["elevated", "high"].forEach(function (b) {
      if (cut[b] == null) return;
      var cx = L + cut[b] * 20 * bw;
      svg += '<line x1="' + cx.toFixed(1) + '" y1="8" x2="' + cx.toFixed(1) + '" y2="' + (H - B) + '" stroke="' + colour[b] + '" stroke-dasharray="4 3"/>';
    });
    svg += '<line x1="' + L + '" y1="' + (H - B) + '" x2="' + (W - R) + '" y2="' + (H - B) + '" stroke="#5d6875"/>';
    for (var t = 0; t <= 10; t += 2) svg += '<text x="' + (L + t * 2 * bw) + '" y="' + (H - 10) + '" text-anchor="middle">' + (t * 10) + '%</text>';
    svg += '<text x="' + (L - 6) + '" y="16" text-anchor="end">' + max + '</text><text x="' + (L - 6) + '" y="' + (H - B) + '" text-anchor="end">0</text>';
    svg += "</svg>";
    document.getElementById("histogram").innerHTML = svg;
    var legend = "Risk estimate (x) and number of apps (y); dashed lines mark where the bands begin.";
    if (cut.elevated != null) legend += " Elevated from " + pct(cut.elevated) + ";";
    if (cut.high != null) legend += " high from " + pct(cut.high) + ".";
    if (data.baseRate != null) legend += " Base rate of the labeled corpus: " + pct(data.baseRate) + ".";
    document.getElementById("histogram-legend").textContent = legend;
  })();

  // Table: sorting, filtering, expandable rows.
  var cats = Array.from(new Set(data.rows.map(function (r) { return r.category; }).filter(Boolean))).sort();
  var fc = document.getElementById("f-category");
  cats.forEach(function (c) { fc.appendChild(el("option", { value: c }, c)); });
  fc.appendChild(el("option", { value: "(pooled)" }, "(no category: pooled)"));
  var fk = document.getElementById("f-check");
  data.checks.forEach(function (c) { fk.appendChild(el("option", { value: c.id }, c.id)); });
  var state = { key: "risk", dir: -1 };
  var value = function (r, key) {
    switch (key) {
      case "app": return (r.package || r.id).toLowerCase();
      case "category": return r.category || "";
      case "risk": return r.risk == null ? -1 : r.risk;
      case "band": return { high: 3, elevated: 2, low: 1 }[r.band] || 0;
      case "warnings": return r.counts ? r.counts.warning + 100 * r.counts.error : -1;
      case "notes": return r.counts ? r.counts.note : -1;
    }
  };
  var tbody = document.querySelector("#apps tbody");
  function render() {
    var cat = fc.value, bandF = document.getElementById("f-band").value, check = fk.value, text = document.getElementById("f-text").value.toLowerCase();
    var rows = data.rows.filter(function (r) {
      if (cat && (cat === "(pooled)" ? r.category : r.category !== cat)) return false;
      if (bandF && (bandF === "failed" ? r.status !== "failed" : r.band !== bandF)) return false;
      if (check && !r.findings.some(function (f) { return f.checkId === check; })) return false;
      if (text && (r.package || "").toLowerCase().indexOf(text) < 0 && r.id.toLowerCase().indexOf(text) < 0) return false;
      return true;
    });
    rows.sort(function (a, b) { var x = value(a, state.key), y = value(b, state.key); return x < y ? -state.dir : x > y ? state.dir : a.id < b.id ? -1 : 1; });
    tbody.textContent = "";
    rows.forEach(function (r) {
      var tr = el("tr", { class: "app", tabindex: "0", "data-id": r.id });
      var app = el("td"); app.appendChild(el("div", null, r.package || "(unreadable)")); app.appendChild(el("div", { class: "legend" }, r.id));
      tr.appendChild(app);
      tr.appendChild(el("td", null, r.category || (r.status === "failed" ? "" : "pooled")));
      tr.appendChild(el("td", { class: "num" }, pct(r.risk)));
      var b = el("td"); b.appendChild(el("span", { class: "pill " + (r.status === "failed" ? "failed" : r.band || "") }, r.status === "failed" ? "failed" : r.band || "—")); tr.appendChild(b);
      tr.appendChild(el("td", { class: "num" }, r.counts ? String(r.counts.warning + r.counts.error) : "—"));
      tr.appendChild(el("td", { class: "num" }, r.counts ? String(r.counts.note) : "—"));
      var details = el("tr", { class: "details", hidden: "" });
      var td = el("td", { colspan: "6" });
      if (r.error) td.appendChild(el("div", { class: "lvl-error" }, "Could not be read: " + r.error));
      if (r.findings.length) {
        var ul = el("ul");
        r.findings.forEach(function (f) { var li = el("li"); li.appendChild(el("span", { class: "lvl-" + f.level }, f.level + " ")); li.appendChild(document.createTextNode(short(f.subject) + " — " + f.checkId)); ul.appendChild(li); });
        td.appendChild(ul);
      } else if (!r.error) td.appendChild(el("div", null, "No findings."));
      if (r.whatIf.length) {
        td.appendChild(el("div", { class: "legend" }, "Without one permission:"));
        var ul2 = el("ul");
        r.whatIf.forEach(function (w) { ul2.appendChild(el("li", null, short(w.permission) + ": " + pct(r.risk) + " → " + pct(w.without))); });
        td.appendChild(ul2);
      }
      details.appendChild(td);
      var toggle = function () { if (details.hasAttribute("hidden")) details.removeAttribute("hidden"); else details.setAttribute("hidden", ""); };
      tr.addEventListener("click", toggle);
      tr.addEventListener("keydown", function (e) { if (e.key === "Enter" || e.key === " ") { e.preventDefault(); toggle(); } });
      tbody.appendChild(tr);
      tbody.appendChild(details);
    });
    document.getElementById("shown").textContent = rows.length + " of " + data.rows.length + " shown";
  }
  document.querySelectorAll("#apps th").forEach(function (th) {
    th.addEventListener("click", function () {
      var key = th.getAttribute("data-key");
      state.dir = state.key === key ? -state.dir : (key === "app" || key === "category" ? 1 : -1);
      state.key = key;
      document.querySelectorAll("#apps th").forEach(function (o) { o.setAttribute("aria-sort", "none"); });
      th.setAttribute("aria-sort", state.dir > 0 ? "ascending" : "descending");
      render();
    });
  });
  ["f-category", "f-band", "f-check"].forEach(function (id) { document.getElementById(id).addEventListener("change", render); });
  document.getElementById("f-text").addEventListener("input", render);
  render();

  // Heatmap: sweep share vs baseline share per category, shaded by how far the sweep exceeds the baseline.
  (function () {
    var h = data.heatmap, box = document.getElementById("heatmap");
    if (!h.permissions.length || !h.categories.length) { box.appendChild(el("p", { class: "legend" }, "No permission was flagged as uncommon for a category.")); return; }
    var t = el("table", { class: "heat" }), head = el("tr");
    head.appendChild(el("th", null, "Permission (times flagged)"));
    h.categories.forEach(function (c) { head.appendChild(el("th", null, c)); });
    var thead = el("thead"); thead.appendChild(head); t.appendChild(thead);
    var body = el("tbody");
    h.permissions.forEach(function (p, i) {
      var tr = el("tr"); tr.appendChild(el("th", null, short(p) + " (" + h.flaggedCounts[i] + ")"));
      h.cells[i].forEach(function (c) {
        var excess = Math.max(0, Math.min(1, (c.sweep - c.baseline) * 4));
        var td = el("td", { title: "swept: " + pct(c.sweep) + " of " + c.sweepN + " · baseline: " + pct(c.baseline) + " of " + c.baselineN });
        td.style.background = "rgba(178, 58, 58, " + (0.08 + 0.6 * excess).toFixed(2) + ")";
        td.appendChild(el("div", null, pct(c.sweep)));
        td.appendChild(el("div", { class: "legend" }, pct(c.baseline)));
        tr.appendChild(td);
      });
      body.appendChild(tr);
    });
    t.appendChild(body); box.appendChild(t);
  })();
})();
</script>
</body>
</html>
`;
}
