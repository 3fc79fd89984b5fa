import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { EXIT } from "../../src/cli/exit-codes.js";
import { cli } from "../helpers/cli.js";
import { manifestText } from "../helpers/judge.js";
import { ROOT } from "../helpers/paths.js";

const dir = mkdtempSync(join(tmpdir(), "overask-delta-"));
const DEMO = `${ROOT}baselines/harbourview-demo.json`;

function write(name: string, text: string): string {
  const p = join(dir, name);
  writeFileSync(p, text);
  return p;
}

describe("overask delta", () => {
  const before = write("v1.xml", manifestText({ permissions: ["INTERNET", "ACCESS_COARSE_LOCATION", "VIBRATE"] }));
  const after = write(
    "v2.xml",
    manifestText({
      permissions: ["INTERNET", "ACCESS_COARSE_LOCATION", "BODY_SENSORS", "READ_CALENDAR"],
      app: `<service android:name=".Helper" android:exported="true" android:permission="android.permission.BIND_ACCESSIBILITY_SERVICE" />
    <receiver android:name=".Ping" android:exported="true" />`,
    }),
  );

  it("shows permissions added and removed, newly uncommon ones, special access and the risk before → after", async () => {
    const { code, stdout } = await cli(["delta", "--format", "json", "-b", DEMO, "-c", "Education", before, after]);
    expect(code).toBe(EXIT.OK);
    const d = JSON.parse(stdout);
    expect(d.added.map((a: { permission: string }) => a.permission)).toEqual(["android.permission.BODY_SENSORS", "android.permission.READ_CALENDAR"]);
    expect(d.removed).toEqual([{ permission: "android.permission.VIBRATE", base: "normal", flags: ["instant"] }]); // platform table: VIBRATE is normal|instant
    expect(d.newlyUncommon.map((f: { subject: string }) => f.subject).sort()).toEqual(["android.permission.BODY_SENSORS", "android.permission.READ_CALENDAR"]);
    expect(d.specialAccess.added.map((f: { subject: string }) => f.subject)).toEqual(["org.example.case.Helper"]);
    expect(d.newlyExported.map((c: { name: string }) => c.name)).toEqual(["org.example.case.Helper", "org.example.case.Ping"]);
    expect(d.after.risk).toBeGreaterThan(d.before.risk);
    expect(d.caution).toMatch(/not evidence of intent or harm/);
  });

  it("prints the same as text for a person", async () => {
    const { stdout } = await cli(["delta", "-b", DEMO, "-c", "Education", before, after]);
    expect(stdout).toMatch(/^org\.example\.case: no version → no version/);
    expect(stdout).toMatch(/risk \d+(\.\d)?% \(\w+\) → \d+(\.\d)?% \(\w+\)/);
    expect(stdout).toMatch(/Permissions added \(2\)\n  \+ BODY_SENSORS/);
    expect(stdout).toMatch(/Special access \(1 new, 0 gone\)/);
  });
});
