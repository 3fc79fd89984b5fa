/**
 * Judging one app: its category, every check, and the risk estimate. Pure: the manifest and the baseline
 * in, a result out; the CLI does the reading and the printing.
 */
import { compareText } from "../util/compare.js";
import { codeEvidence, type CodeEvidence } from "./code-evidence.js";
import type { DexInput } from "../extract/code.js";
import type { BaselineFile } from "../baseline/baseline-file.js";
import { baselineOf } from "../baseline/baseline-file.js";
import type { Baseline, PermissionRate } from "../baseline/rates.js";
import { requestedPermissionNames, type Manifest } from "../extract/manifest/model.js";
import { chooseCategory, type CategoryChoice } from "./category.js";
import { isOwnPermission, judgeFrequency } from "../baseline/judged.js";
import { evaluatePolicy, type Policy } from "./policy/policy.js";
import { CHECKS } from "./registry.js";
import { neededByManifest, type NeedReason } from "./needed.js";
import { uncommonJudgement } from "./uncommon.js";
import { CACHE_LIMIT, RiskScorer, type RiskEstimate } from "./risk.js";
import { levelRank, type Finding, type Level } from "./types.js";

/** A requested permission that frequency does not judge, and why. */
export interface NotJudged {
  permission: string;
  why: "own-permission" | "made-explicit" | "required-alongside" | "no-evidence";
  /** The API level that added it (made-explicit, no-evidence). */
  addedIn?: number;
  /** What the lineage table says of it. */
  note?: string;
  /** The permissions it is needed alongside (required-alongside). */
  alongside?: string[];
}

export interface CheckResult {
  manifest: Manifest;
  category: CategoryChoice;
  findings: Finding[];
  /** Requested permissions frequency does not judge: the app's own, and those newer than the baseline's era. */
  notJudged: NotJudged[];
  /** Permissions frequency alone would call uncommon that the manifest shows the app needs (score/needed.ts). */
  needed: { permission: string; reasons: NeedReason[] }[];
  /** The baseline's era, and whether the app targets a newer platform than the corpus could speak for. */
  era?: { api: number; targetNewer: boolean };
  risk?: RiskEstimate;
  /** Code evidence, when the app's dex code was given (`JudgeOptions.dexes`). */
  code?: CodeEvidence;
  /**
   * A test APK (`<instrumentation>` naming another app): the package it instruments. It runs in that app's
   * process with that app's permissions, so it is not judged as a store app: no frequency judgement, no
   * risk, and nothing "reached in code, not requested".
   */
  instruments?: string;
}

export interface JudgeOptions {
  category?: string;
  categoryIndex?: Map<string, string>;
  /** Level overrides by check id (`off` silences a check). */
  levels?: Map<string, Level | "off">;
  /** Shift the risk to a population with this share of flagged apps (`--prevalence`). */
  prevalence?: number;
  /** Policies whose rules are evaluated beside the checks (`--policy`). */
  policies?: readonly Policy[];
  /**
   * The app's dex code as the reader found it (extract/code.ts): judging turns it into code evidence.
   * Absent or empty (a bare manifest, `--no-code`): no code checks, no code notes.
   */
  dexes?: readonly DexInput[];
}

/** A baseline prepared for judging many apps: rates memoized per category and permission. */
export class Judge {
  readonly baseline: Baseline;
  readonly scorer?: RiskScorer;
  private readonly rates = new Map<string, PermissionRate>();

  constructor(readonly file: BaselineFile) {
    this.baseline = baselineOf(file);
    if (file.model) this.scorer = new RiskScorer(this.baseline, file.model, file.caution, file.atypicality);
  }

  rate(category: string | undefined, permission: string): PermissionRate {
    const key = `${category ?? ""}\u0000${permission}`;
    let r = this.rates.get(key);
    if (!r) {
      // Bounded: a sweep of many apps meets endless custom permission names.
      if (this.rates.size >= CACHE_LIMIT) this.rates.clear();
      this.rates.set(key, (r = this.baseline.rate(category, permission)));
    }
    return r;
  }

