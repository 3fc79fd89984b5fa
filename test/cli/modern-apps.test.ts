/**
 * Apps of today against a baseline of 2020: the well-behaved modern app (fixtures/apps/snapshare, built by
 * aapt2 into fixtures/apk/snapshare.apk) gets no warning and no trim change; the over-asking modern torch
 * (fixtures/apps/beamtorch) still gets its findings.
 */
import { copyFileSync, mkdtempSync, readFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { EXIT } from "../../src/cli/exit-codes.js";
import { cli } from "../helpers/cli.js";
import { APK_DIR, FIXTURES } from "../helpers/paths.js";

const dir = mkdtempSync(join(tmpdir(), "overask-modern-"));
const findings = (stdout: string) => JSON.parse(stdout).results[0].findings as { checkId: string; level: string; subject: string; also?: { checkId: string }[] }[];

describe("a well-behaved app targeting API 34", () => {
  for (const input of [`${APK_DIR}snapshare.apk`, `${FIXTURES}apps/snapshare/AndroidManifest.xml`]) {
    it(`gets no warning and passes --fail-on warning (${input.includes(".apk") ? "APK" : "source"})`, async () => {
      const r = await cli(["check", "-c", "TOOLS", "--fail-on", "warning", "-f", "json", input]);
      expect(findings(r.stdout).filter((f) => f.level !== "note")).toEqual([]);
      expect(r.code).toBe(EXIT.OK);
      const notJudged = JSON.parse(r.stdout).results[0].notJudged.map((n: { permission: string; why: string }) => [n.permission, n.why]);
      expect(notJudged).toContainEqual(["org.example.snapshare.DYNAMIC_RECEIVER_NOT_EXPORTED_PERMISSION", "own-permission"]);
      expect(notJudged).toContainEqual(["android.permission.POST_NOTIFICATIONS", "made-explicit"]);
    });
  }

  it("gets no change from trim --write", async () => {
    const src = join(dir, "AndroidManifest.xml");
    copyFileSync(`${FIXTURES}apps/snapshare/AndroidManifest.xml`, src);
    const out = join(dir, "trimmed.xml");
    const r = await cli(["trim", "-c", "TOOLS", "--write", out, src]);
    expect(r.code).toBe(EXIT.OK);
    expect(r.stderr).toContain("(0 changes)");
    expect(readFileSync(out, "utf8")).toBe(readFileSync(src, "utf8"));
  });

  it("shows in the header that it targets a newer platform than the baseline's era", async () => {
    const r = await cli(["check", "-c", "TOOLS", `${APK_DIR}snapshare.apk`]);
    expect(r.stdout).toContain("era         API 29");
    expect(r.stdout.replace(/\s+/g, " ")).toContain("the app targets API 34, newer than the baseline's era (API 29)");
  });
});

describe("the over-asking torch app of today", () => {
  it("still gets its findings", async () => {
    const r = await cli(["check", "-c", "TOOLS", "-f", "json", `${APK_DIR}beamtorch.apk`]);
    const f = findings(r.stdout);
    const all = f.flatMap((x) => [[x.checkId, x.subject], ...(x.also ?? []).map((a) => [a.checkId, x.subject])]);
    expect(all).toContainEqual(["sensitive-uncommon", "android.permission.READ_SMS"]);
    expect(all).toContainEqual(["sensitive-uncommon", "android.permission.ACCESS_BACKGROUND_LOCATION"]);
    expect(all).toContainEqual(["background-location-alone", "android.permission.ACCESS_BACKGROUND_LOCATION"]);
    expect(all).toContainEqual(["exported-missing", "org.example.beamtorch.Boot"]);
    // READ_CONTACTS: 202 of 2318 TOOLS apps of the bundled corpus request it (8.7%), so frequency does not
    // call it uncommon there; in EDUCATION (59 of 2758) it is.
    const edu = findings((await cli(["check", "-c", "EDUCATION", "-f", "json", `${APK_DIR}beamtorch.apk`])).stdout);
    expect(edu.map((x) => x.subject)).toContain("android.permission.READ_CONTACTS");
  });
});
