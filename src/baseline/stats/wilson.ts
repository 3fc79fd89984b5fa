/**
 * Wilson score interval for a binomial proportion (Wilson 1927), without continuity correction —
 * "method 3" in Newcombe (1998), Statistics in Medicine 17:857–872.
 *
 *   centre = (p + z²/2n) / (1 + z²/n),  half-width = z·sqrt(p(1−p)/n + z²/4n²) / (1 + z²/n)
 *
 * where p = k/n and z is the standard normal quantile for the confidence level.
 * Throws RangeError when n ≤ 0, k < 0 or k > n, or the confidence is not in (0, 1).
 *
 * @example wilsonInterval(81, 263) // → { lower: 0.2553…, upper: 0.3662… } (Newcombe 1998, Table I)
 */
export function wilsonInterval(k: number, n: number, confidence = 0.95): { lower: number; upper: number } {
  if (!(n > 0) || k < 0 || k > n) throw new RangeError(`wilsonInterval needs 0 ≤ k ≤ n and n > 0 (k=${k}, n=${n})`);
  const z = normalQuantile(1 - (1 - confidence) / 2);
  const p = k / n;
  const z2 = z * z;
  const denom = 1 + z2 / n;
  const centre = (p + z2 / (2 * n)) / denom;
  const half = (z * Math.sqrt((p * (1 - p)) / n + z2 / (4 * n * n))) / denom;
  return { lower: Math.max(0, centre - half), upper: Math.min(1, centre + half) };
}

/** Acklam's coefficients (central region a/b, tails c/d). */
const ACKLAM_A = [-3.969683028665376e1, 2.209460984245205e2, -2.759285104469687e2, 1.38357751867269e2, -3.066479806614716e1, 2.506628277459239];
const ACKLAM_B = [-5.447609879822406e1, 1.615858368580409e2, -1.556989798598866e2, 6.680131188771972e1, -1.328068155288572e1];
const ACKLAM_C = [-7.784894002430293e-3, -3.223964580411365e-1, -2.400758277161838, -2.549732539343734, 4.374664141464968, 2.938163982698783];
const ACKLAM_D = [7.784695709041462e-3, 3.224671290700398e-1, 2.445134137142996, 3.754408661907416];

/**
 * Quantile of the standard normal distribution (inverse CDF), by Acklam's rational approximation
 * (relative error below 1.15e-9; common practice). Not simple-statistics' `probit`, whose approximation
 * is off by about 3e-3 at 0.975 — too coarse to reproduce Newcombe's four-decimal intervals.
 * Throws RangeError outside (0, 1).
 *
 * @example normalQuantile(0.975) // → 1.95996398… (exact: 1.959963984540054)
 */
export function normalQuantile(p: number): number {
  if (!(p > 0 && p < 1)) throw new RangeError(`normalQuantile needs 0 < p < 1 (p=${p})`);
  const [a, b, c, d] = [ACKLAM_A, ACKLAM_B, ACKLAM_C, ACKLAM_D];
  const lo = 0.02425;
  let x: number;
  if (p < lo) {
    const q = Math.sqrt(-2 * Math.log(p));
    x = (((((c[0] * q + c[1]) * q + c[2]) * q + c[3]) * q + c[4]) * q + c[5]) / ((((d[0] * q + d[1]) * q + d[2]) * q + d[3]) * q + 1);
  } else if (p <= 1 - lo) {
    const q = p - 0.5;
    const r = q * q;
    x = ((((((a[0] * r + a[1]) * r + a[2]) * r + a[3]) * r + a[4]) * r + a[5]) * q) / (((((b[0] * r + b[1]) * r + b[2]) * r + b[3]) * r + b[4]) * r + 1);
  } else {
    const q = Math.sqrt(-2 * Math.log(1 - p));
    x = -(((((c[0] * q + c[1]) * q + c[2]) * q + c[3]) * q + c[4]) * q + c[5]) / ((((d[0] * q + d[1]) * q + d[2]) * q + d[3]) * q + 1);
  }
  return x;
}
