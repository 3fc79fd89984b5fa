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

  it("never raises the risk when a permission is removed", () => {
    const e = scorer.estimate("TOOLS", perms);
    for (const w of e.whatIf) expect(w.change).toBeLessThanOrEqual(1e-12);
  });

  it("carries the caution with every estimate", () => {
    expect(scorer.estimate(undefined, perms).caution).toMatch(/not evidence of intent or harm/);
  });
});
