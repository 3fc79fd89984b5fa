import { describe, expect, it } from "vitest";
import { findingsOf, manifestText } from "../../helpers/judge.js";

describe("target-below-installable", () => {
  // Android 14 refuses targets below 23 (behaviour changes for all apps), Android 15 below 24 (from memory).
  it("is an error below 23 naming Android 14, and at 23 naming Android 15", () => {
    expect(findingsOf("target-below-installable", manifestText({ target: 22 }))[0]).toMatchObject({ level: "error", data: { targetSdk: 22, android: "14", minTarget: 23 } });
    expect(findingsOf("target-below-installable", manifestText({ target: 23 }))[0].data).toMatchObject({ android: "15", minTarget: 24 });
    expect(findingsOf("target-below-installable", manifestText({ target: 24 }))).toEqual([]);
  });

  it("takes minSdkVersion, then 1, when there is no targetSdkVersion, as the platform does", () => {
    const noTarget = manifestText({}).replace(/ android:targetSdkVersion="\d+"/, "");
    expect(findingsOf("target-below-installable", noTarget)[0].data.targetSdk).toBe(21);
  });
});
