import { describe, expect, it } from "vitest";
import { calibrationTable } from "../../../src/baseline/stats/calibration.js";

describe("calibrationTable", () => {
  it("bins by predicted probability", () => {
    expect(calibrationTable([0.1, 0.2, 0.8, 0.9], [0, 0, 1, 1], 2)).toEqual([
      { from: 0.1, to: 0.2, meanPredicted: expect.closeTo(0.15, 12), observed: 0, n: 2 },
      { from: 0.8, to: 0.9, meanPredicted: expect.closeTo(0.85, 12), observed: 1, n: 2 },
    ]);
  });
});
