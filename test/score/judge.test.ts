import { describe, expect, it } from "vitest";
import { levelRank } from "../../src/score/types.js";
import { defaultJudge, judgeText, manifestText } from "../helpers/judge.js";

describe("judging one app", () => {
  const text = manifestText({ pkg: "org.example.judged", permissions: ["READ_SMS", "ACCESS_BACKGROUND_LOCATION", "BLUETOOTH", "org.example.judged.OWN", "POST_NOTIFICATIONS"], target: 34 });

  it("gives one finding a permission, the other checks' reasons folded into it", () => {
    const r = judgeText(text, { category: "TOOLS" }, defaultJudge);
    const subjects = r.findings.map((f) => f.subject);
    expect(new Set(subjects).size).toBe(subjects.length);
    const bg = r.findings.find((f) => f.subject === "android.permission.ACCESS_BACKGROUND_LOCATION")!;
    expect(bg.checkId).toBe("background-location-alone");
    expect(bg.also?.map((a) => a.checkId)).toEqual(["sensitive-uncommon"]);
  });

  it("sorts findings by level, then check, then subject", () => {
    const r = judgeText(text, { category: "TOOLS" }, defaultJudge);
    for (let i = 1; i < r.findings.length; i++) {
      const a = r.findings[i - 1];
      const b = r.findings[i];
      expect(levelRank(a.level) > levelRank(b.level) || (a.level === b.level && (a.checkId < b.checkId || (a.checkId === b.checkId && a.subject <= b.subject)))).toBe(true);
    }
  });

  it("lists what frequency does not judge, and leaves the app's own permissions out of the risk", () => {
    const r = judgeText(text, { category: "TOOLS" }, defaultJudge);
    expect(r.notJudged.map((n) => [n.permission, n.why])).toEqual([
      ["android.permission.POST_NOTIFICATIONS", "made-explicit"],
      ["org.example.judged.OWN", "own-permission"],
    ]);
    const without = judgeText(manifestText({ pkg: "org.example.judged", permissions: ["READ_SMS", "ACCESS_BACKGROUND_LOCATION", "BLUETOOTH", "POST_NOTIFICATIONS"], target: 34 }), { category: "TOOLS" }, defaultJudge);
    expect(r.risk!.probability).toBe(without.risk!.probability);
    expect(r.era).toEqual({ api: 29, targetNewer: true });
  });

  it("silences a check set off, and sets another's level", () => {
    const r = judgeText(text, { category: "TOOLS", levels: new Map([["background-location-alone", "off"], ["no-effect-at-target", "warning"]]) }, defaultJudge);
    expect(r.findings.some((f) => f.checkId === "background-location-alone")).toBe(false);
    expect(r.findings.find((f) => f.checkId === "no-effect-at-target")?.level).toBe("warning");
  });

  it("has no code evidence and no code findings without the app's dex", () => {
    const r = judgeText(text, { category: "TOOLS", dexes: [] }, defaultJudge);
    expect(r.code).toBeUndefined();
    expect(r.findings.some((f) => f.checkId === "not-seen-in-code")).toBe(false);
  });
});
