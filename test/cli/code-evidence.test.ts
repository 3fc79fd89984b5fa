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

  it("trim on the voice-memo app: never proposes what reached code uses, ranks never-reached and not-seen first, and says the app loads code", async () => {
    // fixtures/apps/echomemo, code in fixtures/smali/echomemo (assembled by Debian's smali).
    const memo = `${APK_DIR}echomemo.apk`;
    const json = JSON.parse((await cli(["trim", "-f", "json", memo])).stdout);
    const perms = json.candidates.map((c: { permission: string }) => c.permission.replace("android.permission.", ""));
    for (const p of ["RECORD_AUDIO", "FOREGROUND_SERVICE", "INTERNET"]) expect(perms).not.toContain(p);
    // The one used candidate (READ_SMS, uncommon) comes last; every other is not seen or never reached.
    expect(perms[perms.length - 1]).toBe("READ_SMS");
    expect(json.candidates.slice(0, -1).map((c: { code: { status: string } }) => c.code.status).every((st: string) => st === "unreached" || st === "not-seen")).toBe(true);
    expect(json.candidates[0].safe).toMatch(/loads code at run time or reflects on names built at run time/);
    const source = `${dir}/EchoManifest.xml`;
    copyFileSync(`${FIXTURES}apps/echomemo/AndroidManifest.xml`, source);
    const r = await cli(["trim", memo, "--source", source, "--in-place"]);
    expect(r.stderr).toContain("left READ_SMS: the app's code uses it");
    const after = readFileSync(source, "utf8");
    for (const p of ["RECORD_AUDIO", "FOREGROUND_SERVICE", "INTERNET", "READ_SMS"]) expect(after).toContain(`android.permission.${p}"`);
    for (const p of ["READ_PHONE_STATE", "WAKE_LOCK", "CAMERA"]) expect(after).not.toContain(`android.permission.${p}"`);
  });

  it("check --format sarif carries the re-delegation warning with its path", async () => {
    const sarif = JSON.parse((await cli(["check", "-f", "sarif", `${APK_DIR}echomemo.apk`])).stdout);
    const result = sarif.runs[0].results.find((x: { ruleId: string }) => x.ruleId === "permission-redelegation");
    expect(result.level).toBe("warning");
    expect(result.message.text).toContain("SmsRelay.onReceive → org.example.echomemo.app.Inbox.lastCode → content://sms string");
  });
});
