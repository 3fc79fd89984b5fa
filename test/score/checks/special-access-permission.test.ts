import { describe, expect, it } from "vitest";
import { wordFinding } from "../../../src/report/messages.js";
import { defaultJudge, findingsOf, judgeText, manifestText } from "../../helpers/judge.js";

describe("special-access-permission", () => {
  // Protection levels from the platform table (API 36): MANAGE_EXTERNAL_STORAGE signature|appop|preinstalled,
  // SYSTEM_ALERT_WINDOW signature|…|appop, FOREGROUND_SERVICE_SPECIAL_USE normal|appop|instant.
  it("reports all-files access with what it gives, always, whatever the category", () => {
    const f = findingsOf("special-access-permission", manifestText({ permissions: ["MANAGE_EXTERNAL_STORAGE", "SYSTEM_ALERT_WINDOW"] }), { category: "TOOLS" }, defaultJudge);
    expect(f.map((x) => x.subject).sort()).toEqual(["android.permission.MANAGE_EXTERNAL_STORAGE", "android.permission.SYSTEM_ALERT_WINDOW"]);
    expect(wordFinding(f.find((x) => x.subject.endsWith("MANAGE_EXTERNAL_STORAGE"))!)).toMatch(/grants by hand in settings: it reads and changes every file in shared storage/);
  });

  it("leaves out app-op permissions granted at install, such as the special-use service type", () => {
    expect(findingsOf("special-access-permission", manifestText({ permissions: ["FOREGROUND_SERVICE_SPECIAL_USE", "INTERNET"] }))).toEqual([]);
  });

  it("calls the mock location app a choice in developer options, not an ungrantable request", () => {
    const r = judgeText(manifestText({ permissions: ["ACCESS_MOCK_LOCATION"] }), {}, defaultJudge);
    const f = r.findings.find((x) => x.subject === "android.permission.ACCESS_MOCK_LOCATION")!;
    expect(f.checkId).toBe("special-access-permission");
    expect(r.findings.some((x) => x.checkId === "ungrantable-permission")).toBe(false);
    expect(wordFinding(f)).toMatch(/developer options .*feeds made-up locations to every app/);
  });
});
