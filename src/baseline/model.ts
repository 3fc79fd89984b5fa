/**
 * The over-permissioning risk model: a logistic regression on the monotone features of features.ts,
 * with every coefficient held non-negative (a feature whose fitted coefficient comes out negative is
 * dropped and the model refitted, and the drop is recorded), evaluated by seeded, stratified k-fold
 * cross-validation against two reference scores.
 *
 * What the model estimates is how strongly an app's permission profile is associated with the flagged
 * apps of the training corpus. It is not evidence of intent or harm.
 */
import { brierScore } from "./stats/brier.js";
import { calibrationTable, type CalibrationBin } from "./stats/calibration.js";
import { fitLogistic, type LogisticFit } from "./stats/logistic.js";
import { rocAuc } from "./stats/roc-auc.js";
import { shuffleInPlace } from "simple-statistics";
import { seededRandom, type Random } from "../util/random.js";

export interface TrainingRow {
  features: number[];
  label: 0 | 1;
  /** Reference scores: the number of dangerous permissions, and the summed surprisal alone. */
  references: { dangerousCount: number; surprisal: number };
}

export interface TrainingOptions {
  featureNames: readonly string[];
  seed: number;
  folds: number;
  steps: number;
  maxSteps?: number;
  /** Default: 1/L of the standardized problem (see fitLogistic). */
  learningRate?: number;
}

export interface DroppedFeature {
  feature: string;
  coefficient: number;
}

export interface ScoreEvaluation {
  auc: number;
  brier: number;
}

export interface RiskModel {
  /** Features the model uses, in order, with their coefficients. */
  features: string[];
  intercept: number;
  coefficients: number[];
  standardized: { means: number[]; scales: number[]; intercept: number; weights: number[] };
  /** Candidate features dropped for a negative coefficient when fitting on all rows, in order. */
  dropped: DroppedFeature[];
  training: {
    rows: number;
    positives: number;
    steps: number;
    learningRate: number;
    converged: boolean;
    gradientMax: number;
    meanLogLikelihood: number;
  };
  evaluation: {
    folds: number;
    seed: number;
    /** Out-of-fold figures of the model. */
    auc: number;
    brier: number;
    baseRate: number;
    /** Brier score of always predicting the base rate, for scale. */
    brierOfBaseRate: number;
    calibration: CalibrationBin[];
    /** Deciles (10th … 90th percentile) of the out-of-fold predicted risk. */
    predictedDeciles: number[];
    /** Reference scores: AUC of the raw score, Brier of a cross-validated one-feature logistic fit. */
    references: Record<"dangerousCount" | "surprisal", ScoreEvaluation>;
  };
}

/** Fits with non-negative coefficients by dropping the most negative feature and refitting. */
export function fitMonotone(
  rows: readonly TrainingRow[],
  columns: number[],
  names: readonly string[],
  options: Pick<TrainingOptions, "steps" | "maxSteps" | "learningRate">,
): { fit: LogisticFit; kept: number[]; dropped: DroppedFeature[] } {
  let kept = [...columns];
  const dropped: DroppedFeature[] = [];
  const y = rows.map((r) => r.label);
  for (;;) {
    const X = rows.map((r) => kept.map((j) => r.features[j]));
    const fit = fitLogistic(X, y, options);
    let worst = -1;
    for (let j = 0; j < kept.length; j++) if (fit.standardized.weights[j] < 0 && (worst < 0 || fit.standardized.weights[j] < fit.standardized.weights[worst])) worst = j;
    if (worst < 0) return { fit, kept, dropped };
    dropped.push({ feature: names[kept[worst]], coefficient: fit.coefficients[worst] });
    kept = kept.filter((_, j) => j !== worst);
  }
}

