import { describe, expect, it } from "vitest";
import { readManifestBytes } from "../../../src/extract/read.js";
import { patchManifest } from "../../../src/score/trim/patch.js";
import type { TrimCandidate, TrimPlan } from "../../../src/score/trim/plan.js";

const SOURCE = `<?xml version="1.0" encoding="utf-8"?>
<manifest xmlns:android="http://schemas.android.com/apk/res/android" package="org.example.patch">
    <!-- the requests -->
    <uses-permission android:name="android.permission.READ_SMS" />
    <uses-permission android:name="android.permission.BLUETOOTH" /> <uses-permission android:name="android.permission.INTERNET" />
    <uses-permission
        android:name="android.permission.WRITE_EXTERNAL_STORAGE" />
    <application />
</manifest>
`;

const m = readManifestBytes(new TextEncoder().encode(SOURCE), "AndroidManifest.xml");
const element = (name: string) => m.usesPermissions.find((p) => p.name === name)!;
const plan = (candidates: TrimCandidate[]): TrimPlan => ({ package: m.package, candidates, kept: [], typos: [] });
const c = (permission: string, action: TrimCandidate["action"]): TrimCandidate => ({ permission, reasons: [], action, element: element(permission), safe: [] });

describe("patching the source manifest", () => {
  it("deletes an element on a line of its own with its line, and leaves everything else as it was", () => {
    const out = patchManifest(SOURCE, plan([c("android.permission.READ_SMS", { kind: "delete" })]));
    expect(out).toBe(SOURCE.replace('    <uses-permission android:name="android.permission.READ_SMS" />\n', ""));
  });

  it("deletes only the element when another shares its line", () => {
    const out = patchManifest(SOURCE, plan([c("android.permission.BLUETOOTH", { kind: "delete" })]));
    expect(out).toContain('    <uses-permission android:name="android.permission.INTERNET" />');
    expect(out).not.toContain("BLUETOOTH");
  });

  it("limits an element written over several lines with maxSdkVersion", () => {
    const out = patchManifest(SOURCE, plan([c("android.permission.WRITE_EXTERNAL_STORAGE", { kind: "limit", maxSdkVersion: 29 })]));
    const back = readManifestBytes(new TextEncoder().encode(out), "AndroidManifest.xml");
    expect(back.usesPermissions.find((p) => p.name === "android.permission.WRITE_EXTERNAL_STORAGE")?.maxSdkVersion).toBe(29);
    expect(out).toContain("<!-- the requests -->");
  });

  it("adds a tools:node=\"remove\" line (and the tools namespace) for a permission a library adds", () => {
    const lib: TrimCandidate = { permission: "android.permission.READ_PHONE_STATE", reasons: [], action: { kind: "merge-remove" }, safe: [] };
    const out = patchManifest(SOURCE, plan([lib]));
    expect(out).toMatch(/xmlns:tools="http:\/\/schemas\.android\.com\/tools"/);
    expect(out).toMatch(/<uses-permission android:name="android\.permission\.READ_PHONE_STATE" tools:node="remove" \/>/);
    expect(readManifestBytes(new TextEncoder().encode(out), "AndroidManifest.xml").usesPermissions.find((p) => p.name === "android.permission.READ_PHONE_STATE")?.removedByTools).toBe(true);
  });
});
