import { describe, expect, it } from "vitest";
import { bandCutPoints, bandOf } from "../../src/baseline/bands.js";

describe("risk bands", () => {
  // A worked calibration: base rate 0.2; bins (from, observed share flagged).
  const evaluation = {
    baseRate: 0.2,
    calibration: [
      { from: 0, to: 0.1, meanPredicted: 0.05, observed: 0.04, n: 100 },
      { from: 0.1, to: 0.3, meanPredicted: 0.2, observed: 0.19, n: 100 },
      { from: 0.3, to: 0.5, meanPredicted: 0.4, observed: 0.35, n: 100 },
      { from: 0.5, to: 0.8, meanPredicted: 0.65, observed: 0.62, n: 100 },
      { from: 0.8, to: 1, meanPredicted: 0.9, observed: 0.88, n: 100 },
    ],
  };

  it("start 'elevated' where flagged apps are more common than in the corpus, 'high' halfway to 1", () => {
    // Elevated: first bin with observed > 0.2 (from 0.3); high: first with observed ≥ (1 + 0.2)/2 = 0.6 (from 0.5).
    expect(bandCutPoints({ evaluation } as never)).toEqual({ elevated: 0.3, high: 0.5 });
  });

  it("place a risk in its band at the cut points", () => {
    const cuts = { elevated: 0.3, high: 0.5 };
    expect(bandOf(0.29, cuts)).toBe("low");
    expect(bandOf(0.3, cuts)).toBe("elevated");
    expect(bandOf(0.5, cuts)).toBe("high");
    expect(bandOf(0.99, {})).toBe("low");
  });
});
