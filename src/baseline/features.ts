/**
 * The risk model's features of one app, computed against its category's baseline. Every feature is a
 * sum of non-negative per-permission terms, so adding a permission can never lower a feature; with
 * non-negative coefficients, removing a permission can never raise the risk (the monotonicity property
 * argued for by Peng et al., "Using probabilistic generative models for ranking risks of Android apps",
 * CCS 2012).
 */
import { isSensitive } from "../platform/sensitivity.js";
import { frequencyBasis } from "./era.js";
import type { Baseline, Exclusion } from "./rates.js";

/**
 * The four counts split the requested permissions into disjoint groups (common or uncommon for the
 * category, sensitive or not), which keeps them far less collinear than nested counts would be. Each
 * enters the model as ln(1 + count): the first uncommon permission says more than the fifth, and the
 * transform is increasing, so monotonicity holds.
 */
export const FEATURE_NAMES = ["commonOther", "commonSensitive", "uncommonOther", "uncommonSensitive", "anyUncommonSensitive", "surprisal"] as const;
export type FeatureName = (typeof FEATURE_NAMES)[number];

/** Features that are counts, entered as ln(1 + count). */
const LOG_COUNTS = new Set<FeatureName>(["commonOther", "commonSensitive", "uncommonOther", "uncommonSensitive"]);

/** Features that say whether any permission has the property (the sum capped at 1). */
const INDICATORS = new Set<FeatureName>(["anyUncommonSensitive"]);

export const FEATURE_DESCRIPTIONS: Record<FeatureName, string> = {
  commonOther: "ln(1 + permissions common for the category, not sensitive)",
  commonSensitive: "ln(1 + permissions common for the category and sensitive)",
  uncommonOther: "ln(1 + permissions uncommon for the category, not sensitive)",
  uncommonSensitive: "ln(1 + permissions uncommon for the category and sensitive: dangerous, app-op or restricted)",
  anyUncommonSensitive: "at least one uncommon sensitive permission (1 or 0)",
  surprisal: "summed surprisal, −ln(rate), of the requested permissions",
};


/** Per-permission terms, so that explanations and what-if figures use the same numbers as the score. */
export interface PermissionTerms {
  permission: string;
  terms: Record<FeatureName, number>;
}

/**
 * The feature terms of one requested permission. Under the era rule (baseline/era.ts) a permission newer
 * than the corpus is rated by the predecessor it took over from, and one with no predecessor (or one that
 * made an old behaviour explicit) adds nothing: absence from an older corpus is not evidence. Sensitivity
 * is always the requested permission's own.
 */
export function permissionTerms(baseline: Baseline, category: string | undefined, permission: string, exclude?: Exclusion): PermissionTerms {
  const basis = frequencyBasis(baseline, category, permission);
  if (basis.kind !== "own" && basis.kind !== "predecessor") return { permission, terms: { commonOther: 0, commonSensitive: 0, uncommonOther: 0, uncommonSensitive: 0, anyUncommonSensitive: 0, surprisal: 0 } };
  const r = baseline.rate(category, basis.basis, exclude);
  const sensitive = isSensitive(permission);
  return {
    permission,
    terms: {
      commonOther: !r.uncommon && !sensitive ? 1 : 0,
      commonSensitive: !r.uncommon && sensitive ? 1 : 0,
      uncommonOther: r.uncommon && !sensitive ? 1 : 0,
      uncommonSensitive: r.uncommon && sensitive ? 1 : 0,
      anyUncommonSensitive: r.uncommon && sensitive ? 1 : 0,
      surprisal: -Math.log(r.rate),
    },
  };
}

/**
 * The feature vector (in FEATURE_NAMES order) of an app. `vocabulary`, when given, limits the
 * permissions counted to those the model's training corpus could have recorded.
 */
export function appFeatures(
  baseline: Baseline,
  category: string | undefined,
  permissions: Iterable<string>,
  options: { vocabulary?: ReadonlySet<string>; exclude?: Exclusion } = {},
): number[] {
  const sums = new Array<number>(FEATURE_NAMES.length).fill(0);
  for (const p of permissions) {
    if (options.vocabulary && !options.vocabulary.has(p)) continue;
    const t = permissionTerms(baseline, category, p, options.exclude).terms;
    for (let i = 0; i < FEATURE_NAMES.length; i++) sums[i] += t[FEATURE_NAMES[i]];
  }
  return sums.map((x, i) => (LOG_COUNTS.has(FEATURE_NAMES[i]) ? Math.log1p(x) : INDICATORS.has(FEATURE_NAMES[i]) ? Math.min(x, 1) : x));
}
