/**
 * Area under the ROC curve, computed as the Mann–Whitney U statistic of the positives' scores divided by
 * n₁·n₀, with tied scores given their average rank (so a tie between a positive and a negative counts ½).
 * Throws RangeError when the lengths differ or either class is empty.
 *
 * @example rocAuc([0.1, 0.4, 0.35, 0.8], [0, 0, 1, 1]) // → 0.75
 */
export function rocAuc(scores: ArrayLike<number>, labels: ArrayLike<number>): number {
  const n = scores.length;
  if (labels.length !== n) throw new RangeError(`rocAuc: ${n} scores but ${labels.length} labels`);
  const order = Array.from({ length: n }, (_, i) => i).sort((a, b) => scores[a] - scores[b]);
  let rankSumPositive = 0;
  let positives = 0;
  for (let i = 0; i < n; ) {
    let j = i;
    while (j + 1 < n && scores[order[j + 1]] === scores[order[i]]) j++;
    const averageRank = (i + j) / 2 + 1; // ranks are 1-based
    for (let t = i; t <= j; t++) if (labels[order[t]] === 1) { rankSumPositive += averageRank; positives++; }
    i = j + 1;
  }
  const negatives = n - positives;
  if (positives === 0 || negatives === 0) throw new RangeError("rocAuc needs both positive and negative labels");
  const u = rankSumPositive - (positives * (positives + 1)) / 2;
  return u / (positives * negatives);
}
