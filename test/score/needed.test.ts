import { describe, expect, it } from "vitest";
import { readManifestBytes } from "../../src/extract/read.js";
import { neededByManifest } from "../../src/score/needed.js";

const manifest = (body: string, app: string) =>
  readManifestBytes(
    new TextEncoder().encode(`<manifest xmlns:android="http://schemas.android.com/apk/res/android" package="org.example.need">
  <uses-sdk android:minSdkVersion="26" android:targetSdkVersion="35" />
${body}
  <application>${app}</application>
</manifest>`),
    "AndroidManifest.xml",
  );
const perms = (...names: string[]) => names.map((n) => `  <uses-permission android:name="${n.includes(".") ? n : `android.permission.${n}`}" />`).join("\n");
const kinds = (m: ReturnType<typeof manifest>) => new Map([...neededByManifest(m)].map(([p, r]) => [p.replace("android.permission.", ""), r.map((x) => x.kind)]));

describe("what the manifest shows the app needs", () => {
  // Service types, their permissions and runtime prerequisites: src/platform/data/foreground-service-types.tsv
  // (developer.android.com/develop/background-work/services/fgs/service-types).
  it("counts a health service's type permission and each of its runtime prerequisites the app requests", () => {
    const m = manifest(perms("FOREGROUND_SERVICE", "FOREGROUND_SERVICE_HEALTH", "BODY_SENSORS", "ACTIVITY_RECOGNITION", "HIGH_SAMPLING_RATE_SENSORS", "READ_CONTACTS"), `<service android:name=".Tracker" android:exported="false" android:foregroundServiceType="health" />`);
    const k = kinds(m);
    expect(k.get("FOREGROUND_SERVICE")).toEqual(["foreground-service"]);
    expect(k.get("FOREGROUND_SERVICE_HEALTH")).toEqual(["service-type"]);
    for (const p of ["BODY_SENSORS", "ACTIVITY_RECOGNITION", "HIGH_SAMPLING_RATE_SENSORS"]) expect(k.get(p), p).toEqual(["service-type-prerequisite"]);
    expect(k.has("READ_CONTACTS")).toBe(false);
  });

  it("counts a media-processing service's permission (API 35) and a microphone service's RECORD_AUDIO", () => {
    const k = kinds(manifest(perms("FOREGROUND_SERVICE_MEDIA_PROCESSING", "RECORD_AUDIO", "FOREGROUND_SERVICE_MICROPHONE"), `<service android:name=".Render" android:foregroundServiceType="mediaProcessing" /><service android:name=".Rec" android:foregroundServiceType="microphone" />`));
    expect(k.get("FOREGROUND_SERVICE_MEDIA_PROCESSING")).toEqual(["service-type"]);
    expect(k.get("RECORD_AUDIO")).toEqual(["service-type-prerequisite"]);
  });

  it("counts MANAGE_OWN_CALLS for a self-managed connection service and for a phoneCall service", () => {
    const cs = `<service android:name=".Calls" android:permission="android.permission.BIND_TELECOM_CONNECTION_SERVICE" android:exported="true"><intent-filter><action android:name="android.telecom.ConnectionService" /></intent-filter></service>`;
    expect(kinds(manifest(perms("MANAGE_OWN_CALLS"), cs)).get("MANAGE_OWN_CALLS")).toEqual(["self-managed-calls"]);
    expect(kinds(manifest(perms("MANAGE_OWN_CALLS"), `<service android:name=".Ongoing" android:foregroundServiceType="phoneCall" />`)).get("MANAGE_OWN_CALLS")).toEqual(["service-type-prerequisite"]);
    expect(kinds(manifest(perms("MANAGE_OWN_CALLS"), "")).has("MANAGE_OWN_CALLS")).toBe(false);
  });

  it("counts Health Connect permissions only when the app shows their rationale", () => {
    const hc = perms("android.permission.health.READ_STEPS", "android.permission.health.WRITE_EXERCISE");
    const rationale = `<activity android:name=".Rationale" android:exported="true"><intent-filter><action android:name="androidx.health.ACTION_SHOW_PERMISSIONS_RATIONALE" /></intent-filter></activity>`;
    const alias = `<activity-alias android:name=".Usage" android:targetActivity=".Rationale" android:exported="true" android:permission="android.permission.START_VIEW_PERMISSION_USAGE"><intent-filter><action android:name="android.intent.action.VIEW_PERMISSION_USAGE" /><category android:name="android.intent.category.HEALTH_PERMISSIONS" /></intent-filter></activity-alias>`;
    expect(kinds(manifest(hc, rationale)).get("health.READ_STEPS")).toEqual(["health-connect"]);
    expect(kinds(manifest(hc, `<activity android:name=".Rationale" />${alias}`)).get("health.WRITE_EXERCISE")).toEqual(["health-connect"]);
    expect(kinds(manifest(hc, "")).has("health.READ_STEPS")).toBe(false);
  });

  it("counts the app's own permissions and guards of its components, and nothing it does not request", () => {
    const k = kinds(manifest(perms("org.example.need.SYNC", "BIND_JOB_SERVICE"), `<service android:name=".Job" android:permission="android.permission.BIND_JOB_SERVICE" /><service android:name=".Other" android:permission="android.permission.BIND_ACCESSIBILITY_SERVICE" />`));
    expect(k.get("org.example.need.SYNC")).toEqual(["own-permission"]);
    expect(k.get("BIND_JOB_SERVICE")).toEqual(["guards-component"]);
    expect(k.has("BIND_ACCESSIBILITY_SERVICE")).toBe(false);
  });
});
