import { execFileSync } from "node:child_process";
import { copyFileSync, mkdirSync, mkdtempSync, readFileSync, statSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { EXIT } from "../../src/cli/exit-codes.js";
import { cli } from "../helpers/cli.js";
import { APK_DIR, FIXTURES, ROOT } from "../helpers/paths.js";

const dir = mkdtempSync(join(tmpdir(), "overask-facts-"));
const LAMP = `${APK_DIR}pocketlamp.apk`;

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
