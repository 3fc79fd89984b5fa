/**
 * `check --format html`: one self-contained page (no script, no network) a reviewer can attach to a
 * listing decision: for each app its header (package, versions, category, baseline and era), the risk and
 * its caution, the findings grouped by level with their explanations, and every requested permission with
 * its category rate drawn as a small bar against the "uncommon" threshold. A print stylesheet puts each
 * app on its own pages.
 */
import type { NotJudged } from "../../score/judge.js";
import type { RequestedRate } from "../../score/requested.js";
import type { Level } from "../../score/types.js";
import { TOOL_VERSION } from "../../version.js";
import { codeLookup } from "../messages.js";
import { alsoMessages, categoryText, messageOf, notJudgedText, type CheckRun, type CheckRunInfo } from "../check.js";
import { CHECK_PAGE_CSS } from "./generated/page-assets.js";
import { esc, pageShell } from "./page-shell.js";
import { pct, short } from "../format.js";

export interface HtmlCheckRun extends CheckRun {
  /** Every requested permission with its category rate (score/requested.ts). */
  rates?: RequestedRate[];
}



const LEVEL_TITLES: Record<Level, string> = { error: "Errors", warning: "Warnings", note: "Notes" };

function bar(r: RequestedRate, threshold: number): string {
  if (r.k === undefined || !r.n) return "";
  const share = r.k / r.n;
  // One square-root scale from 0 to 100% for every bar, so that the threshold mark stands in the same place
  // and rare rates (the interesting ones) still show.
  const w = (x: number) => `${(100 * Math.sqrt(Math.min(1, x))).toFixed(1)}%`;
  return `<div class="bar${r.uncommon ? " uncommon" : ""}" role="img" aria-label="${esc(`${pct(share, "rate")} of apps; threshold ${pct(threshold, "rate")}`)}"><div class="fill" style="width:${w(share)}"></div><div class="mark" style="left:${w(threshold)}" title="threshold ${pct(threshold, "rate")}"></div></div>`;
}

function appSection(run: HtmlCheckRun, info: CheckRunInfo & { threshold: number }, index: number): string {
  const r = run.result!;
  const m = r.manifest;
  const title = m.label && m.labelSource !== "unresolved" ? `${m.package} — ${m.label}` : m.package;
  const facts: [string, string][] = [
    ["file", run.file],
    ["version", [m.versionName, m.versionCode !== undefined ? `(code ${m.versionCode})` : undefined].filter(Boolean).join(" ") || "—"],
    ["SDK", `min ${m.minSdk ?? "—"} · target ${m.targetSdk ?? "—"}`],
    ["category", categoryText(r.category)],
    ["baseline", info.baseline],
    ...(r.era ? [["era", `API ${r.era.api}${r.era.targetNewer ? ` — the app targets API ${m.targetSdk}, newer: permissions added since are judged by what they replaced, or not at all` : ""}`] as [string, string]] : []),
  ];
  const out: string[] = [];
  out.push(`<section class="app" id="app-${index}">`, `<h2>${esc(title)}</h2>`);
  out.push(`<dl class="facts">${facts.map(([k, v]) => `<dt>${esc(k)}</dt><dd>${esc(v)}</dd>`).join("")}</dl>`);
  if (r.risk) {
    out.push(`<div class="risk ${r.risk.band}"><div class="figure">Risk ${pct(r.risk.probability)} — ${esc(r.risk.band)}</div>`);
    out.push(`<div>Base rate of the labeled corpus ${pct(r.risk.baseRate)}.</div><div class="caution">${esc(r.risk.caution)}</div></div>`);
  } else out.push(`<div class="risk"><div>Risk not estimated: the baseline has no risk model.</div><div class="caution">${esc(info.caution)}</div></div>`);
  out.push(`<h3>Findings (${r.findings.length})</h3>`);
  if (!r.findings.length) out.push("<p>None.</p>");
  for (const level of ["error", "warning", "note"] as const) {
    const group = r.findings.filter((f) => f.level === level);
    if (!group.length) continue;
    out.push(`<h4 class="lvl-${level}">${LEVEL_TITLES[level]} (${group.length})</h4><ul class="findings">`);
    for (const f of group) {
      out.push(`<li><span class="subject">${esc(short(f.subject))}</span><span class="verdict">(<span class="lvl-${level}">${level}</span>: ${esc(f.checkId)})</span>`);
      out.push(`<div class="message">${esc(messageOf(f, codeLookup(r.code)))}</div>`);
      for (const a of alsoMessages(f)) out.push(`<div class="also">also (${esc(a.checkId)}): ${esc(a.message)}</div>`);
      out.push("</li>");
    }
    out.push("</ul>");
  }
  const rates = run.rates ?? [];
  out.push(`<h3>Requested permissions (${rates.length})</h3>`);
  if (rates.length) {
    out.push(`<p class="legend">The bar is the share of the category's apps in the baseline that request the permission; the black mark is the "uncommon" threshold (${pct(info.threshold, "rate")}); red bars are uncommon. Square-root scale from 0 to 100%.</p>`);
    out.push(`<table class="perms"><thead><tr><th>Permission</th><th>Apps of the category</th><th class="num">Share</th><th>Rate against the threshold</th></tr></thead><tbody>`);
    const reasons = new Map(r.notJudged.map((n): [string, NotJudged] => [n.permission, n]));
    for (const p of rates) {
      const judged = p.k !== undefined && p.n !== undefined;
      const note = p.judgedBy ? `<div class="legend">judged by ${esc(short(p.judgedBy))}, which it replaced</div>` : "";
      const name = `${esc(short(p.permission))}${p.sensitive ? ' <span class="sensitive">sensitive</span>' : ""}${note}`;
      if (judged) out.push(`<tr><td>${name}</td><td class="num">${p.k} of ${p.n}</td><td class="num">${pct(p.k! / p.n!, "rate")}</td><td>${bar(p, info.threshold)}</td></tr>`);
      else out.push(`<tr><td>${name}</td><td colspan="3" class="legend">${esc(notJudgedText(reasons.get(p.permission) ?? { permission: p.permission, why: p.notJudged! }, r.era?.api))}</td></tr>`);
    }
    out.push("</tbody></table>");
  }
  out.push("</section>");
  return out.join("\n");
}

export function checkToHtml(runs: HtmlCheckRun[], info: CheckRunInfo & { threshold: number }, createdAt = new Date()): string {
  const read = runs.filter((r) => r.result);
  const failed = runs.filter((r) => !r.result);
  const title = read.length === 1 ? `overask check: ${read[0].result!.manifest.package}` : `overask check: ${read.length} apps`;
  const body: string[] = [];
  body.push(`<h1>${esc(title)}</h1>`, `<p class="meta">overask ${esc(TOOL_VERSION)} · ${esc(createdAt.toISOString().slice(0, 16).replace("T", " "))} UTC</p>`);
  if (read.length > 1) body.push(`<nav class="toc"><strong>Apps</strong><ul>${read.map((r, i) => `<li><a href="#app-${i}">${esc(r.result!.manifest.package)}</a> — ${esc(r.file)}</li>`).join("")}</ul></nav>`);
  if (failed.length) body.push(`<h3>Could not be read (${failed.length})</h3><ul>${failed.map((r) => `<li>${esc(r.file)}: ${esc(r.error?.message ?? "unreadable")}</li>`).join("")}</ul>`);
  read.forEach((r, i) => body.push(appSection(r, info, i)));
  body.push(`<footer>${esc(info.caution)}</footer>`);
  return pageShell(title, CHECK_PAGE_CSS, body.join("\n"));
}
