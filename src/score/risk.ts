/**
 * The over-permissioning risk of one app from a baseline's model: the probability, a band whose cut
 * points come from the model's calibration, the features that move it most, and what removing each
 * requested permission would do to it. Always worded as an association with the flagged apps of the
 * named corpus — never as a cause.
 */
import type { StoredModel } from "../baseline/baseline-file.js";
import { appFeatures, FEATURE_DESCRIPTIONS, FEATURE_NAMES, type FeatureName } from "../baseline/features.js";
import { modelRisk } from "../baseline/model-risk.js";
import type { Baseline } from "../baseline/rates.js";

export type Band = "low" | "elevated" | "high";

export interface RiskEstimate {
  probability: number;
  band: Band;
  /** Predicted risks at which the elevated and high bands begin (absent: the calibration never reaches it). */
  cutPoints: { elevated?: number; high?: number };
  /** Share of flagged apps in the model's training rows. */
  baseRate: number;
  /** The category the features were computed against; absent for the pooled baseline. */
  featureCategory?: string;
  /** Features by how much they raise this app's risk above the training average (log-odds), largest first. */
  contributions: { feature: string; description: string; value: number; logOdds: number }[];
  /** For each requested permission the model counts: the risk without it. Largest drop first. */
  whatIf: { permission: string; without: number; change: number }[];
  /** The risk without every requested permission that is uncommon for the category, when there are any. */
  withoutUncommon?: { permissions: string[]; without: number };
  corpus: string;
  caution: string;
}

/**
 * Band cut points from the model's out-of-fold calibration: `high` starts at the first calibration bin
 * (by predicted risk) whose flagged share reaches halfway from the base rate to 1; `elevated` at the
 * first whose flagged share reaches 1.5 times the base rate (or the high mark, if that is lower).
 */
export function bandCutPoints(model: StoredModel): { elevated?: number; high?: number } {
  const base = model.evaluation.baseRate;
  const bins = [...model.evaluation.calibration].sort((a, b) => a.meanPredicted - b.meanPredicted);
  const highMark = (1 + base) / 2;
  const elevated = bins.find((b) => b.observed >= Math.min(1.5 * base, highMark))?.from;
  const high = bins.find((b) => b.observed >= highMark)?.from;
  return { ...(elevated !== undefined ? { elevated } : {}), ...(high !== undefined ? { high } : {}) };
}

export function bandOf(p: number, cuts: { elevated?: number; high?: number }): Band {
  if (cuts.high !== undefined && p >= cuts.high) return "high";
  if (cuts.elevated !== undefined && p >= cuts.elevated) return "elevated";
  return "low";
}

export class RiskScorer {
  private readonly vocabulary?: ReadonlySet<string>;
  readonly cuts: { elevated?: number; high?: number };

  constructor(
    readonly baseline: Baseline,
    readonly model: StoredModel,
    readonly caution: string,
  ) {
    if (model.vocabulary) this.vocabulary = new Set(model.vocabulary);
    this.cuts = bandCutPoints(model);
  }

  /** The category features are computed against: the app's, unless the model learned on pooled features. */
  featureCategory(category: string | undefined): string | undefined {
    return this.model.featureBasis === "pooled" ? undefined : category;
  }

  private counted(permissions: Iterable<string>): string[] {
    const v = this.vocabulary;
    return v ? [...permissions].filter((p) => v.has(p)) : [...permissions];
  }

  probability(category: string | undefined, permissions: Iterable<string>): number {
    return modelRisk(this.model, FEATURE_NAMES, appFeatures(this.baseline, this.featureCategory(category), this.counted(permissions)));
  }

  estimate(category: string | undefined, permissions: readonly string[]): RiskEstimate {
    const fc = this.featureCategory(category);
    const counted = this.counted(permissions);
    const x = appFeatures(this.baseline, fc, counted);
    const probability = modelRisk(this.model, FEATURE_NAMES, x);
    const m = this.model;
    const contributions = m.features
      .map((f, j) => {
        const value = x[FEATURE_NAMES.indexOf(f as FeatureName)];
        return { feature: f, description: FEATURE_DESCRIPTIONS[f as FeatureName] ?? f, value, logOdds: m.coefficients[j] * (value - m.standardized.means[j]) };
      })
      .sort((a, b) => b.logOdds - a.logOdds);
    const whatIf = [...new Set(counted)]
      .map((p) => {
        const without = modelRisk(m, FEATURE_NAMES, appFeatures(this.baseline, fc, counted.filter((q) => q !== p)));
        return { permission: p, without, change: without - probability };
      })
      .sort((a, b) => a.change - b.change || a.permission.localeCompare(b.permission));
    const uncommon = [...new Set(counted)].filter((p) => this.baseline.rate(fc, p).uncommon);
    const withoutUncommon = uncommon.length > 1
      ? { permissions: uncommon, without: modelRisk(m, FEATURE_NAMES, appFeatures(this.baseline, fc, counted.filter((q) => !uncommon.includes(q)))) }
      : undefined;
    return {
      probability,
      band: bandOf(probability, this.cuts),
      cutPoints: this.cuts,
      baseRate: m.evaluation.baseRate,
      ...(fc !== undefined ? { featureCategory: fc } : {}),
      contributions,
      whatIf,
      ...(withoutUncommon ? { withoutUncommon } : {}),
      corpus: m.corpus,
      caution: this.caution,
    };
  }
}
