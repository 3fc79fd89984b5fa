/**
 * Ordinary (unpenalised, unbounded) logistic regression on a few dense features: the one-feature fits
 * that turn each reference score into a probability for its Brier score. It is the project's one logistic
 * fitter (stats/bounded-logistic.ts) run without the bound and without the penalty, on standardized
 * features (centred, scaled by the population standard deviation) so that the accelerated gradient
 * converges in few steps whatever the feature's scale; the coefficients are returned on the original scale.
 *
 * @example fitLogistic([[0], [1], [2], [3]], [0, 1, 0, 1]).coefficients // → [≈ 0.67]
 */
import { mean, standardDeviation } from "simple-statistics";
import { fitBoundedLogistic, type SparseRow } from "./bounded-logistic.js";

export interface LogisticFit {
  /** Intercept and coefficients on the original (unstandardized) feature scale. */
  intercept: number;
  coefficients: number[];
  /** The same model on the standardized scale, as trained. */
  standardized: { means: number[]; scales: number[]; intercept: number; weights: number[] };
  /** Largest absolute component of the mean log-loss's gradient at the final weights. */
  gradientMax: number;
  converged: boolean;
  iterations: number;
}

export interface LogisticOptions {
  /** Most iterations of the fitter (default 3,000). */
  maxIterations?: number;
  /** Largest gradient component at which the fit counts as converged (default 1e-6). */
  tolerance?: number;
}

/**
 * Fits P(y=1|x) = σ(b + x·β) by maximum likelihood. Throws RangeError when rows and labels differ in
 * number, when there are no rows, or when the labels are all of one class.
 */
export function fitLogistic(X: number[][], y: number[], options: LogisticOptions = {}): LogisticFit {
  const n = X.length;
  if (n === 0 || y.length !== n) throw new RangeError(`fitLogistic: ${n} rows, ${y.length} labels`);
  const p = X[0].length;
  // Column means and population standard deviations (simple-statistics; compensated sums).
  const means = new Array<number>(p);
  const scales = new Array<number>(p);
  for (let j = 0; j < p; j++) {
    const column = X.map((row) => row[j]);
    means[j] = mean(column);
    const sd = standardDeviation(column);
    scales[j] = sd > 0 ? sd : 1;
  }
  const rows: SparseRow[] = X.map((row) => row.map((x, j) => [j, (x - means[j]) / scales[j]] as const));
  const fit = fitBoundedLogistic(rows, y, p, { lambda: 0, nonNegative: false, maxIterations: options.maxIterations ?? 3000, tolerance: options.tolerance ?? 1e-6 });
  const weights = [...fit.weights];
  const coefficients = weights.map((b, j) => b / scales[j]);
  const intercept = fit.intercept - coefficients.reduce((s, b, j) => s + b * means[j], 0);
  return {
    intercept,
    coefficients,
    standardized: { means, scales, intercept: fit.intercept, weights },
    gradientMax: fit.kktResidual,
    converged: fit.converged,
    iterations: fit.iterations,
  };
}

/** σ(b + x·β) for a fitted model, on the original feature scale. */
export function predictLogistic(fit: Pick<LogisticFit, "intercept" | "coefficients">, x: number[]): number {
  let z = fit.intercept;
  for (let j = 0; j < x.length; j++) z += fit.coefficients[j] * x[j];
  return 1 / (1 + Math.exp(-z));
}
