/**
 * permission-redelegation on the invented voice-memo app (fixtures/apps/echomemo, code in fixtures/smali/echomemo,
 * assembled by Debian's smali): its exported receiver SmsRelay, guarded by nothing, reads the SMS inbox for
 * whoever asks; SyncReceiver runs the same code behind the app's own signature permission.
 */
import AdmZip from "adm-zip";
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { readDexEntries } from "../../../src/extract/code.js";
import { openArchiveBytes } from "../../../src/extract/containers/zip.js";
import { readManifestBytes } from "../../../src/extract/read.js";
import { wordFinding } from "../../../src/report/messages.js";
import { defaultJudge } from "../../helpers/judge.js";
import { APK_DIR, FIXTURES } from "../../helpers/paths.js";
import { compileManifest, haveAapt2 } from "../../helpers/toolchain.js";

function judge(bytes: Uint8Array, dexSource: Uint8Array = bytes) {
  const manifest = readManifestBytes(bytes);
  const archive = openArchiveBytes(dexSource);
  const dexes = readDexEntries(archive);
  archive.close();
  return defaultJudge.judge(manifest, { dexes });
}

const apk = readFileSync(`${APK_DIR}echomemo.apk`);
const findings = (r: ReturnType<typeof judge>) => r.findings.filter((f) => f.checkId === "permission-redelegation");

describe("permission-redelegation", () => {
  it("warns about an exported, unguarded receiver that reads SMS for its caller, with the call path", () => {
    const r = judge(apk);
    const f = findings(r);
    expect(f.map((x) => x.subject)).toEqual(["org.example.echomemo.app.SmsRelay"]);
    expect(f[0].level).toBe("warning");
    expect(f[0].data).toMatchObject({ kind: "receiver", permission: "android.permission.READ_SMS", level: "dangerous", openBecause: "none" });
    // The path the smali source spells out: onReceive → Inbox.lastCode → the content://sms/inbox constant.
    expect(f[0].data.path).toEqual(["org.example.echomemo.app.SmsRelay.onReceive", "org.example.echomemo.app.Inbox.lastCode", "content://sms string"]);
    expect(wordFinding(f[0])).toMatch(/any app can reach this receiver \(it requires no permission\), and its code uses READ_SMS \(dangerous: reads the user's text messages\)/);
  });

  it("passes the same code behind a signature permission, and a launcher activity", () => {
    const r = judge(apk);
    expect(findings(r).some((x) => x.subject.endsWith("SyncReceiver"))).toBe(false);
    expect(findings(r).some((x) => x.subject.endsWith("MainActivity"))).toBe(false);
  });

  it.skipIf(!haveAapt2())("passes once the relay is guarded by a signature permission (manifest compiled by Debian's aapt2)", () => {
    const source = readFileSync(`${FIXTURES}apps/echomemo/AndroidManifest.xml`, "utf8").replace('android:name=".SmsRelay" android:exported="true"', 'android:name=".SmsRelay" android:exported="true" android:permission="org.example.echomemo.app.permission.SYNC"');
    const guarded = compileManifest(source);
    expect(findings(judge(guarded, apk))).toEqual([]);
    // Guarded by a normal-level platform permission, any app still gets through.
    const weak = compileManifest(source.replace('android:permission="org.example.echomemo.app.permission.SYNC">\n            <intent-filter><action android:name="org.example.echomemo.action.LAST_CODE"', 'android:permission="android.permission.INTERNET">\n            <intent-filter><action android:name="org.example.echomemo.action.LAST_CODE"'));
    expect(findings(judge(weak, apk)).map((x) => x.data.openBecause)).toEqual(["normal"]);
  });

  it("says nothing without code", () => {
    const zip = new AdmZip(apk);
    for (const e of ["classes.dex", "classes2.dex"]) zip.deleteFile(e);
    expect(findings(judge(zip.toBuffer()))).toEqual([]);
  });
});
