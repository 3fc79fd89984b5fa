import { execFileSync } from "node:child_process";
import { copyFileSync, mkdirSync, mkdtempSync, readFileSync, statSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { EXIT } from "../../src/cli/exit-codes.js";
import { cli } from "../helpers/cli.js";
import { APK_DIR, FIXTURES, ROOT } from "../helpers/paths.js";

const dir = mkdtempSync(join(tmpdir(), "overask-judging-"));
const LAMP = `${APK_DIR}pocketlamp.apk`;

describe("judging options", () => {
  it("refuses a category the baseline does not have, suggesting the nearest and listing them (exit 2)", async () => {
    const r = await cli(["check", "-c", "TOLS", LAMP]);
    expect(r.code).toBe(EXIT.USAGE);
    expect(r.stderr).toMatch(/^overask: --category "TOLS" is not a category of the baseline; did you mean "TOOLS"\?; its categories: COMMUNICATION \(625 apps\), EDUCATION/);
    expect(r.stdout).toBe("");
    for (const cmd of [["trim", `${FIXTURES}apps/pocketlamp/AndroidManifest.xml`], ["delta", LAMP, LAMP], ["sweep", LAMP, "-o", join(dir, "x.jsonl")]]) {
      expect((await cli([...cmd, "-c", "NOSUCHCAT"])).code).toBe(EXIT.USAGE);
    }
  });
});

describe("a huge option value", () => {
  it("is cut in the one-line error, not echoed in full", async () => {
    const { cli } = await import("../helpers/cli.js");
    const r = await cli(["check", "-c", "X".repeat(100_000), `${APK_DIR}tidewatch.apk`]);
    expect(r.stderr.split("\n").filter(Boolean)).toHaveLength(1);
    expect(r.stderr.length).toBeLessThan(600);
    expect(r.stderr).toMatch(/^overask: --category "X{57}…" is not a category of the baseline; its categories: /);
  });
});
