import { describe, expect, it } from "vitest";
import { findingsOf, manifestText } from "../../helpers/judge.js";

const run = (permissions: string[], target: number, extra = "") => findingsOf("no-effect-at-target", manifestText({ permissions, target, extra }));

describe("no-effect-at-target", () => {
  it("fires for WRITE_EXTERNAL_STORAGE at targetSdk 30 without maxSdkVersion", () => {
    expect(run(["WRITE_EXTERNAL_STORAGE"], 30).map((f) => f.data.limitTo)).toEqual([29]);
    expect(run(["WRITE_EXTERNAL_STORAGE"], 29)).toEqual([]);
  });

  it("does not fire when maxSdkVersion already limits the request", () => {
    const extra = `  <uses-permission android:name="android.permission.WRITE_EXTERNAL_STORAGE" android:maxSdkVersion="28" />`;
    expect(run([], 34, extra)).toEqual([]);
  });

  it("names READ_MEDIA_* as the replacement for READ_EXTERNAL_STORAGE from targetSdk 33", () => {
    const f = run(["READ_EXTERNAL_STORAGE"], 33);
    expect(f[0].data.instead).toEqual(["android.permission.READ_MEDIA_IMAGES", "android.permission.READ_MEDIA_VIDEO", "android.permission.READ_MEDIA_AUDIO"]);
    expect(run(["READ_EXTERNAL_STORAGE"], 32)).toEqual([]);
    expect(run(["READ_MEDIA_IMAGES"], 32)).toHaveLength(1);
  });

  it("fires at any target for permissions the platform marks removed", () => {
    expect(run(["FLASHLIGHT"], 21).map((f) => f.subject)).toEqual(["android.permission.FLASHLIGHT"]);
  });
});

describe("no-effect-at-target and minSdk", () => {
  it("says 'still used on older devices' and limits, while minSdk is below the change", async () => {
    const { wordFinding } = await import("../../../src/report/messages.js");
    const low = findingsOf("no-effect-at-target", manifestText({ permissions: ["BLUETOOTH"], target: 34 }).replace('minSdkVersion="21"', 'minSdkVersion="26"'));
    expect(low[0].data).toMatchObject({ stillUsedBelow: 31, limitTo: 30 });
    expect(wordFinding(low[0])).toMatch(/^no effect on Android API 31 and later at targetSdk 34 .* still used on devices from minSdk 26 to API 30: limit it with android:maxSdkVersion="30"/);
  });

  it("says 'no effect' and removes, once minSdk is past the change", () => {
    const high = findingsOf("no-effect-at-target", manifestText({ permissions: ["BLUETOOTH"], target: 34 }).replace('minSdkVersion="21"', 'minSdkVersion="31"'));
    expect(high[0].data.stillUsedBelow).toBeUndefined();
    expect(high[0].data.limitTo).toBeUndefined();
  });
});
