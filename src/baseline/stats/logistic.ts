/**
 * Logistic regression fitted with ml-logistic-regression, with what that library leaves to its caller:
 *
 * - it has no intercept: a column of ones is added;
 * - it does not standardize: features are centred and scaled (population standard deviation), and the
 *   means and scales are returned so that scoring applies the same transform;
 * - it runs `numSteps` full-batch gradient steps of w += rate · Xᵀ(y − σ(Xw)) (a summed, not averaged,
 *   gradient) with no convergence check: we pass rate = learningRate / n so that `learningRate` is the
 *   step on the mean log-likelihood, and check convergence ourselves on the gradient of the mean
 *   log-likelihood at the final weights;
 * - it trains one-vs-all, which for two labels means two mirror-image classifiers: we train the single
 *   classifier we need through the library's own serialized form (`LogisticRegression.load` with one
 *   classifier), halving the cost, and read probabilities from `testScores`.
 */
import LogisticRegression from "ml-logistic-regression";
import { Matrix } from "ml-matrix";

export interface LogisticFit {
  /** Intercept and coefficients on the original (unstandardized) feature scale. */
  intercept: number;
  coefficients: number[];
  /** The same model on the standardized scale, as trained. */
  standardized: { means: number[]; scales: number[]; intercept: number; weights: number[] };
  /** Mean log-likelihood at the final weights. */
  meanLogLikelihood: number;
  /** Largest absolute component of the mean log-likelihood's gradient at the final weights. */
  gradientMax: number;
  converged: boolean;
  steps: number;
  learningRate: number;
}

export interface LogisticOptions {
  /** Gradient steps (default 2000). */
  steps?: number;
  /** Step size on the mean log-likelihood of the standardized problem (default 1). */
  learningRate?: number;
  /** Gradient size below which the fit counts as converged (default 1e-4). */
  tolerance?: number;
}

/**
 * Fits P(y=1|x) = σ(b + x·β) by full-batch gradient ascent on standardized features.
 * Throws RangeError when rows and labels differ in number, or when there are no rows.
 *
 * @example fitLogistic([[0], [1], [2], [3]], [0, 1, 0, 1]).coefficients // → [≈ 0.67]
 */
export function fitLogistic(X: number[][], y: number[], options: LogisticOptions = {}): LogisticFit {
  const n = X.length;
  if (n === 0 || y.length !== n) throw new RangeError(`fitLogistic: ${n} rows, ${y.length} labels`);
  const steps = options.steps ?? 2000;
  const learningRate = options.learningRate ?? 1;
  const tolerance = options.tolerance ?? 1e-4;
  const p = X[0].length;
  const means = new Array<number>(p).fill(0);
  const scales = new Array<number>(p).fill(0);
  for (const row of X) for (let j = 0; j < p; j++) means[j] += row[j] / n;
  for (const row of X) for (let j = 0; j < p; j++) scales[j] += (row[j] - means[j]) ** 2 / n;
  for (let j = 0; j < p; j++) scales[j] = scales[j] > 0 ? Math.sqrt(scales[j]) : 1;

  const Z = new Matrix(n, p + 1);
  for (let i = 0; i < n; i++) {
    Z.set(i, 0, 1);
    for (let j = 0; j < p; j++) Z.set(i, j + 1, (X[i][j] - means[j]) / scales[j]);
  }
  const model = LogisticRegression.load({
    name: "LogisticRegression",
    numSteps: steps,
    learningRate: learningRate / n,
    numberClasses: 1,
    classifiers: [{ numSteps: steps, learningRate: learningRate / n, weights: null }],
  });
  const classifier = model.classifiers[0];
  classifier.train(Z, Matrix.columnVector(y));
  const w = classifier.weights!.to1DArray();

  // Our own check: mean log-likelihood and its gradient at the final weights.
  const scores = classifier.testScores(Z);
  let ll = 0;
  const grad = new Array<number>(p + 1).fill(0);
  for (let i = 0; i < n; i++) {
    const q = Math.min(Math.max(scores[i], 1e-15), 1 - 1e-15);
    ll += y[i] * Math.log(q) + (1 - y[i]) * Math.log(1 - q);
    const r = y[i] - scores[i];
    for (let j = 0; j <= p; j++) grad[j] += (r * Z.get(i, j)) / n;
  }
  const gradientMax = Math.max(...grad.map(Math.abs));

  const coefficients = w.slice(1).map((b, j) => b / scales[j]);
  const intercept = w[0] - coefficients.reduce((s, b, j) => s + b * means[j], 0);
  return {
    intercept,
    coefficients,
    standardized: { means, scales, intercept: w[0], weights: w.slice(1) },
    meanLogLikelihood: ll / n,
    gradientMax,
    converged: gradientMax < tolerance,
    steps,
    learningRate,
  };
}

/** σ(b + x·β) for a fitted model, on the original feature scale. */
export function predictLogistic(fit: Pick<LogisticFit, "intercept" | "coefficients">, x: number[]): number {
  let z = fit.intercept;
  for (let j = 0; j < x.length; j++) z += fit.coefficients[j] * x[j];
  return 1 / (1 + Math.exp(-z));
}
