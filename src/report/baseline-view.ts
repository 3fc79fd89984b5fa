/**
 * `overask baseline`: what a baseline knows. Its categories with app counts, era, parameters, provenance and
 * risk model; for one category, the rate of every permission its apps request; for one permission, its
 * rate in every category. Text for a person, JSON for machines. Pure: the baseline in, a string out.
 */
import type { BaselineFile } from "../baseline/baseline-file.js";
import type { Baseline, PermissionRate } from "../baseline/rates.js";
import { judgeFrequency, type FrequencyJudgement } from "../baseline/judged.js";
import { reportedByAnotherCheck } from "../score/uncommon.js";
import { compareText } from "../util/compare.js";
import { TOOL_VERSION } from "../version.js";
import { PLAIN, fit, wrap, type Style } from "./style.js";
import { pct, short } from "./format.js";


export interface BaselineView {
  name: string;
  file: BaselineFile;
  baseline: Baseline;
  /** Rates of every permission requested in this category. */
  category?: string;
  /** Rates of this permission in every category. */
  permission?: string;
}

/** A permission's rate in one group, and what `check` makes of it there (the one rule: baseline/judged.ts). */
interface RateView {
  permission: string;
  rate: PermissionRate;
  judgement: FrequencyJudgement;
  uncommon: boolean;
}

function view(v: BaselineView, category: string | undefined, permission: string): RateView {
  const judgement = judgeFrequency(undefined, v.baseline, category, permission);
  // Not judged by frequency: the permission's own counts are still shown, for what they are worth.
  const rate = judgement.kind === "rate" ? judgement.rate : v.baseline.rate(category, permission);
  return { permission, rate, judgement, uncommon: judgement.kind === "rate" && judgement.rate.uncommon && !reportedByAnotherCheck(permission) };
}

function rateRow(x: RateView) {
  const r = x.rate;
  const j = x.judgement;
  return {
    permission: x.permission,
    category: r.category ?? null,
    fallback: r.fallback ?? null,
    k: r.k,
    n: r.n,
    share: r.n ? r.k / r.n : 0,
    rate: r.rate,
    lower: r.lower,
    upper: r.upper,
    uncommon: x.uncommon,
    judged: j.kind === "rate" ? (j.judgedBy ? "by-predecessor" : "by-rate") : j.kind,
    ...(j.kind === "rate" && j.judgedBy ? { judgedBy: j.judgedBy.permission } : {}),
  };
}

function categoryRates(v: BaselineView): RateView[] {
  const g = v.baseline.counts.categories.get(v.category!);
  const names = [...(g?.permissions.keys() ?? [])];
  return names.map((p) => view(v, v.category, p)).sort((a, b) => b.rate.k - a.rate.k || compareText(a.permission, b.permission));
}

function permissionRates(v: BaselineView): RateView[] {
  return [...[...v.baseline.counts.categories.keys()].sort().map((c) => view(v, c, v.permission!)), view(v, undefined, v.permission!)];
}

/** What `check` does with the permission in this group, when it is not simply its own rate. */
function judgementNote(x: RateView): string {
  const j = x.judgement;
  if (j.kind === "rate") return j.judgedBy ? `  judged by ${short(j.judgedBy.permission)}` : "";
  if (j.kind === "made-explicit") return `  not judged by frequency: made an older behaviour explicit in API ${j.addedIn}`;
  if (j.kind === "required-alongside") return `  not judged by frequency: needed alongside ${j.lineage.predecessors.map(short).join(" or ")} since API ${j.addedIn}, not instead`;
  if (j.kind === "no-evidence") return `  not judged by frequency: added in API ${j.addedIn}, after the baseline's era`;
  return "";
}

