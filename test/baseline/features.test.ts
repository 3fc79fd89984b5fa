import { describe, expect, it } from "vitest";
import { appTerms, permissionTerms, TERM_NAMES } from "../../src/baseline/features.js";
import { defaultJudge } from "../helpers/judge.js";
import { seededRandom } from "../../src/util/random.js";

const baseline = defaultJudge.baseline;
const vocabulary = [...baseline.counts.pooled.permissions.keys()].sort();

describe("permissionTerms", () => {
  it("counts a permission as uncommon-sensitive or uncommon-other at most once, with a non-negative surprisal", () => {
    for (const p of vocabulary.slice(0, 200)) {
      const t = permissionTerms(baseline, "TOOLS", p);
      expect(t.uncommonSensitive + t.uncommonOther).toBeLessThanOrEqual(1);
      expect(t.surprisal).toBeGreaterThanOrEqual(0);
    }
  });

  it("adds nothing for a permission newer than the baseline with nothing before it (era rule)", () => {
    expect(permissionTerms(baseline, "TOOLS", "android.permission.UWB_RANGING")).toEqual({ permission: "android.permission.UWB_RANGING", uncommonSensitive: 0, uncommonOther: 0, surprisal: 0 });
  });
});

describe("appTerms", () => {
  it("never lowers a term when a permission is added (the monotonicity the model relies on)", () => {
    const rand = seededRandom(7);
    for (let trial = 0; trial < 300; trial++) {
      const perms = vocabulary.filter(() => rand() < 0.05);
      const extra = vocabulary[Math.floor(rand() * vocabulary.length)];
      const before = appTerms(baseline, "TOOLS", perms);
      const after = appTerms(baseline, "TOOLS", [...perms, extra]);
      TERM_NAMES.forEach((_, i) => expect(after[i]).toBeGreaterThanOrEqual(before[i] - 1e-12));
    }
  });

  it("depends on the category", () => {
    const perms = ["android.permission.READ_CONTACTS", "android.permission.READ_SMS"];
    expect(appTerms(baseline, "EDUCATION", perms)).not.toEqual(appTerms(baseline, "COMMUNICATION", perms));
  });
});
