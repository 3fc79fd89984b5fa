import { describe, expect, it } from "vitest";
import { scoreRecord } from "../../src/score/records.js";
import { defaultJudge } from "../helpers/judge.js";

const record = { id: "org.example.lamp", line: 1, permissions: ["android.permission.INTERNET", "android.permission.READ_SMS"] };

describe("scoreRecord", () => {
  it("finds the category whatever its case, like check -c does", () => {
    for (const name of ["TOOLS", "tools", "Tools"]) expect(scoreRecord(defaultJudge, { ...record, category: name }).category).toBe("TOOLS");
  });

  it("lets an explicit category win over the record's", () => {
    expect(scoreRecord(defaultJudge, { ...record, category: "SOCIAL" }, "education").category).toBe("EDUCATION");
  });

  it("falls back to the pooled baseline for a category the baseline lacks, and says so", () => {
    const s = scoreRecord(defaultJudge, { ...record, category: "Weather" });
    expect(s.category).toBeUndefined();
    expect(s.fallback).toBe("unknown-category");
  });

  it("lists uncommon permissions and scores the risk", () => {
    const s = scoreRecord(defaultJudge, { ...record, category: "TOOLS" });
    expect(s.uncommon).toContain("android.permission.READ_SMS");
    expect(s.sensitiveUncommon).toBeGreaterThanOrEqual(1);
    expect(s.risk).toBeGreaterThan(0);
    expect(["low", "elevated", "high"]).toContain(s.band);
  });
});
