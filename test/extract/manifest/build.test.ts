import { describe, expect, it } from "vitest";
import { qualifyClassName } from "../../../src/extract/manifest/build.js";
import { readManifestBytes } from "../../../src/extract/index.js";
import { readManifestFile } from "../../../src/ops/read-manifest.js";
import { APK_DIR } from "../../helpers/paths.js";

const manifest = (target: number, app: string, extra = "") =>
  readManifestBytes(
    new TextEncoder().encode(`<manifest xmlns:android="http://schemas.android.com/apk/res/android" package="org.example.model">
  <uses-sdk android:minSdkVersion="16" android:targetSdkVersion="${target}" />${extra}
  <application>${app}</application>
</manifest>`),
  );

describe("the manifest model", () => {
  it("exports a component with an intent filter by default below targetSdk 31", () => {
    const c = manifest(30, `<receiver android:name=".Boot"><intent-filter><action android:name="android.intent.action.BOOT_COMPLETED"/></intent-filter></receiver>`).components[0];
    expect(c).toMatchObject({ name: "org.example.model.Boot", effectiveExported: true, exportedReason: "intent-filter-default" });
    expect(c.exported).toBeUndefined();
  });

  it("notes a component with an intent filter but no android:exported at targetSdk 31 and above", () => {
    const m = manifest(31, `<service android:name="Sync"><intent-filter><action android:name="org.example.SYNC"/></intent-filter></service>`);
    expect(m.components[0]).toMatchObject({ effectiveExported: false, exportedReason: "missing-at-target-31" });
    expect(m.notes.join("\n")).toMatch(/refuses to install/);
  });

  it("keeps an explicit android:exported and leaves components without filters private", () => {
    const m = manifest(34, `<activity android:name=".A" android:exported="true"/><activity android:name=".B"/>`);
    expect(m.components.map((c) => [c.effectiveExported, c.exportedReason])).toEqual([[true, "explicit"], [false, "no-intent-filter"]]);
  });

  it("exports providers by default for apps targeting SDK 16 or lower", () => {
    const old = manifest(16, `<provider android:name=".P" android:authorities="org.example.model.p"/>`);
    const recent = manifest(17, `<provider android:name=".P" android:authorities="org.example.model.p"/>`);
    expect(old.components[0].effectiveExported).toBe(true);
    expect(recent.components[0].effectiveExported).toBe(false);
  });

  it("qualifies class names the way the platform does", () => {
    expect(qualifyClassName("org.example.a", ".Main")).toBe("org.example.a.Main");
    expect(qualifyClassName("org.example.a", "Main")).toBe("org.example.a.Main");
    expect(qualifyClassName("org.example.a", "org.example.b.Main")).toBe("org.example.b.Main");
  });

  it("annotates requested permissions as platform, app-declared or other", () => {
    const m = manifest(34, "", `
  <permission android:name="org.example.model.permission.OWN" android:protectionLevel="signature" />
  <uses-permission android:name="android.permission.READ_SMS" />
  <uses-permission android:name="org.example.model.permission.OWN" />
  <uses-permission android:name="com.example.partner.permission.BIND" />
  <uses-permission android:name="android.permission.ACCESS_FINE_LOCATON" />
  <uses-permission android:name="android.permission.READ_SMS" />`);
    expect(m.usesPermissions.map((p) => p.facts.origin)).toEqual(["platform", "app", "other", "other", "platform"]);
    expect(m.usesPermissions[0].facts).toMatchObject({ base: "dangerous", hardRestricted: true });
    expect(m.usesPermissions[1].facts).toMatchObject({ base: "signature" });
    expect(m.usesPermissions[3].facts.unknownPlatformName).toBe(true);
    expect(m.notes.join("\n")).toMatch(/READ_SMS is requested again/);
  });

  it("decodes custom protection levels and <queries> from a toolchain-built APK", () => {
    const m = readManifestFile(`${APK_DIR}chirpchat.apk`);
    expect(m.declaredPermissions.map((d) => [d.name, d.protectionLevel.base])).toEqual([
      ["org.example.chirpchat.permission.READ_MESSAGES", "signature"],
      ["org.example.chirpchat.permission.SYNC", "normal"],
    ]);
    expect(m.queries).toEqual({ packages: ["org.example.townsquare"], intents: [{ actions: ["android.intent.action.SEND"], categories: [], data: [{ mimeType: "image/*" }] }], providers: [] });
    expect(m.usesFeatures.map((f) => [f.name ?? f.glEsVersion, f.required])).toEqual([["android.hardware.camera", false], ["2.0", true]]);
    const alias = m.components.find((c) => c.kind === "activity-alias")!;
    expect(alias.targetActivity).toBe("org.example.chirpchat.ConversationListActivity");
  });

  it("reads the application flags a reviewer looks at", () => {
    const m = readManifestFile(`${APK_DIR}pocketlamp.apk`);
    expect(m.application).toEqual({ debuggable: true, usesCleartextTraffic: true, networkSecurityConfig: false, source: { path: "/manifest/application", line: expect.any(Number) } });
  });
});
