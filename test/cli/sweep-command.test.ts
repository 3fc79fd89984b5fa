import { execFileSync } from "node:child_process";
import { copyFileSync, mkdirSync, mkdtempSync, readFileSync, statSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { EXIT } from "../../src/cli/exit-codes.js";
import { cli } from "../helpers/cli.js";
import { APK_DIR, FIXTURES, ROOT } from "../helpers/paths.js";

const dir = mkdtempSync(join(tmpdir(), "overask-sweep-command-"));
const LAMP = `${APK_DIR}pocketlamp.apk`;

describe("overask sweep from the command line", () => {
  it("reports an index row's unknown category per app and counts it in the sweep summary", async () => {
    const index = join(dir, "index.csv");
    writeFileSync(index, `file,category\n${LAMP},Gardening\n${APK_DIR}tidewatch.apk,Tools\n`);
    const out = join(dir, "index.jsonl");
    const r = await cli(["sweep", index, "-o", out, "-j", "1"]);
    const rows = readFileSync(out, "utf8").trim().split("\n").map((l) => JSON.parse(l));
    expect(rows.find((x) => x.package === "org.example.pocketlamp").fallback).toBe("unknown-category");
    expect(r.stdout).toContain("1 app named a category the baseline does not have");
  });
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
    expect(JSON.parse(readFileSync(jsonl, "utf8")).findings.find((f: { checkId: string }) => f.checkId === "sensitive-uncommon").message).toMatch(/of 2318 TOOLS apps request it/);
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
