import { describe, expect, it } from "vitest";
import { brierScore } from "../../src/baseline/stats/brier.js";
import { calibrationTable } from "../../src/baseline/stats/calibration.js";
import { fitLogistic, predictLogistic } from "../../src/baseline/stats/logistic.js";
import { rocAuc } from "../../src/baseline/stats/roc-auc.js";
import { empiricalBayesStrength, shrinkToward } from "../../src/baseline/stats/shrink.js";
import { normalQuantile, wilsonInterval } from "../../src/baseline/stats/wilson.js";

const TOL = 5e-5; // the published values are given to four decimals

describe("wilsonInterval", () => {
  // Newcombe RG (1998), "Two-sided confidence intervals for the single proportion: comparison of seven
  // methods", Statistics in Medicine 17:857–872, Table I, method 3 (score, no continuity correction).
  // Values from memory of that table.
  const cases: [number, number, number, number][] = [
    [81, 263, 0.2553, 0.3662],
    [15, 148, 0.0624, 0.1605],
    [0, 20, 0.0, 0.1611],
    [1, 29, 0.0061, 0.1718],
  ];
  for (const [k, n, lower, upper] of cases) {
    it(`matches Newcombe's ${k}/${n}: ${lower}–${upper}`, () => {
      const ci = wilsonInterval(k, n);
      expect(Math.abs(ci.lower - lower)).toBeLessThan(TOL);
      expect(Math.abs(ci.upper - upper)).toBeLessThan(TOL);
    });
  }

  it("uses the normal quantile for the confidence level", () => {
    expect(normalQuantile(0.975)).toBeCloseTo(1.959963984540054, 8); // common practice: z for 95%
    expect(normalQuantile(0.995)).toBeCloseTo(2.5758293035489, 8); // common practice: z for 99%
    expect(wilsonInterval(5, 10, 0.99).upper).toBeGreaterThan(wilsonInterval(5, 10, 0.95).upper);
  });

  it("refuses impossible counts", () => {
    expect(() => wilsonInterval(3, 2)).toThrow(RangeError);
    expect(() => wilsonInterval(0, 0)).toThrow(RangeError);
  });
});

describe("shrinkToward and empiricalBayesStrength", () => {
  it("is the beta-binomial posterior mean", () => {
    expect(shrinkToward(3, 10, 0.5, 10)).toBeCloseTo(0.4, 12);
    expect(shrinkToward(3, 10, 0.5, 0)).toBeCloseTo(0.3, 12);
    expect(shrinkToward(0, 0, 0.2, 5)).toBeCloseTo(0.2, 12);
  });

  it("estimates a small strength when categories differ and the cap when they do not", () => {
    expect(empiricalBayesStrength([{ k: 10, n: 100 }, { k: 50, n: 100 }])).toBeCloseTo(1.696, 3); // worked by hand: 0.21/0.0779 − 1
    expect(empiricalBayesStrength([{ k: 30, n: 100 }, { k: 30, n: 100 }], 500)).toBe(500);
  });
});

describe("rocAuc", () => {
  it("equals U/(n1·n0) on a hand-checked example with ties", () => {
    // Positives 0.35, 0.8, 0.5; negatives 0.1, 0.5, 0.4.
    // Pairs (pos > neg count 1, tie ½): 0.35 beats 0.1 → 1; 0.8 beats all 3 → 3; 0.5 beats 0.1, 0.4, ties 0.5 → 2.5.
    // U = 6.5, n1·n0 = 9 → 0.7222… (common practice: AUC is the Mann–Whitney U over n1·n0).
    expect(rocAuc([0.1, 0.35, 0.8, 0.5, 0.5, 0.4], [0, 1, 1, 1, 0, 0])).toBeCloseTo(6.5 / 9, 12);
    expect(rocAuc([1, 1, 1, 1], [0, 1, 0, 1])).toBe(0.5);
  });
});

describe("brierScore and calibrationTable", () => {
  it("computes the mean squared error of probabilities", () => {
    expect(brierScore([0.9, 0.2], [1, 0])).toBeCloseTo(0.025, 12);
  });
  it("bins by predicted probability", () => {
    expect(calibrationTable([0.1, 0.2, 0.8, 0.9], [0, 0, 1, 1], 2)).toEqual([
      { from: 0.1, to: 0.2, meanPredicted: expect.closeTo(0.15, 12), observed: 0, n: 2 },
      { from: 0.8, to: 0.9, meanPredicted: expect.closeTo(0.85, 12), observed: 1, n: 2 },
    ]);
  });
});

describe("fitLogistic", () => {
  it("reproduces the published Challenger O-ring fit, logit p = 15.0429 − 0.2322·t", () => {
    // Dalal, Fowlkes & Hoadley (1989), JASA 84:945–957: 23 pre-accident launches, launch temperature (°F)
    // and whether any O-ring was damaged. Data and coefficients from memory of the paper's Table 1 and fit.
    const temperature = [66, 70, 69, 68, 67, 72, 73, 70, 57, 63, 70, 78, 67, 53, 67, 75, 70, 81, 76, 79, 75, 76, 58];
    const damaged = [0, 1, 0, 0, 0, 0, 0, 0, 1, 1, 1, 0, 0, 1, 0, 0, 0, 0, 0, 0, 1, 0, 1];
    const fit = fitLogistic(temperature.map((t) => [t]), damaged, { learningRate: 2 });
    expect(fit.converged).toBe(true);
    expect(Math.abs(fit.intercept - 15.0429)).toBeLessThan(1e-3);
    expect(Math.abs(fit.coefficients[0] - -0.2322)).toBeLessThan(1e-4);
    // At 31 °F (the accident's launch temperature) the fitted probability is close to 1.
    expect(predictLogistic(fit, [31])).toBeGreaterThan(0.99);
  });

  it("reports non-convergence when given too few steps", () => {
    const fit = fitLogistic([[0], [1], [2], [3], [4], [5]], [0, 0, 1, 0, 1, 1], { steps: 2, maxSteps: 2, learningRate: 0.01 });
    expect(fit.converged).toBe(false);
  });
});
