import { describe, expect, it } from "vitest";
import { findingsOf, manifestText } from "../../helpers/judge.js";

const extra = `
  <permission android:name="org.example.case.permission.WEAK" android:protectionLevel="normal" />
  <permission android:name="org.example.case.permission.STRONG" android:protectionLevel="signature" />`;

describe("weak-custom-permission", () => {
  it("fires for an exported component guarded by the app's own normal permission", () => {
    const app = `<service android:name=".Sync" android:exported="true" android:permission="org.example.case.permission.WEAK" />`;
    expect(findingsOf("weak-custom-permission", manifestText({ app, extra })).map((f) => [f.subject, f.data.level])).toEqual([["org.example.case.Sync", "normal"]]);
  });

  it("does not fire for signature guards or unexported components", () => {
    const app = `
    <service android:name=".A" android:exported="true" android:permission="org.example.case.permission.STRONG" />
    <service android:name=".B" android:exported="false" android:permission="org.example.case.permission.WEAK" />`;
    expect(findingsOf("weak-custom-permission", manifestText({ app, extra }))).toEqual([]);
  });
});
