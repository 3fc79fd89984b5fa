/**
 * Debian's Android toolchain for tests that build an APK from a manifest written in the test: `aapt2 link`
 * against android-framework-res (API 29). Tests that need it skip, and say so, when it is not installed.
 */
import { execFileSync } from "node:child_process";
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";

export const FRAMEWORK = "/usr/share/android-framework-res/framework-res.apk";

let have: boolean | undefined;
export function haveAapt2(): boolean {
  if (have === undefined) {
    try {
      execFileSync("aapt2", ["version"], { stdio: "ignore" });
      have = existsSync(FRAMEWORK);
    } catch {
      have = false;
    }
  }
  return have;
}

/**
 * The binary APK aapt2 links from a plain manifest. Service types newer than the API-29 framework are
 * linked as dataSync (the framework aapt2 links against knows no later flags).
 */
export function compileManifest(xml: string): Uint8Array {
  const dir = mkdtempSync(join(tmpdir(), "overask-aapt2-"));
  try {
    writeFileSync(join(dir, "AndroidManifest.xml"), xml.replace(/android:foregroundServiceType="[^"]*"/g, 'android:foregroundServiceType="dataSync"'));
    execFileSync("aapt2", ["link", "-I", FRAMEWORK, "--manifest", join(dir, "AndroidManifest.xml"), "-o", join(dir, "out.apk")], { stdio: ["ignore", "ignore", "pipe"] });
    return readFileSync(join(dir, "out.apk"));
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
