import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { run } from "../../src/cli/main.js";
import { EXIT } from "../../src/cli/exit-codes.js";
import { APK_DIR, APK_VARIANTS, FIXTURES } from "../helpers/paths.js";

import { cli } from "../helpers/cli.js";

const dir = mkdtempSync(join(tmpdir(), "overask-cli-"));

describe("overask facts", () => {
  it("prints a summary that fits an 80-column terminal for every fixture", async () => {
    const files = APK_VARIANTS.map((v) => `${APK_DIR}${v}.apk`);
    const { code, stdout, stderr } = await cli(["facts", ...files]);
    expect(stderr).toBe("");
    expect(code).toBe(EXIT.OK);
    for (const line of stdout.split("\n")) expect([...line].length, line).toBeLessThanOrEqual(80);
  });

  it("shows what a reviewer looks for in the over-asking demo app", async () => {
    const { stdout } = await cli(["facts", `${APK_DIR}pocketlamp.apk`]);
    expect(stdout).toContain("org.example.pocketlamp  “Pocket Lamp”");
    expect(stdout).toMatch(/app flags\s+debuggable, cleartext traffic allowed/);
    expect(stdout).toMatch(/Runtime: the user is asked when the app uses it \(7\)\n(.*\n)*? {4}READ_SMS\s+hard-restricted/);
    expect(stdout).toMatch(/Not defined by the platform \(2\)\n {4}ACCESS_FINE_LOCATON\s+an android\.permission name the platform/);
    expect(stdout).toMatch(/receiver\s+org\.example\.pocketlamp\.BootReceiver\n\s+exported by default \(intent filter, targetSdk < 31\)\n\s+no permission required/);
    expect(stdout).not.toMatch(/\u001b\[/); // no colour when not a terminal
  });

  it("uses colour on a terminal, and never with NO_COLOR", async () => {
    const tty = async (env: NodeJS.ProcessEnv) => {
      let out = "";
      await run(["facts", `${APK_DIR}pocketlamp.apk`], { stdout: { write: (s: string) => (out += s), isTTY: true }, stderr: { write: () => true }, env });
      return out;
    };
    expect(await tty({})).toMatch(/\u001b\[/);
    expect(await tty({ NO_COLOR: "1" })).not.toMatch(/\u001b\[/);
  });

  it("writes the full model as JSON, with a schema version", async () => {
    const { code, stdout } = await cli(["facts", "--format", "json", `${APK_DIR}chirpchat.apk`]);
    expect(code).toBe(EXIT.OK);
    const doc = JSON.parse(stdout);
    expect(doc).toMatchObject({ tool: "overask", schemaVersion: 1 });
    expect(doc.results[0].manifest.package).toBe("org.example.chirpchat");
    expect(doc.results[0].manifest.usesPermissions).toHaveLength(9);
  });

  it("reports a bad file on one line, keeps the others, and exits with the input code", async () => {
    const bad = join(dir, "broken.apk");
    writeFileSync(bad, "PK\u0003\u0004 this is not really a zip");
    const { code, stdout, stderr } = await cli(["facts", "--format", "json", bad, `${FIXTURES}apps/tidewatch/AndroidManifest.xml`]);
    expect(code).toBe(EXIT.INPUT);
    expect(stderr.trim().split("\n")).toEqual([`overask: ${bad}: no end of central directory record (not a zip archive, or truncated)`]);
    const doc = JSON.parse(stdout);
    expect(doc.results[0]).toMatchObject({ file: bad, error: { kind: "ArchiveError" } });
    expect(doc.results[1].manifest.package).toBe("org.example.tidewatch");
  });

  it("names missing files and unrecognised content", async () => {
    const text = join(dir, "notes.txt");
    writeFileSync(text, "hello");
    const { code, stderr } = await cli(["facts", join(dir, "missing.apk"), text]);
    expect(code).toBe(EXIT.INPUT);
    expect(stderr).toContain(`${join(dir, "missing.apk")}: no such file`);
    expect(stderr).toContain(`${text}: is not an APK, a binary AndroidManifest.xml or an XML manifest`);
  });

  it("prints a stack trace only with --debug", async () => {
    const missing = join(dir, "missing.apk");
    expect((await cli(["facts", missing])).stderr).not.toMatch(/\n\s+at /);
    expect((await cli(["--debug", "facts", missing])).stderr).toMatch(/\n\s+at /);
  });

  it("exits with the usage code on a wrong command line", async () => {
    expect((await cli(["facts", "--format", "yaml", "x"])).code).toBe(EXIT.USAGE);
    expect((await cli(["facts"])).code).toBe(EXIT.USAGE);
    expect((await cli(["no-such-command"])).code).toBe(EXIT.USAGE);
    expect((await cli(["--help"])).code).toBe(EXIT.OK);
  });
});
