import { describe, expect, it } from "vitest";
import { rocAuc } from "../../../src/baseline/stats/roc-auc.js";

describe("rocAuc", () => {
  it("equals U/(n1·n0) on a hand-checked example with ties", () => {
    // Positives 0.35, 0.8, 0.5; negatives 0.1, 0.5, 0.4.
    // Pairs (pos > neg count 1, tie ½): 0.35 beats 0.1 → 1; 0.8 beats all 3 → 3; 0.5 beats 0.1, 0.4, ties 0.5 → 2.5.
    // U = 6.5, n1·n0 = 9 → 0.7222… (common practice: AUC is the Mann–Whitney U over n1·n0).
    expect(rocAuc([0.1, 0.35, 0.8, 0.5, 0.5, 0.4], [0, 1, 1, 1, 0, 0])).toBeCloseTo(6.5 / 9, 12);
    expect(rocAuc([1, 1, 1, 1], [0, 1, 0, 1])).toBe(0.5);
  });
});
