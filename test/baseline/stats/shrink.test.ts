import { describe, expect, it } from "vitest";
import { empiricalBayesStrength, shrinkToward } from "../../../src/baseline/stats/shrink.js";

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
describe("empiricalBayesStrength with the sample variance", () => {
  it("matches the method-of-moments strength worked by hand for three groups", () => {
    // Rates 0.1, 0.2, 0.3 on n = 100 each: pooled p = 0.2, sample variance s² = 0.01 (n − 1 denominator),
    // noise p(1−p)·mean(1/n) = 0.16 · 0.01 = 0.0016, τ² = 0.0084, strength = 0.16/0.0084 − 1 = 18.047… (worked by hand).
    expect(empiricalBayesStrength([{ k: 10, n: 100 }, { k: 20, n: 100 }, { k: 30, n: 100 }])).toBeCloseTo(0.16 / 0.0084 - 1, 9);
  });
});