/** Assigns rows to k folds, stratified by label, in an order fixed by the seed. */
export function stratifiedFolds(labels: readonly number[], k: number, rand: Random): number[] {
  const fold = new Array<number>(labels.length);
  for (const cls of [0, 1]) {
    // Fisher–Yates with the seeded source (simple-statistics' shuffleInPlace).
    const idx = shuffleInPlace(labels.map((l, i) => (l === cls ? i : -1)).filter((i) => i >= 0), rand);
    idx.forEach((row, i) => (fold[row] = i % k));
  }
  return fold;
}

function predictRow(fit: LogisticFit, kept: number[], features: number[]): number {
  let z = fit.intercept;
  for (let j = 0; j < kept.length; j++) z += fit.coefficients[j] * features[kept[j]];
  return 1 / (1 + Math.exp(-z));
}

function quantile(sorted: number[], q: number): number {
  // Linear interpolation between order statistics (Hyndman & Fan type 7, the common default). Not
  // simple-statistics' quantileSorted, which takes a nearest order statistic (or the mean of two): the
  // deciles stored in baselines are type 7.
  const h = (sorted.length - 1) * q;
  const lo = Math.floor(h);
  return sorted[lo] + (h - lo) * ((sorted[Math.min(lo + 1, sorted.length - 1)] ?? sorted[lo]) - sorted[lo]);
}

export function trainRiskModel(rows: readonly TrainingRow[], options: TrainingOptions): RiskModel {
  const names = options.featureNames;
  const all = names.map((_, j) => j);
  const labels = rows.map((r) => r.label);
  const positives = labels.reduce<number>((s, l) => s + l, 0);
  if (positives === 0 || positives === rows.length) throw new RangeError("the labeled corpus needs both flagged and unflagged apps");

  // Cross-validation repeats the whole procedure, feature dropping included, inside each fold.
  const folds = stratifiedFolds(labels, options.folds, seededRandom(options.seed));
  const oof = new Array<number>(rows.length).fill(0);
  const refOof = { dangerousCount: new Array<number>(rows.length).fill(0), surprisal: new Array<number>(rows.length).fill(0) };
  for (let f = 0; f < options.folds; f++) {
    const train = rows.filter((_, i) => folds[i] !== f);
    const { fit, kept } = fitMonotone(train, all, names, options);
    for (const key of ["dangerousCount", "surprisal"] as const) {
      const ref = fitLogistic(train.map((r) => [r.references[key]]), train.map((r) => r.label), options);
      rows.forEach((r, i) => {
        if (folds[i] === f) refOof[key][i] = predictRow(ref, [0], [r.references[key]]);
      });
    }
    rows.forEach((r, i) => {
      if (folds[i] === f) oof[i] = predictRow(fit, kept, r.features);
    });
  }

  const { fit, kept, dropped } = fitMonotone(rows, all, names, options);
  const baseRate = positives / rows.length;
  const sorted = [...oof].sort((a, b) => a - b);
  const reference = (key: "dangerousCount" | "surprisal"): ScoreEvaluation => ({
    auc: rocAuc(rows.map((r) => r.references[key]), labels),
    brier: brierScore(refOof[key], labels),
  });
  return {
    features: kept.map((j) => names[j]),
    intercept: fit.intercept,
    coefficients: fit.coefficients,
    standardized: fit.standardized,
    dropped,
    training: {
      rows: rows.length,
      positives,
      steps: fit.steps,
      learningRate: fit.learningRate,
      converged: fit.converged,
      gradientMax: fit.gradientMax,
      meanLogLikelihood: fit.meanLogLikelihood,
    },
    evaluation: {
      folds: options.folds,
      seed: options.seed,
      auc: rocAuc(oof, labels),
      brier: brierScore(oof, labels),
      baseRate,
      brierOfBaseRate: baseRate * (1 - baseRate),
      calibration: calibrationTable(oof, labels, 10),
      predictedDeciles: [0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7, 0.8, 0.9].map((q) => quantile(sorted, q)),
      references: { dangerousCount: reference("dangerousCount"), surprisal: reference("surprisal") },
    },
  };
}

export { modelRisk } from "./model-risk.js";
