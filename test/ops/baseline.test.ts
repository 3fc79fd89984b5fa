import { mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { DEFAULT_BASELINE_NAME, defaultBaselinePath, loadJudge, readBaselineFile, writeBaselineFile } from "../../src/ops/baseline.js";
import { BaselineError } from "../../src/errors.js";
import { ROOT } from "../helpers/paths.js";

describe("baselines on disk", () => {
  it("loads the bundled default, named by its role", () => {
    const l = loadJudge();
    expect(l.baselinePath).toBe(defaultBaselinePath());
    expect(l.baselineName).toBe(DEFAULT_BASELINE_NAME);
    expect(l.judge.baseline.categorySummary().map((c) => c.name)).toEqual(["COMMUNICATION", "EDUCATION", "SOCIAL", "TOOLS"]);
  });

  it("names a baseline given by path by its path, and writes one back byte for byte", () => {
    const dir = mkdtempSync(join(tmpdir(), "overask-baseline-"));
    const l = loadJudge(`${ROOT}baselines/harbourview-demo.json`);
    expect(l.baselineName).toBe(`${ROOT}baselines/harbourview-demo.json`);
    const out = join(dir, "copy.json");
    writeBaselineFile(out, readBaselineFile(`${ROOT}baselines/harbourview-demo.json`));
    expect(readFileSync(out, "utf8")).toBe(readFileSync(`${ROOT}baselines/harbourview-demo.json`, "utf8"));
  });

  it("refuses a file that is not a baseline, as a BaselineError naming it", () => {
    const dir = mkdtempSync(join(tmpdir(), "overask-baseline-"));
    writeFileSync(join(dir, "x.json"), "[]");
    expect(() => readBaselineFile(join(dir, "x.json"))).toThrow(BaselineError);
    expect(() => readBaselineFile(join(dir, "none.json"))).toThrow(BaselineError);
  });
});
