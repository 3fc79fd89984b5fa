/**
 * The over-permissioning risk of one app from a baseline's model: the probability, a band whose cut points
 * come from the model's calibration, the likelihood ratio against the training base rate, optionally the
 * figure shifted to the user's own prevalence, the permissions and category terms that raise it most, what
 * removing each requested permission would do to it, and the label-free atypicality beside it. Always
 * worded as an association with the flagged apps of the named corpus — never as a cause.
 */
import { compareText } from "../util/compare.js";
import { percentileOf } from "../baseline/atypicality.js";
import type { BaselineFile, StoredModel } from "../baseline/baseline-file.js";
import { permissionTerms, TERM_DESCRIPTIONS, TERM_NAMES, type PermissionTerms, type TermName } from "../baseline/features.js";
import type { Baseline } from "../baseline/rates.js";


export interface RiskEstimate {
  probability: number;
  band: Band;
  /** Predicted risks at which the elevated and high bands begin (absent: the calibration never reaches it). */
  cutPoints: { elevated?: number; high?: number };
  /** Share of flagged apps in the model's training rows. */
  baseRate: number;
  /** odds(probability) / odds(base rate): how much the profile moves the odds, whatever the prevalence. */
  likelihoodRatio: number;
  /** The figure for a population with another share of flagged apps (`--prevalence`). */
  prevalence?: { share: number; probability: number; band: Band; cutPoints: { elevated?: number; high?: number } };
  /** The category the terms were computed against; absent for the pooled baseline. */
  featureCategory?: string;
  /** What raises the log-odds most: permissions (their whole effect, indicator and terms) and the terms. */
  contributions: { kind: "permission" | "term"; name: string; description: string; logOdds: number }[];
  /** For each requested permission: the risk without it. Largest drop first. */
  whatIf: { permission: string; without: number; change: number }[];
  /** The risk without every requested permission that is uncommon for the category, when there are several. */
  withoutUncommon?: { permissions: string[]; without: number };
  /** The label-free figure: where the app's summed surprisal falls among the baseline's apps of its category. */
  atypicality?: { percentile: number; category?: string; apps: number };
  /** In-corpus and later-corpus ROC AUC, for the caution. */
  quality: { inCorpus: number; validation: { name: string; auc: number }[] };
  corpus: string;
  caution: string;
}

export { bandCutPoints, bandOf, type Band } from "../baseline/bands.js";
import { bandCutPoints, bandOf, type Band } from "../baseline/bands.js";

/** Most entries a per-permission cache keeps before starting afresh. */
export const CACHE_LIMIT = 100_000;

const logit = (p: number) => Math.log(p / (1 - p));
const sigmoid = (z: number) => 1 / (1 + Math.exp(-z));

/**
 * Prior shift (Saerens, Latinne & Decaestecker, "Adjusting the outputs of a classifier to new a priori
 * probabilities", Neural Computation 14, 2002): logit p′ = logit p + logit π′ − logit π.
 * @example shiftPrevalence(0.5, 0.37, 0.05) // → about 0.082
 */
export function shiftPrevalence(p: number, from: number, to: number): number {
  if (!(to > 0 && to < 1)) throw new RangeError(`a prevalence must lie strictly between 0 and 1 (got ${to})`);
  return sigmoid(logit(Math.min(1 - 1e-12, Math.max(1e-12, p))) + logit(to) - logit(from));
}

export class RiskScorer {
  private readonly index: ReadonlyMap<string, number>;
  readonly cuts: { elevated?: number; high?: number };

  constructor(
    readonly baseline: Baseline,
    readonly model: StoredModel,
    readonly caution: string,
    private readonly atypicality?: BaselineFile["atypicality"],
  ) {
    this.index = new Map(model.vocabulary.map((p, j) => [p, j]));
    this.cuts = bandCutPoints(model);
  }

  /** A permission's category terms, looked up once per category (bounded: a sweep meets endless custom names). */
  private termsOf(category: string | undefined, permission: string): PermissionTerms {
    const key = `${category ?? ""}\u0000${permission}`;
    let t = this.termsCache.get(key);
    if (!t) {
      if (this.termsCache.size >= CACHE_LIMIT) this.termsCache.clear();
      this.termsCache.set(key, (t = permissionTerms(this.baseline, category, permission)));
    }
    return t;
  }

  private readonly termsCache = new Map<string, PermissionTerms>();

  /** Log-odds of an app in `category` requesting `permissions`. */
  logOdds(category: string | undefined, permissions: readonly string[]): number {
    const perms = [...new Set(permissions)];
    return this.parts(category, perms).z();
  }

