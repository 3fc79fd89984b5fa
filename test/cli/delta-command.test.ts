import { execFileSync } from "node:child_process";
import { copyFileSync, mkdirSync, mkdtempSync, readFileSync, statSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { EXIT } from "../../src/cli/exit-codes.js";
import { cli } from "../helpers/cli.js";
import { APK_DIR, FIXTURES, ROOT } from "../helpers/paths.js";

const dir = mkdtempSync(join(tmpdir(), "overask-delta-command-"));
const LAMP = `${APK_DIR}pocketlamp.apk`;

describe("overask delta", () => {
  it("gives removed permissions their protection level and restrictions in delta", async () => {
    const d = JSON.parse((await cli(["delta", "-f", "json", `${APK_DIR}tidewatch.apk`, `${APK_DIR}tidewatch-next.apk`])).stdout);
    expect(d.removed).toEqual([{ permission: "android.permission.WRITE_EXTERNAL_STORAGE", base: "dangerous", restricted: "soft" }]);
    expect(d.added.map((a: { permission: string }) => a.permission)).toEqual(["android.permission.ACCESS_BACKGROUND_LOCATION", "android.permission.READ_CONTACTS"]);
  });
});

describe("overask delta for a reviewer of an update", () => {
  it("names a lower target, debugging and cleartext turned on, and gates on them with --fail-on", async () => {
    // Two invented versions of one app: the update lowers its target and turns on debugging and cleartext.
    const older = join(dir, "older.xml");
    const newer = join(dir, "newer.xml");
    const m = (target: number, app: string) => `<manifest xmlns:android="http://schemas.android.com/apk/res/android" package="org.example.update" android:versionCode="${target}"><uses-sdk android:minSdkVersion="21" android:targetSdkVersion="${target}"/><uses-permission android:name="android.permission.INTERNET"/><application ${app}/></manifest>`;
    writeFileSync(older, m(35, ""));
    writeFileSync(newer, m(22, 'android:debuggable="true" android:usesCleartextTraffic="true"'));
    const json = JSON.parse((await cli(["delta", "-f", "json", older, newer])).stdout);
    expect(json.regressions.map((r: { kind: string }) => r.kind)).toEqual(["target-downgrade", "debuggable-on", "cleartext-on"]);
    const text = (await cli(["delta", older, newer])).stdout;
    expect(text).toMatch(/Changes for the worse \(3\)/);
    expect(text.replace(/\s+/g, " ")).toContain("targetSdk lowered from 35 to 22");
    expect((await cli(["delta", "--fail-on", "warning", older, newer])).code).toBe(EXIT.GATE);
    expect((await cli(["delta", "--fail-on", "warning", older, older])).code).toBe(EXIT.OK);
  });
});
