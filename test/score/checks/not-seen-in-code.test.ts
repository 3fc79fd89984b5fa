import AdmZip from "adm-zip";
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { readDexEntries } from "../../../src/extract/code.js";
import { openArchiveBytes } from "../../../src/extract/containers/zip.js";
import { readManifestBytes } from "../../../src/extract/read.js";
import { defaultJudge as demoJudge } from "../../helpers/judge.js";
import { APK_DIR } from "../../helpers/paths.js";

function judgeApk(bytes: Uint8Array) {
  const manifest = readManifestBytes(bytes);
  const archive = openArchiveBytes(bytes);
  const dexes = readDexEntries(archive);
  archive.close();
  return demoJudge.judge(manifest, { category: "TOOLS", dexes });
}

const all = (r: ReturnType<typeof judgeApk>) => r.findings.flatMap((f) => [f, ...(f.also ?? []).map((a) => ({ ...f, ...a }))]);

describe("not-seen-in-code", () => {
  // Judged against the bundled default baseline, where READ_SMS is uncommon for TOOLS.
  // The demo torch's smali (fixtures/smali/beamtorch) calls CameraManager.setTorchMode, which needs no CAMERA
  // permission (from memory: Android API reference), and never posts a notification.
  const bytes = readFileSync(`${APK_DIR}beamtorch-code.apk`);

  it("notes the requested permissions the code never reaches, and only those", () => {
    const r = judgeApk(bytes);
    const seen = all(r).filter((f) => f.checkId === "not-seen-in-code").map((f) => f.subject).sort();
    expect(seen).toEqual(["android.permission.CAMERA", "android.permission.POST_NOTIFICATIONS"]);
    expect(all(r).find((f) => f.checkId === "not-seen-in-code")!.level).toBe("note");
  });

  it("leaves the other findings as their checks made them; their message says what the code shows", async () => {
    const { codeLookup, wordFinding } = await import("../../../src/report/messages.js");
    const r = judgeApk(bytes);
    const sms = r.findings.find((f) => f.subject === "android.permission.READ_SMS")!;
    expect(sms.data.code).toBeUndefined(); // no step rewrites another's findings
    expect(wordFinding(sms, codeLookup(r.code))).toMatch(/ Code: used by org\.example\.beamtorch\.$/);
    expect(wordFinding(sms)).not.toMatch(/Code:/);
  });

  it("says nothing when no dex could be read, or without code evidence", () => {
    const zip = new AdmZip(bytes);
    zip.updateFile("classes.dex", Buffer.from("dex\n035\0"));
    zip.updateFile("classes2.dex", Buffer.from("not a dex"));
    const r = judgeApk(zip.toBuffer());
    expect(r.code?.problems).toHaveLength(2);
    expect(all(r).some((f) => f.checkId === "not-seen-in-code")).toBe(false);
    const plain = demoJudge.judge(readManifestBytes(bytes), { category: "TOOLS" });
    expect(all(plain).some((f) => f.checkId === "not-seen-in-code")).toBe(false);
  });
});
