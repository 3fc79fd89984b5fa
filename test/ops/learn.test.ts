import { mkdtempSync, readFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { foldFiles, learnFiles } from "../../src/ops/learn.js";
import { OutputError } from "../../src/errors.js";
import { FIXTURES, ROOT } from "../helpers/paths.js";

const dir = mkdtempSync(join(tmpdir(), "overask-oplearn-"));
const CORPUS = `${FIXTURES}corpus/harbourview.jsonl`;

describe("learning from files as a library call", () => {
  it("writes the baseline only when given an output, and the same baseline the bundled demo one is", async () => {
    const r = await learnFiles({ frequencies: [{ path: CORPUS, options: { labelField: "flagged", positive: ["yes"] }, licence: "Apache-2.0" }], labelsName: "the Harbourview demo corpus (invented)" });
    const bundled = JSON.parse(readFileSync(`${ROOT}baselines/harbourview-demo.json`, "utf8"));
    expect(r.file.counts).toEqual(bundled.counts);
    const out = join(dir, "b.json");
    await learnFiles({ frequencies: [{ path: CORPUS, options: { labelField: "none" } }], output: out });
    expect(JSON.parse(readFileSync(out, "utf8")).counts.pooled.apps).toBe(1500);
  });

  it("lists rejected rows in a CSV when asked, and says so when that file cannot be written", async () => {
    const rejects = join(dir, "rejects.csv");
    await learnFiles({ frequencies: [{ path: CORPUS, options: { labelField: "none" } }], rejects });
    expect(readFileSync(rejects, "utf8").split("\n")[0]).toBe("file,line,reason");
    await expect(learnFiles({ frequencies: [{ path: CORPUS, options: {} }], rejects: join(dir, "no/such/folder.csv") })).rejects.toThrow(OutputError);
  });

  it("folds baseline files and writes the result", () => {
    const out = join(dir, "folded.json");
    const { folded, inputs } = foldFiles([`${ROOT}baselines/harbourview-demo.json`, `${ROOT}baselines/default.json`], out);
    expect(inputs).toHaveLength(2);
    expect(folded.counts.pooled.apps).toBe(inputs.reduce((n, i) => n + i.file.counts.pooled.apps, 0));
    expect(JSON.parse(readFileSync(out, "utf8")).counts).toEqual(folded.counts);
  });
});
