import { describe, expect, it } from "vitest";
import { pick, randomInt, seededRandom } from "../../src/util/random.js";

describe("the seeded generator", () => {
  it("repeats exactly for a seed, and differs between seeds", () => {
    const a = seededRandom(7);
    const b = seededRandom(7);
    const c = seededRandom(8);
    const xs = Array.from({ length: 5 }, () => a());
    expect(Array.from({ length: 5 }, () => b())).toEqual(xs);
    expect(Array.from({ length: 5 }, () => c())).not.toEqual(xs);
  });

  it("stays in [0, 1) with a mean near one half over many draws", () => {
    const r = seededRandom(1);
    let sum = 0;
    for (let i = 0; i < 20_000; i++) {
      const x = r();
      expect(x >= 0 && x < 1).toBe(true);
      sum += x;
    }
    // Uniform on [0,1): mean 1/2, standard error 1/sqrt(12·20000) ≈ 0.002 (common practice: 5 s.e.).
    expect(Math.abs(sum / 20_000 - 0.5)).toBeLessThan(0.01);
  });

  it("draws whole numbers within their bounds, and picks from a list", () => {
    const r = seededRandom(3);
    for (let i = 0; i < 1000; i++) {
      const n = randomInt(r, 2, 5);
      expect(Number.isInteger(n) && n >= 2 && n <= 5).toBe(true);
    }
    expect(["a", "b"]).toContain(pick(r, ["a", "b"]));
  });
});
