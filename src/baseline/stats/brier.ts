/**
 * Brier score: the mean squared difference between predicted probabilities and 0/1 outcomes
 * (Brier 1950). Lower is better; always predicting the base rate p scores p(1−p).
 * Throws RangeError when the lengths differ or are zero.
 *
 * @example brierScore([0.9, 0.2], [1, 0]) // → 0.025
 */
export function brierScore(probabilities: ArrayLike<number>, labels: ArrayLike<number>): number {
  const n = probabilities.length;
  if (n === 0 || labels.length !== n) throw new RangeError(`brierScore: ${n} probabilities, ${labels.length} labels`);
  let s = 0;
  for (let i = 0; i < n; i++) s += (probabilities[i] - labels[i]) ** 2;
  return s / n;
}