export function baselineToJson(v: BaselineView): string {
  const f = v.file;
  const out: Record<string, unknown> = {
    tool: "overask",
    version: TOOL_VERSION,
    baseline: v.name,
    createdAt: f.createdAt,
    learnedWith: f.tool.version,
    categories: v.baseline.categorySummary().map((c) => ({ name: c.name, apps: c.apps, belowMinSupport: c.pooled })),
    pooledApps: f.counts.pooled.apps,
    era: f.era ?? (v.baseline.era !== undefined ? { api: v.baseline.era } : null),
    parameters: f.parameters,
    provenance: f.provenance,
    model: f.model ? { corpus: f.model.corpus, citation: f.model.corpusCitation ?? null, licence: f.model.corpusLicence ?? null, featureBasis: f.model.featureBasis, auc: f.model.evaluation.auc, brier: f.model.evaluation.brier, baseRate: f.model.evaluation.baseRate } : null,
    caution: f.caution,
  };
  if (v.category) out.categoryRates = { category: v.category, rates: categoryRates(v).map(rateRow) };
  if (v.permission) out.permissionRates = { permission: v.permission, rates: permissionRates(v).map(rateRow) };
  return `${JSON.stringify(out, null, 2)}\n`;
}

function rateLines(rates: RateView[], label: (r: PermissionRate) => string, confidence: number, s: Style): string[] {
  const width = Math.min(52, Math.max(12, ...rates.map((r) => label(r.rate).length)));
  // The share shown is k/n itself; the smoothed rate the checks use is in the JSON (`rate`).
  const out = [s.dim(`  ${fit("", width)}  ${"apps".padStart(13)}  ${"share".padStart(6)}  ${Math.round(100 * confidence)}% interval`)];
  for (const x of rates) {
    const r = x.rate;
    const name = label(r);
    out.push(`  ${fit(name, width)}  ${`${r.k} of ${r.n}`.padStart(13)}  ${pct(r.n ? r.k / r.n : 0, "rate").padStart(6)}  ${pct(r.lower, "rate")}–${pct(r.upper, "rate")}${x.uncommon ? s.warn("  uncommon") : ""}${s.dim(judgementNote(x))}`);
  }
  return out;
}

export function baselineToText(v: BaselineView, s: Style = PLAIN): string {
  const f = v.file;
  const out: string[] = [];
  out.push(s.bold(v.name));
  out.push(`  learned ${f.createdAt.slice(0, 10)} by overask ${f.tool.version}; ${f.counts.pooled.apps} apps`);
  const era = f.era ?? (v.baseline.era !== undefined ? { api: v.baseline.era } : undefined);
  if (era) out.push(...wrap(`  era API ${era.api}${"years" in era && era.years ? `, apps of ${era.years}` : ""}: permissions added later are judged by what they replaced, or not at all`, 80, 4));
  out.push("", s.bold(`Categories (${v.baseline.categorySummary().length})`));
  for (const c of v.baseline.categorySummary()) out.push(`  ${fit(c.name, 28)} ${String(c.apps).padStart(7)} apps${c.pooled ? s.warn(`  below ${f.parameters.minSupport}: uses the pooled baseline`) : ""}`);
  const aliases = Object.entries(f.parameters.aliases ?? {});
  if (aliases.length) out.push(...wrap(`  aliases: ${aliases.map(([a, b]) => `${a} → ${b}`).join(", ")}`, 80, 4));
  out.push("", s.bold("Inputs"));
  for (const i of f.provenance.inputs) out.push(...wrap(`  ${i.path} (${i.role}, ${i.format}${i.licence ? `, licence ${i.licence}` : ""}): ${i.accepted} of ${i.rows} rows`, 80, 4));
  if (f.model) {
    out.push("", s.bold("Risk model"));
    out.push(...wrap(`  learned from ${f.model.corpus}${f.model.corpusLicence ? ` (${f.model.corpusLicence})` : ""}; in-corpus ROC AUC ${f.model.evaluation.auc.toFixed(3)}, base rate ${pct(f.model.evaluation.baseRate, "rate")}`, 80, 4));
    if (f.model.corpusCitation) out.push(...wrap(`  ${f.model.corpusCitation}`, 80, 4).map((l) => s.dim(l)));
  }
  out.push("", ...wrap(f.caution, 80, 0).map((l) => s.dim(l)));
  if (v.category) {
    const rates = categoryRates(v);
    out.push("", s.bold(`Permissions requested by ${v.category} apps (${rates.length})`));
    out.push(...rateLines(rates, (r) => short(r.permission), f.parameters.confidence, s));
  }
  if (v.permission) {
    out.push("", s.bold(`${short(v.permission)} by category`));
    out.push(...rateLines(permissionRates(v), (r) => (r.category ?? (r.fallback === "no-category" ? "all categories" : `(pooled)`)), f.parameters.confidence, s));
  }
  return `${out.join("\n")}\n`;
}
