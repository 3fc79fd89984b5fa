/**
 * The risk model's inputs for one app. Two kinds, every one a sum of non-negative per-permission terms, so
 * that with non-negative weights removing a permission can never raise the risk (the monotonicity argued
 * for by Peng et al., "Using probabilistic generative models for ranking risks of Android apps", CCS 2012):
 *
 * - one indicator per permission of the labeled corpus's vocabulary (requested: 1);
 * - three category-relative terms, computed against the app's category in the baseline, under the era rule
 *   (baseline/era.ts): how many sensitive permissions are uncommon for the category, how many other ones
 *   are (each as ln(1 + count)), and the summed surprisal −ln(rate) of all requested permissions. These are
 *   how permissions the labeled corpus never recorded, and the category (`-c`), enter the risk.
 */
import { isSensitive } from "../platform/sensitivity.js";
import { isJudgedUncommon, judgeFrequency } from "./judged.js";
import type { Baseline, Exclusion } from "./rates.js";

export const TERM_NAMES = ["uncommonSensitive", "uncommonOther", "surprisal"] as const;
export type TermName = (typeof TERM_NAMES)[number];

export const TERM_DESCRIPTIONS: Record<TermName, string> = {
  uncommonSensitive: "ln(1 + sensitive permissions uncommon for the category)",
  uncommonOther: "ln(1 + other permissions uncommon for the category)",
  surprisal: "summed surprisal, −ln(rate in the category), of the requested permissions",
};

/** One permission's share of the terms (before the logarithms): uncommon sensitive, uncommon other, surprisal. */
export interface PermissionTerms {
  permission: string;
  uncommonSensitive: number;
  uncommonOther: number;
  surprisal: number;
}

/**
 * The terms one requested permission adds. A permission newer than the corpus is rated by the predecessor
 * it took over from, and one with no predecessor (or one that made an old behaviour explicit) adds nothing:
 * absence from an older corpus is not evidence. Sensitivity is always the requested permission's own.
 */
export function permissionTerms(baseline: Baseline, category: string | undefined, permission: string, exclude?: Exclusion): PermissionTerms {
  // The app's own permissions are left out by the caller (score/judge.ts): a corpus record has no manifest.
  const j = judgeFrequency(undefined, baseline, category, permission, (p) => baseline.rate(category, p, exclude));
  if (j.kind !== "rate") return { permission, uncommonSensitive: 0, uncommonOther: 0, surprisal: 0 };
  const uncommon = isJudgedUncommon(j);
  const sensitive = isSensitive(permission);
  return { permission, uncommonSensitive: uncommon && sensitive ? 1 : 0, uncommonOther: uncommon && !sensitive ? 1 : 0, surprisal: -Math.log(j.rate.rate) };
}

/** The three category-relative terms of an app, in TERM_NAMES order. */
export function appTerms(baseline: Baseline, category: string | undefined, permissions: Iterable<string>, exclude?: Exclusion): number[] {
  let us = 0;
  let uo = 0;
  let s = 0;
  for (const p of permissions) {
    const t = permissionTerms(baseline, category, p, exclude);
    us += t.uncommonSensitive;
    uo += t.uncommonOther;
    s += t.surprisal;
  }
  return [Math.log1p(us), Math.log1p(uo), s];
}
