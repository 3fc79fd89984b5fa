import { execFileSync } from "node:child_process";
import { copyFileSync, mkdirSync, mkdtempSync, readFileSync, statSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { EXIT } from "../../src/cli/exit-codes.js";
import { cli } from "../helpers/cli.js";
import { APK_DIR, FIXTURES, ROOT } from "../helpers/paths.js";

const dir = mkdtempSync(join(tmpdir(), "overask-finding-text-"));
const LAMP = `${APK_DIR}pocketlamp.apk`;

describe("the finding layout of check, trim and delta", () => {
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
