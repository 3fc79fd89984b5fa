/**
 * What a reviewer and a buyer tripped over, each fixed, each tried through the CLI.
 */
import { execFileSync } from "node:child_process";
import { copyFileSync, mkdirSync, mkdtempSync, readFileSync, statSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { EXIT } from "../../src/cli/exit-codes.js";
import { cli } from "../helpers/cli.js";
import { APK_DIR, FIXTURES, ROOT } from "../helpers/paths.js";

const dir = mkdtempSync(join(tmpdir(), "overask-fixes-"));
const LAMP = `${APK_DIR}pocketlamp.apk`;

describe("overask's own finding layout", () => {
  it("puts the subject first, then (level: check), then the message, in check, trim and delta", async () => {
    const check = (await cli(["check", "-c", "TOOLS", LAMP])).stdout;
    expect(check).toMatch(/^ {2}READ_SMS {2}\(warning: sensitive-uncommon\)\n {4}18 of 2318 TOOLS apps request it/m);
    expect(check).not.toMatch(/\[sensitive-uncommon\]/);
    const trim = (await cli(["trim", "-c", "TOOLS", `${FIXTURES}apps/pocketlamp/AndroidManifest.xml`])).stdout;
    expect(trim).toMatch(/\(warning: sensitive-uncommon\) 18 of 2318 TOOLS apps request it/);
    const delta = (await cli(["delta", `${APK_DIR}tidewatch.apk`, `${APK_DIR}tidewatch-next.apk`])).stdout;
    expect(delta).toMatch(/^ {2}ACCESS_BACKGROUND_LOCATION {2}\(warning: sensitive-uncommon\)$/m);
  });
});

describe("facts", () => {
  it("groups requested permissions by what they mean to a user, with counts", async () => {
    const out = (await cli(["facts", LAMP])).stdout;
    const groups = [...out.matchAll(/^ {2}(\S.*) \((\d+)\)$/gm)].map((m) => [m[1], Number(m[2])]);
    expect(groups).toEqual([
      ["Runtime: the user is asked when the app uses it", 7],
      ["Special access: the user grants it in settings", 1],
      ["Install-time: granted without asking", 3],
      ["Out of reach: a store app is not granted it", 1],
      ["Not defined by the platform", 2],
    ]);
    expect((await cli(["facts", `${APK_DIR}snapshare.apk`])).stdout).toMatch(/The app's own \(1\)\n {4}org\.example\.snapshare\.DYNAMIC_RECEIVER_NOT_EXPORTED_PERMISSION/);
  });
});

describe("the risk caution", () => {
  it("describes the labeled corpus instead of naming it after a detector; the citation stays in the provenance", async () => {
    const out = (await cli(["check", "-c", "TOOLS", LAMP])).stdout.replace(/\s+/g, " ");
    expect(out).toContain("apps flagged in a labeled corpus of Android malware and benign apps from 2010–2012");
    expect(out).not.toMatch(/Drebin/);
    const json = JSON.parse((await cli(["baseline", "-f", "json"])).stdout);
    expect(json.model.citation).toMatch(/Drebin-215/);
  });
});

describe("categories", () => {
  it("refuses a category the baseline does not have, suggesting the nearest and listing them (exit 2)", async () => {
    const r = await cli(["check", "-c", "TOLS", LAMP]);
    expect(r.code).toBe(EXIT.USAGE);
    expect(r.stderr).toMatch(/^overask: --category "TOLS" is not a category of the baseline; did you mean "TOOLS"\? Its categories: COMMUNICATION \(625 apps\), EDUCATION/);
    expect(r.stdout).toBe("");
    for (const cmd of [["trim", `${FIXTURES}apps/pocketlamp/AndroidManifest.xml`], ["delta", LAMP, LAMP], ["sweep", LAMP, "-o", join(dir, "x.jsonl")]]) {
      expect((await cli([...cmd, "-c", "NOSUCHCAT"])).code).toBe(EXIT.USAGE);
    }
  });

  it("reports an index row's unknown category per app and counts it in the sweep summary", async () => {
    const index = join(dir, "index.csv");
    writeFileSync(index, `file,category\n${LAMP},Gardening\n${APK_DIR}tidewatch.apk,Tools\n`);
    const out = join(dir, "index.jsonl");
    const r = await cli(["sweep", index, "-o", out, "-j", "1"]);
    const rows = readFileSync(out, "utf8").trim().split("\n").map((l) => JSON.parse(l));
    expect(rows.find((x) => x.package === "org.example.pocketlamp").fallback).toBe("unknown-category");
    expect(r.stdout).toContain("1 app named a category the baseline does not have");
  });

  it("shows what a baseline knows: categories, era, sources; rates for a category or a permission", async () => {
    const text = (await cli(["baseline"])).stdout;
    expect(text).toMatch(/TOOLS +2318 apps/);
    expect(text).toMatch(/era API 29, apps of 2020/);
    const cat = JSON.parse((await cli(["baseline", "-c", "tools", "-f", "json"])).stdout);
    expect(cat.categoryRates.category).toBe("TOOLS");
    expect(cat.categoryRates.rates[0]).toMatchObject({ permission: "android.permission.INTERNET", k: 2025, n: 2318 });
    const perm = (await cli(["baseline", "-p", "READ_SMS"])).stdout;
    expect(perm).toMatch(/TOOLS +18 of 2318 +0\.78% +0\.49%–1\.2% +uncommon/);
  });
});

describe("sweep inputs and outputs", () => {
  it("sweeps a single APK or manifest as one input", async () => {
    for (const f of [LAMP, `${FIXTURES}apps/pocketlamp/AndroidManifest.xml`]) {
      const out = join(dir, "single.jsonl");
      const r = await cli(["sweep", f, "-o", out, "-j", "1"]);
      expect(readFileSync(out, "utf8").trim().split("\n")).toHaveLength(1);
      expect(r.stdout).toMatch(/^Swept 1 input: 1 scored, 0 could not be read\./);
    }
  });

  it("refuses what is neither an app, a folder, a list of files nor an index (exit 2)", async () => {
    writeFileSync(join(dir, "junk.bin"), Buffer.from([0, 159, 146, 150, 0, 1]));
    for (const f of [`${ROOT}package.json`, join(dir, "junk.bin"), `${FIXTURES}apps/tidewatch/res/values/strings.xml`]) {
      const r = await cli(["sweep", f, "-o", join(dir, "n.jsonl")]);
      expect(r.code, f).toBe(EXIT.USAGE);
      expect(r.stderr, f).toMatch(/^overask: .*(not a list of app files|neither an app nor a text list|not a manifest)/);
    }
  });

  it("says when there is nothing to sweep (exit 3)", async () => {
    mkdirSync(join(dir, "empty"));
    const r = await cli(["sweep", join(dir, "empty"), "-o", join(dir, "e.jsonl")]);
    expect(r.code).toBe(EXIT.INPUT);
    expect(r.stderr).toMatch(/nothing to sweep: no APK, app bundle or manifest/);
  });

  it("keeps each finding's message in JSONL and CSV rows", async () => {
    const jsonl = join(dir, "m.jsonl");
    await cli(["sweep", LAMP, "-o", jsonl, "-c", "TOOLS"]);
    expect(JSON.parse(readFileSync(jsonl, "utf8")).findings[0].message).toMatch(/of 2318 TOOLS apps request it/);
    const csv = join(dir, "m.csv");
    await cli(["sweep", LAMP, "-o", csv, "-f", "csv", "-c", "TOOLS"]);
    expect(readFileSync(csv, "utf8")).toMatch(/warning sensitive-uncommon android\.permission\.READ_SMS: 18 of 2318 TOOLS apps request it/);
  });

  it("gates like check: --fail-on and --max-risk exit 1", async () => {
    const out = join(dir, "g.jsonl");
    expect((await cli(["sweep", LAMP, "-o", out, "--fail-on", "warning"])).code).toBe(EXIT.GATE);
    expect((await cli(["sweep", LAMP, "-o", out, "--max-risk", "0.5"])).code).toBe(EXIT.GATE);
    expect((await cli(["sweep", `${APK_DIR}tidewatch.apk`, "-o", out, "--fail-on", "error"])).code).toBe(EXIT.OK);
  });
});

describe("errors and small things", () => {
  it("refuses a FIFO instead of waiting on it", async () => {
    const fifo = join(dir, "pipe.apk");
    execFileSync("mkfifo", [fifo]);
    const r = await cli(["check", fifo]);
    expect(r.code).toBe(EXIT.INPUT);
    expect(r.stderr).toBe(`overask: ${fifo}: is not a regular file (a device, FIFO or socket); give an APK or manifest file\n`);
  });

  it("prints an unreadable input once, on stderr, and argument errors like every other error", async () => {
    const r = await cli(["check", join(dir, "nosuch.apk")]);
    expect(r.stderr.match(/nosuch\.apk/g)).toHaveLength(1);
    expect(r.stdout).not.toMatch(/nosuch/);
    const bad = await cli(["check", "--max-risk", "2", LAMP]);
    expect(bad.stderr).toMatch(/^overask: option '--max-risk <p>' argument '2' is invalid/);
  });

  it("refuses trim --write onto the source itself, and says when --in-place has nothing to change", async () => {
    const src = join(dir, "AndroidManifest.xml");
    copyFileSync(`${FIXTURES}apps/pocketlamp/AndroidManifest.xml`, src);
    const r = await cli(["trim", "-c", "TOOLS", "--write", src, src]);
    expect(r.code).toBe(EXIT.USAGE);
    expect(r.stderr).toMatch(/is the source manifest itself; to patch it in place say --in-place/);
    const clean = join(dir, "snapshare.xml");
    copyFileSync(`${FIXTURES}apps/snapshare/AndroidManifest.xml`, clean);
    const before = statSync(clean).mtimeMs;
    const same = await cli(["trim", "-c", "TOOLS", "--in-place", clean]);
    expect(same.stderr).toMatch(/nothing to change in .*snapshare\.xml; left it as it was/);
    expect(statSync(clean).mtimeMs).toBe(before);
  });

  it("gives removed permissions their protection level and restrictions in delta", async () => {
    const d = JSON.parse((await cli(["delta", "-f", "json", `${APK_DIR}tidewatch.apk`, `${APK_DIR}tidewatch-next.apk`])).stdout);
    expect(d.removed).toEqual([{ permission: "android.permission.WRITE_EXTERNAL_STORAGE", base: "dangerous", restricted: "soft" }]);
    expect(d.added.map((a: { permission: string }) => a.permission)).toEqual(["android.permission.ACCESS_BACKGROUND_LOCATION", "android.permission.READ_CONTACTS"]);
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
