/**
 * Calibration table by quantile bins of the predicted probability (deciles by default): rows sorted by
 * prediction are cut into `bins` groups of (nearly) equal size, never splitting rows with the same
 * prediction (so a model with few distinct scores gives fewer, larger bins); each bin reports its
 * prediction range, mean prediction, observed positive rate and size. Well calibrated: mean ≈ observed.
 * Throws RangeError when the lengths differ or are zero.
 *
 * @example calibrationTable([0.1, 0.2, 0.8, 0.9], [0, 0, 1, 1], 2)
 * // → [{ from: 0.1, to: 0.2, meanPredicted: 0.15, observed: 0, n: 2 }, { from: 0.8, to: 0.9, meanPredicted: 0.85, observed: 1, n: 2 }]
 */
export interface CalibrationBin {
  from: number;
  to: number;
  meanPredicted: number;
  observed: number;
  n: number;
}

export function calibrationTable(probabilities: ArrayLike<number>, labels: ArrayLike<number>, bins = 10): CalibrationBin[] {
  const n = probabilities.length;
  if (n === 0 || labels.length !== n) throw new RangeError(`calibrationTable: ${n} probabilities, ${labels.length} labels`);
  const order = Array.from({ length: n }, (_, i) => i).sort((a, b) => probabilities[a] - probabilities[b]);
  const out: CalibrationBin[] = [];
  let start = 0;
  for (let b = 1; b <= bins && start < n; b++) {
    let end = Math.max(start + 1, Math.floor((b * n) / bins));
    while (end < n && probabilities[order[end]] === probabilities[order[end - 1]]) end++;
    if (b === bins) end = n;
    let sp = 0;
    let sy = 0;
    for (let i = start; i < end; i++) {
      sp += probabilities[order[i]];
      sy += labels[order[i]];
    }
    out.push({ from: probabilities[order[start]], to: probabilities[order[end - 1]], meanPredicted: sp / (end - start), observed: sy / (end - start), n: end - start });
    start = end;
  }
  return out;
}
