import { mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { EXIT } from "../../../src/cli/exit-codes.js";
import { readManifestFile } from "../../../src/ops/read-manifest.js";
import { requestedPermissionNames } from "../../../src/extract/manifest/model.js";
import { parseMergeReport } from "../../../src/score/merge-report.js";
import { cli } from "../../helpers/cli.js";
import { FIXTURES } from "../../helpers/paths.js";

const dir = mkdtempSync(join(tmpdir(), "overask-trim-"));
const SOURCE = `${FIXTURES}apps/pocketlamp/AndroidManifest.xml`;

/** Line-level diff: lines only in a, lines only in b (order kept). */
function changedLines(a: string, b: string): { removed: string[]; added: string[] } {
  const bl = b.split("\n");
  const al = a.split("\n");
  return { removed: al.filter((l) => !bl.includes(l)), added: bl.filter((l) => !al.includes(l)) };
}

describe("overask trim --write", () => {
  it("patches only the intended lines, and the result still reads as a manifest without them", async () => {
    const out = join(dir, "patched.xml");
    const { code, stdout } = await cli(["trim", "-c", "TOOLS", "--format", "json", "--write", out, SOURCE]);
    expect(code).toBe(EXIT.OK);
    const plan = JSON.parse(stdout);
    const before = readFileSync(SOURCE, "utf8");
    const after = readFileSync(out, "utf8");
    const { removed, added } = changedLines(before, after);
    const deleted = plan.candidates.filter((c: { action: { kind: string } }) => c.action.kind === "delete").map((c: { permission: string }) => c.permission);
    expect(removed.map((l) => /android:name="([^"]+)"/.exec(l)?.[1]).sort()).toEqual([...deleted, "android.permission.WRITE_EXTERNAL_STORAGE"].sort());
    expect(added).toEqual(['    <uses-permission android:name="android.permission.WRITE_EXTERNAL_STORAGE" android:maxSdkVersion="29" />']);
    const m = readManifestFile(out);
    for (const p of deleted) expect(requestedPermissionNames(m)).not.toContain(p);
    expect(m.usesPermissions.find((p) => p.name === "android.permission.WRITE_EXTERNAL_STORAGE")?.maxSdkVersion).toBe(29);
    // Comments and every other line stay as they were.
    expect(after).toContain("<!-- Pocket Lamp: a torch app that asks for far more than a torch needs (invented demo app). -->");
  });

  it("leaves --keep permissions alone and refuses to patch an APK", async () => {
    const out = join(dir, "kept.xml");
    await cli(["trim", "-c", "TOOLS", "--keep", "READ_SMS", "--write", out, SOURCE]);
    expect(requestedPermissionNames(readManifestFile(out))).toContain("android.permission.READ_SMS");
    expect((await cli(["trim", "--write", out, `${FIXTURES}apk/pocketlamp.apk`])).code).toBe(EXIT.USAGE);
  });

  it("names the library behind a merged permission and removes it with tools:node=\"remove\"", async () => {
    const src = join(dir, "lib.xml");
    // A source manifest that does not itself declare READ_PHONE_STATE or AD_ID: the merger report says a library adds them.
    writeFileSync(src, readFileSync(SOURCE, "utf8").replace(/\n\s*<uses-permission android:name="(android\.permission\.READ_PHONE_STATE|org\.example\.adnet\.permission\.AD_ID)" \/>/g, ""));
    const out = join(dir, "lib-patched.xml");
    // The APK is the merged result; the source manifest is what gets patched.
    const { code, stdout } = await cli(["trim", "-c", "TOOLS", "--merge-report", `${FIXTURES}merge/pocketlamp-merger-report.txt`, "--source", src, "--write", out, `${FIXTURES}apk/pocketlamp.apk`]);
    expect(code).toBe(EXIT.OK);
    expect(stdout).toMatch(/AD_ID[\s\S]*added by org\.example\.adnet:adnet-sdk:4\.2\.0[\s\S]*tools:node="remove"/);
    const patched = readFileSync(out, "utf8");
    expect(patched).toMatch(/<manifest xmlns:android="http:\/\/schemas.android.com\/apk\/res\/android" xmlns:tools="http:\/\/schemas.android.com\/tools"/);
    const m = readManifestFile(out);
    expect(m.usesPermissions.filter((p) => p.removedByTools).map((p) => p.name)).toEqual(["org.example.adnet.permission.AD_ID"]);
  });
});

describe("parseMergeReport", () => {
  it("tells the app's own permissions from the libraries' (report layout from memory)", () => {
    const origins = parseMergeReport(readFileSync(`${FIXTURES}merge/pocketlamp-merger-report.txt`, "utf8"));
    expect(origins.get("android.permission.CAMERA")).toEqual({ libraries: [], app: true });
    expect(origins.get("android.permission.READ_PHONE_STATE")).toEqual({ libraries: ["org.example.adnet:adnet-sdk:4.2.0", "org.example.analytics:tally:1.0.3"], app: false });
    expect(origins.get("org.example.adnet.permission.AD_ID")?.libraries).toEqual(["org.example.adnet:adnet-sdk:4.2.0"]);
  });
});

describe("trim never removes what the manifest shows the app needs", () => {
  it("keeps what the manifest shows the app needs, and says why in words (score/needed.ts decides)", async () => {
    const { planTrim } = await import("../../../src/score/trim/plan.js");
    const { neededText } = await import("../../../src/report/messages.js");
    const { defaultJudge, judgeText } = await import("../../helpers/judge.js");
    // A step counter (invented) with a health service: BODY_SENSORS is rare among TOOLS apps (the bundled
    // counts), but the health service needs it (or another sensor permission) before it starts.
    const text = `<manifest xmlns:android="http://schemas.android.com/apk/res/android" package="org.example.keep">
  <uses-sdk android:minSdkVersion="26" android:targetSdkVersion="34" />
  <uses-permission android:name="android.permission.BODY_SENSORS" />
  <uses-permission android:name="android.permission.FOREGROUND_SERVICE" />
  <uses-permission android:name="android.permission.FOREGROUND_SERVICE_HEALTH" />
  <application>
    <service android:name=".Steps" android:exported="false" android:foregroundServiceType="health" />
  </application>
</manifest>`;
    const result = judgeText(text, { category: "TOOLS" }, defaultJudge);
    expect(result.findings.map((f) => f.subject)).not.toContain("android.permission.BODY_SENSORS");
    const plan = planTrim(result);
    expect(plan.candidates.map((c) => c.permission)).not.toContain("android.permission.BODY_SENSORS");
    const kept = plan.kept.find((k) => k.permission === "android.permission.BODY_SENSORS");
    expect(kept && neededText(kept.reasons[0])).toMatch(/^the health foreground service org\.example\.keep\.Steps needs one of ACTIVITY_RECOGNITION, BODY_SENSORS, /);
  });

  it("says why each suggestion is safe", async () => {
    const { cli } = await import("../../helpers/cli.js");
    const r = await cli(["trim", "-c", "TOOLS", "-f", "json", `${FIXTURES}apps/pocketlamp/AndroidManifest.xml`]);
    for (const c of JSON.parse(r.stdout).candidates) expect(c.safe.length, c.permission).toBeGreaterThan(10);
  });
});
