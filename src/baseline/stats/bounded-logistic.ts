/**
 * L2-penalised logistic regression with every weight bounded below by 0 (the intercept is free): the fit
 * behind a monotone risk model, where removing a permission can never raise the risk.
 *
 *   minimise  (1/n) Σ log(1 + exp(−s_i z_i)) + (λ/2)·‖w‖²   subject to  w ≥ 0,   z_i = b + x_iᵀw, s_i = ±1
 *
 * Method: accelerated projected gradient (FISTA, Beck & Teboulle 2009) with a backtracking step on the
 * smooth part and the adaptive restart of O'Donoghue & Candès (2015); the projection onto w ≥ 0 is a clip.
 * Rows are sparse (index, value) lists, as permission indicators are. Stops when the largest component of
 * the projected gradient (the KKT residual) is below `tolerance`, or after `maxIterations`.
 * Throws RangeError when the labels are all of one class or the rows are empty.
 *
 * @example fitBoundedLogistic([[[0, 1]], [[0, 1]], [], []], [1, 1, 0, 0], 1, { lambda: 0.01 }).weights[0] // → about 3.9
 */

/** A sparse row: [feature index, value] pairs. */
export type SparseRow = readonly (readonly [number, number])[];

export interface BoundedLogisticOptions {
  lambda: number;
  maxIterations?: number;
  tolerance?: number;
  /** Warm start. */
  start?: { weights: ArrayLike<number>; intercept: number };
  /** Bound the weights below by 0 (default true); false gives the ordinary L2 fit, as a reference. */
  nonNegative?: boolean;
}

export interface BoundedLogisticFit {
  weights: Float64Array;
  intercept: number;
  iterations: number;
  converged: boolean;
  /** Largest component of the projected gradient at the solution (0 at an exact optimum). */
  kktResidual: number;
  objective: number;
}

function objectiveAndGradient(rows: readonly SparseRow[], y: ArrayLike<number>, p: number, lambda: number, w: Float64Array, b: number, grad: Float64Array | undefined): { f: number; gb: number } {
  const n = rows.length;
  let f = 0;
  let gb = 0;
  if (grad) grad.fill(0);
  for (let i = 0; i < n; i++) {
    let z = b;
    const r = rows[i];
    for (let k = 0; k < r.length; k++) z += w[r[k][0]] * r[k][1];
    // log(1 + e^{-sz}) computed stably; its derivative in z is σ(z) − y.
    const s = y[i] === 1 ? 1 : -1;
    const m = -s * z;
    f += m > 0 ? m + Math.log1p(Math.exp(-m)) : Math.log1p(Math.exp(m));
    if (grad) {
      const sig = z >= 0 ? 1 / (1 + Math.exp(-z)) : Math.exp(z) / (1 + Math.exp(z));
      const g = sig - y[i];
      gb += g;
      for (let k = 0; k < r.length; k++) grad[r[k][0]] += g * r[k][1];
    }
  }
  let reg = 0;
  for (let j = 0; j < p; j++) reg += w[j] * w[j];
  f = f / n + (lambda / 2) * reg;
  if (grad) for (let j = 0; j < p; j++) grad[j] = grad[j] / n + lambda * w[j];
  return { f, gb: gb / n };
}

export function fitBoundedLogistic(rows: readonly SparseRow[], y: ArrayLike<number>, p: number, options: BoundedLogisticOptions): BoundedLogisticFit {
  const n = rows.length;
  if (n === 0) throw new RangeError("no rows to fit");
  let pos = 0;
  for (let i = 0; i < n; i++) pos += y[i];
  if (pos === 0 || pos === n) throw new RangeError("the labels are all of one class");
  const lambda = options.lambda;
  const lo = options.nonNegative === false ? -Infinity : 0;
  const maxIt = options.maxIterations ?? 3000;
  const tol = options.tolerance ?? 1e-6;
  let w = new Float64Array(p);
  let b = Math.log(pos / (n - pos));
  if (options.start) {
    for (let j = 0; j < p; j++) w[j] = Math.max(lo, options.start.weights[j]);
    b = options.start.intercept;
  }
  // FISTA state: the extrapolated point (v, c) at which gradients are taken.
  let v = Float64Array.from(w);
  let c = b;
  let t = 1;
  let L = 1;
  const g = new Float64Array(p);
  const wNew = new Float64Array(p);
  let fw = objectiveAndGradient(rows, y, p, lambda, w, b, undefined).f;
  let it = 0;
  let kkt = Infinity;
  for (; it < maxIt; it++) {
    const { f: fv, gb } = objectiveAndGradient(rows, y, p, lambda, v, c, g);
    // Backtracking: the quadratic model at v must bound the objective at the projected step.
    let bNew = c;
    for (;;) {
      for (let j = 0; j < p; j++) wNew[j] = Math.max(lo, v[j] - g[j] / L);
      bNew = c - gb / L;
      let dot = (bNew - c) * gb;
      let sq = (bNew - c) * (bNew - c);
      for (let j = 0; j < p; j++) {
        const d = wNew[j] - v[j];
        dot += d * g[j];
        sq += d * d;
      }
      const fNew = objectiveAndGradient(rows, y, p, lambda, wNew, bNew, undefined).f;
      if (fNew <= fv + dot + (L / 2) * sq + 1e-15 * Math.abs(fv)) {
        // Adaptive restart when the objective goes up: drop the momentum.
        const restart = fNew > fw;
        const tNext = restart ? 1 : (1 + Math.sqrt(1 + 4 * t * t)) / 2;
        const beta = restart ? 0 : (t - 1) / tNext;
        for (let j = 0; j < p; j++) {
          v[j] = wNew[j] + beta * (wNew[j] - w[j]);
          w[j] = wNew[j];
        }
        c = bNew + beta * (bNew - b);
        b = bNew;
        t = tNext;
        fw = fNew;
        break;
      }
      L *= 2;
    }
    L = Math.max(L / 1.25, 1e-8);
    if (it % 10 === 9) {
      kkt = kktResidual(rows, y, p, lambda, w, b, lo === 0);
      if (kkt < tol) {
        it++;
        break;
      }
    }
  }
  kkt = kktResidual(rows, y, p, lambda, w, b, lo === 0);
  return { weights: w, intercept: b, iterations: it, converged: kkt < tol * 10, kktResidual: kkt, objective: fw };
}

/**
 * The KKT residual of the problem at (w, b): for a free or positive coordinate the gradient itself, for a
 * coordinate at its bound 0 only a negative gradient (which would want it to grow).
 */
export function kktResidual(rows: readonly SparseRow[], y: ArrayLike<number>, p: number, lambda: number, w: Float64Array, b: number, bounded = true): number {
  const g = new Float64Array(p);
  const { gb } = objectiveAndGradient(rows, y, p, lambda, w, b, g);
  let r = Math.abs(gb);
  for (let j = 0; j < p; j++) r = Math.max(r, !bounded || w[j] > 0 ? Math.abs(g[j]) : Math.max(0, -g[j]));
  return r;
}

/** The objective value at (w, b), for comparisons. */
export function boundedLogisticObjective(rows: readonly SparseRow[], y: ArrayLike<number>, p: number, lambda: number, w: ArrayLike<number>, b: number): number {
  return objectiveAndGradient(rows, y, p, lambda, Float64Array.from(w), b, undefined).f;
}

/** The predicted probability of a sparse row. */
export function predictSparse(row: SparseRow, weights: ArrayLike<number>, intercept: number): number {
  let z = intercept;
  for (const [j, x] of row) z += weights[j] * x;
  return 1 / (1 + Math.exp(-z));
}
