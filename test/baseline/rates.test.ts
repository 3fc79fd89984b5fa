import { describe, expect, it } from "vitest";
import { CountTable } from "../../src/baseline/counts.js";
import { Baseline, DEFAULT_RATE_PARAMETERS } from "../../src/baseline/rates.js";
import { wilsonInterval } from "../../src/baseline/stats/wilson.js";

const CAMERA = "android.permission.CAMERA";
const SMS = "android.permission.SEND_SMS";

function table(): CountTable {
  const t = new CountTable();
  for (let i = 0; i < 100; i++) t.add({ category: "Social", permissions: i < 60 ? [CAMERA] : [] });
  for (let i = 0; i < 40; i++) t.add({ category: "Tools", permissions: i < 4 ? [CAMERA, SMS] : [] });
  for (let i = 0; i < 10; i++) t.add({ category: "Weather", permissions: [CAMERA] });
  return t;
}

describe("Baseline rates", () => {
  const b = new Baseline(table(), DEFAULT_RATE_PARAMETERS);

  it("shrinks a category's rate toward the pooled rate with the stated pseudo-count", () => {
    const r = b.rate("Tools", CAMERA);
    const pooled = (74 + 0.5) / (150 + 1); // Jeffreys-smoothed pooled rate
    expect(r.pooledRate).toBeCloseTo(pooled, 12);
    expect(r.rate).toBeCloseTo((4 + 10 * pooled) / (40 + 10), 12);
    expect([r.k, r.n]).toEqual([4, 40]);
    expect(r.lower).toBeCloseTo(wilsonInterval(4, 40).lower, 12);
  });

  it("falls back to the pooled baseline below the minimum support, and says why", () => {
    expect(b.rate("Weather", CAMERA)).toMatchObject({ fallback: "below-min-support", k: 74, n: 150 });
    expect(b.rate("Games", CAMERA)).toMatchObject({ fallback: "unknown-category" });
    expect(b.rate(undefined, CAMERA)).toMatchObject({ fallback: "no-category" });
    expect(b.rate("Weather", CAMERA).category).toBeUndefined();
  });

  it("calls a permission uncommon only when the interval's upper end is below the threshold", () => {
    expect(b.rate("Social", SMS).uncommon).toBe(true); // 0 of 100: upper end 3.7%
    expect(b.rate("Tools", SMS).uncommon).toBe(false); // 4 of 40: upper end 23%
  });

  it("gives exactly the rates of a table without an app when that app is excluded", () => {
    const without = new CountTable();
    let skipped = false;
    for (let i = 0; i < 100; i++) {
      const perms = i < 60 ? [CAMERA] : [];
      if (!skipped && i === 0) { skipped = true; continue; }
      without.add({ category: "Social", permissions: perms });
    }
    for (let i = 0; i < 40; i++) without.add({ category: "Tools", permissions: i < 4 ? [CAMERA, SMS] : [] });
    for (let i = 0; i < 10; i++) without.add({ category: "Weather", permissions: [CAMERA] });
    const loo = new Baseline(without, DEFAULT_RATE_PARAMETERS);
    for (const p of [CAMERA, SMS]) {
      expect(b.rate("Social", p, { category: "Social", permissions: new Set([CAMERA]) })).toEqual(loo.rate("Social", p));
    }
  });

  it("estimates an empirical-Bayes strength per permission when asked", () => {
    const eb = new Baseline(table(), { ...DEFAULT_RATE_PARAMETERS, prior: { method: "empirical-bayes", strength: 1000 } });
    // Social 60% vs Tools 10% camera: categories differ, so the estimated strength is small.
    expect(eb.rate("Tools", CAMERA).strength).toBeLessThan(10);
    expect(eb.rate("Tools", CAMERA).rate).toBeLessThan(b.rate("Tools", CAMERA).rate);
  });
});
