import { describe, expect, it } from "vitest";
import { appFeatures, FEATURE_NAMES, permissionTerms } from "../../src/baseline/features.js";
import { defaultJudge } from "../helpers/judge.js";
import { seededRandom } from "../../src/util/random.js";

const baseline = defaultJudge.baseline;
const vocabulary = [...baseline.counts.pooled.permissions.keys()].sort();

describe("permissionTerms", () => {
  it("puts every permission in exactly one of the four disjoint groups", () => {
    for (const p of vocabulary.slice(0, 200)) {
      const t = permissionTerms(baseline, "TOOLS", p).terms;
      expect(t.commonOther + t.commonSensitive + t.uncommonOther + t.uncommonSensitive).toBe(1);
      expect(t.surprisal).toBeGreaterThanOrEqual(0);
    }
  });
});

describe("appFeatures", () => {
  it("never lowers a feature when a permission is added (the monotonicity the model relies on)", () => {
    const rand = seededRandom(7);
    for (let trial = 0; trial < 300; trial++) {
      const perms = vocabulary.filter(() => rand() < 0.05);
      const extra = vocabulary[Math.floor(rand() * vocabulary.length)];
      const before = appFeatures(baseline, "TOOLS", perms);
      const after = appFeatures(baseline, "TOOLS", [...perms, extra]);
      FEATURE_NAMES.forEach((_, i) => expect(after[i]).toBeGreaterThanOrEqual(before[i] - 1e-12));
    }
  });

  it("counts only the permissions of the given vocabulary", () => {
    const perms = ["android.permission.INTERNET", "org.example.NOT_RECORDED"];
    expect(appFeatures(baseline, "TOOLS", perms, { vocabulary: new Set(["android.permission.INTERNET"]) })).toEqual(appFeatures(baseline, "TOOLS", ["android.permission.INTERNET"]));
  });
});
