/**
 * Judging one app: its category, every check, and the risk estimate. Pure: the manifest and the baseline
 * in, a result out; the CLI does the reading and the printing.
 */
import type { BaselineFile } from "../baseline/baseline-file.js";
import { baselineOf } from "../baseline/baseline-file.js";
import type { Baseline, PermissionRate } from "../baseline/rates.js";
import { requestedPermissionNames, type Manifest } from "../extract/manifest/model.js";
import { chooseCategory, type CategoryChoice } from "./category.js";
import { CHECKS } from "./registry.js";
import { RiskScorer, type RiskEstimate } from "./risk.js";
import { levelRank, type Finding, type Level } from "./types.js";

export interface CheckResult {
  manifest: Manifest;
  category: CategoryChoice;
  findings: Finding[];
  risk?: RiskEstimate;
}

export interface JudgeOptions {
  category?: string;
  categoryIndex?: Map<string, string>;
  /** Level overrides by check id (`off` silences a check). */
  levels?: Map<string, Level | "off">;
}

/** A baseline prepared for judging many apps: rates memoized per category and permission. */
export class Judge {
  readonly baseline: Baseline;
  readonly scorer?: RiskScorer;
  private readonly rates = new Map<string, PermissionRate>();

  constructor(readonly file: BaselineFile) {
    this.baseline = baselineOf(file);
    if (file.model) this.scorer = new RiskScorer(this.baseline, file.model, file.caution);
  }

  rate(category: string | undefined, permission: string): PermissionRate {
    const key = `${category ?? ""}\u0000${permission}`;
    let r = this.rates.get(key);
    if (!r) this.rates.set(key, (r = this.baseline.rate(category, permission)));
    return r;
  }

  judge(manifest: Manifest, options: JudgeOptions = {}): CheckResult {
    const category = chooseCategory(manifest, this.baseline, { category: options.category, index: options.categoryIndex });
    const ctx = { manifest, baseline: this.baseline, category, rate: (p: string) => this.rate(category.category ?? category.requested, p) };
    const findings: Finding[] = [];
    for (const check of CHECKS) {
      const level = options.levels?.get(check.meta.id) ?? check.meta.defaultLevel;
      if (level === "off") continue;
      for (const f of check.run(ctx)) findings.push({ checkId: check.meta.id, level, ...f });
    }
    findings.sort((a, b) => levelRank(b.level) - levelRank(a.level) || a.checkId.localeCompare(b.checkId) || a.subject.localeCompare(b.subject));
    const result: CheckResult = { manifest, category, findings };
    if (this.scorer) result.risk = this.scorer.estimate(category.category, requestedPermissionNames(manifest));
    return result;
  }
}
