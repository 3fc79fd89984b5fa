/**
 * `sweep`: screens an inventory. Inputs are spread over worker threads; results are appended to the
 * output as they are known (whole lines), so an interrupted run loses nothing, and nothing is held in
 * memory. Every row carries a stable id (the input's path as listed): two runs on the same inputs give
 * the same rows, in the order they finished. `--resume` keeps the rows of unchanged inputs (same size and
 * modification time) and sweeps the rest. The HTML report, when asked for, is written from the output.
 */
import { compareText } from "../../util/compare.js";
import { closeSync, existsSync, openSync, writeSync } from "node:fs";
import { InputError, OutputError } from "../../errors.js";
import { csvHeader } from "../../report/csv.js";
import type { SweepTotals } from "../../report/sweep-summary.js";
import type { JudgeOptions } from "../../score/judge.js";
import { tripsGate, type Gates } from "../../score/gates.js";
import type { AppRow } from "../../score/row.js";
import { loadJudge, type LoadedJudge } from "../baseline.js";
import { outputProblem } from "../files.js";
import { listInputs, shardOf } from "./inputs.js";
import { runPool } from "./pool.js";
import { writeSweepReport } from "./report.js";
import { compactOutput, readRows } from "./resume.js";
import type { ScoredLine, SweepFormat, SweepInput } from "./rows.js";

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
/** How many inputs that could not be read the summary names. */
const FAILED_NAMED = 10;

/** Running totals for the summary, so that no result has to stay in memory. */
export class Tally {
  scored = 0;
  failed = 0;
  unknownCategory = 0;
  gated = 0;
  constructor(private readonly gates: Gates = {}) {}
  readonly byBand: Record<string, number> = {};
  readonly top: SweepTotals["top"] = [];
  /** The first inputs that could not be read (the summary names them; the output has them all). */
  readonly failedIds: string[] = [];
  add(r: Omit<ScoredLine, "line">): void {
    if (r.status === "scored") this.scored++;
    else {
      this.failed++;
      if (this.failedIds.length < FAILED_NAMED) this.failedIds.push(r.id);
    }
    if (r.band) this.byBand[r.band] = (this.byBand[r.band] ?? 0) + 1;
    if (r.fallback === "unknown-category") this.unknownCategory++;
    if (tripsGate(r, this.gates)) this.gated++;
    if (r.risk === undefined) return;
    const last = this.top[this.top.length - 1];
    if (this.top.length < TOP || r.risk > last.risk || (r.risk === last.risk && r.id < last.id)) {
      this.top.push({ id: r.id, ...(r.package ? { package: r.package } : {}), risk: r.risk, ...(r.band ? { band: r.band } : {}) });
      this.top.sort((x, y) => y.risk - x.risk || compareText(x.id, y.id));
      if (this.top.length > TOP) this.top.pop();
    }
  }
}

/** What a sweep's output needs to know, for local and queued sweeps alike. */
export interface OutputOptions {
  output: string;
  format: SweepFormat;
  resume: boolean;
  gates?: Gates;
  shard?: { index: number; count: number };
  html?: string;
}

/**
 * A sweep's output file and running totals: rows are appended a batch of whole lines at a time, so an
 * interruption can tear at most the last line; `--resume` first keeps the rows of unchanged inputs.
 */
export class SweepOutput {
  readonly tally: Tally;
  /** Ids of the inputs whose rows were kept from an earlier run. */
  readonly kept: Set<string>;
  private readonly fd: number;
  constructor(private readonly options: OutputOptions, inputs: SweepInput[]) {
    this.tally = new Tally(options.gates);
    this.kept = options.resume ? compactOutput(options.output, options.format, inputs, (r) => this.tally.add(r)) : new Set<string>();
    try {
      // After compaction a resumed output already starts with its CSV header; a fresh run starts anew.
      const append = options.resume && existsSync(options.output);
      this.fd = openSync(options.output, append ? "a" : "w");
      if (!append && options.format === "csv") writeSync(this.fd, csvHeader());
    } catch (e) {
      throw new OutputError(`cannot be written: ${outputProblem(e)}`, { file: options.output });
    }
  }

  get format(): SweepFormat {
    return this.options.format;
  }

  /** Appends a batch of rows in one write. */
  write(batch: readonly ScoredLine[]): void {
    let text = "";
    for (const scored of batch) {
      text += `${scored.line}\n`;
      this.tally.add(scored);
    }
    try {
      writeSync(this.fd, text);
    } catch (e) {
      throw new OutputError(`cannot be written: ${outputProblem(e)}`, { file: this.options.output });
    }
  }

  close(): void {
    closeSync(this.fd);
  }

  /** The summary once every row is written; writes the HTML report when asked. */
  finish(loaded: LoadedJudge, inputs: number, notManifests: number): SweepSummary {
    const { judge } = loaded;
    const o = this.options;
    const t = this.tally;
    const summary: SweepSummary = {
      inputs,
      skipped: this.kept.size,
      notManifests,
      unknownCategory: t.unknownCategory,
      gated: t.gated,
      scored: t.scored,
      failed: t.failed,
      failedIds: [...t.failedIds].sort(compareText),
      byBand: t.byBand,
      top: t.top,
      ...(o.shard ? { shard: o.shard } : {}),
      output: o.output,
      ...(o.html ? { html: o.html } : {}),
      ...(judge.scorer ? { caution: judge.file.caution, baseRate: judge.scorer.model.evaluation.baseRate } : {}),
      rows: () => readRows(o.output, o.format),
    };
    if (o.html) writeSweepReport({ output: o.output, format: o.format, html: o.html, loaded, inputs });
    return summary;
  }
}

/** The inputs of a sweep source (of one shard, when asked); nothing to sweep is an error. */
export function sweepInputs(source: string, shard?: { index: number; count: number }): { inputs: SweepInput[]; notManifests: number } {
  const walked = { notManifests: 0 };
  let inputs = listInputs(source, walked);
  if (inputs.length === 0) {
    throw new InputError(`nothing to sweep: no APK, app bundle or manifest${walked.notManifests ? ` (${walked.notManifests} .xml file${walked.notManifests === 1 ? "" : "s"} that are not manifests passed over)` : ""}`, { file: source });
  }
  if (shard) inputs = inputs.filter((i) => shardOf(i.id, shard.count) === shard.index - 1);
  return { inputs, notManifests: walked.notManifests };
}

export async function sweep(options: SweepOptions): Promise<SweepSummary> {
  const loaded = options.loaded ?? loadJudge(options.baseline);
  const { inputs, notManifests } = sweepInputs(options.source, options.shard);
  const out = new SweepOutput(options, inputs);
  const todo = inputs.filter((i) => !out.kept.has(i.id));
  let done = out.kept.size;
  try {
    await runPool(todo, { baselinePath: loaded.baselinePath, judge: options.judge, format: options.format, jobs: options.jobs, readCode: options.readCode ?? true }, (batch) => {
      out.write(batch);
      done += batch.length;
      options.onProgress?.(done, inputs.length);
    });
  } finally {
    out.close();
  }
  return out.finish(loaded, inputs.length, notManifests);
}
