import { execFileSync } from "node:child_process";
import { copyFileSync, mkdirSync, mkdtempSync, readFileSync, statSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { EXIT } from "../../src/cli/exit-codes.js";
import { cli } from "../helpers/cli.js";
import { APK_DIR, FIXTURES, ROOT } from "../helpers/paths.js";

const dir = mkdtempSync(join(tmpdir(), "overask-read-manifest-"));
const LAMP = `${APK_DIR}pocketlamp.apk`;

describe("reading a file from disk", () => {
  it("refuses a FIFO instead of waiting on it", async () => {
    const fifo = join(dir, "pipe.apk");
    execFileSync("mkfifo", [fifo]);
    const r = await cli(["check", fifo]);
    expect(r.code).toBe(EXIT.INPUT);
    expect(r.stderr).toBe(`overask: ${fifo}: is not a regular file (a device, FIFO or socket); give an APK or manifest file\n`);
  });
});
