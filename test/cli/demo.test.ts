/**
 * `npm run demo` prints exactly what it printed before the code was restructured: the committed snapshot
 * was taken from the demo before the move to the ops layer, and a change to it must be deliberate
 * (update the snapshot in the same commit and say why). Changes so far: the platform-facts work added the
 * debuggable and special-access findings the demo app earns (android:debuggable="true", SYSTEM_ALERT_WINDOW)
 * and corrected the wording of role permissions; trim says why --write leaves likely typos alone.
 */
import { execFileSync } from "node:child_process";
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { ROOT } from "../helpers/paths.js";

describe("npm run demo", () => {
  it("prints the committed snapshot byte for byte", () => {
    const out = execFileSync(process.execPath, [`${ROOT}scripts/demo.mjs`], { encoding: "utf8", env: { ...process.env, NO_COLOR: "1" } });
    expect(out).toBe(readFileSync(`${ROOT}test/cli/__snapshots__/demo.txt`, "utf8"));
  });
});
