/**
 * The sweep report's script, run in the reader's browser. It reads the data embedded in the page and draws
 * the tiles, the risk histogram (inline SVG), the sortable and filterable table of apps, and the heatmap.
 * Compiled and inlined into the page at build time (scripts/gen.mjs); no network, no libraries.
 */
import type { PageData, PageRow } from "../page-data.js";
import { pct, short } from "../../format.js";

const pctOrDash = (x: number | null | undefined) => (x == null ? "—" : pct(x));
const data = JSON.parse(document.getElementById("data")!.textContent ?? "{}") as PageData;
const byId = <T extends HTMLElement = HTMLElement>(id: string) => document.getElementById(id) as T;

function el(tag: string, attrs?: Record<string, string> | null, text?: string | null): HTMLElement {
  const e = document.createElement(tag);
  if (attrs) for (const k of Object.keys(attrs)) e.setAttribute(k, attrs[k]);
  if (text != null) e.textContent = text;
  return e;
}

byId("meta").textContent = `${data.totals.inputs} apps · baseline: ${data.baseline} · ${data.tool}`;
if (!data.summary.complete) {
  byId("partial").hidden = false;
  byId("results").textContent = data.summary.results;
}
byId("caution").textContent = data.caution;

const tiles = byId("tiles");
const tileList: [string, number, string][] = [
  ["scored", data.totals.scored, ""],
  ["could not be read", data.totals.failed, ""],
  ["high", data.totals.byBand.high || 0, "band-high"],
  ["elevated", data.totals.byBand.elevated || 0, "band-elevated"],
  ["low", data.totals.byBand.low || 0, "band-low"],
];
for (const [label, n, cls] of tileList) {
  const d = el("div", { class: "tile" });
  d.appendChild(el("b", { class: cls }, String(n)));
  d.appendChild(document.createTextNode(label));
  tiles.appendChild(d);
}

/** Histogram: 20 bins over [0, 1], each bar stacked by the bands of the apps in it. */
function drawHistogram(): void {
  const order = ["low", "elevated", "high"] as const;
  type Band = (typeof order)[number];
  // Counted over every app of the sweep, not only the rows this page holds.
  const bins: Record<Band, number>[] = data.summary.histogram.map((b) => ({ low: b.low ?? 0, elevated: b.elevated ?? 0, high: b.high ?? 0 }));
  const totals = bins.map((b) => b.low + b.elevated + b.high);
  const max = Math.max(...totals, 1);
  // As wide as the page (1,150 units across its 1,200-pixel column), so the bars are not squeezed into half of it.
  const W = 1150, H = 220, L = 40, R = 30, B = 28, bw = (W - L - R) / 20;
  const cut = data.cutPoints || {};
  const colour: Record<Band, string> = { low: "#4f7f5a", elevated: "#c28a1e", high: "#b23a3a" };
  let svg = `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 ${W} ${H}" width="100%">`;
  for (let i = 0; i < 20; i++) {
    let y = H - B;
    const x = L + i * bw;
    for (const band of order) {
      const n = bins[i][band];
      if (!n) continue;
      const h = ((H - B - 10) * n) / max;
      y -= h;
      svg += `<rect x="${(x + 1).toFixed(1)}" y="${y.toFixed(1)}" width="${(bw - 2).toFixed(1)}" height="${h.toFixed(1)}" fill="${colour[band]}"><title>${i * 5}–${i * 5 + 5}%: ${n} ${band}</title></rect>`;
    }
  }
  for (const b of ["elevated", "high"] as const) {
    const at = cut[b];
    if (at == null) continue;
    const cx = L + at * 20 * bw;
    svg += `<line x1="${cx.toFixed(1)}" y1="8" x2="${cx.toFixed(1)}" y2="${H - B}" stroke="${colour[b]}" stroke-dasharray="4 3"/>`;
  }
  svg += `<line x1="${L}" y1="${H - B}" x2="${W - R}" y2="${H - B}" stroke="#5d6875"/>`;
  for (let t = 0; t <= 10; t += 2) svg += `<text x="${L + t * 2 * bw}" y="${H - 10}" text-anchor="middle">${t * 10}%</text>`;
  svg += `<text x="${L - 6}" y="16" text-anchor="end">${max}</text><text x="${L - 6}" y="${H - B}" text-anchor="end">0</text>`;
  svg += "</svg>";
  byId("histogram").innerHTML = svg;
  let legend = "Risk estimate (x) and number of apps (y); dashed lines mark where the bands begin.";
  if (cut.elevated != null) legend += ` Elevated from ${pctOrDash(cut.elevated)};`;
  if (cut.high != null) legend += ` high from ${pctOrDash(cut.high)}.`;
  if (data.baseRate != null) legend += ` Base rate of the labeled corpus: ${pctOrDash(data.baseRate)}.`;
  byId("histogram-legend").textContent = legend;
}
drawHistogram();

