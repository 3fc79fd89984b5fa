import { copyFileSync, mkdtempSync, readFileSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { afterAll, describe, expect, it } from "vitest";
import { cli } from "../helpers/cli.js";
import { APK_DIR, FIXTURES } from "../helpers/paths.js";

// The demo torch with its dex code (fixtures/smali/beamtorch, assembled by Debian's smali).
const apk = `${APK_DIR}beamtorch-code.apk`;
const dir = mkdtempSync(`${tmpdir()}/overask-code-`);
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe("code evidence on the command line", () => {
  it("facts shows a code column and section; --no-code leaves both out", async () => {
    const on = await cli(["facts", apk]);
    expect(on.stdout).toContain("CAMERA                      code: not seen");
    expect(on.stdout).toContain("Code evidence");
    const off = await cli(["facts", "--no-code", apk]);
    expect(off.stdout).not.toContain("code:");
    expect(off.stdout).not.toContain("Code evidence");
  });

  it("check reports not-seen notes and a code line; JSON carries the evidence", async () => {
    const text = await cli(["check", "-c", "TOOLS", apk]);
    expect(text.stdout).toMatch(/code {8}2 dex files read: 2 of 5 requested permissions used, 2 not seen, 1\s+not mappable/);
    expect(text.stdout).toContain("CAMERA  (note: not-seen-in-code)");
    const json = JSON.parse((await cli(["check", "-c", "TOOLS", "-f", "json", apk])).stdout);
    expect(json.results[0].code.permissions.map((p: { status: string }) => p.status).sort()).toEqual(["not-mappable", "not-seen", "not-seen", "used", "used"]);
    const off = await cli(["check", "-c", "TOOLS", "--no-code", apk]);
    expect(off.stdout).not.toContain("not-seen-in-code");
  });

  it("a damaged dex is said once and costs only the evidence", async () => {
    const AdmZip = (await import("adm-zip")).default;
    const zip = new AdmZip(readFileSync(apk));
    zip.updateFile("classes2.dex", Buffer.from("dex\n099\0"));
    zip.writeZip(`${dir}/damaged.apk`);
    const r = await cli(["check", "-c", "TOOLS", `${dir}/damaged.apk`]);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/could not read classes2\.dex: /);
    expect(r.stdout).toContain("READ_SMS");
  });

  it("trim --in-place leaves a permission the code uses unless --remove-used", async () => {
    const source = `${dir}/AndroidManifest.xml`;
    copyFileSync(`${FIXTURES}apps/beamtorch/AndroidManifest.xml`, source);
    const r = await cli(["trim", "-c", "TOOLS", apk, "--source", source, "--in-place"]);
    expect(r.stderr).toContain("left READ_SMS: the app's code uses it; say --remove-used");
    const after = readFileSync(source, "utf8");
    expect(after).toContain("android.permission.READ_SMS");
    expect(after).not.toContain("android.permission.CAMERA");
    await cli(["trim", "-c", "TOOLS", apk, "--source", source, "--in-place", "--remove-used"]);
    expect(readFileSync(source, "utf8")).not.toContain("android.permission.READ_SMS");
  });

  it("delta lists evidence that appeared with a new library", async () => {
    const AdmZip = (await import("adm-zip")).default;
    const zip = new AdmZip(readFileSync(apk));
    zip.deleteFile("classes2.dex");
    zip.writeZip(`${dir}/before.apk`);
    const r = await cli(["delta", "-c", "TOOLS", `${dir}/before.apk`, apk]);
    // The library's code is never called: its evidence appears, marked so; what it would use unrequested is not listed.
    expect(r.stdout).toContain("Code evidence (1 appeared, 0 vanished)");
    expect(r.stdout.replace(/\s+/g, " ")).toContain("+ android.telephony.TelephonyManager.getLine1Number(…) — READ_SMS (org.example.adnet), never reached");
    const json = JSON.parse((await cli(["delta", "-c", "TOOLS", "-f", "json", `${dir}/before.apk`, apk])).stdout);
    expect(json.code.appeared.map((e: { what: string }) => e.what.split("(")[0]).sort()).toEqual(["android.telephony.TelephonyManager.getLine1Number"]);
  });
});
