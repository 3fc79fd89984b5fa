/**
 * The layout DEVELOPERS.md describes, kept true: data flows one way (platform → extract → baseline → score
 * → report → ops → cli), only ops/ and cli/ touch the file system, processes or threads, DEVELOPERS.md's
 * layout table names every folder of src/, and every module has a test file named after it or is listed
 * below with the test that covers it.
 */
import { existsSync, readdirSync, readFileSync, statSync } from "node:fs";
import { dirname, join, relative, resolve } from "node:path";
import { describe, expect, it } from "vitest";
import { ROOT } from "./helpers/paths.js";

const SRC = join(ROOT, "src");

function walk(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const p = join(dir, name);
    if (statSync(p).isDirectory()) return name === "generated" ? [] : walk(p);
    return /\.ts$/.test(name) && !name.endsWith(".d.ts") ? [p] : [];
  });
}

const modules = walk(SRC).map((p) => relative(SRC, p).split("\\").join("/"));

/** Layer of a module: a lower layer never imports a higher one. */
const LAYERS: [RegExp, number][] = [
  [/^(util\/|types\/|errors\.ts$|limits\.ts$|version\.ts$)/, 0],
  [/^platform\//, 1],
  [/^extract\//, 2],
  [/^baseline\//, 3],
  [/^score\//, 4],
  [/^report\//, 5],
  [/^ops\//, 6],
  [/^cli\//, 7],
  [/^index\.ts$/, 8],
];
const layerOf = (m: string) => LAYERS.find(([re]) => re.test(m))?.[1] ?? -1;

function importsOf(module: string): string[] {
  const text = readFileSync(join(SRC, module), "utf8");
  return [...text.matchAll(/(?:from|import)\s*\(?\s*["']([^"']+)["']/g)].map((m) => m[1]);
}

describe("layers", () => {
  it("place every module in a layer", () => {
    expect(modules.filter((m) => layerOf(m) < 0)).toEqual([]);
  });

  it("never import a higher layer", () => {
    const upward: string[] = [];
    for (const m of modules) {
      for (const spec of importsOf(m).filter((s) => s.startsWith("."))) {
        const target = relative(SRC, resolve(dirname(join(SRC, m)), spec)).replace(/\.js$/, ".ts");
        if (layerOf(target) > layerOf(m)) upward.push(`${m} → ${target}`);
      }
    }
    expect(upward).toEqual([]);
  });

  it("leave the console, standard streams and the environment to ops/ and cli/", () => {
    // A library layer never writes to the terminal or reads settings from the environment behind its
    // caller's back (a statistics step once printed a trace when an undocumented variable was set).
    const io = /\b(console\.\w+|process\.(stderr|stdout|stdin|env|exit))\b/;
    const offenders = modules.filter((m) => layerOf(m) < 6 && io.test(readFileSync(join(SRC, m), "utf8").replace(/\/\*[\s\S]*?\*\/|\/\/[^\n]*/g, "")));
    expect(offenders).toEqual([]);
  });

  it("leave the file system, child processes and threads to ops/ and cli/", () => {
    const io = /^node:(fs|fs\/promises|child_process|worker_threads|readline|net)$/;
    const offenders = modules.filter((m) => layerOf(m) < 6 && importsOf(m).some((s) => io.test(s)));
    expect(offenders).toEqual([]);
  });
});

describe("DEVELOPERS.md", () => {
  it("has a row in its layout table for every folder of src/, and none for a folder that is gone", () => {
    const text = readFileSync(join(ROOT, "DEVELOPERS.md"), "utf8");
    const named = [...text.matchAll(/^\| `src\/([\w-]+)\/` \|/gm)].map((m) => m[1]).sort();
    const folders = readdirSync(SRC).filter((n) => statSync(join(SRC, n)).isDirectory()).sort();
    expect(named).toEqual(folders);
  });
});

/**
 * Modules without a test file of their own name, and the test that covers each instead. Type-only
 * modules and barrels are listed with "types only" or "barrel". Keep it short: a new module gets its test.
 */
const COVERED_ELSEWHERE: Record<string, string> = {
  "index.ts": "test/readme.test.ts",
  "platform/android-attributes.ts": "test/extract/framework.test.ts",
  "extract/index.ts": "barrel",
  "extract/xml-tree.ts": "test/extract/plain-xml.test.ts",
  "extract/binary/resource-table.ts": "test/extract/fixtures.test.ts",
  "baseline/corpus/index.ts": "test/baseline/corpus.test.ts",
  "baseline/corpus/common.ts": "test/baseline/corpus.test.ts",
  "baseline/corpus/files.ts": "test/baseline/corpus.test.ts",
  "baseline/corpus/jsonl.ts": "test/baseline/corpus.test.ts",
  "baseline/corpus/types.ts": "types only",
  "baseline/corpus/wide-csv.ts": "test/baseline/corpus.test.ts",
  "score/types.ts": "types only",
  "score/heatmap-types.ts": "types only",
  "score/checks/rate-findings.ts": "test/score/checks/uncommon-for-category.test.ts",
  "ops/sweep/report.ts": "test/report/html/sweep-report.test.ts",
  "cli/rules-command.ts": "test/cli/policies.test.ts",
  "cli/work-command.ts": "test/ops/queue/queue.test.ts",
  "report/html/page-shell.ts": "test/report/html/check-report.test.ts",
  "report/rules.ts": "test/cli/policies.test.ts",
  "ops/policy.ts": "test/score/policy/policy.test.ts",
  "report/learn.ts": "test/cli/learn-command.test.ts",
  "report/trim-delta.ts": "test/score/delta.test.ts",
  "report/sweep-summary.ts": "test/ops/sweep/sweep.test.ts",
  "report/html/page-data.ts": "types only",
  "report/html/page/sweep-page.ts": "test/report/html/sweep-report.test.ts",
  "ops/baseline.ts": "test/baseline/bundled.test.ts",
  "ops/corpus.ts": "test/baseline/corpus.test.ts",
  "ops/delta.ts": "test/score/delta.test.ts",
  "ops/learn.ts": "test/cli/learn-command.test.ts",
  "ops/package-root.ts": "test/ops/sweep/sweep.test.ts",
  "ops/trim.ts": "test/score/trim/plan.test.ts",
  "ops/sweep/index.ts": "barrel",
  "ops/sweep/pool.ts": "test/ops/sweep/sweep.test.ts",
  "ops/sweep/resume.ts": "test/ops/sweep/sweep.test.ts",
  "ops/sweep/rows.ts": "test/ops/sweep/sweep.test.ts",
  "ops/sweep/worker.ts": "test/ops/sweep/sweep.test.ts",
  "ops/queue/jobs.ts": "test/ops/queue/queue.test.ts",
  "ops/queue/produce.ts": "test/ops/queue/queue.test.ts",
  "ops/queue/redis.ts": "test/ops/queue/queue.test.ts",
  "ops/queue/serve.ts": "test/ops/queue/queue.test.ts",
  "ops/queue/thread.ts": "test/ops/queue/queue.test.ts",
  "ops/queue/work.ts": "test/ops/queue/queue.test.ts",
  "cli/io.ts": "types only",
  "cli/progress.ts": "test/cli/learn-command.test.ts",
};

describe("tests", () => {
  const own = (m: string) => join(ROOT, "test", m.replace(/\.ts$/, ".test.ts"));
  it("exist for every module: its own, or one listed as covering it", () => {
    const missing = modules.filter((m) => !existsSync(own(m)) && !COVERED_ELSEWHERE[m]);
    expect(missing).toEqual([]);
  });

  it("list no module that has its own test file or no longer exists, and name test files that exist", () => {
    for (const [m, by] of Object.entries(COVERED_ELSEWHERE)) {
      expect(modules.includes(m) || m.endsWith(".d.ts"), `${m} exists`).toBe(true);
      expect(existsSync(own(m)), `${m} has its own test now: drop it from the list`).toBe(false);
      if (by !== "types only" && by !== "barrel") expect(existsSync(join(ROOT, by)), by).toBe(true);
    }
  });
});
