import { mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { createRequire } from "node:module";
import { describe, expect, it } from "vitest";
import { EXIT } from "../../src/cli/exit-codes.js";
import { manifestText } from "../helpers/judge.js";
import { APK_DIR, FIXTURES, ROOT } from "../helpers/paths.js";
import { cli } from "../helpers/cli.js";

// ajv-draft-04 is CommonJS with a default export; require it to get the class itself.
type Validator = ((data: unknown) => boolean) & { errors?: unknown[] | null };
const Ajv = (createRequire(import.meta.url)("ajv-draft-04") as { default: new (opts: { allErrors: boolean; strict: boolean }) => { compile(schema: object): Validator } }).default;
const dir = mkdtempSync(join(tmpdir(), "overask-check-"));
const DEMO = `${ROOT}baselines/harbourview-demo.json`;

describe("overask check", () => {
  it("prints a readable report for the over-asking demo app (snapshot)", async () => {
    const { code, stdout } = await cli(["check", "fixtures/apk/pocketlamp.apk", "--category", "TOOLS"].map((a) => (a.startsWith("fixtures/") ? `${ROOT}${a}` : a)));
    expect(code).toBe(EXIT.OK);
    const text = stdout.replaceAll(ROOT, "");
    await expect(text).toMatchFileSnapshot(`${ROOT}test/cli/__snapshots__/check-pocketlamp.txt`);
    for (const line of stdout.split("\n")) expect([...line.replaceAll(ROOT, "")].length, line).toBeLessThanOrEqual(80);
    expect(text).toMatch(/not evidence of intent or harm/);
  });

  it("writes SARIF 2.1.0 that validates against the OASIS schema", async () => {
    // Schema: fixtures/sarif/sarif-schema-2.1.0.json, the OASIS SARIF 2.1.0 (errata 01) JSON schema.
    const schema = JSON.parse(readFileSync(`${FIXTURES}sarif/sarif-schema-2.1.0.json`, "utf8"));
    const validate = new Ajv({ allErrors: true, strict: false }).compile(schema);
    const plain = `${FIXTURES}apps/pocketlamp/AndroidManifest.xml`;
    const { stdout } = await cli(["check", "--format", "sarif", "-b", DEMO, plain, `${APK_DIR}pocketlamp.apk`]);
    const log = JSON.parse(stdout);
    expect(validate(log), JSON.stringify(validate.errors?.slice(0, 3))).toBe(true);
    const run = log.runs[0];
    expect(run.tool.driver.rules.map((r: { id: string }) => r.id)).toContain("exported-unguarded");
    const fromPlain = run.results.find((r: { locations: { physicalLocation: { artifactLocation: { uri: string } } }[] }) => r.locations[0].physicalLocation.artifactLocation.uri.endsWith(".xml"));
    expect(fromPlain.locations[0].physicalLocation.region.startLine).toBeGreaterThan(1);
    const fromApk = run.results.find((r: { locations: { physicalLocation: { artifactLocation: { uri: string } } }[] }) => r.locations[0].physicalLocation.artifactLocation.uri.endsWith(".apk"));
    expect(fromApk.locations[0].physicalLocation.region).toBeUndefined();
    expect(fromApk.locations[0].logicalLocations[0].fullyQualifiedName).toMatch(/^\/manifest\//);
  });

  it("writes SARIF with an empty results list when nothing is found", async () => {
    const clean = join(dir, "clean.xml");
    writeFileSync(clean, manifestText({ permissions: ["INTERNET"], pkg: "org.example.clean" }));
    const log = JSON.parse((await cli(["check", "--format", "sarif", "-b", DEMO, "-c", "Tools", clean])).stdout);
    expect(log.runs[0].results).toEqual([]);
  });

  it("gates a build: exit 1 at or above --fail-on, or above --max-risk", async () => {
    const apk = `${APK_DIR}pocketlamp.apk`;
    expect((await cli(["check", "-b", DEMO, apk])).code).toBe(EXIT.OK);
    expect((await cli(["check", "-b", DEMO, "--fail-on", "warning", apk])).code).toBe(EXIT.GATE);
    expect((await cli(["check", "-b", DEMO, "--fail-on", "error", apk])).code).toBe(EXIT.OK);
    expect((await cli(["check", "-b", DEMO, "--level", "unknown-permission=error", "--fail-on", "error", apk])).code).toBe(EXIT.GATE);
    expect((await cli(["check", "-b", DEMO, "--max-risk", "0.5", apk])).code).toBe(EXIT.GATE);
    expect((await cli(["check", "-b", DEMO, "--max-risk", "1", apk])).code).toBe(EXIT.OK);
    expect((await cli(["check", "-b", DEMO, "--max-risk", "2", apk])).code).toBe(EXIT.USAGE);
    expect((await cli(["check", "-b", DEMO, "--level", "nope=error", apk])).code).toBe(EXIT.USAGE);
  });

  it("keeps input errors apart from gates", async () => {
    const { code, stdout } = await cli(["check", "-b", DEMO, "--format", "json", join(dir, "missing.apk"), `${APK_DIR}tidewatch.apk`]);
    expect(code).toBe(EXIT.INPUT);
    const doc = JSON.parse(stdout);
    expect(doc.results[0].error.message).toBe("no such file");
    expect(doc.results[1].package).toBe("org.example.tidewatch");
  });

  it("never reports a higher risk after removing a requested permission (through the CLI)", async () => {
    const permissions = ["INTERNET", "CAMERA", "READ_SMS", "SEND_SMS", "READ_CONTACTS", "ACCESS_FINE_LOCATION", "SYSTEM_ALERT_WINDOW", "FLASHLIGHT"];
    const riskOf = async (perms: string[]) => {
      const p = join(dir, `m${perms.length}-${perms.join("").length}.xml`);
      writeFileSync(p, manifestText({ permissions: perms }));
      return JSON.parse((await cli(["check", "--format", "json", "-b", DEMO, "-c", "Tools", p])).stdout).results[0].risk.probability as number;
    };
    const full = await riskOf(permissions);
    for (const p of permissions) expect(await riskOf(permissions.filter((q) => q !== p))).toBeLessThanOrEqual(full);
  });

  it("takes the category from --categories, then android:appCategory, else says the pool is used", async () => {
    const index = join(dir, "categories.csv");
    writeFileSync(index, "package,category\norg.example.tidewatch,Tools\n");
    const json = async (args: string[]) => JSON.parse((await cli(["check", "--format", "json", "-b", DEMO, ...args])).stdout).results[0].category;
    expect(await json(["--categories", index, `${APK_DIR}tidewatch.apk`])).toEqual({ source: "index", requested: "Tools", category: "Tools" });
    // flashdeck declares android:appCategory="productivity"; the demo baseline maps it to Tools.
    expect(await json([`${APK_DIR}flashdeck.apk`])).toEqual({ source: "appCategory", requested: "Tools", category: "Tools" });
    expect(await json([`${APK_DIR}chirpchat.apk`])).toEqual({ source: "none", fallback: "no-category" });
    const { stdout } = await cli(["check", "-b", DEMO, `${APK_DIR}chirpchat.apk`]);
    expect(stdout).toMatch(/category\s+all categories pooled: no category given or declared/);
  });

  it("scores pre-extracted records, one JSON line each", async () => {
    const { code, stdout } = await cli(["check", "-b", DEMO, "--records", `${FIXTURES}corpus/harbourview.jsonl`]);
    expect(code).toBe(EXIT.OK);
    const lines = stdout.trim().split("\n").map((l) => JSON.parse(l));
    expect(lines).toHaveLength(1500);
    expect(lines[0]).toMatchObject({ id: "org.example.lanternreef0", category: "Tools", band: expect.stringMatching(/^(low|elevated|high)$/) });
    expect(typeof lines[0].risk).toBe("number");
  });
});
