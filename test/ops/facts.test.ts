import { execFileSync } from "node:child_process";
import { copyFileSync, mkdirSync, mkdtempSync, readFileSync, statSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { EXIT } from "../../src/cli/exit-codes.js";
import { cli } from "../helpers/cli.js";
import { APK_DIR, FIXTURES, ROOT } from "../helpers/paths.js";

const dir = mkdtempSync(join(tmpdir(), "overask-facts-"));
const LAMP = `${APK_DIR}pocketlamp.apk`;

describe("facts", () => {
  it("groups requested permissions by what they mean to a user, with counts", async () => {
    const out = (await cli(["facts", LAMP])).stdout;
    const groups = [...out.matchAll(/^ {2}(\S.*) \((\d+)\)$/gm)].map((m) => [m[1], Number(m[2])]);
    expect(groups).toEqual([
      ["Runtime: the user is asked when the app uses it", 7],
      ["Special access: the user grants it by hand (settings, developer options)", 1],
      ["Install-time: granted without asking", 3],
      ["Out of reach: a store app is not granted it", 1],
      ["Not defined by the platform", 2],
    ]);
    expect((await cli(["facts", `${APK_DIR}snapshare.apk`])).stdout).toMatch(/The app's own \(1\)\n {4}org\.example\.snapshare\.DYNAMIC_RECEIVER_NOT_EXPORTED_PERMISSION/);
  });

  it("puts all-files access and the mock location app under special access, the special-use service type at install", async () => {
    // Platform table (API 36): MANAGE_EXTERNAL_STORAGE signature|appop|preinstalled; FOREGROUND_SERVICE_SPECIAL_USE
    // normal|appop|instant (granted at install); ACCESS_MOCK_LOCATION signature, picked in developer options.
    const path = join(dir, "special.xml");
    writeFileSync(path, `<manifest xmlns:android="http://schemas.android.com/apk/res/android" package="org.example.special"><uses-sdk android:minSdkVersion="26" android:targetSdkVersion="34"/><uses-permission android:name="android.permission.MANAGE_EXTERNAL_STORAGE"/><uses-permission android:name="android.permission.ACCESS_MOCK_LOCATION"/><uses-permission android:name="android.permission.FOREGROUND_SERVICE_SPECIAL_USE"/><application/></manifest>`);
    const out = (await cli(["facts", path])).stdout;
    expect(out).toMatch(/Special access: the user grants it by hand \(settings, developer options\) \(2\)\n {4}ACCESS_MOCK_LOCATION.*\n {4}MANAGE_EXTERNAL_STORAGE/);
    expect(out).toMatch(/Install-time: granted without asking \(1\)\n {4}FOREGROUND_SERVICE_SPECIAL_USE/);
  });

  it("notes a Health Connect permission and one the platform defines under a feature flag", async () => {
    // Platform tables: android.permission.RANGING is dangerous under android.permission.flags.ranging_permission_enabled
    // (API 36); health.READ_STEPS is the Health Connect module's (health-connect-permissions.tsv).
    const path = join(dir, "flags.xml");
    writeFileSync(path, `<manifest xmlns:android="http://schemas.android.com/apk/res/android" package="org.example.flags"><uses-sdk android:minSdkVersion="26" android:targetSdkVersion="36"/><uses-permission android:name="android.permission.RANGING"/><uses-permission android:name="android.permission.health.READ_STEPS"/><application/></manifest>`);
    const out = (await cli(["facts", path])).stdout.replace(/\s+/g, " ");
    expect(out).toMatch(/RANGING defined under feature flag android\.permission\.flags\.ranging_permission_enabled/);
    expect(out).toMatch(/health\.READ_STEPS Health Connect/);
  });

  it("says that an app targeting below 23 gets its runtime permissions at install", async () => {
    const path = join(dir, "old.xml");
    writeFileSync(path, `<manifest xmlns:android="http://schemas.android.com/apk/res/android" package="org.example.old"><uses-sdk android:minSdkVersion="15" android:targetSdkVersion="22"/><uses-permission android:name="android.permission.READ_CONTACTS"/><application/></manifest>`);
    expect((await cli(["facts", path])).stdout).toMatch(/Runtime permissions, granted at install at this targetSdk \(no prompt; the user can revoke them later\) \(1\)/);
  });
});
