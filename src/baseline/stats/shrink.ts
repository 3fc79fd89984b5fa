/**
 * Shrinking a category's rate toward the pooled rate: the posterior mean of a Beta prior centred on the
 * pooled rate with `strength` pseudo-observations (a beta-binomial model).
 *
 *   shrunk = (k + strength·pooled) / (n + strength)
 *
 * With strength 0 this is k/n; as n grows the category's own data dominates.
 * Throws RangeError for n < 0, k outside [0, n], pooled outside [0, 1] or a negative strength.
 *
 * @example shrinkToward(3, 10, 0.5, 10) // → 0.4   ((3 + 5) / 20)
 */
import { sampleVariance } from "simple-statistics";
export function shrinkToward(k: number, n: number, pooled: number, strength: number): number {
  if (n < 0 || k < 0 || k > n || pooled < 0 || pooled > 1 || strength < 0) {
    throw new RangeError(`shrinkToward needs 0 ≤ k ≤ n, 0 ≤ pooled ≤ 1, strength ≥ 0 (k=${k}, n=${n}, pooled=${pooled}, strength=${strength})`);
  }
  if (n + strength === 0) return pooled;
  return (k + strength * pooled) / (n + strength);
}

/**
 * Empirical-Bayes prior strength for one permission across categories, by the method of moments for the
 * beta-binomial model: with category rates p_c = k_c/n_c around the pooled rate p, the between-category
 * variance of the true rates is estimated as s² − p(1−p)·mean(1/n_c), and the Beta prior's strength is
 * p(1−p)/τ² − 1. When the estimated τ² is not positive (categories no more spread than sampling noise
 * explains) the strength is capped at `maxStrength`: shrink fully toward the pooled rate.
 * Needs at least two categories; returns `maxStrength` otherwise.
 *
 * @example empiricalBayesStrength([{ k: 10, n: 100 }, { k: 50, n: 100 }]) // → about 1.70
 */
export function empiricalBayesStrength(groups: { k: number; n: number }[], maxStrength = 10_000): number {
  const used = groups.filter((g) => g.n > 0);
  if (used.length < 2) return maxStrength;
  const K = used.reduce((s, g) => s + g.k, 0);
  const N = used.reduce((s, g) => s + g.n, 0);
  const p = K / N;
  if (p === 0 || p === 1) return maxStrength;
  const rates = used.map((g) => g.k / g.n);
  const s2 = sampleVariance(rates); // n − 1 in the denominator
  const noise = p * (1 - p) * (used.reduce((s, g) => s + 1 / g.n, 0) / used.length);
  const tau2 = s2 - noise;
  if (tau2 <= 0) return maxStrength;
  return Math.min(maxStrength, Math.max(0, (p * (1 - p)) / tau2 - 1));
}
