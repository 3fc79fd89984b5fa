import { describe, expect, it } from "vitest";
import { delta } from "../../src/ops/delta.js";
import { trim } from "../../src/ops/trim.js";
import { deltaToJson, deltaToText, safeText, trimToJson, trimToText } from "../../src/report/trim-delta.js";
import { defaultJudge } from "../helpers/judge.js";
import { APK_DIR, FIXTURES } from "../helpers/paths.js";

describe("trim in words", () => {
  const { plan } = trim(defaultJudge, `${FIXTURES}apps/pocketlamp/AndroidManifest.xml`, { judge: { category: "TOOLS" } });
  const text = trimToText(plan, "AndroidManifest.xml", defaultJudge.file.caution);

  it("numbers each candidate with its reasons, why acting is safe, and the exact change", () => {
    expect(text).toMatch(/^org\.example\.pocketlamp: \d+ permissions worth removing or limiting/);
    expect(text).toMatch(/\n {2}1\. [A-Z_]+/);
    expect(text).toMatch(/\n {5}safe because /);
    expect(text).toMatch(/\n {5}delete line \d+:\n {7}<uses-permission android:name="/);
  });

  it("words the safety reasons and the check reasons in JSON too, keeping their codes", () => {
    const json = JSON.parse(trimToJson(plan, "AndroidManifest.xml"));
    const c = json.candidates[0];
    expect(c.safe).toBe(safeText(plan.candidates[0].safe));
    expect(c.safeBecause).toEqual(plan.candidates[0].safe);
    expect(c.reasons[0].message).toMatch(/./);
    expect(c.reasons[0].data).toBeDefined();
  });
});

describe("what trim keeps, in words", () => {
  it("says what is kept and why, without contradicting itself (POST_NOTIFICATIONS flagged as not seen in code)", () => {
    // fixtures/smali/beamtorch never posts a notification, so not-seen-in-code flags POST_NOTIFICATIONS; trim keeps it.
    const { plan } = trim(defaultJudge, `${APK_DIR}beamtorch-code.apk`, { judge: { category: "TOOLS" } });
    const text = trimToText(plan, "beamtorch-code.apk", defaultJudge.file.caution);
    const section = text.slice(text.indexOf("Flagged, but kept"));
    expect(section).toMatch(/\n {2}POST_NOTIFICATIONS: removing it silences every notification the app posts/);
    expect(section).not.toMatch(/shows the app needs them|never posts/);
    expect(plan.candidates.map((c) => c.permission)).not.toContain("android.permission.POST_NOTIFICATIONS");
  });
});

describe("delta in words", () => {
  const d = delta(defaultJudge, `${APK_DIR}tidewatch.apk`, `${APK_DIR}tidewatch-next.apk`, {});

  it("lists what the update adds, with each newly uncommon permission's message", () => {
    const text = deltaToText(d, ["old.apk", "new.apk"], defaultJudge.file.caution);
    expect(text).toMatch(/ACCESS_BACKGROUND_LOCATION/);
    const json = JSON.parse(deltaToJson(d, ["old.apk", "new.apk"], defaultJudge.file.caution));
    for (const f of json.newlyUncommon) expect(f.message).toMatch(/ of \d+ /);
  });
});

describe("trim's likely typos", () => {
  it("are listed to fix, with why --write leaves them alone", async () => {
    const { trim } = await import("../../src/ops/trim.js");
    const { plan } = trim(defaultJudge, `${FIXTURES}apps/pocketlamp/AndroidManifest.xml`, { judge: { category: "TOOLS" } });
    expect(plan.typos.length).toBeGreaterThan(0);
    const text = trimToText(plan, "AndroidManifest.xml", undefined).replace(/\s+/g, " ");
    expect(text).toContain("--write leaves these names as they are: correcting one grants the app a permission it does not get today");
  });
});
