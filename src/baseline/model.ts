/**
 * The over-permissioning risk model: a logistic regression with non-negative weights on one indicator per
 * permission of the labeled corpus and on three category-relative terms (features.ts), fitted on all labeled
 * rows by bounded L2-penalised logistic regression (stats/bounded-logistic.ts), with the penalty chosen by
 * inner cross-validation on the training rows only. It is evaluated by seeded, stratified k-fold
 * cross-validation — the penalty chosen anew inside each fold — beside simple reference scores on the same
 * rows, and can be validated on labeled corpora it never saw (a later era, for instance).
 *
 * What the model estimates is how strongly an app's permission profile is associated with the flagged
 * apps of the training corpus. It is not evidence of intent or harm.
 */
import { shuffleInPlace } from "simple-statistics";
import { seededRandom, type Random } from "../util/random.js";
import { TERM_NAMES } from "./features.js";
import { brierScore } from "./stats/brier.js";
import { fitBoundedLogistic, predictSparse, type SparseRow } from "./stats/bounded-logistic.js";
import { calibrationTable, type CalibrationBin } from "./stats/calibration.js";
import { fitLogistic, predictLogistic } from "./stats/logistic.js";
import { rocAuc } from "./stats/roc-auc.js";

export interface TrainingRow {
  label: 0 | 1;
  /** Indices into the vocabulary of the permissions the app requests. */
  indicators: number[];
  /** The category-relative terms, in TERM_NAMES order. */
  terms: number[];
  /** Reference scores on the same rows. */
  references: { dangerousCount: number; permissionCount: number; surprisal: number };
}

export interface TrainingOptions {
  vocabulary: readonly string[];
  seed: number;
  folds: number;
  /** L2 penalties to choose from (on the standardised features). */
  lambdas?: readonly number[];
  /** Inner folds for choosing the penalty. */
  innerFolds?: number;
}

export const DEFAULT_LAMBDAS = [1e-5, 1e-4, 1e-3, 1e-2] as const;

export interface ScoreEvaluation {
  auc: number;
  brier: number;
}

export type ReferenceName = "dangerousCount" | "permissionCount" | "surprisal" | "unconstrained";

export interface Evaluation {
  rows: number;
  positives: number;
  auc: number;
  brier: number;
  baseRate: number;
  /** Brier score of always predicting the base rate, for scale. */
  brierOfBaseRate: number;
  calibration: CalibrationBin[];
  /** Deciles (10th … 90th percentile) of the predicted risk. */
  predictedDeciles: number[];
  /** How many different risk values the rows received (a graded score has many). */
  distinctValues: number;
  /** Reference scores on the same rows: AUC of the raw score, Brier of a one-feature logistic fit. */
  references: Partial<Record<ReferenceName, ScoreEvaluation>>;
  /** Share of the rows in each band (cut points from the model's own out-of-fold calibration). */
  bands?: Record<Band, number>;
}

export interface ValidationResult extends Evaluation {
  /** How outputs name the corpus. */
  name: string;
  /** Share of the model's vocabulary the corpus records. */
  vocabularyOverlap: number;
}

export interface RiskModel {
  kind: "bounded-logistic";
  /** The permissions with an indicator, in weight order. */
  vocabulary: string[];
  intercept: number;
  /** Non-negative weight of each vocabulary permission (log-odds when requested). */
  permissionWeights: number[];
  /** Non-negative weights of the category-relative terms, in TERM_NAMES order. */
  termWeights: number[];
  lambda: number;
  /** The inner cross-validation's mean log loss for each penalty tried. */
  lambdaChoice: { lambda: number; logLoss: number }[];
  training: { rows: number; positives: number; iterations: number; converged: boolean; kktResidual: number; objective: number };
  evaluation: Evaluation & { folds: number; seed: number };
  /** Labeled corpora the model never saw, scored after training. */
  validation: ValidationResult[];
}

export { bandCutPoints, bandOf, type Band } from "./bands.js";
import { bandCutPoints, bandOf, type Band } from "./bands.js";

