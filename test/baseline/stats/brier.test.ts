import { describe, expect, it } from "vitest";
import { brierScore } from "../../../src/baseline/stats/brier.js";

describe("brierScore", () => {
  it("computes the mean squared error of probabilities", () => {
    expect(brierScore([0.9, 0.2], [1, 0])).toBeCloseTo(0.025, 12); // worked by hand: (0.01 + 0.04) / 2
  });
});
