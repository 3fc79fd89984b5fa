import { execFileSync } from "node:child_process";
import { copyFileSync, mkdirSync, mkdtempSync, readFileSync, statSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { EXIT } from "../../src/cli/exit-codes.js";
import { cli } from "../helpers/cli.js";
import { APK_DIR, FIXTURES, ROOT } from "../helpers/paths.js";

const dir = mkdtempSync(join(tmpdir(), "overask-delta-command-"));
const LAMP = `${APK_DIR}pocketlamp.apk`;

describe("overask delta", () => {
  it("gives removed permissions their protection level and restrictions in delta", async () => {
    const d = JSON.parse((await cli(["delta", "-f", "json", `${APK_DIR}tidewatch.apk`, `${APK_DIR}tidewatch-next.apk`])).stdout);
    expect(d.removed).toEqual([{ permission: "android.permission.WRITE_EXTERNAL_STORAGE", base: "dangerous", restricted: "soft" }]);
    expect(d.added.map((a: { permission: string }) => a.permission)).toEqual(["android.permission.ACCESS_BACKGROUND_LOCATION", "android.permission.READ_CONTACTS"]);
  });
});
