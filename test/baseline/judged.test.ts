import { describe, expect, it } from "vitest";
import { isOwnPermission } from "../../src/baseline/judged.js";
import { defaultJudge, judgeText, manifestText } from "../helpers/judge.js";

describe("the app's own permissions", () => {
  const m = { package: "org.example.snap", declaredPermissions: [{ name: "org.example.partner.SHARED" }] } as never;

  it("are those it declares and those under its package name", () => {
    expect(isOwnPermission(m, "org.example.snap.DYNAMIC_RECEIVER_NOT_EXPORTED_PERMISSION")).toBe(true);
    expect(isOwnPermission(m, "org.example.partner.SHARED")).toBe(true);
    expect(isOwnPermission(m, "org.example.snapshot.OTHER")).toBe(false); // another package, same prefix
    expect(isOwnPermission(m, "android.permission.CAMERA")).toBe(false);
  });

  it("are never uncommon and are listed apart", () => {
    const r = judgeText(manifestText({ pkg: "org.example.snap", permissions: ["org.example.snap.DYNAMIC_RECEIVER_NOT_EXPORTED_PERMISSION", "org.example.other.permission.X"] }), { category: "TOOLS" }, defaultJudge);
    expect(r.findings.map((f) => f.subject)).toEqual(["org.example.other.permission.X"]); // another app's custom permission stays judged
    expect(r.notJudged).toEqual([{ permission: "org.example.snap.DYNAMIC_RECEIVER_NOT_EXPORTED_PERMISSION", why: "own-permission" }]);
  });
});

describe("the era rule in judgements", () => {
  it("judges a newer permission by what it replaced and says so", () => {
    // The bundled corpus's era is API 29; READ_MEDIA_AUDIO (33) is judged by READ_EXTERNAL_STORAGE, which few EDUCATION apps request.
    const r = judgeText(manifestText({ permissions: ["READ_MEDIA_AUDIO"], target: 34 }), { category: "EDUCATION" }, defaultJudge);
    const f = r.findings.find((x) => x.subject === "android.permission.READ_MEDIA_AUDIO");
    const rate = defaultJudge.baseline.rate("EDUCATION", "android.permission.READ_EXTERNAL_STORAGE");
    if (rate.uncommon) expect(f?.data).toMatchObject({ judgedBy: "android.permission.READ_EXTERNAL_STORAGE", replacedIn: 33, k: rate.k });
    else expect(f).toBeUndefined();
    expect(r.era).toEqual({ api: 29, targetNewer: true });
  });

  it("never calls a newer permission uncommon for lack of data", () => {
    const r = judgeText(manifestText({ permissions: ["POST_NOTIFICATIONS", "UWB_RANGING", "DETECT_SCREEN_CAPTURE"], target: 34 }), { category: "TOOLS" }, defaultJudge);
    expect(r.findings.filter((f) => f.checkId === "uncommon-for-category" || f.checkId === "sensitive-uncommon")).toEqual([]);
    expect(r.notJudged.map((n) => [n.permission.replace("android.permission.", ""), n.why])).toEqual([
      ["DETECT_SCREEN_CAPTURE", "made-explicit"],
      ["POST_NOTIFICATIONS", "made-explicit"],
      ["UWB_RANGING", "no-evidence"],
    ]);
  });

  it("folds several findings on one permission into one, keeping every reason", () => {
    // FLASHLIGHT: no effect (flagged removed by the platform) and uncommon in EDUCATION.
    const r = judgeText(manifestText({ permissions: ["FLASHLIGHT"] }), { category: "EDUCATION" }, defaultJudge);
    const on = r.findings.filter((f) => f.subject === "android.permission.FLASHLIGHT");
    expect(on).toHaveLength(1);
    expect([on[0].checkId, ...(on[0].also ?? []).map((a) => a.checkId)].sort()).toEqual(["no-effect-at-target", "uncommon-for-category"]);
  });
});
