/** Check messages live in the report layer: one a check, worded from the finding's data. */
import { describe, expect, it } from "vitest";
import { atypicalityText, codeLookup, MESSAGES, wordFinding } from "../../src/report/messages.js";
import { CHECKS } from "../../src/score/registry.js";
import { defaultJudge, judgeText, manifestText } from "../helpers/judge.js";

describe("check messages", () => {
  it("have one entry a check, and none for a check that is gone", () => {
    expect(Object.keys(MESSAGES).sort()).toEqual(CHECKS.map((c) => c.meta.id).sort());
  });

  it("word every finding of a busy app without leaving a placeholder", () => {
    const r = judgeText(manifestText({ permissions: ["READ_SMS", "ACCESS_BACKGROUND_LOCATION", "BLUETOOTH", "INSTALL_PACKAGES", "READ_SMSS"], target: 34 }), { category: "TOOLS" }, defaultJudge);
    expect(r.findings.length).toBeGreaterThan(3);
    for (const f of r.findings) {
      const text = wordFinding(f);
      expect(text, f.checkId).not.toMatch(/undefined|NaN|\[object/);
      expect(text.length).toBeGreaterThan(20);
    }
  });

  it("word a rate finding with its counts, interval and threshold as percents", () => {
    const r = judgeText(manifestText({ permissions: ["READ_SMS"] }), { category: "TOOLS" }, defaultJudge);
    const sms = r.findings.find((f) => f.subject === "android.permission.READ_SMS")!;
    // The bundled baseline: 18 of 2318 TOOLS apps request READ_SMS (baselines/default.json counts).
    expect(wordFinding(sms)).toMatch(/^18 of 2318 TOOLS apps request it \(95% interval 0\.49%–1\.2%, below 5\.0%\)\. It reads the user's text messages\.$/);
  });

  it("add what the code shows only to rate findings, and only when the code was read", () => {
    const r = judgeText(manifestText({ permissions: ["READ_SMS"] }), { category: "TOOLS" }, defaultJudge);
    const sms = r.findings.find((f) => f.subject === "android.permission.READ_SMS")!;
    const evidence = [{ permission: sms.subject, status: "used" as const, evidence: [], users: ["org.example.adnet"], onlyLibraries: true }];
    expect(wordFinding(sms, codeLookup(evidence))).toMatch(/ Code: used only by org\.example\.adnet\.$/);
    expect(wordFinding(sms, codeLookup(undefined))).not.toMatch(/Code:/);
    expect(wordFinding({ checkId: "background-location-alone", subject: sms.subject, data: {} }, codeLookup(evidence))).not.toMatch(/Code:/);
  });

  it("word a policy rule's finding with where the rule is", () => {
    expect(wordFinding({ checkId: "policy:no-sms", subject: "android.permission.SEND_SMS", data: { message: "no SMS here", rule: "no-sms", policy: "shop", file: "shop.json", line: 4 } })).toBe("no SMS here (rule no-sms of shop, shop.json:4)");
  });
});

describe("atypicality in words", () => {
  it("gives the percentile, and says where the app stands below the first (framework-res.apk sits there)", () => {
    expect(atypicalityText({ percentile: 89.7, category: "TOOLS" })).toBe("more atypical than 89% of TOOLS apps in the baseline");
    expect(atypicalityText({ percentile: 0 })).toBe("among the 1% least atypical of all apps in the baseline");
    expect(atypicalityText({ percentile: 0.4, category: "TOOLS" }, "")).not.toMatch(/0%/);
  });
});
