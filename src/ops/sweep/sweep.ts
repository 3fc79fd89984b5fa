/**
 * `sweep`: screens an inventory. Inputs are spread over worker threads; results are appended to the
 * output as they are known (whole lines), so an interrupted run loses nothing, and nothing is held in
 * memory. Every row carries a stable id (the input's path as listed): two runs on the same inputs give
 * the same rows, in the order they finished. `--resume` keeps the rows of unchanged inputs (same size and
 * modification time) and sweeps the rest. The HTML report, when asked for, is written from the output.
 */
import { closeSync, existsSync, openSync, writeSync } from "node:fs";
import { InputError, OutputError } from "../../errors.js";
import { csvHeader } from "../../report/csv.js";
import type { SweepTotals } from "../../report/sweep-summary.js";
import type { JudgeOptions } from "../../score/judge.js";
import { levelRank } from "../../score/types.js";
import type { Gates } from "../check.js";
import type { AppRow } from "../../score/row.js";
import { loadJudge, type LoadedJudge } from "../baseline.js";
import { outputProblem } from "../files.js";
import { listInputs, shardOf } from "./inputs.js";
import { runPool } from "./pool.js";
import { writeSweepReport } from "./report.js";
import { compactOutput, readRows } from "./resume.js";
import type { ScoredLine, SweepFormat } from "./rows.js";

export interface SweepOptions {
  source: string;
  output: string;
  format: SweepFormat;
  /** Baseline file; the bundled default when absent. */
  baseline?: string;
  /** The baseline already loaded (by a caller that needed it first); read from `baseline` otherwise. */
  loaded?: LoadedJudge;
  judge: JudgeOptions;
  jobs: number;
  /** Read each app's dex code for code evidence; default true (`--no-code`: false). */
  readCode?: boolean;
  resume: boolean;
  shard?: { index: number; count: number };
  /** Also write the self-contained HTML report here. */
  html?: string;
  /** Gates, as for `check`: a finding at or above this level, or a risk above this, trips them. */
  gates?: Gates;
  onProgress?: (done: number, total: number) => void;
}

/** What a sweep did: the totals the summary prints, and every row of its output on demand. */
export interface SweepSummary extends SweepTotals {
  /** Every row of the final output, read back on demand (CSV rows carry the summary columns only). */
  rows(): AppRow[];
}

/** How many of the highest risks the summary keeps. */
const TOP = 10;

/** Running totals for the summary, so that no result has to stay in memory. */
class Tally {
  scored = 0;
  failed = 0;
  unknownCategory = 0;
  gated = 0;
  constructor(private readonly gates: Gates = {}) {}
  readonly byBand: Record<string, number> = {};
  readonly top: SweepTotals["top"] = [];
  add(r: Omit<ScoredLine, "line">): void {
    if (r.status === "scored") this.scored++;
    else this.failed++;
    if (r.band) this.byBand[r.band] = (this.byBand[r.band] ?? 0) + 1;
    if (r.fallback === "unknown-category") this.unknownCategory++;
    const g = this.gates;
    if ((g.failOn && r.worst && levelRank(r.worst) >= levelRank(g.failOn)) || (g.maxRisk !== undefined && r.risk !== undefined && r.risk > g.maxRisk)) this.gated++;
    if (r.risk === undefined) return;
    const last = this.top[this.top.length - 1];
    if (this.top.length < TOP || r.risk > last.risk || (r.risk === last.risk && r.id < last.id)) {
      this.top.push({ id: r.id, ...(r.package ? { package: r.package } : {}), risk: r.risk, ...(r.band ? { band: r.band } : {}) });
      this.top.sort((x, y) => y.risk - x.risk || x.id.localeCompare(y.id));
      if (this.top.length > TOP) this.top.pop();
    }
  }
}

export async function sweep(options: SweepOptions): Promise<SweepSummary> {
  const { judge, baselinePath, baselineName } = options.loaded ?? loadJudge(options.baseline);
  const walked = { notManifests: 0 };
  let inputs = listInputs(options.source, walked);
  if (inputs.length === 0) {
    throw new InputError(`nothing to sweep: no APK, app bundle or manifest${walked.notManifests ? ` (${walked.notManifests} .xml file${walked.notManifests === 1 ? "" : "s"} that are not manifests passed over)` : ""}`, { file: options.source });
  }
  if (options.shard) inputs = inputs.filter((i) => shardOf(i.id, options.shard!.count) === options.shard!.index - 1);
  const tally = new Tally(options.gates);
  const kept = options.resume ? compactOutput(options.output, options.format, inputs, (r) => tally.add(r)) : new Set<string>();
  const todo = inputs.filter((i) => !kept.has(i.id));

  // Append each batch of results as it arrives; on a fresh run, start the file anew.
  let fd: number;
  try {
    // After compaction a resumed output already starts with its CSV header.
    const append = options.resume && existsSync(options.output);
    fd = openSync(options.output, append ? "a" : "w");
    if (!append && options.format === "csv") writeSync(fd, csvHeader());
  } catch (e) {
    throw new OutputError(`cannot be written: ${outputProblem(e)}`, { file: options.output });
  }
  let done = kept.size;
  try {
    await runPool(todo, { baselinePath, judge: options.judge, format: options.format, jobs: options.jobs, readCode: options.readCode ?? true }, (batch) => {
      // One write per batch of whole lines: an interruption can tear at most the last line.
      let text = "";
      for (const scored of batch) {
        text += `${scored.line}\n`;
        tally.add(scored);
      }
      try {
        writeSync(fd, text);
      } catch (e) {
        throw new OutputError(`cannot be written: ${outputProblem(e)}`, { file: options.output });
      }
      done += batch.length;
      options.onProgress?.(done, inputs.length);
    });
  } finally {
    closeSync(fd);
  }
  const summary: SweepSummary = {
    inputs: inputs.length,
    skipped: kept.size,
    notManifests: walked.notManifests,
    unknownCategory: tally.unknownCategory,
    gated: tally.gated,
    scored: tally.scored,
    failed: tally.failed,
    byBand: tally.byBand,
    top: tally.top,
    ...(options.shard ? { shard: options.shard } : {}),
    output: options.output,
    ...(options.html ? { html: options.html } : {}),
    ...(judge.scorer ? { caution: judge.file.caution, baseRate: judge.scorer.model.evaluation.baseRate } : {}),
    rows: () => readRows(options.output, options.format),
  };
  if (options.html) writeSweepReport({ output: options.output, format: options.format, html: options.html, loaded: { judge, baselinePath, baselineName }, inputs: inputs.length });
  return summary;
}