  judge(manifest: Manifest, options: JudgeOptions = {}): CheckResult {
    const category = chooseCategory(manifest, this.baseline, { category: options.category, index: options.categoryIndex });
    const rateCategory = category.category ?? category.requested;
    const rate = (p: string) => this.rate(rateCategory, p);
    const instruments = manifest.instrumentation?.find((i) => i.targetPackage !== manifest.package)?.targetPackage;
    const read = options.dexes?.length ? codeEvidence(manifest, options.dexes) : undefined;
    const code = read && instruments ? { ...read, unrequested: [] } : read;
    const needed = neededByManifest(manifest);
    const ctx = { manifest, baseline: this.baseline, category, rate, needed, ...(instruments ? { instruments } : {}), frequency: (p: string) => judgeFrequency(manifest, this.baseline, category.category, p, rate), ...(code ? { code } : {}) };
    const raw: Finding[] = [];
    for (const check of CHECKS) {
      const level = options.levels?.get(check.meta.id) ?? check.meta.defaultLevel;
      if (level === "off") continue;
      for (const f of check.run(ctx)) raw.push({ checkId: check.meta.id, level, ...f });
    }
    const requested = requestedPermissionNames(manifest);
    const notJudged: NotJudged[] = [];
    for (const p of requested) {
      const j = ctx.frequency(p);
      if (j.kind === "own-permission") notJudged.push({ permission: p, why: "own-permission" });
      else if (j.kind === "made-explicit") notJudged.push({ permission: p, why: "made-explicit", addedIn: j.addedIn, note: j.lineage.note });
      else if (j.kind === "required-alongside") notJudged.push({ permission: p, why: "required-alongside", addedIn: j.addedIn, note: j.lineage.note, alongside: j.lineage.predecessors });
      else if (j.kind === "no-evidence") notJudged.push({ permission: p, why: "no-evidence", addedIn: j.addedIn });
    }
    // Where frequency alone would have called a permission uncommon, the manifest's reason stands instead.
    const neededInstead = [...needed].filter(([p]) => !isOwnPermission(manifest, p) && uncommonJudgement(manifest, this.baseline, category.category, p, rate)).map(([permission, reasons]) => ({ permission, reasons }));
    const result: CheckResult = { manifest, category, findings: [], notJudged, needed: instruments ? [] : neededInstead, ...(code ? { code } : {}), ...(instruments ? { instruments } : {}) };
    if (this.baseline.era !== undefined) result.era = { api: this.baseline.era, targetNewer: (manifest.targetSdk ?? 0) > this.baseline.era };
    // The app's own permissions say nothing about it against other apps: the risk leaves them out too.
    if (this.scorer && !instruments) result.risk = this.scorer.estimate(category.category, requested.filter((p) => !isOwnPermission(manifest, p)), options.prevalence);
    if (options.policies?.length) {
      // A policy's rules see the risk; their findings on a permission fold in with the checks' (one finding a permission).
      const subject = { manifest, ...(category.category ? { category: category.category } : {}), ...(result.risk ? { risk: result.risk.probability } : {}), ...(result.risk?.atypicality ? { atypicality: result.risk.atypicality.percentile } : {}) };
      for (const p of options.policies) raw.push(...evaluatePolicy(p, subject));
    }
    result.findings = foldByPermission(raw, new Set(requested));
    result.findings.sort((a, b) => levelRank(b.level) - levelRank(a.level) || compareText(a.checkId, b.checkId) || compareText(a.subject, b.subject));
    return result;
  }
}

/**
 * One finding a permission: where several permission checks report the same requested permission (for
 * example uncommon for the category and without effect at the target SDK, or special access), the most severe finding keeps
 * the others' reasons in `also`. Component findings are left as they are.
 */
function foldByPermission(findings: Finding[], requested: ReadonlySet<string>): Finding[] {
  const out: Finding[] = [];
  const byPermission = new Map<string, Finding[]>();
  for (const f of findings) {
    if (!requested.has(f.subject)) out.push(f);
    else byPermission.set(f.subject, [...(byPermission.get(f.subject) ?? []), f]);
  }
  for (const group of byPermission.values()) {
    // Most severe first; at the same level, the order of CHECKS (a stable, documented order).
    group.sort((a, b) => levelRank(b.level) - levelRank(a.level) || CHECK_ORDER.indexOf(a.checkId) - CHECK_ORDER.indexOf(b.checkId));
    const [first, ...rest] = group;
    out.push(rest.length ? { ...first, also: rest.map((r) => ({ checkId: r.checkId, level: r.level, data: r.data })) } : first);
  }
  return out;
}

const CHECK_ORDER = CHECKS.map((c) => c.meta.id);
