import { describe, expect, it } from "vitest";
import { normalQuantile, wilsonInterval } from "../../../src/baseline/stats/wilson.js";

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
