/**
 * Formatters for `overask check`: text for a person, JSON for machines (docs/check-json.md).
 * Pure functions from results to strings.
 */
import type { CodeEvidence } from "../score/code-evidence.js";
import type { CheckResult, NotJudged } from "../score/judge.js";
import type { Policy } from "../score/policy/policy.js";
import type { CategoryChoice } from "../score/category.js";
import { atypicalityText, codeLookup, neededText, wordFinding, type CodeLookup } from "./messages.js";
import type { RiskEstimate } from "../score/risk.js";
import type { Finding } from "../score/types.js";
import { TOOL_VERSION } from "../version.js";
import { findingLines } from "./finding-text.js";
import { PLAIN, fit, wrap, type Style } from "./style.js";
import { pct, short } from "./format.js";

export const CHECK_SCHEMA_VERSION = 1;

export interface CheckRun {
  file: string;
  result?: CheckResult;
  error?: { kind: string; message: string };
}

export interface CheckRunInfo {
  baseline: string;
  caution: string;
  /** Policies in force, for SARIF's rule descriptors. */
  policies?: readonly Policy[];
}


/** A finding's message; `code`: what the app's code shows for its permissions (report/messages.ts). */
export function messageOf(f: Pick<Finding, "checkId" | "subject" | "data">, code?: CodeLookup): string {
  return wordFinding(f, code);
}

/** The other reasons folded into a finding on the same permission, worded by their own checks. */
export function alsoMessages(f: Finding): { checkId: string; level: string; message: string }[] {
  return (f.also ?? []).map((a) => ({ checkId: a.checkId, level: a.level, message: messageOf({ checkId: a.checkId, subject: f.subject, data: a.data }) }));
}

/** Why a requested permission is not judged by frequency, in words. */
export function notJudgedText(n: NotJudged, era: number | undefined): string {
  if (n.why === "own-permission") return "declared by this app";
  if (n.why === "made-explicit") return `not measured: added in API ${n.addedIn} to make explicit what every app could do before${n.note ? ` (${n.note})` : ""}, so older apps could not request it`;
  if (n.why === "required-alongside") return `not measured: needed alongside ${(n.alongside ?? []).map(short).join(" or ")} (added in API ${n.addedIn}${n.note ? `: ${n.note}` : ""}), not instead of it, so how often apps request that says nothing about this one`;
  return `newer than this baseline (added in API ${n.addedIn}; baseline era API ${era}): no frequency evidence`;
}

export function categoryText(c: CategoryChoice): string {
  const how = { option: "from --category", index: "from --categories", appCategory: "from android:appCategory", none: "" }[c.source];
  if (c.category) return `${c.category} (${how})`;
  const why = {
    "no-category": "no category given or declared",
    "unknown-category": `"${c.requested}" is not a category of the baseline`,
    "below-min-support": `"${c.requested}" has too few apps in the baseline`,
  }[c.fallback ?? "no-category"];
  return `all categories pooled: ${why}`;
}

/** A contribution in words: a permission's whole effect, or a category term. */
export function contributionText(c: RiskEstimate["contributions"][number], category: string | undefined): string {
  const lo = `+${c.logOdds.toFixed(2)} log-odds`;
  if (c.kind === "permission") return `${short(c.name)}  ${lo}`;
  const group = category ?? "all categories";
  const what = { uncommonSensitive: `sensitive permissions uncommon for ${group}`, uncommonOther: `other permissions uncommon for ${group}`, surprisal: `how unusual the whole set is for ${group}` }[c.name] ?? c.description;
  return `${what}  ${lo}`;
}

export function riskLines(r: RiskEstimate, s: Style, width = 80): string[] {
  const out: string[] = [];
  const bandText = r.band === "high" ? s.alert("high") : r.band === "elevated" ? s.warn("elevated") : "low";
  out.push(`${s.bold("Risk")}  ${pct(r.probability)} — ${bandText}  ${s.dim(`(base rate ${pct(r.baseRate)}; likelihood ratio ${r.likelihoodRatio.toFixed(2)})`)}`);
  if (r.prevalence) {
    const pb = r.prevalence.band === "high" ? s.alert("high") : r.prevalence.band === "elevated" ? s.warn("elevated") : "low";
    out.push(...wrap(`  at a prevalence of ${pct(r.prevalence.share)} (--prevalence): ${pct(r.prevalence.probability)} — ${pb}`, width, 4));
  }
  if (r.atypicality) out.push(...wrap(`  atypicality: ${atypicalityText(r.atypicality)} (no labels involved)`, width, 4));
  const quality = [`in-corpus ROC AUC ${r.quality.inCorpus.toFixed(2)}`, ...r.quality.validation.map((v) => `${v.name} ${v.auc.toFixed(2)}`)].join("; ");
  out.push(...wrap(`  ${r.caution} How well it ranks: ${quality}.`, width, 2).map((l) => s.dim(l)));
  const top = r.contributions.slice(0, 4);
  if (top.length) {
    out.push("  raised most by:");
    for (const c of top) out.push(...wrap(`    ${contributionText(c, r.featureCategory)}`, width, 6));
  }
  const drops = r.whatIf.filter((w) => w.change < -0.0005).slice(0, 5);
  if (drops.length) {
    out.push("  without one permission:");
    for (const w of drops) out.push(`    ${fit(short(w.permission), 40)}  ${pct(r.probability)} → ${pct(w.without)}`);
  } else out.push("  removing any one permission alone would not lower it");
  if (r.withoutUncommon && r.withoutUncommon.without < r.probability - 0.0005) {
    out.push(...wrap(`  without all ${r.withoutUncommon.permissions.length} permissions uncommon for the category (${r.withoutUncommon.permissions.map(short).join(", ")}): ${pct(r.probability)} → ${pct(r.withoutUncommon.without)}`, width, 4));
  }
  return out;
}

