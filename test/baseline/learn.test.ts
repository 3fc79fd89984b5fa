import { mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { baselineOf, foldBaselines } from "../../src/baseline/baseline-file.js";
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

describe("the risk model learned from the demo corpus", async () => {
  const result = await learn({ frequencies: [{ source: corpusFile(CORPUS), options: { labelField: "flagged", positive: ["yes"] } }] });
  const model = result.file.model!;
  const baseline = baselineOf(result.file);

  it("has every weight non-negative, chosen its penalty by inner cross-validation, and converged", () => {
    expect(model.permissionWeights.every((w) => w >= 0)).toBe(true);
    expect(model.termWeights.every((w) => w >= 0)).toBe(true);
    expect(model.lambdaChoice.map((c) => c.lambda)).toContain(model.lambda);
    expect(model.lambdaChoice.find((c) => c.lambda === model.lambda)!.logLoss).toBe(Math.min(...model.lambdaChoice.map((c) => c.logLoss)));
    expect(model.training.converged).toBe(true);
  });

  it("never raises the risk when a permission is removed (monotonicity, 10,000 random permission sets)", () => {
    const scorer = new RiskScorer(baseline, model, result.file.caution);
    const pool = [...new Set(LINES.flatMap((l) => (JSON.parse(l) as { permissions: string[] }).permissions))].sort();
    const categories = [...baseline.counts.categories.keys(), undefined];
    const rand = seededRandom(11);
    for (let t = 0; t < 10_000; t++) {
      const perms = pool.filter(() => rand() < 0.15);
      if (!perms.length) continue;
      const category = categories[Math.floor(rand() * categories.length)];
      const drop = perms[Math.floor(rand() * perms.length)];
      expect(scorer.probability(category, perms.filter((q) => q !== drop))).toBeLessThanOrEqual(scorer.probability(category, perms) + 1e-12);
    }
  });

  it("scores a training row against counts that leave that row out (cross-fitting)", () => {
    const i = 17;
    const app = JSON.parse(LINES[i]) as { category: string; permissions: string[] };
    const without = new CountTable();
    LINES.forEach((line, j) => {
      if (j !== i) without.add(JSON.parse(line));
    });
    const loo = new Baseline(without, baseline.parameters, new Map(), baseline.era);
    const crossFitted = appTerms(baseline, app.category, app.permissions, { category: app.category, permissions: new Set(app.permissions) });
    expect(crossFitted).toEqual(appTerms(loo, app.category, app.permissions));
    expect(crossFitted).not.toEqual(appTerms(baseline, app.category, app.permissions));
  });

  it("beats the reference scores in cross-validation on the demo corpus", () => {
    const e = model.evaluation;
    for (const k of ["dangerousCount", "permissionCount", "surprisal"] as const) expect(e.auc).toBeGreaterThan(e.references[k]!.auc);
    expect(e.brier).toBeLessThan(e.brierOfBaseRate);
    expect(e.calibration.reduce((s, b) => s + b.n, 0)).toBe(model.training.rows);
  });

  it("is deterministic for a seed", async () => {
    const again = await learn({ frequencies: [{ source: corpusFile(CORPUS), options: { labelField: "flagged", positive: ["yes"] } }], createdAt: new Date(result.file.createdAt) });
    expect(again.file).toEqual(result.file);
  });

  it("trains on a seeded stratified sample above the row limit, and says so", async () => {
    const sampled = await learn({ frequencies: [{ source: corpusFile(CORPUS), options: { labelField: "flagged", positive: ["yes"] } }], model: { maxRows: 600 } });
    expect(sampled.file.model!.sample).toEqual({ of: 1500, taken: 600, seed: 1 });
    const share = sampled.file.model!.training.positives / 600;
    expect(Math.abs(share - model.training.positives / 1500)).toBeLessThan(0.01);
    expect(sampled.file.provenance.notes.join("\n")).toMatch(/stratified sample of 600 of 1500/);
  });
});

describe("reject threshold", () => {
  it("fails with a clear message when too many rows are rejected", async () => {
    const p = join(dir, "bad.jsonl");
    writeFileSync(p, `${LINES.slice(0, 90).join("\n")}\n${Array.from({ length: 10 }, () => "{oops").join("\n")}\n`);
    await expect(learn({ frequencies: [{ source: corpusFile(p), options: {} }] })).rejects.toThrow(/10 of 100 rows rejected \(10\.0%\), over the limit of 5\.0%; first at line 91/);
    await expect(learn({ frequencies: [{ source: corpusFile(p), options: {} }], rejectLimit: 0.2 })).resolves.toBeDefined();
  });
});

describe("baseline files", () => {
  it("refuses another schema version with a clear message", () => {
    const p = join(dir, "old.json");
    writeFileSync(p, JSON.stringify({ format: "overask-baseline", schemaVersion: 99 }));
    expect(() => readBaselineFile(p)).toThrow(/schema version 99; this overask .* reads version 2/);
    writeFileSync(p, "{");
    expect(() => readBaselineFile(p)).toThrow(/is not JSON/);
  });
});