function bandShares(predicted: number[], cuts: { elevated?: number; high?: number }): Record<Band, number> {
  const out: Record<Band, number> = { low: 0, elevated: 0, high: 0 };
  for (const p of predicted) out[bandOf(p, cuts)] += 1 / predicted.length;
  return out;
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

function quantile(sorted: number[], q: number): number {
  // Linear interpolation between order statistics (Hyndman & Fan type 7, the common default). Not
  // simple-statistics' quantileSorted, which takes a nearest order statistic (or the mean of two).
  const h = (sorted.length - 1) * q;
  const lo = Math.floor(h);
  return sorted[lo] + (h - lo) * ((sorted[Math.min(lo + 1, sorted.length - 1)] ?? sorted[lo]) - sorted[lo]);
}

/** Scales that standardise each column (indicators and terms) on the given rows; 1 for a constant column. */
function columnScales(rows: readonly TrainingRow[], v: number): number[] {
  const p = v + TERM_NAMES.length;
  const sum = new Array<number>(p).fill(0);
  const sq = new Array<number>(p).fill(0);
  for (const r of rows) {
    for (const j of r.indicators) {
      sum[j] += 1;
      sq[j] += 1;
    }
    r.terms.forEach((t, k) => {
      sum[v + k] += t;
      sq[v + k] += t * t;
    });
  }
  const n = rows.length;
  return sum.map((s, j) => {
    const mean = s / n;
    const sd = Math.sqrt(Math.max(0, sq[j] / n - mean * mean));
    return sd > 1e-12 ? sd : 1;
  });
}

function sparse(r: TrainingRow, v: number, scales: readonly number[]): SparseRow {
  const out: [number, number][] = r.indicators.map((j) => [j, 1 / scales[j]]);
  r.terms.forEach((t, k) => {
    if (t !== 0) out.push([v + k, t / scales[v + k]]);
  });
  return out;
}

interface Fitted {
  intercept: number;
  /** Raw-scale weights: vocabulary, then terms. */
  weights: number[];
  fit: ReturnType<typeof fitBoundedLogistic>;
}

function fitRows(rows: readonly TrainingRow[], v: number, lambda: number, nonNegative = true, start?: Fitted): Fitted {
  const scales = columnScales(rows, v);
  const X = rows.map((r) => sparse(r, v, scales));
  const y = rows.map((r) => r.label);
  const fit = fitBoundedLogistic(X, y, v + TERM_NAMES.length, {
    lambda,
    nonNegative,
    maxIterations: 4000,
    tolerance: 1e-6,
    ...(start ? { start: { weights: start.weights.map((w, j) => w * scales[j]), intercept: start.intercept } } : {}),
  });
  return { intercept: fit.intercept, weights: Array.from(fit.weights, (w, j) => w / scales[j]), fit };
}

/** The model's probability for a row, from raw-scale weights. */
export function rowRisk(intercept: number, weights: readonly number[], v: number, r: Pick<TrainingRow, "indicators" | "terms">): number {
  let z = intercept;
  for (const j of r.indicators) z += weights[j];
  r.terms.forEach((t, k) => (z += weights[v + k] * t));
  return 1 / (1 + Math.exp(-z));
}

function logLoss(p: number[], y: number[]): number {
  let s = 0;
  for (let i = 0; i < p.length; i++) {
    const q = Math.min(1 - 1e-12, Math.max(1e-12, p[i]));
    s -= y[i] ? Math.log(q) : Math.log(1 - q);
  }
  return s / p.length;
}

/** Chooses the penalty by inner k-fold cross-validation (mean log loss), on `rows` only. */
export function chooseLambda(rows: readonly TrainingRow[], v: number, lambdas: readonly number[], k: number, seed: number): { lambda: number; scores: { lambda: number; logLoss: number }[] } {
  const labels = rows.map((r) => r.label);
  const folds = stratifiedFolds(labels, k, seededRandom(seed ^ 0x1a2b));
  const scores = lambdas.map((lambda) => ({ lambda, logLoss: 0 }));
  for (let f = 0; f < k; f++) {
    const train = rows.filter((_, i) => folds[i] !== f);
    const test = rows.filter((_, i) => folds[i] === f);
    let warm: Fitted | undefined;
    // From the strongest penalty down, each fit warm-started from the last.
    for (const s of [...scores].sort((a, b) => b.lambda - a.lambda)) {
      warm = fitRows(train, v, s.lambda, true, warm);
      s.logLoss += logLoss(test.map((r) => rowRisk(warm!.intercept, warm!.weights, v, r)), test.map((r) => r.label)) / k;
    }
  }
  const best = scores.reduce((a, b) => (b.logLoss < a.logLoss - 1e-12 ? b : a));
  return { lambda: best.lambda, scores };
}

/** Figures of a score on labeled rows. `oneFeatureBrier` fits each reference on `train` to score `rows`. */
export function evaluate(predicted: number[], rows: readonly TrainingRow[], references: Partial<Record<ReferenceName, ScoreEvaluation>>): Evaluation {
  const labels = rows.map((r) => r.label);
  const positives = labels.reduce<number>((s, l) => s + l, 0);
  const baseRate = positives / rows.length;
  const sorted = [...predicted].sort((a, b) => a - b);
  return {
    rows: rows.length,
    positives,
    auc: rocAuc(predicted, labels),
    brier: brierScore(predicted, labels),
    baseRate,
    brierOfBaseRate: baseRate * (1 - baseRate),
    calibration: calibrationTable(predicted, labels, 10),
    predictedDeciles: [0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7, 0.8, 0.9].map((q) => quantile(sorted, q)),
    distinctValues: new Set(predicted.map((p) => p.toFixed(6))).size,
    references,
  };
}

const REFERENCE_SCORES: ("dangerousCount" | "permissionCount" | "surprisal")[] = ["dangerousCount", "permissionCount", "surprisal"];

/** AUC of each raw reference score on the rows. */
export function referenceAucs(rows: readonly TrainingRow[]): Partial<Record<ReferenceName, ScoreEvaluation>> {
  const labels = rows.map((r) => r.label);
  return Object.fromEntries(REFERENCE_SCORES.map((k) => [k, { auc: rocAuc(rows.map((r) => r.references[k]), labels), brier: NaN }]));
}

export function trainRiskModel(rows: readonly TrainingRow[], options: TrainingOptions): RiskModel {
  const v = options.vocabulary.length;
  const labels = rows.map((r) => r.label);
  const positives = labels.reduce<number>((s, l) => s + l, 0);
  if (positives === 0 || positives === rows.length) throw new RangeError("the labeled corpus needs both flagged and unflagged apps");
  const lambdas = options.lambdas ?? DEFAULT_LAMBDAS;
  const inner = options.innerFolds ?? 3;

  // Outer cross-validation: everything the final fit does (choosing the penalty included) is repeated
  // inside each fold, on that fold's training rows only.
  const folds = stratifiedFolds(labels, options.folds, seededRandom(options.seed));
  const oof = new Array<number>(rows.length).fill(0);
  const oofFree = new Array<number>(rows.length).fill(0);
  const oofRef: Record<string, number[]> = Object.fromEntries(REFERENCE_SCORES.map((k) => [k, new Array<number>(rows.length).fill(0)]));
  for (let f = 0; f < options.folds; f++) {
    const train = rows.filter((_, i) => folds[i] !== f);
    const { lambda } = chooseLambda(train, v, lambdas, inner, options.seed + f);
    const m = fitRows(train, v, lambda);
    const free = fitRows(train, v, lambda, false, m);
    for (const k of REFERENCE_SCORES) {
      // One-feature logistic fit of each reference score, for its Brier score: an unbounded fit of one
      // feature, by the same fitter without bound or penalty (stats/logistic.ts).
      const ref = fitLogistic(train.map((r) => [r.references[k]]), train.map((r) => r.label));
      rows.forEach((r, i) => {
        if (folds[i] === f) oofRef[k][i] = predictLogistic(ref, [r.references[k]]);
      });
    }
    rows.forEach((r, i) => {
      if (folds[i] !== f) return;
      oof[i] = rowRisk(m.intercept, m.weights, v, r);
      oofFree[i] = rowRisk(free.intercept, free.weights, v, r);
    });
  }

  const choice = chooseLambda(rows, v, lambdas, inner, options.seed);
  const final = fitRows(rows, v, choice.lambda);
  const refs: Partial<Record<ReferenceName, ScoreEvaluation>> = {};
  for (const k of REFERENCE_SCORES) refs[k] = { auc: rocAuc(rows.map((r) => r.references[k]), labels), brier: brierScore(oofRef[k], labels) };
  refs.unconstrained = { auc: rocAuc(oofFree, labels), brier: brierScore(oofFree, labels) };
  const evaluation = { ...evaluate(oof, rows, refs), folds: options.folds, seed: options.seed };
  evaluation.bands = bandShares(oof, bandCutPoints({ evaluation }));
  return {
    kind: "bounded-logistic",
    vocabulary: [...options.vocabulary],
    intercept: final.intercept,
    permissionWeights: final.weights.slice(0, v),
    termWeights: final.weights.slice(v),
    lambda: choice.lambda,
    lambdaChoice: choice.scores,
    training: { rows: rows.length, positives, iterations: final.fit.iterations, converged: final.fit.converged, kktResidual: final.fit.kktResidual, objective: final.fit.objective },
    evaluation,
    validation: [],
  };
}

/** Scores labeled rows the model never saw, beside the reference scores on the same rows. */
export function validateModel(model: Pick<RiskModel, "intercept" | "permissionWeights" | "termWeights" | "vocabulary" | "evaluation">, rows: readonly TrainingRow[], name: string, vocabularyOverlap: number): ValidationResult {
  const v = model.vocabulary.length;
  const weights = [...model.permissionWeights, ...model.termWeights];
  const predicted = rows.map((r) => rowRisk(model.intercept, weights, v, r));
  return { name, vocabularyOverlap, ...evaluate(predicted, rows, referenceAucs(rows)), bands: bandShares(predicted, bandCutPoints(model)) };
}