/** "2 dex files read: 2 of 5 requested permissions used, 2 not seen, 1 not mappable". */
export function codeSummary(code: CodeEvidence): string {
  if (!code.read.length && !code.problems.length) return "no dex code in the archive";
  const count = (st: string) => code.permissions.filter((p) => p.status === st).length;
  const files = `${code.read.length} dex ${code.read.length === 1 ? "file" : "files"} read`;
  const problems = code.problems.length ? `; ${code.problems.join("; ")}` : "";
  const unreached = count("unreached") ? `, ${count("unreached")} only in code never reached` : "";
  return `${files}: ${count("used")} of ${code.permissions.length} requested permissions used${unreached}, ${count("not-seen")} not seen, ${count("not-mappable")} not mappable${problems}`;
}

export function checkToText(runs: CheckRun[], info: CheckRunInfo, s: Style = PLAIN): string {
  const parts: string[] = [];
  for (const run of runs) {
    // An input that could not be read was reported once, on stderr, by the command.
    if (!run.result) continue;
    const { manifest: m, category, findings, risk, notJudged, era } = run.result;
    const out: string[] = [];
    out.push(s.bold(m.label && m.labelSource !== "unresolved" ? `${m.package}  “${m.label}”` : m.package));
    out.push(...wrap(`  file        ${run.file}`, 80, 14));
    out.push(...wrap(`  category    ${categoryText(category)}`, 80, 14));
    out.push(...wrap(`  baseline    ${info.baseline}`, 80, 14));
    if (era) out.push(`  era         API ${era.api}: what the baseline's apps could request`);
    if (era?.targetNewer) out.push(...wrap(`  note        the app targets API ${m.targetSdk}, newer than the baseline's era (API ${era.api}): permissions added since are judged by what they replaced, or not at all`, 80, 14));
    if (run.result.instruments) out.push(...wrap(`  test APK    instruments ${run.result.instruments}: it runs in that app's process with that app's permissions, so it is not judged as a store app (no frequency judgement, no risk)`, 80, 14));
    if (run.result.code) out.push(...wrap(`  code        ${codeSummary(run.result.code)}`, 80, 14).map((l, i) => (i === 0 || !run.result!.code!.problems.length ? l : s.warn(l))));
    out.push("");
    if (risk) out.push(...riskLines(risk, s), "");
    else out.push(s.dim(run.result.instruments ? "Risk  not estimated: a test APK runs with its target's permissions" : "Risk  not estimated: the baseline has no risk model"), "");
    out.push(s.bold(`Findings (${findings.length})`));
    if (findings.length === 0) out.push("  none");
    const code = codeLookup(run.result.code);
    for (const f of findings) out.push(...findingLines(f, messageOf(f, code), alsoMessages(f), s));
    if (run.result.needed.length) {
      out.push("", s.bold(`Rare for the category, but needed by the manifest (${run.result.needed.length})`));
      for (const n of run.result.needed) {
        out.push(`  ${short(n.permission)}`);
        for (const r of n.reasons) out.push(...wrap(`    ${neededText(r)}`, 80, 6).map((l) => s.dim(l)));
      }
    }
    if (notJudged.length) {
      out.push("", s.bold(`Not judged by frequency (${notJudged.length})`));
      for (const n of notJudged) {
        out.push(`  ${short(n.permission)}`);
        out.push(...wrap(`    ${notJudgedText(n, era?.api)}`, 80, 4).map((l) => s.dim(l)));
      }
    }
    parts.push(`${out.join("\n")}\n`);
  }
  return parts.join("\n");
}

export function checkToJson(runs: CheckRun[], info: CheckRunInfo): string {
  const results = runs.map((run) => {
    if (!run.result) return { file: run.file, error: run.error };
    const { manifest: m, category, findings, risk } = run.result;
    return {
      file: run.file,
      package: m.package,
      versionCode: m.versionCode,
      versionName: m.versionName,
      targetSdk: m.targetSdk,
      category,
      ...(run.result.era ? { era: run.result.era } : {}),
      ...(run.result.instruments ? { instruments: run.result.instruments } : {}),
      findings: findings.map((f) => ({ ...f, message: messageOf(f, codeLookup(run.result!.code)), ...(f.also ? { also: alsoMessages(f).map((a, i) => ({ ...f.also![i], message: a.message })) } : {}) })),
      ...(run.result.code ? { code: run.result.code } : {}),
      notJudged: run.result.notJudged.map((n) => ({ ...n, message: notJudgedText(n, run.result!.era?.api) })),
      needed: run.result.needed.map((n) => ({ ...n, message: n.reasons.map(neededText).join("; ") })),
      risk: risk ?? null,
    };
  });
  return `${JSON.stringify({ tool: "overask", version: TOOL_VERSION, schemaVersion: CHECK_SCHEMA_VERSION, baseline: info.baseline, caution: info.caution, results }, null, 2)}\n`;
}
