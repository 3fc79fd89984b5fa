/**
 * The bounded logistic fit against an independent reference: the same problem solved by cyclic
 * coordinate descent with one-dimensional Newton steps clipped at the bound (a different algorithm,
 * written here), and the KKT conditions, which certify an optimum whatever algorithm found it.
 */
import { describe, expect, it } from "vitest";
import { boundedLogisticObjective, fitBoundedLogistic, kktResidual, type SparseRow } from "../../../src/baseline/stats/bounded-logistic.js";
import { seededRandom } from "../../../src/util/random.js";

/** Reference: cyclic coordinate descent, exact-ish 1-D Newton steps with halving, w ≥ 0, b free. */
function coordinateDescent(rows: SparseRow[], y: number[], p: number, lambda: number, sweeps = 400) {
  const n = rows.length;
  const w = new Float64Array(p);
  let b = 0;
  const z = new Float64Array(n);
  const cols: [number, number][][] = Array.from({ length: p }, () => []);
  rows.forEach((r, i) => r.forEach(([j, x]) => cols[j].push([i, x])));
  const f = () => boundedLogisticObjective(rows, y, p, lambda, w, b);
  for (let s = 0; s < sweeps; s++) {
    for (let j = -1; j < p; j++) {
      const entries = j < 0 ? rows.map((_, i) => [i, 1] as [number, number]) : cols[j];
      let g = 0;
      let h = 0;
      for (const [i, x] of entries) {
        const q = 1 / (1 + Math.exp(-z[i]));
        g += (q - y[i]) * x;
        h += q * (1 - q) * x * x;
      }
      g /= n;
      h /= n;
      if (j >= 0) {
        g += lambda * w[j];
        h += lambda;
      }
      if (h <= 0) continue;
      const old = j < 0 ? b : w[j];
      let next = old - g / h;
      if (j >= 0) next = Math.max(0, next);
      const before = f();
      let step = next - old;
      for (let k = 0; k < 30; k++) {
        const cand = old + step;
        if (j < 0) b = cand;
        else w[j] = cand;
        if (f() <= before + 1e-15) break;
        step /= 2;
      }
      const d = (j < 0 ? b : w[j]) - old;
      if (d !== 0) for (const [i, x] of entries) z[i] += d * x;
    }
  }
  return { w, b };
}

function synthetic(n: number, p: number, seed: number) {
  const rand = seededRandom(seed);
  const truth = Array.from({ length: p }, (_, j) => (j % 3 === 0 ? -0.8 : 1.2 * rand()));
  const rows: SparseRow[] = [];
  const y: number[] = [];
  for (let i = 0; i < n; i++) {
    const row: [number, number][] = [];
    let z = -1;
    for (let j = 0; j < p; j++) {
      if (rand() < 0.3) {
        const x = j === p - 1 ? 2 * rand() : 1; // one dense-ish continuous feature, the rest indicators
        row.push([j, x]);
        z += truth[j] * x;
      }
    }
    rows.push(row);
    y.push(rand() < 1 / (1 + Math.exp(-z)) ? 1 : 0);
  }
  return { rows, y };
}

describe("fitBoundedLogistic", () => {
  for (const lambda of [1e-4, 1e-2]) {
    it(`matches coordinate descent and satisfies KKT (λ = ${lambda})`, () => {
      const { rows, y } = synthetic(1500, 12, 7);
      const fit = fitBoundedLogistic(rows, y, 12, { lambda, tolerance: 1e-8, maxIterations: 20000 });
      expect(fit.converged).toBe(true);
      expect(fit.kktResidual).toBeLessThan(1e-7);
      const ref = coordinateDescent(rows, y, 12, lambda);
      expect(kktResidual(rows, y, 12, lambda, ref.w, ref.b)).toBeLessThan(1e-6);
      const TOL = 1e-3; // both solve a strictly convex problem; weights agree to this (stated tolerance)
      for (let j = 0; j < 12; j++) expect(Math.abs(fit.weights[j] - ref.w[j]), `w${j}`).toBeLessThan(TOL);
      expect(Math.abs(fit.intercept - ref.b)).toBeLessThan(TOL);
      // The features generated with negative effects end at the bound.
      for (let j = 0; j < 12; j += 3) expect(fit.weights[j]).toBe(0);
    });
  }

  it("never has a negative weight and refuses labels of one class", () => {
    const { rows, y } = synthetic(300, 6, 3);
    const fit = fitBoundedLogistic(rows, y, 6, { lambda: 1e-3 });
    for (const w of fit.weights) expect(w).toBeGreaterThanOrEqual(0);
    expect(() => fitBoundedLogistic(rows, y.map(() => 1), 6, { lambda: 1e-3 })).toThrow(/one class/);
  });

  it("gives the worked example", () => {
    // Two rows with feature 0 labelled 1, two without labelled 0: the weight grows until the L2 term holds it.
    const fit = fitBoundedLogistic([[[0, 1]], [[0, 1]], [], []], [1, 1, 0, 0], 1, { lambda: 0.01, tolerance: 1e-9, maxIterations: 50000 });
    expect(fit.weights[0]).toBeGreaterThan(3);
    expect(fit.weights[0]).toBeLessThan(5);
  });
});
