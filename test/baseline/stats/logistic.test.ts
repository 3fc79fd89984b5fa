import { describe, expect, it } from "vitest";
import { fitLogistic, predictLogistic } from "../../../src/baseline/stats/logistic.js";

describe("fitLogistic", () => {
  it("reproduces the published Challenger O-ring fit, logit p = 15.0429 − 0.2322·t", () => {
    // Dalal, Fowlkes & Hoadley (1989), JASA 84:945–957: 23 pre-accident launches, launch temperature (°F)
    // and whether any O-ring was damaged. Data and coefficients from memory of the paper's Table 1 and fit.
    const temperature = [66, 70, 69, 68, 67, 72, 73, 70, 57, 63, 70, 78, 67, 53, 67, 75, 70, 81, 76, 79, 75, 76, 58];
    const damaged = [0, 1, 0, 0, 0, 0, 0, 0, 1, 1, 1, 0, 0, 1, 0, 0, 0, 0, 0, 0, 1, 0, 1];
    const fit = fitLogistic(temperature.map((t) => [t]), damaged);
    expect(fit.converged).toBe(true);
    expect(Math.abs(fit.intercept - 15.0429)).toBeLessThan(1e-3);
    expect(Math.abs(fit.coefficients[0] - -0.2322)).toBeLessThan(1e-4);
    // At 31 °F (the accident's launch temperature) the fitted probability is close to 1.
    expect(predictLogistic(fit, [31])).toBeGreaterThan(0.99);
  });

  it("reports non-convergence when given too few iterations", () => {
    const fit = fitLogistic([[0], [1], [2], [3], [4], [5]], [0, 0, 1, 0, 1, 1], { maxIterations: 2 });
    expect(fit.converged).toBe(false);
  });

  it("refuses labels all of one class, where no maximum-likelihood fit exists", () => {
    expect(() => fitLogistic([[0], [1]], [1, 1])).toThrow(RangeError);
  });
});
