import { execFileSync } from "node:child_process";
import { copyFileSync, mkdirSync, mkdtempSync, readFileSync, statSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { EXIT } from "../../src/cli/exit-codes.js";
import { cli } from "../helpers/cli.js";
import { APK_DIR, FIXTURES, ROOT } from "../helpers/paths.js";

const dir = mkdtempSync(join(tmpdir(), "overask-main-"));
const LAMP = `${APK_DIR}pocketlamp.apk`;

describe("the overask command", () => {
  it("prints an unreadable input once, on stderr, and argument errors like every other error", async () => {
    const r = await cli(["check", join(dir, "nosuch.apk")]);
    expect(r.stderr.match(/nosuch\.apk/g)).toHaveLength(1);
    expect(r.stdout).not.toMatch(/nosuch/);
    const bad = await cli(["check", "--max-risk", "2", LAMP]);
    expect(bad.stderr).toMatch(/^overask: option '--max-risk <p>' argument '2' is invalid/);
  });
});
