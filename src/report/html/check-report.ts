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
import { atypicalityText, codeLookup, neededText } from "../messages.js";
import { alsoMessages, categoryText, contributionText, messageOf, notJudgedText, type CheckRun, type CheckRunInfo } from "../check.js";
import { codeStatusText } from "../../score/code-evidence.js";
import { isSpecialAccess } from "../../platform/sensitivity.js";
import type { PermissionFacts } from "../../extract/manifest/model.js";
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

/** Who grants a requested permission, as `facts` groups them. */
function grantedText(f: PermissionFacts, name: string): string {
  if (f.origin === "app") return "the app's own";
  if (f.origin !== "platform") return "not the platform's";
  if (f.base === "dangerous") return "runtime prompt";
  if (isSpecialAccess(f, name)) return "special access, by hand";
  if (f.base === "normal") return "at install";
  return "not to store apps";
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
    out.push(`<div>Base rate of the labeled corpus ${pct(r.risk.baseRate)}; likelihood ratio ${r.risk.likelihoodRatio.toFixed(2)}.${r.risk.atypicality ? ` ${esc(sentence(atypicalityText(r.risk.atypicality)))} (no labels involved).` : ""}</div>`);
    // What drives the figure, as the text report gives it: the largest contributions, and the risk without each permission.
    const top = r.risk.contributions.slice(0, 4);
    if (top.length) out.push(`<div class="breakdown"><strong>Raised most by</strong><ul>${top.map((c) => `<li>${esc(contributionText(c, r.risk!.featureCategory))}</li>`).join("")}</ul></div>`);
    const drops = r.risk.whatIf.filter((w) => w.change < -0.0005).slice(0, 5);
    out.push(drops.length ? `<div class="breakdown"><strong>Without one permission</strong><ul>${drops.map((w) => `<li>${esc(short(w.permission))}: ${pct(r.risk!.probability)} → ${pct(w.without)}</li>`).join("")}</ul></div>` : `<div class="breakdown">Removing any one permission alone would not lower it.</div>`);
    out.push(`<div class="caution">${esc(r.risk.caution)}</div></div>`);
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
    out.push(`<table class="perms"><thead><tr><th>Permission</th><th>Granted</th><th>Apps of the category</th><th class="num">Share</th><th>Rate against the threshold</th></tr></thead><tbody>`);
    const reasons = new Map(r.notJudged.map((n): [string, NotJudged] => [n.permission, n]));
    const code = codeLookup(r.code);
    for (const p of rates) {
      const judged = p.k !== undefined && p.n !== undefined;
      const el = m.usesPermissions.find((u) => u.name === p.permission && !u.removedByTools);
      const extra = [p.judgedBy ? `judged by ${short(p.judgedBy)}, which it replaced` : "", el?.maxSdkVersion !== undefined ? `up to SDK ${el.maxSdkVersion}` : "", code(p.permission) ? `code: ${codeStatusText(code(p.permission)!.status, code(p.permission)!.users, code(p.permission)!.onlyLibraries)}` : ""].filter(Boolean);
      const note = extra.length ? `<div class="legend">${esc(extra.join(" · "))}</div>` : "";
      const name = `${esc(short(p.permission))}${p.sensitive ? ' <span class="sensitive">sensitive</span>' : ""}${note}`;
      const granted = el ? `<td>${esc(grantedText(el.facts, p.permission))}${el.facts.protectionLevel ? `<div class="legend">${esc(el.facts.protectionLevel)}</div>` : ""}</td>` : "<td></td>";
      if (judged) out.push(`<tr><td>${name}</td>${granted}<td class="num">${p.k} of ${p.n}</td><td class="num">${pct(p.k! / p.n!, "rate")}</td><td>${bar(p, info.threshold)}</td></tr>`);
      else out.push(`<tr><td>${name}</td>${granted}<td colspan="3" class="legend">${esc(notJudgedText(reasons.get(p.permission) ?? { permission: p.permission, why: p.notJudged! }, r.era?.api))}</td></tr>`);
    }
    out.push("</tbody></table>");
  }
  if (r.needed.length) {
    out.push(`<h3>Rare for the category, but needed by the manifest (${r.needed.length})</h3><ul class="findings">`);
    for (const n of r.needed) out.push(`<li><span class="subject">${esc(short(n.permission))}</span><div class="message">${esc(n.reasons.map(neededText).join("; "))}</div></li>`);
    out.push("</ul>");
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
  if (read.length > 1) {
    // An overview first: one row an app, linking to its section.
    const count = (r: HtmlCheckRun, level: Level) => r.result!.findings.filter((f) => f.level === level).length;
    body.push(`<table class="overview"><thead><tr><th>App</th><th>Category</th><th class="num">Risk</th><th>Band</th><th class="num">Errors</th><th class="num">Warnings</th><th class="num">Notes</th></tr></thead><tbody>`);
    read.forEach((r, i) => {
      const x = r.result!;
      body.push(`<tr><td><a href="#app-${i}">${esc(x.manifest.package)}</a><div class="legend">${esc(r.file)}</div></td><td>${esc(x.category.category ?? "pooled")}</td><td class="num">${x.risk ? pct(x.risk.probability) : "—"}</td><td>${esc(x.risk?.band ?? "—")}</td><td class="num">${count(r, "error")}</td><td class="num">${count(r, "warning")}</td><td class="num">${count(r, "note")}</td></tr>`);
    });
    body.push("</tbody></table>");
  }
  if (failed.length) body.push(`<h3>Could not be read (${failed.length})</h3><ul>${failed.map((r) => `<li>${esc(r.file)}: ${esc(r.error?.message ?? "unreadable")}</li>`).join("")}</ul>`);
  read.forEach((r, i) => body.push(appSection(r, info, i)));
  body.push(`<footer>${esc(info.caution)}</footer>`);
  return pageShell(title, CHECK_PAGE_CSS, body.join("\n"));
}

/** A phrase as the start of a sentence. */
function sentence(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}