  /**
   * Each permission's weight and category terms, looked up once, and the log-odds of the app with any
   * one of them left out — summed in the same order as for the whole app, so that a what-if figure is
   * exactly the log-odds of the smaller app (not the whole minus a part, which rounds differently).
   */
  private parts(category: string | undefined, perms: readonly string[]): { z: (without?: (i: number) => boolean) => number; terms: number[]; uncommon: boolean[] } {
    const m = this.model;
    const weight = perms.map((p) => {
      const j = this.index.get(p);
      return j === undefined ? undefined : m.permissionWeights[j];
    });
    const t = perms.map((p) => this.termsOf(category, p));
    const z = (without?: (i: number) => boolean): number => {
      let sum = m.intercept;
      for (let i = 0; i < perms.length; i++) if (weight[i] !== undefined && !without?.(i)) sum += weight[i]!;
      termsOf(without).forEach((v, k) => (sum += m.termWeights[k] * v));
      return sum;
    };
    // The three category-relative terms in TERM_NAMES order, summed as appTerms sums them.
    const termsOf = (without?: (i: number) => boolean): number[] => {
      let us = 0;
      let uo = 0;
      let sp = 0;
      for (let i = 0; i < perms.length; i++) {
        if (without?.(i)) continue;
        us += t[i].uncommonSensitive;
        uo += t[i].uncommonOther;
        sp += t[i].surprisal;
      }
      return [Math.log1p(us), Math.log1p(uo), sp];
    };
    // Uncommon as the model's features see it: by the era rule's basis (a permission newer than the baseline
    // and not judged by frequency is not "uncommon", just unmeasured).
    return { z, terms: termsOf(), uncommon: t.map((x) => x.uncommonSensitive + x.uncommonOther > 0) };
  }

  probability(category: string | undefined, permissions: readonly string[]): number {
    return sigmoid(this.logOdds(category, permissions));
  }

  estimate(category: string | undefined, permissions: readonly string[], prevalence?: number): RiskEstimate {
    const m = this.model;
    const perms = [...new Set(permissions)];
    const parts = this.parts(category, perms);
    const z = parts.z();
    const probability = sigmoid(z);
    const base = m.evaluation.baseRate;
    const zWithout = perms.map((_, i) => parts.z((k) => k === i));
    const whatIf = perms
      .map((p, i) => {
        const without = sigmoid(zWithout[i]);
        return { permission: p, without, change: without - probability };
      })
      .sort((a, b) => a.change - b.change || compareText(a.permission, b.permission));
    const terms = parts.terms;
    const contributions: RiskEstimate["contributions"] = [
      ...perms.map((p, i) => ({ kind: "permission" as const, name: p, description: p, logOdds: z - zWithout[i] })),
      ...TERM_NAMES.map((t, k) => ({ kind: "term" as const, name: t, description: TERM_DESCRIPTIONS[t as TermName], logOdds: m.termWeights[k] * terms[k] })),
    ]
      .filter((c) => c.logOdds > 1e-9)
      .sort((a, b) => b.logOdds - a.logOdds);
    const uncommon = perms.filter((_, i) => parts.uncommon[i]);
    const out: RiskEstimate = {
      probability,
      band: bandOf(probability, this.cuts),
      cutPoints: this.cuts,
      baseRate: base,
      likelihoodRatio: Math.exp(z - logit(base)),
      ...(category !== undefined ? { featureCategory: category } : {}),
      contributions,
      whatIf,
      ...(uncommon.length > 1 ? { withoutUncommon: { permissions: uncommon, without: sigmoid(parts.z((i) => parts.uncommon[i])) } } : {}),
      quality: { inCorpus: m.evaluation.auc, validation: m.validation.map((v) => ({ name: v.name, auc: v.auc })) },
      corpus: m.corpus,
      caution: this.caution,
    };
    const a = this.atypicality;
    if (a) {
      const points = category !== undefined ? a.categories[category] : a.pooled;
      if (points?.length) out.atypicality = { percentile: percentileOf(points, terms[2]), ...(category !== undefined ? { category } : {}), apps: a.apps[category ?? ""] ?? 0 };
    }
    if (prevalence !== undefined) {
      const shift = (p: number) => shiftPrevalence(p, base, prevalence);
      const cuts = { ...(this.cuts.elevated !== undefined ? { elevated: shift(this.cuts.elevated) } : {}), ...(this.cuts.high !== undefined ? { high: shift(this.cuts.high) } : {}) };
      const shifted = shift(probability);
      out.prevalence = { share: prevalence, probability: shifted, band: bandOf(shifted, cuts), cutPoints: cuts };
    }
    return out;
  }
}
