/**
 * Logistic regression fitted with ml-logistic-regression, with what that library leaves to its caller:
 *
 * - it has no intercept: a column of ones is added;
 * - it does not standardize: features are centred and scaled (population standard deviation), and the
 *   means and scales are returned so that scoring applies the same transform;
 * - it runs `numSteps` full-batch gradient steps of w += rate · Xᵀ(y − σ(Xw)) (a summed, not averaged,
 *   gradient) from zero weights, with no convergence check: we pass rate = learningRate / n so that
 *   `learningRate` is the step on the mean log-likelihood, check convergence ourselves on the gradient of
 *   the mean log-likelihood at the final weights, and when it has not converged train again with twice
 *   the steps (up to `maxSteps`). Each step costs milliseconds at 10,000 rows, so few steps matter;
 * - it trains one-vs-all, which for two labels means two mirror-image classifiers: we train the single
 *   classifier we need through the library's own serialized form (`LogisticRegression.load` with one
 *   classifier), halving the cost, and read probabilities from `testScores`.
 */
import { mean, standardDeviation } from "simple-statistics";
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
  /** Gradient steps of the first attempt (default 100); doubled until converged or past `maxSteps`. */
  steps?: number;
  /** Most steps tried (default 25,600). */
  maxSteps?: number;
  /**
   * Step size on the mean log-likelihood of the standardized problem. Default: 1/L, where
   * L = λmax(ZᵀZ)/(4n) bounds the curvature of the mean log-likelihood (σ' ≤ ¼), the largest step
   * for which plain gradient ascent is sure to converge (common practice).
   */
  learningRate?: number;
  /** Largest gradient component of the mean log-likelihood at which the fit counts as converged (default 1e-4). */
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
  const firstSteps = options.steps ?? 100;
  const maxSteps = Math.max(firstSteps, options.maxSteps ?? 25_600);
  const tolerance = options.tolerance ?? 1e-4;
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

  const Z = new Matrix(n, p + 1);
  for (let i = 0; i < n; i++) {
    Z.set(i, 0, 1);
    for (let j = 0; j < p; j++) Z.set(i, j + 1, (X[i][j] - means[j]) / scales[j]);
  }
  const learningRate = options.learningRate ?? 4 / largestEigenvalue(Z);
  let attempt: ReturnType<typeof trainOnce>;
  let steps = firstSteps;
  for (;;) {
    attempt = trainOnce(Z, y, steps, learningRate / n);
    if (attempt.gradientMax < tolerance || steps * 2 > maxSteps) break;
    steps *= 2;
  }
  const { w, meanLogLikelihood, gradientMax } = attempt;
  if (process.env.OVERASK_TRACE_FIT) process.stderr.write(`fit n=${n} p=${p} steps=${steps} lr=${learningRate.toFixed(3)} grad=${gradientMax.toExponential(1)}\n`);
  const coefficients = w.slice(1).map((b, j) => b / scales[j]);
  const intercept = w[0] - coefficients.reduce((s, b, j) => s + b * means[j], 0);
  return {
    intercept,
    coefficients,
    standardized: { means, scales, intercept: w[0], weights: w.slice(1) },
    meanLogLikelihood,
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

/** One run of the library's trainer, then our own look at the mean log-likelihood and its gradient. */
function trainOnce(Z: Matrix, y: number[], steps: number, rate: number): { w: number[]; meanLogLikelihood: number; gradientMax: number } {
  const n = Z.rows;
  const cols = Z.columns;
  const model = LogisticRegression.load({
    name: "LogisticRegression",
    numSteps: steps,
    learningRate: rate,
    numberClasses: 1,
    classifiers: [{ numSteps: steps, learningRate: rate, weights: null }],
  });
  const classifier = model.classifiers[0];
  classifier.train(Z, Matrix.columnVector(y));
  const w = classifier.weights!.to1DArray();
  const scores = classifier.testScores(Z);
  let ll = 0;
  const grad = new Array<number>(cols).fill(0);
  for (let i = 0; i < n; i++) {
    const q = Math.min(Math.max(scores[i], 1e-15), 1 - 1e-15);
    ll += y[i] * Math.log(q) + (1 - y[i]) * Math.log(1 - q);
    const r = y[i] - scores[i];
    for (let j = 0; j < cols; j++) grad[j] += (r * Z.get(i, j)) / n;
  }
  return { w, meanLogLikelihood: ll / n, gradientMax: Math.max(...grad.map(Math.abs)) };
}

/** λmax(ZᵀZ/n) by power iteration on the small (columns × columns) Gram matrix. */
function largestEigenvalue(Z: Matrix): number {
  const n = Z.rows;
  const c = Z.columns;
  const G = Array.from({ length: c }, () => new Array<number>(c).fill(0));
  for (let i = 0; i < n; i++) {
    for (let a = 0; a < c; a++) {
      const za = Z.get(i, a);
      if (za === 0) continue;
      for (let b = a; b < c; b++) G[a][b] += (za * Z.get(i, b)) / n;
    }
  }
  for (let a = 0; a < c; a++) for (let b = 0; b < a; b++) G[a][b] = G[b][a];
  let v = new Array<number>(c).fill(1 / Math.sqrt(c));
  let lambda = 1;
  for (let it = 0; it < 100; it++) {
    const u = G.map((row) => row.reduce((s, g, b) => s + g * v[b], 0));
    const norm = Math.hypot(...u);
    if (norm === 0) return 1;
    v = u.map((x) => x / norm);
    if (Math.abs(norm - lambda) < 1e-9 * norm) return norm;
    lambda = norm;
  }
  return lambda;
}
