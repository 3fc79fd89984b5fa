import { existsSync, mkdirSync, mkdtempSync, readFileSync, readdirSync, writeFileSync, chmodSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { EXIT } from "../../src/cli/exit-codes.js";
import { ROOT } from "../helpers/paths.js";
import { cli } from "../helpers/cli.js";

const CORPUS = `${ROOT}fixtures/corpus/harbourview.jsonl`;
const dir = mkdtempSync(join(tmpdir(), "overask-cli-learn-"));

describe("overask learn", () => {
  it("writes a baseline and prints a summary with the model against the reference scores", async () => {
    const out = join(dir, "demo.json");
    const { code, stdout, stderr } = await cli(["learn", CORPUS, "--label-field", "flagged", "--positive", "yes", "-o", out]);
    expect(stderr).toBe("");
    expect(code).toBe(EXIT.OK);
    expect(JSON.parse(readFileSync(out, "utf8")).format).toBe("overask-baseline");
    expect(stdout).toMatch(/this model\s+0\.\d{3}\s+0\.\d{4}/);
    expect(stdout).toMatch(/number of dangerous permissions\s+0\.\d{3}/);
    expect(stdout).toMatch(/Weather\s+22 apps\s+below 30: uses the pooled baseline/);
    expect(stdout).toMatch(/not evidence of intent or harm/);
    for (const line of stdout.split("\n")) expect(line.length, line).toBeLessThanOrEqual(80);
  });

  it("lists every rejected row with --rejects and fails over the reject limit", async () => {
    const bad = join(dir, "bad.jsonl");
    const lines = readFileSync(CORPUS, "utf8").trim().split("\n").slice(0, 40);
    writeFileSync(bad, `${lines.join("\n")}\n{broken\n{"id":"q","permissions":[]}\n{"id":"r","category":"Tools"}\n`);
    const rejects = join(dir, "rejects.csv");
    const out = join(dir, "never.json");
    const { code, stderr } = await cli(["learn", bad, "--rejects", rejects, "-o", out]);
    expect(code).toBe(EXIT.INPUT);
    expect(stderr).toMatch(new RegExp(`^overask: ${bad}: 3 of 43 rows rejected \\(7\\.0%\\), over the limit of 5\\.0%; first at line 41`));
    expect(readFileSync(rejects, "utf8").trim().split("\n")).toEqual([
      "file,line,reason",
      expect.stringMatching(new RegExp(`^${bad},41,"?not valid JSON`)),
      `${bad},42,no category`,
      `${bad},43,"field ""permissions"" is not a list of permission names"`,
    ]);
    expect(existsSync(out)).toBe(false);
  });

  it("rejects malformed options with the usage code", async () => {
    expect((await cli(["learn", CORPUS, "--confidence", "1.5", "-o", join(dir, "x.json")])).code).toBe(EXIT.USAGE);
    expect((await cli(["learn", CORPUS, "--alias", "nonsense", "-o", join(dir, "x.json")])).code).toBe(EXIT.USAGE);
    expect((await cli(["learn", CORPUS])).code).toBe(EXIT.USAGE); // -o is required
  });

  it("keeps the old baseline when the new one cannot be written", async () => {
    const ro = join(dir, "readonly");
    mkdirSync(ro);
    const out = join(ro, "b.json");
    writeFileSync(out, "old");
    chmodSync(ro, 0o500);
    try {
      const { code, stderr } = await cli(["learn", CORPUS, "--label-field", "none", "-o", out]);
      if (process.getuid?.() === 0) {
        // root ignores folder permissions; the write then succeeds, which is all this case can show
        expect(code).toBe(EXIT.OK);
      } else {
        expect(code).toBe(EXIT.OUTPUT);
        expect(stderr).toMatch(/cannot be written: the folder is not writable/);
        expect(readFileSync(out, "utf8")).toBe("old");
      }
      expect(readdirSync(ro).filter((f) => f.endsWith(".tmp"))).toEqual([]);
    } finally {
      chmodSync(ro, 0o700);
    }
  });

  it("fails with the output code when the folder does not exist", async () => {
    const { code, stderr } = await cli(["learn", CORPUS, "--label-field", "none", "-o", join(dir, "no/such/dir/b.json")]);
    expect(code).toBe(EXIT.OUTPUT);
    expect(stderr).toMatch(/cannot be written: the folder does not exist/);
  });
});

describe("overask fold", () => {
  it("adds up baselines and notes that models do not merge", async () => {
    // Two halves of the demo corpus, one learned with its labels (a model), one without.
    const lines = readFileSync(CORPUS, "utf8").trim().split("\n");
    const halves = [lines.filter((_, i) => i % 2 === 0), lines.filter((_, i) => i % 2 === 1)].map((h, i) => {
      const path = join(dir, `half${i}.jsonl`);
      writeFileSync(path, `${h.join("\n")}\n`);
      return path;
    });
    const a = join(dir, "fa.json");
    const b = join(dir, "fb.json");
    await cli(["learn", halves[0], "--label-field", "flagged", "--positive", "yes", "-o", a]);
    await cli(["learn", halves[1], "--label-field", "none", "-o", b]);
    const out = join(dir, "folded.json");
    const { code, stdout, stderr } = await cli(["fold", a, b, "-o", out]);
    expect(code).toBe(EXIT.OK);
    expect(stdout).toMatch(new RegExp(`Folded 2 baselines into .*: ${lines.length} apps in 5 categories`));
    expect(stderr).toMatch(/models do not merge/);
    expect(JSON.parse(readFileSync(out, "utf8")).counts.pooled.apps).toBe(lines.length);
  });

  it("refuses the same baseline twice, which would count every app twice", async () => {
    const a = join(dir, "same.json");
    await cli(["learn", CORPUS, "--label-field", "none", "-o", a]);
    const { code, stderr } = await cli(["fold", a, a, "-o", join(dir, "twice.json")]);
    expect(code).toBe(EXIT.INPUT);
    expect(stderr).toMatch(/holds the same counts as .*same\.json .*count every app twice; give each baseline once/);
  });

  it("matches categories without regard to case, and folds at the older era", async () => {
    // The demo baseline (categories like TOOLS, era of its own corpus) and the bundled default (API 29).
    const out = join(dir, "mixed.json");
    const { code, stderr } = await cli(["fold", `${ROOT}baselines/harbourview-demo.json`, `${ROOT}baselines/default.json`, "-o", out]);
    expect(code, stderr).toBe(EXIT.OK);
    const folded = JSON.parse(readFileSync(out, "utf8"));
    // The demo baseline spells Tools, the bundled one TOOLS (2,318 apps, the larger part): one category.
    expect(Object.keys(folded.counts.categories).sort()).toEqual(["COMMUNICATION", "EDUCATION", "SOCIAL", "TOOLS", "Weather"]);
    expect(folded.provenance.notes.join(" ")).toMatch(/categories TOOLS, Tools folded as one, TOOLS/);
    // Eras: the demo's API 33, the bundled API 29 (their files' `era`): the folded one speaks for API 29.
    expect(folded.era.api).toBe(29);
    // So a well-behaved modern app (fixtures/apk/snapshare.apk) gets no warning against it.
    const r = await cli(["check", "-b", out, "-c", "tools", "--fail-on", "warning", "-f", "json", `${ROOT}fixtures/apk/snapshare.apk`]);
    expect(JSON.parse(r.stdout).results[0].findings.filter((f: { level: string }) => f.level !== "note")).toEqual([]);
    expect(r.code).toBe(EXIT.OK);
  });

  it("refuses a file that is not a baseline", async () => {
    const { code, stderr } = await cli(["fold", CORPUS, "-o", join(dir, "x.json")]);
    expect(code).toBe(EXIT.INPUT);
    expect(stderr).toMatch(/is not JSON|is not an overask baseline/);
  });
});

describe("learn: the model's bad inputs", () => {
  it("refuses labels that are all of one class, naming the corpus (exit 3)", async () => {
    const { mkdtempSync, writeFileSync } = await import("node:fs");
    const { tmpdir } = await import("node:os");
    const { join } = await import("node:path");
    const dir = mkdtempSync(join(tmpdir(), "overask-oneclass-"));
    const p = join(dir, "c.jsonl");
    writeFileSync(p, Array.from({ length: 40 }, (_, i) => JSON.stringify({ id: `a${i}`, category: "Tools", permissions: ["android.permission.CAMERA"], label: 1 })).join("\n") + "\n");
    const r = await cli(["learn", p, "-o", join(dir, "b.json")]);
    expect(r.code).toBe(3);
    expect(r.stderr).toMatch(/c\.jsonl: the labeled rows are all flagged/);
  });

  it("refuses a validation corpus that records none of the model's permissions", async () => {
    const { mkdtempSync, writeFileSync } = await import("node:fs");
    const { tmpdir } = await import("node:os");
    const { join } = await import("node:path");
    const dir = mkdtempSync(join(tmpdir(), "overask-noverlap-"));
    const v = join(dir, "v.csv");
    writeFileSync(v, "BODY_SENSORS,label\n1,1\n0,0\n");
    const r = await cli(["learn", `${ROOT}fixtures/corpus/harbourview.jsonl`, "--label-field", "flagged", "--positive", "yes", "--validate", v, "--validate-label-field", "label", "--validate-positive", "1", "-o", join(dir, "b.json")]);
    expect(r.code).toBe(3);
    expect(r.stderr).toMatch(/v\.csv: records none of the labeled corpus's permissions/);
  });

  it("refuses a prevalence outside (0, 1) (exit 2)", async () => {
    const r = await cli(["check", "--prevalence", "1", `${ROOT}fixtures/apk/pocketlamp.apk`]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/--prevalence <share>.*It must be between 0 and 1/);
  });
});
