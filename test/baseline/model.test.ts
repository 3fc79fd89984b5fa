import { describe, expect, it } from "vitest";
import { rowRisk, stratifiedFolds, trainRiskModel, type TrainingRow } from "../../src/baseline/model.js";
import { seededRandom } from "../../src/util/random.js";

/** Invented rows: permission 0 goes with the flag, permission 1 with nothing; three zero terms. */
function rows(n: number, seed: number): TrainingRow[] {
  const r = seededRandom(seed);
  return Array.from({ length: n }, () => {
    const flagged = r() < 0.3 ? 1 : 0;
    const indicators = [...(r() < (flagged ? 0.8 : 0.1) ? [0] : []), ...(r() < 0.5 ? [1] : [])];
    return { indicators, terms: [0, 0, 0], label: flagged, references: { dangerousCount: indicators.length, permissionCount: indicators.length, surprisal: 0 } } as unknown as TrainingRow;
  });
}

describe("the monotone risk model", () => {
  const data = rows(600, 4);
  const model = trainRiskModel(data, { vocabulary: ["org.example.permission.SIGNAL", "org.example.permission.NOISE"], seed: 1, folds: 3 });

  it("keeps every weight at or above zero, so removing a permission never raises the risk", () => {
    expect(model.permissionWeights.every((w) => w >= 0)).toBe(true);
    expect(model.termWeights.every((w) => w >= 0)).toBe(true);
    const weights = [...model.permissionWeights, ...model.termWeights];
    const v = model.permissionWeights.length;
    for (const r of data.slice(0, 50)) {
      for (const j of r.indicators) {
        const without = { ...r, indicators: r.indicators.filter((x) => x !== j) };
        expect(rowRisk(model.intercept, weights, v, without)).toBeLessThanOrEqual(rowRisk(model.intercept, weights, v, r) + 1e-12);
      }
    }
  });

  it("learns that the signal permission goes with the flag and the noise one does not", () => {
    expect(model.permissionWeights[0]).toBeGreaterThan(1);
    expect(model.permissionWeights[1]).toBeLessThan(0.3);
    expect(model.evaluation.auc).toBeGreaterThan(0.8);
  });

  it("puts each label class into every fold in about its share", () => {
    const labels = data.map((r) => r.label);
    const folds = stratifiedFolds(labels, 3, seededRandom(2));
    for (let f = 0; f < 3; f++) {
      const inFold = labels.filter((_, i) => folds[i] === f);
      const share = inFold.filter((l) => l === 1).length / inFold.length;
      const overall = labels.filter((l) => l === 1).length / labels.length;
      expect(Math.abs(share - overall)).toBeLessThan(0.02);
    }
  });
});
