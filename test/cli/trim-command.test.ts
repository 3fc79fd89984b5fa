import { execFileSync } from "node:child_process";
import { copyFileSync, mkdirSync, mkdtempSync, readFileSync, statSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { EXIT } from "../../src/cli/exit-codes.js";
import { cli } from "../helpers/cli.js";
import { APK_DIR, FIXTURES, ROOT } from "../helpers/paths.js";

const dir = mkdtempSync(join(tmpdir(), "overask-trim-command-"));
const LAMP = `${APK_DIR}pocketlamp.apk`;

describe("overask trim", () => {
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
});
