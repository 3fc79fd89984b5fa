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

describe("special-access-component: the list", () => {
  it("names only permissions the platform defines, and covers assistants, credential providers and Do Not Disturb", async () => {
    const { SPECIAL_ACCESS } = await import("../../../src/score/checks/special-access-component.js");
    const { platformPermission } = await import("../../../src/platform/permissions.js");
    for (const p of Object.keys(SPECIAL_ACCESS)) expect(platformPermission(p), p).toBeDefined(); // platform table, API 34
    for (const p of ["BIND_VOICE_INTERACTION", "BIND_CREDENTIAL_PROVIDER_SERVICE", "BIND_CONDITION_PROVIDER_SERVICE"]) expect(SPECIAL_ACCESS[`android.permission.${p}`]).toBeDefined();
    // Carrier services are bound only for apps signed by the SIM carrier: no user grants them.
    expect(SPECIAL_ACCESS["android.permission.BIND_CARRIER_SERVICES"]).toBeUndefined();
  });
});
