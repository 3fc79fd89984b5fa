import { describe, expect, it } from "vitest";
import { reportedByAnotherCheck, uncommonJudgement } from "../../src/score/uncommon.js";
import { defaultJudge } from "../helpers/judge.js";

const b = defaultJudge.baseline;
const app = { package: "org.example.lamp" };

describe("what check reports as uncommon", () => {
  it("follows the baseline's rule: READ_SMS is uncommon for TOOLS in the bundled baseline", () => {
    expect(uncommonJudgement(app, b, "TOOLS", "android.permission.READ_SMS")?.rate.uncommon).toBe(true);
    expect(uncommonJudgement(app, b, "TOOLS", "android.permission.INTERNET")).toBeUndefined();
  });

  it("leaves to other checks what the platform cannot grant and names it does not define", () => {
    // INSTALL_PACKAGES is signature|privileged (platform table, API 34): ungrantable-permission reports it.
    expect(reportedByAnotherCheck("android.permission.INSTALL_PACKAGES")).toBe(true);
    expect(reportedByAnotherCheck("android.permission.READ_SMSS")).toBe(true);
    expect(reportedByAnotherCheck("android.permission.READ_SMS")).toBe(false);
    expect(uncommonJudgement(app, b, "TOOLS", "android.permission.INSTALL_PACKAGES")).toBeUndefined();
  });

  it("never judges the app's own permissions or ones newer than the era with nothing before them", () => {
    expect(uncommonJudgement(app, b, "TOOLS", "org.example.lamp.PRIVATE")).toBeUndefined();
    // POST_NOTIFICATIONS (API 33) made an old behaviour explicit: not judged against an API-29 corpus.
    expect(uncommonJudgement(app, b, "TOOLS", "android.permission.POST_NOTIFICATIONS")).toBeUndefined();
  });
});