// Table: sorting, filtering, expandable rows.
const categoryFilter = byId<HTMLSelectElement>("f-category");
for (const c of Object.keys(data.summary.byCategory).filter((c) => c !== "(pooled)").sort()) categoryFilter.appendChild(el("option", { value: c }, `${c} (${data.summary.byCategory[c]})`));
categoryFilter.appendChild(el("option", { value: "(pooled)" }, `(no category: pooled) (${data.summary.byCategory["(pooled)"] ?? 0})`));
const checkFilter = byId<HTMLSelectElement>("f-check");
for (const c of data.checks) checkFilter.appendChild(el("option", { value: c.id }, `${c.id} (${data.summary.byCheck[c.id] ?? 0})`));
const bandFilter = byId<HTMLSelectElement>("f-band");
const textFilter = byId<HTMLInputElement>("f-text");
const atypicalFilter = byId<HTMLSelectElement>("f-atypical");
const codeFilter = byId<HTMLSelectElement>("f-code");

/** Whether a row passes the code-evidence filter. */
function codeMatches(r: PageRow, want: string): boolean {
  const c = r.code;
  switch (want) {
    case "not-seen": return !!c && c.notSeen.length + (c.unreached?.length ?? 0) > 0;
    case "library-only": return !!c && c.libraryOnly.length > 0;
    case "problems": return !!c && c.problems.length > 0;
    case "none": return !c && r.status === "scored";
    default: return true;
  }
}

const state = { key: "risk", dir: -1 };
function sortValue(r: PageRow, key: string): string | number {
  switch (key) {
    case "app": return (r.package || r.id).toLowerCase();
    case "category": return r.category || "";
    case "risk": return r.risk == null ? -1 : r.risk;
    case "band": return ({ high: 3, elevated: 2, low: 1 } as Record<string, number>)[r.band ?? ""] || 0;
    case "atypicality": return r.atypicality == null ? -1 : r.atypicality;
    case "errors": return r.counts ? r.counts.error * 1e6 + r.counts.warning * 1e3 + r.counts.note : -1;
    case "warnings": return r.counts ? r.counts.warning * 1e3 + r.counts.note : -1;
    case "notes": return r.counts ? r.counts.note : -1;
    case "code": return r.code ? r.code.notSeen.length + (r.code.unreached?.length ?? 0) : -1;
    default: return 0;
  }
}

/** The category an app was judged against, or the one it asked for and why it fell back to all apps pooled. */
function categoryCell(r: PageRow): string {
  if (r.status === "failed") return "";
  if (r.category) return r.category;
  const why = r.fallback === "unknown-category" ? "not in the baseline" : r.fallback === "below-min-support" ? "too few apps in the baseline" : "none given or declared";
  return r.requestedCategory ? `${r.requestedCategory} (pooled: ${why})` : `pooled (${why})`;
}

