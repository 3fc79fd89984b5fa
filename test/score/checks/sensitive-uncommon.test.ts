import { describe, expect, it } from "vitest";
import { findingsOf, manifestText } from "../../helpers/judge.js";

describe("sensitive-uncommon", () => {
  it("fires for dangerous, app-op and restricted permissions the category rarely requests", async () => {
    // Against the default baseline (MapperDroid counts): SEND_SMS is requested by 0.0% of EDUCATION apps.
    const f = findingsOf("sensitive-uncommon", manifestText({ permissions: ["SEND_SMS", "INTERNET", "CAMERA"] }), { category: "EDUCATION" }, (await import("../../helpers/judge.js")).defaultJudge);
    expect(f.map((x) => x.subject)).toEqual(["android.permission.SEND_SMS"]);
    expect(f[0].level).toBe("warning");
  });

  it("does not fire where the category commonly requests the permission", async () => {
    const { defaultJudge } = await import("../../helpers/judge.js");
    // SOCIAL apps request CAMERA at 59.6% (MapperDroid SOURCES.md).
    expect(findingsOf("sensitive-uncommon", manifestText({ permissions: ["CAMERA"] }), { category: "SOCIAL" }, defaultJudge)).toEqual([]);
  });
});
