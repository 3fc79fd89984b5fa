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
 * Modules without a test file of their own name, and the test that covers each instead, with why. Only
 * three reasons hold: the module is types only or a barrel; it is one face of a reader tested through its
 * interface; or it works only against a real service or browser that one test drives. A new module gets
 * its own test; the cap below keeps this list from growing back.
 */
const COVERED_ELSEWHERE: Record<string, string> = {
  "index.ts": "test/readme.test.ts", // the library's exports, run as the README shows them
  "extract/index.ts": "barrel",
  "ops/sweep/index.ts": "barrel",
  "baseline/corpus/types.ts": "types only",
  "score/types.ts": "types only",
  "score/heatmap-types.ts": "types only",
  "report/html/page-data.ts": "types only",
  "cli/io.ts": "types only",
  // The corpus formats: one reader interface, each format tested through it.
  "baseline/corpus/common.ts": "test/baseline/corpus/index.test.ts",
  "baseline/corpus/files.ts": "test/baseline/corpus/index.test.ts",
  "baseline/corpus/jsonl.ts": "test/baseline/corpus/index.test.ts",
  "baseline/corpus/wide-csv.ts": "test/baseline/corpus/index.test.ts",
  // The two rate checks' shared body, tested through both checks.
  "score/checks/rate-findings.ts": "test/score/checks/uncommon-for-category.test.ts",
  // Generated from framework-res at fixture time; checked against the platform manifest's own dump.
  "platform/android-attributes.ts": "test/extract/framework.test.ts",
  // The HTML pages: the page's script and shell run only in the browser test (chromium).
  "report/html/page-shell.ts": "test/report/html/check-report.test.ts",
  "report/html/page/sweep-page.ts": "test/report/html/sweep-report.test.ts",
  "ops/sweep/report.ts": "test/report/html/sweep-report.test.ts",
  // The sweep's threads: they run only as a pool of real workers, which the sweep test drives.
  "ops/sweep/pool.ts": "test/ops/sweep/sweep.test.ts",
  "ops/sweep/worker.ts": "test/ops/sweep/sweep.test.ts",
  // The queue's parts work only together against a real redis-server, which the queue test runs.
  "ops/queue/produce.ts": "test/ops/queue/queue.test.ts",
  "ops/queue/redis.ts": "test/ops/queue/queue.test.ts",
  "ops/queue/serve.ts": "test/ops/queue/queue.test.ts",
  "ops/queue/thread.ts": "test/ops/queue/queue.test.ts",
  "ops/queue/work.ts": "test/ops/queue/queue.test.ts",
  "cli/work-command.ts": "test/ops/queue/queue.test.ts",
};

/** The most modules the list above may hold (types, barrels, one reader's faces, service- and browser-bound parts). */
const COVERED_ELSEWHERE_CAP = 25;

describe("tests", () => {
  it(`leave at most ${COVERED_ELSEWHERE_CAP} modules to tests of other names`, () => {
    expect(Object.keys(COVERED_ELSEWHERE).length).toBeLessThanOrEqual(COVERED_ELSEWHERE_CAP);
  });

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
