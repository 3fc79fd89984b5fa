import { describe, expect, it } from "vitest";
import { findingsOf, manifestText } from "../../helpers/judge.js";

describe("weak-guard", () => {
  it("fires for a provider guarded only for reading", () => {
    const app = `<provider android:name=".Notes" android:authorities="org.example.case.notes" android:exported="true" android:readPermission="org.example.case.permission.READ" />`;
    const f = findingsOf("weak-guard", manifestText({ app }));
    expect(f.map((x) => x.data.weakness)).toEqual(["read-only-guard"]);
  });

  it("fires for a component guarded by a normal-level platform permission", () => {
    // INTERNET is normal in the platform table (API 34): every app that asks gets it.
    const app = `<service android:name=".Sync" android:exported="true" android:permission="android.permission.INTERNET" />`;
    expect(findingsOf("weak-guard", manifestText({ app })).map((x) => [x.data.weakness, x.data.permission])).toEqual([["normal-platform-permission", "android.permission.INTERNET"]]);
  });

  it("does not fire for a signature guard, a provider guarded both ways, or a component not exported", () => {
    const app = `
    <service android:name=".Bound" android:exported="true" android:permission="android.permission.BIND_JOB_SERVICE" />
    <provider android:name=".Both" android:authorities="a.b" android:exported="true" android:readPermission="x.R" android:writePermission="x.W" />
    <service android:name=".Private" android:exported="false" android:permission="android.permission.INTERNET" />`;
    expect(findingsOf("weak-guard", manifestText({ app }))).toEqual([]);
  });
});
