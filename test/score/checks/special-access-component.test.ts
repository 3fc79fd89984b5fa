import { describe, expect, it } from "vitest";
import { findingsOf, manifestText } from "../../helpers/judge.js";

describe("special-access-component", () => {
  it("fires for an accessibility service and a notification listener", () => {
    const app = `
    <service android:name=".Helper" android:exported="true" android:permission="android.permission.BIND_ACCESSIBILITY_SERVICE" />
    <service android:name=".Listener" android:exported="true" android:permission="android.permission.BIND_NOTIFICATION_LISTENER_SERVICE" />`;
    expect(findingsOf("special-access-component", manifestText({ app })).map((f) => f.subject)).toEqual(["org.example.case.Helper", "org.example.case.Listener"]);
  });

  it("does not fire for ordinary services, even guarded ones", () => {
    const app = `<service android:name=".Sync" android:permission="android.permission.BIND_JOB_SERVICE" />`;
    expect(findingsOf("special-access-component", manifestText({ app }))).toEqual([]);
  });
});
