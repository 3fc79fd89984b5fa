/**
 * The sweep's HTML report: one self-contained file (no network: data, styles, script and charts inline).
 * A histogram of risk with the bands, a sortable and filterable table of apps whose rows expand to their
 * findings and what-if figures, and a heatmap of the permissions the sweep flagged most, by category,
 * against the baseline. The page's script and styles are real files (page/), compiled and inlined at build
 * time; this formatter only fills in the data.
 */
import { CHECKS } from "../../score/registry.js";
import { EMBED_ALL_UP_TO, EMBED_TOP, type SweepDigest } from "../../score/sweep-digest.js";
import { TOOL_VERSION } from "../../version.js";
import { SWEEP_PAGE_CSS, SWEEP_PAGE_SCRIPT } from "./generated/page-assets.js";
import type { PageData } from "./page-data.js";
import { esc, pageShell } from "./page-shell.js";

export interface SweepReportInput {
  /** The sweep's rows, digested (score/sweep-digest.ts): figures over all of them, and the rows to embed. */
  digest: SweepDigest;
  /** Where the full results are (the sweep's output file). */
  results: string;
  inputs: number;
  baselineName: string;
  caution: string;
  cutPoints?: { elevated?: number; high?: number };
  baseRate?: number;
  title?: string;
}

/** JSON for a `<script type="application/json">` element: nothing in it can end the element. */
function safeJson(value: unknown): string {
  return JSON.stringify(value).replace(/</g, "\\u003c").replace(/\u2028/g, "\\u2028").replace(/\u2029/g, "\\u2029");
}

/** Script text for a `<script>` element: `</script` inside it would end the element early. */
function inlineScript(js: string): string {
  return js.replace(/<\/(script)/gi, "<\\/$1");
}


export function sweepToHtml(input: SweepReportInput): string {
  const data: PageData = {
    tool: `overask ${TOOL_VERSION}`,
    baseline: input.baselineName,
    caution: input.caution,
    cutPoints: input.cutPoints ?? {},
    baseRate: input.baseRate ?? null,
    checks: CHECKS.map((c) => ({ id: c.meta.id, title: c.meta.title })),
    rows: input.digest.embedded.map((r) => ({
      id: r.id,
      package: r.package ?? null,
      category: r.category ?? null,
      fallback: r.fallback ?? null,
      requestedCategory: r.requestedCategory ?? null,
      risk: r.risk ?? null,
      band: r.band ?? null,
      atypicality: r.atypicality ?? null,
      status: r.status,
      counts: r.counts ?? null,
      findings: r.findings ?? [],
      whatIf: r.whatIf ?? [],
      code: r.code ?? null,
      error: r.error?.message ?? null,
    })),
    heatmap: input.digest.heatmap,
    totals: { inputs: input.inputs, scored: input.digest.scored, failed: input.digest.failed, byBand: input.digest.byBand },
    summary: { histogram: input.digest.histogram, byCategory: input.digest.byCategory, byCheck: input.digest.byCheck, complete: input.digest.complete, results: input.results },
  };
  const title = input.title ?? "overask sweep report";
  return pageShell(title, SWEEP_PAGE_CSS, `<h1>${esc(title)}</h1>
<div class="meta" id="meta"></div>
<div class="caution" id="caution"></div>
<div class="tiles" id="tiles"></div>

<h2>Risk across the inventory</h2>
<div id="histogram" role="img" aria-label="Histogram of the risk estimates, coloured by band"></div>
<div class="legend" id="histogram-legend"></div>

<h2>Apps</h2>
<p class="legend" id="partial" hidden>This page holds the ${EMBED_TOP.toLocaleString("en")} riskiest apps, the ${EMBED_TOP.toLocaleString("en")} with the most warnings and errors, and every app that could not be read (sweeps of more than ${EMBED_ALL_UP_TO.toLocaleString("en")} apps); the figures above count every app. All results: <code id="results"></code>.</p>
<div class="filters">
  <label>Category <select id="f-category"><option value="">all</option></select></label>
  <label>Band <select id="f-band"><option value="">all</option><option>high</option><option>elevated</option><option>low</option><option value="failed">could not be read</option></select></label>
  <label>Check <select id="f-check"><option value="">any</option></select></label>
  <label>Code <select id="f-code"><option value="">any</option><option value="not-seen">requests a permission not seen in reached code</option><option value="library-only">a permission used only by a library</option><option value="problems">code could not be read</option><option value="none">code not read</option></select></label>
  <label>Atypical <select id="f-atypical"><option value="">any</option><option value="90">above the 90th percentile</option><option value="95">above the 95th</option><option value="99">above the 99th</option></select></label>
  <label>Search <input type="search" id="f-text" placeholder="package or file"></label>
  <span class="legend" id="shown"></span>
</div>
<table id="apps">
  <thead><tr>
    <th data-key="app" aria-sort="none">App</th>
    <th data-key="category" aria-sort="none">Category</th>
    <th data-key="risk" aria-sort="descending" class="num">Risk</th>
    <th data-key="band" aria-sort="none">Band</th>
    <th data-key="atypicality" aria-sort="none" class="num" title="percentile among the baseline's apps of the category; no labels involved">Atypical</th>
    <th data-key="errors" aria-sort="none" class="num" title="findings of level error (an app that will not install, …); sorted by errors, then warnings, then notes">Errors</th>
    <th data-key="warnings" aria-sort="none" class="num">Warnings</th>
    <th data-key="notes" aria-sort="none" class="num">Notes</th>
    <th data-key="code" aria-sort="none" class="num" title="requested permissions the app's code was not seen to use, or uses only in code no entry point reaches (code evidence)">Not seen in code</th>
  </tr></thead>
  <tbody></tbody>
</table>
<p class="legend noprint">Click a row for its findings and for what removing a permission would do to its risk.</p>

<h2>Permissions flagged most, by category</h2>
<p class="legend">Each cell: share of swept apps of the category requesting the permission, how many of how many (and how many were flagged), and the share in the baseline. Darker: requested more often than the baseline would suggest, weighed by support (the lower end of the 95% interval of the swept share), so a cell of one app is never dark.</p>
<div id="heatmap"></div>

<script type="application/json" id="data">${safeJson(data)}</script>
<script>
${inlineScript(SWEEP_PAGE_SCRIPT)}</script>`);
}
