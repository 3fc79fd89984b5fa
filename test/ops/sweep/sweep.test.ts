import { spawn } from "node:child_process";
import { copyFileSync, mkdirSync, mkdtempSync, readFileSync, readdirSync, statSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { EXIT } from "../../../src/cli/exit-codes.js";
import { cli } from "../../helpers/cli.js";
import { APK_DIR, FIXTURES, ROOT } from "../../helpers/paths.js";

const DEMO = `${ROOT}baselines/harbourview-demo.json`;
const base = mkdtempSync(join(tmpdir(), "overask-sweep-"));

/** A folder of `copies` × the fixture APKs (distinct names), one bundle, a note and a broken file. */
function inventory(name: string, copies = 1): string {
  const dir = join(base, name);
  mkdirSync(join(dir, "nested"), { recursive: true });
  const apks = readdirSync(APK_DIR).filter((f) => f.endsWith(".apk"));
  for (let c = 0; c < copies; c++) for (const f of apks) copyFileSync(join(APK_DIR, f), join(dir, c % 2 ? "nested" : "", `${c}-${f}`));
  copyFileSync(`${FIXTURES}bundle/tidewatch.aab`, join(dir, "nested", "tidewatch.aab"));
  writeFileSync(join(dir, "README.txt"), "not an app");
  writeFileSync(join(dir, "broken.apk"), "PK\u0003\u0004 cut short");
  return dir;
}

/** The ids in a results file, sorted: rows come in the order they finished, each with its stable id. */
const ids = (path: string) => readFileSync(path, "utf8").trim().split("\n").map((l) => JSON.parse(l).id as string).sort();
const sortedLines = (path: string) => readFileSync(path, "utf8").trim().split("\n").sort();

describe("overask sweep", () => {
  it("scores every app under a folder once, keeps bad files as rows, and exits with the input code", async () => {
    const dir = inventory("basic");
    const out = join(base, "basic.jsonl");
    const { code, stdout } = await cli(["sweep", dir, "-o", out, "-b", DEMO, "-j", "1"]);
    expect(code).toBe(EXIT.INPUT);
    const rows = readFileSync(out, "utf8").trim().split("\n").map((l) => JSON.parse(l));
    const apks = readdirSync(APK_DIR).filter((f) => f.endsWith(".apk")).length;
    expect(rows).toHaveLength(apks + 2); // the APKs, 1 bundle, 1 broken file; the README is not an app
    expect(new Set(rows.map((r) => r.id)).size).toBe(apks + 2);
    expect(rows.find((r) => r.id === "broken.apk")).toMatchObject({ status: "failed", error: { kind: "ArchiveError" } });
    expect(rows.find((r) => r.id === "nested/tidewatch.aab")).toMatchObject({ status: "scored", package: "org.example.tidewatch" });
    expect(stdout).toContain(`Swept ${apks + 2} inputs: ${apks + 1} scored, 1 could not be read.`);
    expect(stdout.replace(/\s+/g, " ")).toMatch(/not evidence of intent or harm/);
  });

  it("gives the same rows on every run, with one job or two", async () => {
    const dir = inventory("repeat", 3);
    const a = join(base, "a.jsonl");
    const b = join(base, "b.jsonl");
    await cli(["sweep", dir, "-o", a, "-b", DEMO, "-j", "1"]);
    await cli(["sweep", dir, "-o", b, "-b", DEMO, "-j", "2"]);
    expect(sortedLines(b)).toEqual(sortedLines(a));
  });

  it("reads a list of files and an index CSV with categories", async () => {
    const list = join(base, "list.txt");
    writeFileSync(list, `${APK_DIR}tidewatch.apk\n# a comment\n${APK_DIR}pocketlamp.apk\n`);
    const out1 = join(base, "list.jsonl");
    expect((await cli(["sweep", list, "-o", out1, "-b", DEMO, "-j", "1"])).code).toBe(EXIT.OK);
    expect(ids(out1)).toHaveLength(2);
    const index = join(base, "index.csv");
    writeFileSync(index, `file,category\n${APK_DIR}tidewatch.apk,Tools\n${APK_DIR}chirpchat.apk,Communication\n`);
    const out2 = join(base, "index.jsonl");
    await cli(["sweep", index, "-o", out2, "-b", DEMO, "-j", "1"]);
    const rows = readFileSync(out2, "utf8").trim().split("\n").map((l) => JSON.parse(l));
    expect(rows.map((r) => r.category).sort()).toEqual(["Communication", "Tools"]);
  });

  it("splits inputs into stable, disjoint shards that together cover all", async () => {
    const dir = inventory("shards", 4);
    const all = join(base, "all.jsonl");
    await cli(["sweep", dir, "-o", all, "-b", DEMO, "-j", "1"]);
    const parts: string[][] = [];
    for (const i of [1, 2, 3]) {
      const out = join(base, `shard${i}.jsonl`);
      await cli(["sweep", dir, "-o", out, "-b", DEMO, "-j", "1", "--shard", `${i}/3`]);
      parts.push(ids(out));
    }
    expect(parts.flat().sort()).toEqual(ids(all));
    expect(parts.every((p) => p.length > 0)).toBe(true);
    expect((await cli(["sweep", dir, "-o", all, "--shard", "4/3"])).code).toBe(EXIT.USAGE);
  });

  it("resumes after an interruption that left a torn last line, keeping finished rows", async () => {
    const dir = inventory("resume", 2);
    const out = join(base, "resume.jsonl");
    await cli(["sweep", dir, "-o", out, "-b", DEMO, "-j", "1"]);
    const lines = readFileSync(out, "utf8").trim().split("\n").sort();
    // As if killed: the first 5 rows written (one marked, to see it is kept, not redone), then half a row.
    const marked = { ...JSON.parse(lines[0]), package: "org.example.kept-from-before" };
    writeFileSync(out, [JSON.stringify(marked), ...lines.slice(1, 5)].join("\n") + "\n" + lines[5].slice(0, 20));
    const { stdout } = await cli(["sweep", dir, "-o", out, "-b", DEMO, "-j", "1", "--resume"]);
    expect(stdout).toMatch(/5 kept from the earlier run/);
    const after = readFileSync(out, "utf8").trim().split("\n").map((l) => JSON.parse(l));
    expect(after.map((r) => r.id).sort()).toEqual(lines.map((l) => JSON.parse(l).id));
    expect(after.find((r) => r.id === marked.id).package).toBe("org.example.kept-from-before");
  });

  it("ends with every input exactly once when killed at any point and resumed (SIGKILL, several points)", async () => {
    const dir = inventory("killed", 120); // 120 × 7 APKs + a bundle + a broken file
    const expected = await (async () => {
      const out = join(base, "killed-full.jsonl");
      await cli(["sweep", dir, "-o", out, "-b", DEMO, "-j", "1"]);
      return ids(out);
    })();
    // Kill points: before any output, and at several depths into the run (once rows have appeared).
    let midRun = 0;
    for (const [afterBytes, extraMs] of [[-1, 50], [1, 0], [1, 5], [1, 15], [1, 30], [20_000, 0], [60_000, 0]] as const) {
      const out = join(base, `killed-${afterBytes}-${extraMs}.jsonl`);
      await new Promise<void>((resolve) => {
        const child = spawn(process.execPath, [`${ROOT}bin/overask.js`, "sweep", dir, "-o", out, "-b", DEMO, "-j", "2"], { stdio: "ignore" });
        const started = Date.now();
        const poll = setInterval(() => {
          let size = 0;
          try {
            size = statSync(out).size;
          } catch {
            /* not created yet */
          }
          if ((afterBytes < 0 && Date.now() - started > extraMs) || (afterBytes >= 0 && size >= afterBytes)) {
            clearInterval(poll);
            setTimeout(() => child.kill("SIGKILL"), afterBytes < 0 ? 0 : extraMs);
          }
        }, 2);
        child.on("exit", () => {
          clearInterval(poll);
          resolve();
        });
      });
      let partial = 0;
      try {
        partial = readFileSync(out, "utf8").split("\n").filter(Boolean).length;
      } catch {
        /* killed before the file was made */
      }
      if (partial > 0 && partial < expected.length) midRun++;
      const { code } = await cli(["sweep", dir, "-o", out, "-b", DEMO, "-j", "2", "--resume"]);
      expect(code).toBe(EXIT.INPUT); // the broken file
      expect(ids(out)).toEqual(expected);
    }
    expect(midRun).toBeGreaterThanOrEqual(3); // most kills landed while rows were being written
  }, 180_000);

  it("writes CSV with a header, and resumes from it", async () => {
    const dir = inventory("csv");
    const out = join(base, "out.csv");
    await cli(["sweep", dir, "-o", out, "-b", DEMO, "-j", "1", "--format", "csv"]);
    const text = readFileSync(out, "utf8");
    expect(text.split("\n")[0]).toBe("id,size,mtimeMs,status,package,versionName,versionCode,category,fallback,risk,band,errors,warnings,notes,checks,errorKind,errorMessage,findings,atypicality,riskAtPrevalence,codeUsed,codeNotSeen,codeNotMappable,codeLibraryOnly,codeProblems,permissions,codeUnreached");
    const inputs = readdirSync(APK_DIR).filter((f) => f.endsWith(".apk")).length + 2;
    expect(text.trim().split("\n")).toHaveLength(inputs + 1);
    const { stdout } = await cli(["sweep", dir, "-o", out, "-b", DEMO, "-j", "1", "--format", "csv", "--resume"]);
    expect(stdout).toContain(`${inputs} kept from the earlier run`);
    const again = readFileSync(out, "utf8").trim().split("\n");
    expect(again[0]).toBe(text.split("\n")[0]);
    expect(again.slice(1).sort()).toEqual(text.trim().split("\n").slice(1).sort());
  });

  it("gives each app with code its code evidence, in JSONL and CSV alike, and none with --no-code", async () => {
    const list = join(base, "code-list.txt");
    writeFileSync(list, `${APK_DIR}beamtorch-code.apk\n${APK_DIR}beamtorch.apk\n`);
    const jsonl = join(base, "code.jsonl");
    await cli(["sweep", list, "-o", jsonl, "-b", DEMO, "-j", "1"]);
    const rows = readFileSync(jsonl, "utf8").trim().split("\n").map((l) => JSON.parse(l));
    const withCode = rows.find((r) => r.id.endsWith("beamtorch-code.apk"));
    // The same statuses `facts` and `check` give for this fixture (test/score/code-evidence.test.ts derives them
    // from the smali source and the published map).
    expect(withCode.code).toEqual({
      used: ["android.permission.READ_CONTACTS", "android.permission.READ_SMS"],
      unreached: [],
      notSeen: ["android.permission.CAMERA", "android.permission.POST_NOTIFICATIONS"],
      notMappable: ["android.permission.ACCESS_BACKGROUND_LOCATION"],
      libraryOnly: [],
      problems: [],
    });
    // The APK without dex code has no code evidence, rather than "nothing used".
    expect(rows.find((r) => r.id.endsWith("/beamtorch.apk")).code).toBeUndefined();
    // The same row in CSV, read back.
    const csv = join(base, "code.csv");
    await cli(["sweep", list, "-o", csv, "-b", DEMO, "-j", "1", "--format", "csv"]);
    const { rowFromCsv } = await import("../../../src/report/csv.js");
    const { splitCsvLine } = await import("../../../src/util/csv.js");
    const back = readFileSync(csv, "utf8").trim().split("\n").slice(1).map((l) => rowFromCsv(splitCsvLine(l)!)!);
    expect(back.find((r) => r.id.endsWith("beamtorch-code.apk"))!.code).toEqual(withCode.code);
    const skipped = join(base, "nocode.jsonl");
    await cli(["sweep", list, "-o", skipped, "-b", DEMO, "-j", "2", "--no-code"]);
    const plain = readFileSync(skipped, "utf8").trim().split("\n").map((l) => JSON.parse(l));
    expect(plain.every((r) => r.code === undefined)).toBe(true);
    expect(plain.find((r) => r.id.endsWith("beamtorch-code.apk")).findings.some((f: { checkId: string }) => f.checkId === "not-seen-in-code")).toBe(false);
    expect(withCode.findings.filter((f: { checkId: string }) => f.checkId === "not-seen-in-code").map((f: { subject: string }) => f.subject).sort()).toEqual(withCode.code.notSeen);
  });

  it("writes for each app the same judgement `check --format json` gives for the same file", async () => {
    const dir = inventory("same-as-check");
    const out = join(base, "same-as-check.jsonl");
    await cli(["sweep", dir, "-o", out, "-b", DEMO, "-j", "2"]);
    const rows = readFileSync(out, "utf8").trim().split("\n").map((l) => JSON.parse(l)).filter((r) => r.status === "scored");
    expect(rows.length).toBeGreaterThan(10);
    for (const row of rows) {
      const { stdout } = await cli(["check", "-f", "json", "-b", DEMO, join(dir, row.id)]);
      const c = JSON.parse(stdout).results[0];
      expect(row.package, row.id).toBe(c.package);
      expect(row.versionCode).toBe(c.versionCode);
      expect(row.risk).toBe(c.risk?.probability);
      expect(row.band).toBe(c.risk?.band);
      // A row's message folds in the other reasons for the same subject (`also`), which check's JSON lists apart.
      type Also = { checkId: string; message: string };
      const message = (f: { message: string; also?: Also[] }) => [f.message, ...(f.also ?? []).map((a) => `also (${a.checkId}): ${a.message}`)].join(" — ");
      type Row = { checkId: string; level: string; subject: string; data: unknown; message: string; also?: Also[] };
      const pick = (f: Row, m: string) => ({ checkId: f.checkId, level: f.level, subject: f.subject, data: f.data, message: m });
      expect(row.findings.map((f: Row) => pick(f, f.message))).toEqual(c.findings.map((f: Row) => pick(f, message(f))));
      // No risk (a test APK, or a baseline without a model): no what-if either.
      expect(row.whatIf ?? []).toEqual((c.risk?.whatIf ?? []).filter((w: { change: number }) => w.change < 0).slice(0, 5).map((w: { permission: string; without: number }) => ({ permission: w.permission, without: w.without })));
      if (c.code) {
        const by = (s: string) => c.code.permissions.filter((p: { status: string }) => p.status === s).map((p: { permission: string }) => p.permission).sort();
        expect(row.code).toEqual({ used: by("used"), unreached: by("unreached"), notSeen: by("not-seen"), notMappable: by("not-mappable"), libraryOnly: c.code.permissions.filter((p: { onlyLibraries: boolean }) => p.onlyLibraries).map((p: { permission: string }) => p.permission).sort(), problems: c.code.problems });
      } else expect(row.code).toBeUndefined();
    }
  }, 120_000);
});