const tbody = document.querySelector("#apps tbody")!;
function render(): void {
  const cat = categoryFilter.value, band = bandFilter.value, check = checkFilter.value, text = textFilter.value.toLowerCase();
  const atypicalAbove = atypicalFilter.value === "" ? -1 : Number(atypicalFilter.value);
  const rows = data.rows.filter((r) => {
    if (cat && (cat === "(pooled)" ? r.category : r.category !== cat)) return false;
    if (band && (band === "failed" ? r.status !== "failed" : r.band !== band)) return false;
    if (check && !r.findings.some((f) => f.checkId === check)) return false;
    if (!codeMatches(r, codeFilter.value)) return false;
    if (atypicalAbove >= 0 && !(r.atypicality != null && r.atypicality > atypicalAbove)) return false;
    if (text && (r.package || "").toLowerCase().indexOf(text) < 0 && r.id.toLowerCase().indexOf(text) < 0) return false;
    return true;
  });
  rows.sort((a, b) => {
    const x = sortValue(a, state.key), y = sortValue(b, state.key);
    return x < y ? -state.dir : x > y ? state.dir : a.id < b.id ? -1 : 1;
  });
  tbody.textContent = "";
  for (const r of rows) {
    const tr = el("tr", { class: "app", tabindex: "0", "data-id": r.id });
    const app = el("td");
    app.appendChild(el("div", null, r.package || "(unreadable)"));
    app.appendChild(el("div", { class: "legend" }, r.id));
    tr.appendChild(app);
    tr.appendChild(el("td", null, categoryCell(r)));
    tr.appendChild(el("td", { class: "num" }, pctOrDash(r.risk)));
    const b = el("td");
    b.appendChild(el("span", { class: `pill ${r.status === "failed" ? "failed" : r.band || ""}` }, r.status === "failed" ? "failed" : r.band || "—"));
    tr.appendChild(b);
    tr.appendChild(el("td", { class: "num" }, r.atypicality == null ? "—" : `${Math.floor(r.atypicality)}`));
    tr.appendChild(el("td", { class: `num${r.counts?.error ? " lvl-error" : ""}` }, r.counts ? String(r.counts.error) : "—"));
    tr.appendChild(el("td", { class: "num" }, r.counts ? String(r.counts.warning) : "—"));
    tr.appendChild(el("td", { class: "num" }, r.counts ? String(r.counts.note) : "—"));
    tr.appendChild(el("td", { class: "num", title: r.code ? "" : "code not read" }, r.code ? String(r.code.notSeen.length + (r.code.unreached?.length ?? 0)) : "—"));
    const details = el("tr", { class: "details", hidden: "" });
    const td = el("td", { colspan: "9" });
    if (r.error) td.appendChild(el("div", { class: "lvl-error" }, `Could not be read: ${r.error}`));
    if (r.findings.length) {
      const ul = el("ul");
      for (const f of r.findings) {
        const li = el("li");
        li.appendChild(el("span", { class: `lvl-${f.level}` }, `${f.level} `));
        li.appendChild(document.createTextNode(`${short(f.subject)} (${f.checkId})${f.message ? `: ${f.message}` : ""}`));
        ul.appendChild(li);
      }
      td.appendChild(ul);
    } else if (!r.error) td.appendChild(el("div", null, "No findings."));
    if (r.whatIf.length) {
      td.appendChild(el("div", { class: "legend" }, "Without one permission:"));
      const ul2 = el("ul");
      for (const w of r.whatIf) ul2.appendChild(el("li", null, `${short(w.permission)}: ${pctOrDash(r.risk)} → ${pctOrDash(w.without)}`));
      td.appendChild(ul2);
    }
    if (r.code) {
      const c = r.code;
      const line = (label: string, list: string[]) => (list.length ? `${label}: ${list.map(short).join(", ")}` : "");
      const parts = [line("Used in code", c.used), line("used only by libraries", c.libraryOnly), line("only in code never reached", c.unreached ?? []), line("not seen in code", c.notSeen), line("no map covers", c.notMappable)].filter(Boolean);
      if (parts.length) td.appendChild(el("div", { class: "legend" }, `Code evidence — ${parts.join("; ")}.`));
      for (const p of c.problems) td.appendChild(el("div", { class: "lvl-warning" }, p));
    }
    details.appendChild(td);
    const toggle = () => (details.hasAttribute("hidden") ? details.removeAttribute("hidden") : details.setAttribute("hidden", ""));
    tr.addEventListener("click", toggle);
    tr.addEventListener("keydown", (e) => {
      if (e.key === "Enter" || e.key === " ") {
        e.preventDefault();
        toggle();
      }
    });
    tbody.appendChild(tr);
    tbody.appendChild(details);
  }
  byId("shown").textContent = `${rows.length} of ${data.rows.length} shown`;
}
document.querySelectorAll<HTMLElement>("#apps th").forEach((th) => {
  th.addEventListener("click", () => {
    const key = th.getAttribute("data-key") ?? "risk";
    state.dir = state.key === key ? -state.dir : key === "app" || key === "category" ? 1 : -1;
    state.key = key;
    document.querySelectorAll("#apps th").forEach((o) => o.setAttribute("aria-sort", "none"));
    th.setAttribute("aria-sort", state.dir > 0 ? "ascending" : "descending");
    render();
  });
});
for (const f of [categoryFilter, bandFilter, checkFilter, atypicalFilter, codeFilter]) f.addEventListener("change", render);
textFilter.addEventListener("input", render);
render();

/** Heatmap: sweep share vs baseline share per category, shaded by how far the sweep exceeds the baseline. */
function drawHeatmap(): void {
  const h = data.heatmap;
  const box = byId("heatmap");
  if (!h.permissions.length || !h.categories.length) {
    box.appendChild(el("p", { class: "legend" }, "No permission was flagged as uncommon for a category."));
    return;
  }
  const t = el("table", { class: "heat" });
  const head = el("tr");
  head.appendChild(el("th", null, "Permission (apps flagged)"));
  for (const c of h.categories) head.appendChild(el("th", null, c));
  const thead = el("thead");
  thead.appendChild(head);
  t.appendChild(thead);
  const body = el("tbody");
  h.permissions.forEach((p, i) => {
    const tr = el("tr");
    tr.appendChild(el("th", null, `${short(p)} (${h.flaggedCounts[i]})`));
    for (const c of h.cells[i]) {
      // Shaded by how far even the lower end of the swept share's 95% interval lies above the baseline's
      // share: one app of one is weak evidence (lower end about 21%), many apps are strong.
      const excess = Math.max(0, Math.min(1, (c.sweepLower - c.baseline) * 4));
      const td = el("td", { title: `swept: ${c.sweepK} of ${c.sweepN} (${pctOrDash(c.sweep)}; 95% interval from ${pctOrDash(c.sweepLower)}) · flagged: ${c.flagged} · baseline: ${pctOrDash(c.baseline)} of ${c.baselineN}` });
      td.style.background = `rgba(178, 58, 58, ${(0.08 + 0.6 * excess).toFixed(2)})`;
      td.appendChild(el("div", null, `${pctOrDash(c.sweep)}`));
      td.appendChild(el("div", { class: "legend" }, `${c.sweepK} of ${c.sweepN}${c.flagged ? `, ${c.flagged} flagged` : ""}`));
      td.appendChild(el("div", { class: "legend" }, `baseline ${pctOrDash(c.baseline)}`));
      tr.appendChild(td);
    }
    body.appendChild(tr);
  });
  t.appendChild(body);
  box.appendChild(t);
}
drawHeatmap();
