import { describe, expect, it } from "vitest";
import { requestedRates } from "../../src/score/requested.js";
import { defaultJudge, judgeText, manifestText } from "../helpers/judge.js";

describe("the rates behind the check report's bars", () => {
  const result = judgeText(manifestText({ pkg: "org.example.bars", permissions: ["READ_SMS", "INTERNET", "POST_NOTIFICATIONS", "BLUETOOTH_CONNECT", "org.example.bars.PRIVATE", "READ_SMSS"] }), { category: "TOOLS" }, defaultJudge);
  const rates = new Map(requestedRates(defaultJudge, result).map((r) => [r.permission, r]));

  it("say what the findings say: uncommon exactly where a rate check flags the permission", () => {
    const flagged = new Set(result.findings.flatMap((f) => [f, ...(f.also ?? []).map((a) => ({ ...f, ...a }))]).filter((f) => f.checkId === "sensitive-uncommon" || f.checkId === "uncommon-for-category").map((f) => f.subject));
    for (const [p, r] of rates) expect(r.uncommon === true, p).toBe(flagged.has(p));
  });

  it("show a newer permission by its predecessor, and say why others are not judged", () => {
    expect(rates.get("android.permission.BLUETOOTH_CONNECT")?.judgedBy).toBe("android.permission.BLUETOOTH");
    expect(rates.get("android.permission.POST_NOTIFICATIONS")?.notJudged).toBe("made-explicit");
    expect(rates.get("org.example.bars.PRIVATE")?.notJudged).toBe("own-permission");
    expect(rates.get("android.permission.READ_SMS")).toMatchObject({ sensitive: true, k: 18, n: 2318 });
  });
});
