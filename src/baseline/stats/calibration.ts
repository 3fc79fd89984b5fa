/**
 * Calibration table by quantile bins of the predicted probability (deciles by default): rows sorted by
 * prediction are cut into `bins` groups of (nearly) equal size; each bin reports its prediction range,
 * mean prediction, observed positive rate and size. A well-calibrated model has mean ≈ observed.
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
  for (let b = 0; b < bins; b++) {
    const start = Math.floor((b * n) / bins);
    const end = Math.floor(((b + 1) * n) / bins);
    if (end <= start) continue;
    let sp = 0;
    let sy = 0;
    for (let i = start; i < end; i++) {
      sp += probabilities[order[i]];
      sy += labels[order[i]];
    }
    out.push({ from: probabilities[order[start]], to: probabilities[order[end - 1]], meanPredicted: sp / (end - start), observed: sy / (end - start), n: end - start });
  }
  return out;
}
