import { describe, expect, it } from "vitest";
import { bandOf } from "../../src/score/risk.js";
import { defaultJudge } from "../helpers/judge.js";

const scorer = defaultJudge.scorer!;

describe("bandOf", () => {
  it("puts a probability in the highest band whose cut point it reaches", () => {
    const cuts = { elevated: 0.3, high: 0.6 };
    expect(bandOf(0.1, cuts)).toBe("low");
    expect(bandOf(0.3, cuts)).toBe("elevated");
    expect(bandOf(0.6, cuts)).toBe("high");
    expect(bandOf(0.9, {})).toBe("low");
  });
});

describe("RiskScorer", () => {
  const perms = ["android.permission.INTERNET", "android.permission.READ_SMS", "android.permission.SEND_SMS", "android.permission.CAMERA"];

  it("gives each what-if figure as the probability of the app without that permission", () => {
    const e = scorer.estimate("TOOLS", perms);
    for (const w of e.whatIf) {
      expect(w.without).toBeCloseTo(scorer.probability("TOOLS", perms.filter((p) => p !== w.permission)), 12);
      expect(w.change).toBeCloseTo(w.without - e.probability, 12);
    }
  });

  it("counts as uncommon only what the model's features judge by frequency, not a permission newer than the baseline", () => {
    // POST_NOTIFICATIONS made an old behaviour explicit at API 33 (src/platform/data/permission-lineage.tsv); the
    // bundled baseline's apps (API 29) could not request it, so its zero count says nothing and is not judged.
    const app = ["android.permission.READ_SMS", "android.permission.ACCESS_BACKGROUND_LOCATION", "android.permission.POST_NOTIFICATIONS", "android.permission.INTERNET"];
    const e = scorer.estimate("TOOLS", app);
    expect(defaultJudge.baseline.rate("TOOLS", "android.permission.POST_NOTIFICATIONS").uncommon).toBe(true); // the raw count alone
    expect(e.withoutUncommon?.permissions.sort()).toEqual(["android.permission.ACCESS_BACKGROUND_LOCATION", "android.permission.READ_SMS"]);
    expect(e.withoutUncommon?.without).toBeCloseTo(scorer.probability("TOOLS", ["android.permission.POST_NOTIFICATIONS", "android.permission.INTERNET"]), 12);
  });

  it("never raises the risk when a permission is removed", () => {
    const e = scorer.estimate("TOOLS", perms);
    for (const w of e.whatIf) expect(w.change).toBeLessThanOrEqual(1e-12);
  });

  it("carries the caution with every estimate", () => {
    expect(scorer.estimate(undefined, perms).caution).toMatch(/not evidence of intent or harm/);
  });
});

describe("prevalence and the likelihood ratio", async () => {
  const { shiftPrevalence } = await import("../../src/score/risk.js");
  it("shifts a figure to another population by the prior-shift formula", () => {
    // Saerens, Latinne & Decaestecker (Neural Computation 2002): logit p′ = logit p + logit π′ − logit π. Worked by hand:
    // logit 0.5 = 0, logit 0.05 = −2.9444, logit 0.37 = −0.5322 → p′ = σ(−2.4122) = 0.08225.
    expect(shiftPrevalence(0.5, 0.37, 0.05)).toBeCloseTo(0.08225, 4);
    expect(shiftPrevalence(0.3, 0.3, 0.3)).toBeCloseTo(0.3, 12);
    expect(() => shiftPrevalence(0.5, 0.37, 1)).toThrow(RangeError);
  });

  it("gives the likelihood ratio, which needs no prevalence, and shifts the bands alike", () => {
    const perms = ["android.permission.SEND_SMS", "android.permission.READ_PHONE_STATE"];
    const e = scorer.estimate("TOOLS", perms, 0.02);
    const odds = (p: number) => p / (1 - p);
    expect(e.likelihoodRatio).toBeCloseTo(odds(e.probability) / odds(e.baseRate), 9);
    expect(e.prevalence!.probability).toBeCloseTo(shiftPrevalence(e.probability, e.baseRate, 0.02), 12);
    if (scorer.cuts.high !== undefined) expect(e.prevalence!.cutPoints.high).toBeCloseTo(shiftPrevalence(scorer.cuts.high, e.baseRate, 0.02), 12);
  });
});

describe("atypicality", async () => {
  const { percentileOf } = await import("../../src/baseline/atypicality.js");
  it("reads a percentile off the stored points by linear interpolation", () => {
    const points = Array.from({ length: 101 }, (_, i) => i / 10); // 0, 0.1, … 10
    expect(percentileOf(points, 5)).toBeCloseTo(50, 9);
    expect(percentileOf(points, 5.05)).toBeCloseTo(50.5, 9);
    expect(percentileOf(points, -1)).toBe(0);
    expect(percentileOf(points, 11)).toBe(100);
  });

  it("places an app among the baseline's apps of its category, and depends on the category", () => {
    const perms = ["android.permission.READ_CONTACTS", "android.permission.READ_SMS", "android.permission.INTERNET"];
    const tools = scorer.estimate("TOOLS", perms).atypicality!;
    const comm = scorer.estimate("COMMUNICATION", perms).atypicality!;
    expect(tools.category).toBe("TOOLS");
    expect(tools.apps).toBe(2318);
    expect(tools.percentile).toBeGreaterThan(comm.percentile); // SMS and contacts are ordinary for messengers
  });
});
