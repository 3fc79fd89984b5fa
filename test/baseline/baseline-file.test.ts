import { mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { BaselineError } from "../../src/errors.js";
import { baselineOf, cautionFor, foldBaselines, parseBaselineFile, serializeBaseline } from "../../src/baseline/baseline-file.js";
import { readBaselineFile } from "../../src/ops/baseline.js";
import { corpusFile } from "../../src/ops/corpus.js";
import { CountTable } from "../../src/baseline/counts.js";
import { appTerms } from "../../src/baseline/features.js";
import { RiskScorer } from "../../src/score/risk.js";
import { learn } from "../../src/baseline/learn.js";
import { Baseline } from "../../src/baseline/rates.js";
import { seededRandom } from "../../src/util/random.js";
import { ROOT } from "../helpers/paths.js";

const CORPUS = `${ROOT}fixtures/corpus/harbourview.jsonl`;
const LINES = readFileSync(CORPUS, "utf8").trim().split("\n");
const dir = mkdtempSync(join(tmpdir(), "overask-learn-"));
const frequenciesOnly = { labelField: "no-such-field" };

describe("a baseline file", () => {
  it("reads back what it was written as, byte for byte", async () => {
    const r = await learn({ frequencies: [{ source: corpusFile(CORPUS), options: frequenciesOnly }] });
    const text = serializeBaseline(r.file);
    expect(serializeBaseline(parseBaselineFile(text, "a.json"))).toBe(text);
  });

  it("refuses what is not JSON, not a baseline, or of another schema version, naming the file", () => {
    expect(() => parseBaselineFile("{", "a.json")).toThrow(BaselineError);
    expect(() => parseBaselineFile(JSON.stringify({ format: "something-else" }), "b.json")).toThrow(/not an overask baseline/);
    const other = JSON.parse(readFileSync(`${ROOT}baselines/harbourview-demo.json`, "utf8"));
    other.schemaVersion = 99;
    expect(() => parseBaselineFile(JSON.stringify(other), "c.json")).toThrow(/schema version/);
  });

  it("carries the caution that names its labeled corpus", () => {
    expect(cautionFor("the Harbourview demo corpus (invented)")).toMatch(/the Harbourview demo corpus \(invented\).*not evidence of intent or harm/s);
  });
});

describe("fold", () => {
  it("refuses the same counts twice, naming both files", async () => {
    const a = await learn({ frequencies: [{ source: corpusFile(CORPUS), options: frequenciesOnly }] });
    expect(() => foldBaselines([{ path: "a.json", file: a.file }, { path: "copy.json", file: a.file }])).toThrow(/copy\.json|a\.json/);
  });


  for (const seed of [1, 2, 3]) {
    it(`gives exactly the counts of learning on both parts at once (random split, seed ${seed})`, async () => {
      const rand = seededRandom(seed);
      const parts: string[][] = [[], []];
      for (const line of LINES) parts[rand() < 0.4 ? 0 : 1].push(line);
      const paths = parts.map((p, i) => {
        const path = join(dir, `part${seed}-${i}.jsonl`);
        writeFileSync(path, `${p.join("\n")}\n`);
        return path;
      });
      const whole = await learn({ frequencies: [{ source: corpusFile(CORPUS), options: frequenciesOnly }] });
      const a = await learn({ frequencies: [{ source: corpusFile(paths[0]), options: frequenciesOnly }] });
      const b = await learn({ frequencies: [{ source: corpusFile(paths[1]), options: frequenciesOnly }] });
      const folded = foldBaselines([{ path: paths[0], file: a.file }, { path: paths[1], file: b.file }]);
      expect(folded.counts).toEqual(whole.file.counts);
      expect(folded.model).toBeNull();
    });
  }

  it("refuses baselines learned with different parameters", async () => {
    const a = await learn({ frequencies: [{ source: corpusFile(CORPUS), options: frequenciesOnly }] });
    const b = await learn({ frequencies: [{ source: corpusFile(CORPUS), options: frequenciesOnly }], parameters: { minSupport: 5 } });
    expect(() => foldBaselines([{ path: "a.json", file: a.file }, { path: "b.json", file: b.file }])).toThrow(/parameters differ/);
  });
});

