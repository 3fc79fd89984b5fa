import { describe, expect, it } from "vitest";
import { delta } from "../../src/ops/delta.js";
import { defaultJudge } from "../helpers/judge.js";
import { APK_DIR } from "../helpers/paths.js";

describe("delta as a library call", () => {
  // fixtures/apps/tidewatch and tidewatch-next: the update adds background location (aapt dump permissions
  // of both APKs in fixtures/dumps).
  const d = delta(defaultJudge, `${APK_DIR}tidewatch.apk`, `${APK_DIR}tidewatch-next.apk`, {});

  it("lists the permissions added, with the newer version's details", () => {
    expect(d.samePackage).toBe(true);
    expect(d.added.map((p) => p.permission)).toContain("android.permission.ACCESS_BACKGROUND_LOCATION");
    expect(d.before.versionCode).toBeLessThan(d.after.versionCode!);
  });

  it("judges the older version against the newer one's category, so the two compare", () => {
    const other = delta(defaultJudge, `${APK_DIR}tidewatch.apk`, `${APK_DIR}tidewatch-next.apk`, { category: "TOOLS" });
    expect(other.newlyUncommon.every((f) => f.data.category === "TOOLS")).toBe(true);
  });
});
