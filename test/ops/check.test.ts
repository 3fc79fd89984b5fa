import { execFileSync } from "node:child_process";
import { copyFileSync, mkdirSync, mkdtempSync, readFileSync, statSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { EXIT } from "../../src/cli/exit-codes.js";
import { cli } from "../helpers/cli.js";
import { APK_DIR, FIXTURES, ROOT } from "../helpers/paths.js";

const dir = mkdtempSync(join(tmpdir(), "overask-check-"));
const LAMP = `${APK_DIR}pocketlamp.apk`;

describe("check on files", () => {
  it("describes the labeled corpus instead of naming it after a detector; the citation stays in the provenance", async () => {
    const out = (await cli(["check", "-c", "TOOLS", LAMP])).stdout.replace(/\s+/g, " ");
    expect(out).toContain("apps flagged in a labeled corpus of Android malware and benign apps from 2010–2012");
    expect(out).not.toMatch(/Drebin/);
    const json = JSON.parse((await cli(["baseline", "-f", "json"])).stdout);
    expect(json.model.citation).toMatch(/Drebin-215/);
  });
  it("refuses SARIF with --records", async () => {
    const records = join(dir, "r.jsonl");
    writeFileSync(records, `${JSON.stringify({ id: "a", permissions: ["android.permission.CAMERA"] })}\n`);
    const r = await cli(["check", "--records", records, "-f", "sarif"]);
    expect(r.code).toBe(EXIT.USAGE);
  });
  it("writes SARIF without relative help URIs, and lists unreadable inputs as tool notifications", async () => {
    const log = JSON.parse((await cli(["check", "-f", "sarif", LAMP, join(dir, "gone.apk")])).stdout);
    const run = log.runs[0];
    for (const rule of run.tool.driver.rules) {
      if (rule.helpUri !== undefined) expect(rule.helpUri).toMatch(/^https?:\/\//);
      expect(rule.help.text.length).toBeGreaterThan(20);
    }
    expect(run.invocations[0].executionSuccessful).toBe(false);
    expect(run.invocations[0].toolExecutionNotifications[0].message.text).toMatch(/gone\.apk: no such file/);
  });
  it("wraps a long path in the header instead of leaving its label alone", async () => {
    const deep = join(dir, "a-rather-long-folder-name-for-an-inventory", "2026-12-02", "batch-000017");
    mkdirSync(deep, { recursive: true });
    const apk = join(deep, "org.example.tidewatch-release-signed.apk");
    copyFileSync(`${APK_DIR}tidewatch.apk`, apk);
    const out = (await cli(["check", "-c", "TOOLS", apk])).stdout;
    expect(out).not.toMatch(/^ {2}file\s*$/m);
    expect(out).toMatch(/^ {2}file {8}\/\S+/m);
    for (const line of out.split("\n")) expect(line.length).toBeLessThanOrEqual(80);
  });
});
