/**
 * One category resolver for every caller: `check -c`, `check --categories`, `check --records`, `sweep -c`,
 * a sweep index's category column, `trim -c` and `delta -c` all find a baseline category by alias and
 * without regard to case.
 */
import { mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { beforeAll, describe, expect, it } from "vitest";
import { baselineOf } from "../../src/baseline/baseline-file.js";
import { readManifestFile } from "../../src/ops/read-manifest.js";
import { learnFiles } from "../../src/ops/learn.js";
import { chooseCategory, parseCategoryIndex, resolveCategory } from "../../src/score/category.js";
import { cli } from "../helpers/cli.js";
import { APK_DIR, FIXTURES, ROOT } from "../helpers/paths.js";

const dir = mkdtempSync(join(tmpdir(), "overask-category-"));
const baselinePath = join(dir, "aliased.json");
// The demo corpus's categories are Communication, Education, Social, Tools, Weather; "Utilities" is an alias.
const SPELLINGS = ["Tools", "tools", "TOOLS", "Utilities", "utilities"];

beforeAll(async () => {
  await learnFiles({
    frequencies: [{ path: `${ROOT}fixtures/corpus/harbourview.jsonl`, options: { labelField: "none" } }],
    aliases: new Map([["Utilities", "Tools"]]),
    output: baselinePath,
  });
}, 60_000);

describe("resolveCategory", () => {
  it("finds a category by its name in any case, or by an alias in any case", async () => {
    const { readBaselineFile } = await import("../../src/ops/baseline.js");
    const baseline = baselineOf(readBaselineFile(baselinePath));
    for (const s of SPELLINGS) expect(resolveCategory(baseline, s)).toEqual({ category: "Tools" });
    expect(resolveCategory(baseline, "Weather").fallback).toBe("below-min-support");
    expect(resolveCategory(baseline, "Nothing").fallback).toBe("unknown-category");
    expect(resolveCategory(baseline, undefined).fallback).toBe("no-category");
  });

  it("takes the option first, then the index, then android:appCategory", async () => {
    const { readBaselineFile } = await import("../../src/ops/baseline.js");
    const baseline = baselineOf(readBaselineFile(baselinePath));
    const m = readManifestFile(`${APK_DIR}flashdeck.apk`); // android:appCategory="productivity"
    expect(chooseCategory(m, baseline, {})).toMatchObject({ source: "appCategory", category: "Tools" }); // productivity → tools (APP_CATEGORY_MATCHES)
    expect(chooseCategory(m, baseline, { index: new Map([[m.package, "social"]]) })).toMatchObject({ source: "index", category: "Social" });
    expect(chooseCategory(m, baseline, { category: "education", index: new Map([[m.package, "social"]]) })).toMatchObject({ source: "option", category: "Education" });
  });
});

describe("parseCategoryIndex", () => {
  it("reads package,category rows with an optional header and quoted fields", () => {
    expect([...parseCategoryIndex('package,category\norg.example.a,Tools\n"org.example.b","Social, media"\n', "map.csv")]).toEqual([
      ["org.example.a", "Tools"],
      ["org.example.b", "Social, media"],
    ]);
  });

  it("names the file and line of a row without a category", () => {
    expect(() => parseCategoryIndex("org.example.a\n", "map.csv")).toThrow(/line 1: expected package,category/);
  });
});

describe("every caller resolves the same way", () => {
  const lamp = `${APK_DIR}pocketlamp.apk`;

  for (const spelling of SPELLINGS) {
    it(`check -c ${spelling}`, async () => {
      const r = await cli(["check", "-b", baselinePath, "-c", spelling, "-f", "json", lamp]);
      expect(JSON.parse(r.stdout).results[0].category.category).toBe("Tools");
    });

    it(`check --categories with ${spelling}`, async () => {
      const map = join(dir, `map-${spelling}.csv`);
      writeFileSync(map, `package,category\norg.example.pocketlamp,${spelling}\n`);
      const r = await cli(["check", "-b", baselinePath, "--categories", map, "-f", "json", lamp]);
      expect(JSON.parse(r.stdout).results[0].category.category).toBe("Tools");
    });

    it(`check --records with a record in ${spelling}`, async () => {
      const records = join(dir, `records-${spelling}.jsonl`);
      writeFileSync(records, `${JSON.stringify({ id: "org.example.lamp", category: spelling, permissions: ["android.permission.CAMERA"] })}\n`);
      const r = await cli(["check", "-b", baselinePath, "--records", records]);
      expect(JSON.parse(r.stdout).category).toBe("Tools");
    });

    it(`sweep -c ${spelling} and a sweep index saying ${spelling}`, async () => {
      const out = join(dir, `sweep-${spelling}.jsonl`);
      await cli(["sweep", `${APK_DIR}pocketlamp.apk`.replace(/pocketlamp\.apk$/, ""), "-b", baselinePath, "-c", spelling, "-o", out, "-j", "1"]);
      const rows = readFileSync(out, "utf8").trim().split("\n").map((l) => JSON.parse(l));
      expect(rows.filter((r) => r.status === "scored").every((r) => r.category === "Tools")).toBe(true);
      const index = join(dir, `index-${spelling}.csv`);
      writeFileSync(index, `file,category\n${lamp},${spelling}\n`);
      const out2 = join(dir, `sweep-index-${spelling}.jsonl`);
      await cli(["sweep", index, "-b", baselinePath, "-o", out2, "-j", "1"]);
      expect(JSON.parse(readFileSync(out2, "utf8").trim()).category).toBe("Tools");
    });

    it(`trim -c ${spelling} and delta -c ${spelling}`, async () => {
      const t = await cli(["trim", "-b", baselinePath, "-c", spelling, "-f", "json", `${FIXTURES}apps/pocketlamp/AndroidManifest.xml`]);
      expect(t.code).toBe(0);
      const viaName = await cli(["trim", "-b", baselinePath, "-c", "Tools", "-f", "json", `${FIXTURES}apps/pocketlamp/AndroidManifest.xml`]);
      expect(JSON.parse(t.stdout)).toEqual(JSON.parse(viaName.stdout));
      const d = await cli(["delta", "-b", baselinePath, "-c", spelling, "-f", "json", `${APK_DIR}tidewatch.apk`, lamp]);
      const dv = await cli(["delta", "-b", baselinePath, "-c", "Tools", "-f", "json", `${APK_DIR}tidewatch.apk`, lamp]);
      expect(JSON.parse(d.stdout)).toEqual(JSON.parse(dv.stdout));
      expect(d.stdout).toContain("newlyUncommon");
    });
  }
});
