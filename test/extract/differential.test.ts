/**
 * Randomized differential test against the Android toolchain: manifests generated from a seed are
 * compiled by Debian's aapt2 (linked against android-framework-res, API 29), then decoded by overask
 * and compared with overask's reading of the source, and with `aapt dump permissions` of the build.
 * Runs whenever aapt2 and the framework are installed (CI installs both); says so when it is skipped.
 */
import { execFileSync } from "node:child_process";
import { existsSync, mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { readManifestBytes } from "../../src/extract/index.js";
import { readManifestFile } from "../../src/ops/read-manifest.js";
import type { Manifest } from "../../src/extract/manifest/model.js";
import { platformPermissions } from "../../src/platform/permissions.js";
import { pick, randomInt, seededRandom, type Random } from "../../src/util/random.js";
import { parsePermissionsDump } from "../helpers/aapt-dump.js";

const FRAMEWORK = "/usr/share/android-framework-res/framework-res.apk";
const hasToolchain = (() => {
  try {
    execFileSync("aapt2", ["version"], { stdio: "ignore" });
    execFileSync("aapt", ["version"], { stdio: "ignore" });
    return existsSync(FRAMEWORK);
  } catch {
    return false;
  }
})();
if (!hasToolchain) console.warn("differential test skipped: aapt/aapt2 or android-framework-res not installed (apt-get install aapt android-framework-res)");

const SEEDS = Array.from({ length: 30 }, (_, i) => 1000 + i);
// Permissions the API 29 framework defines too, so that aapt2 needs no newer platform.
const PERMISSIONS = [...platformPermissions().keys()].filter((n) => n.startsWith("android.permission.")).slice(0, 400);
const LEVELS = ["normal", "dangerous", "signature", "signature|privileged", "signature|appop", "dangerous|instant"];
const LABEL_CHARS = "abcXYZ äöü ßçñ 学习卡 Карточки ✓ & ' \" < >";

function escapeXml(s: string): string {
  return s.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;").replace(/"/g, "&quot;");
}

function randomText(rand: Random, n: number): string {
  return Array.from({ length: n }, () => pick(rand, [...LABEL_CHARS])).join("");
}

function generate(seed: number): string {
  const rand = seededRandom(seed);
  const pkg = `org.example.gen${seed}`;
  const lines = [
    `<?xml version="1.0" encoding="utf-8"?>`,
    `<manifest xmlns:android="http://schemas.android.com/apk/res/android" package="${pkg}" android:versionCode="${randomInt(rand, 1, 2_000_000_000)}" android:versionName="${randomInt(rand, 0, 9)}.${randomInt(rand, 0, 99)}">`,
    `  <uses-sdk android:minSdkVersion="${randomInt(rand, 14, 26)}" android:targetSdkVersion="${randomInt(rand, 26, 34)}" />`,
  ];
  const declared: string[] = [];
  for (let i = randomInt(rand, 0, 3); i > 0; i--) {
    const name = `${pkg}.permission.P${i}`;
    declared.push(name);
    lines.push(`  <permission android:name="${name}" android:protectionLevel="${pick(rand, LEVELS)}" />`);
  }
  for (let i = randomInt(rand, 0, 25); i > 0; i--) {
    const name = rand() < 0.1 && declared.length ? pick(rand, declared) : pick(rand, PERMISSIONS);
    const element = rand() < 0.15 ? "uses-permission-sdk-23" : "uses-permission";
    const max = rand() < 0.15 ? ` android:maxSdkVersion="${randomInt(rand, 18, 32)}"` : "";
    lines.push(`  <${element} android:name="${name}"${max} />`);
  }
  lines.push(`  <application android:label="${escapeXml(randomText(rand, randomInt(rand, 1, 40)))}"${rand() < 0.5 ? ` android:allowBackup="${rand() < 0.5}"` : ""}${rand() < 0.3 ? ' android:debuggable="true"' : ""}>`);
  for (let i = randomInt(rand, 0, 6); i > 0; i--) {
    const kind = pick(rand, ["activity", "service", "receiver", "provider"]);
    const exported = rand() < 0.6 ? ` android:exported="${rand() < 0.5}"` : "";
    const permission = rand() < 0.3 ? ` android:permission="${pick(rand, [...PERMISSIONS, ...declared])}"` : "";
    const authorities = kind === "provider" ? ` android:authorities="${pkg}.p${i}"` : "";
    const filter = kind !== "provider" && rand() < 0.5
      ? `<intent-filter><action android:name="org.example.ACTION_${i}" /><category android:name="android.intent.category.DEFAULT" /></intent-filter>`
      : "";
    lines.push(`    <${kind} android:name="${rand() < 0.5 ? "." : `${pkg}.`}C${i}"${exported}${permission}${authorities}>${filter}</${kind}>`);
  }
  if (rand() < 0.3) lines.push(`    <meta-data android:name="${pkg}.LONG" android:value="${"v".repeat(randomInt(rand, 100, 40_000))}" />`);
  lines.push("  </application>", "</manifest>", "");
  return lines.join("\n");
}

function comparable(m: Manifest): unknown {
  const { input: _i, compileSdk: _c, compileSdkCodename: _cc, notes: _n, ...rest } = m;
  return JSON.parse(JSON.stringify(rest));
}

describe.runIf(hasToolchain)("randomized manifests compiled by aapt2", () => {
  const dir = mkdtempSync(join(tmpdir(), "overask-diff-"));
  for (const seed of SEEDS) {
    it(`seed ${seed}: the APK decodes to the source's model and aapt's permission list`, () => {
      const source = join(dir, `m${seed}.xml`);
      const apk = join(dir, `m${seed}.apk`);
      const text = generate(seed);
      writeFileSync(source, text);
      execFileSync("aapt2", ["link", "-I", FRAMEWORK, "--manifest", source, "-o", apk], { stdio: "pipe" });
      const fromApk = readManifestFile(apk);
      const fromSource = readManifestBytes(new TextEncoder().encode(text), source);
      expect(comparable(fromApk)).toEqual(comparable(fromSource));
      // Source: Debian aapt, `aapt dump permissions` of the same build.
      const dumped = parsePermissionsDump(execFileSync("aapt", ["dump", "permissions", apk], { encoding: "utf8" }));
      expect(fromApk.usesPermissions.map((p) => ({ element: p.element, name: p.name, ...(p.maxSdkVersion !== undefined ? { maxSdkVersion: p.maxSdkVersion } : {}) }))).toEqual(dumped);
    });
  }
});
