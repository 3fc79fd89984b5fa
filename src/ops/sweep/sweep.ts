/**
 * `sweep`: screens an inventory. Inputs are spread over worker threads; results are appended to the
 * output as they are known (whole lines), so an interrupted run loses nothing, and nothing is held in
 * memory. Every row carries a stable id (the input's path as listed): two runs on the same inputs give
 * the same rows, in the order they finished. `--resume` keeps the rows of unchanged inputs (same size and
 * modification time) and sweeps the rest.
 */
import { closeSync, existsSync, openSync, readFileSync, writeSync } from "node:fs";
import { join } from "node:path";
import { Worker } from "node:worker_threads";
import { readBaselineFile, writeFileAtomic } from "../../baseline/baseline-file.js";
import { splitCsvLine } from "../../util/csv.js";
import { InputError, OutputError } from "../../errors.js";
import { Judge, type JudgeOptions } from "../../score/judge.js";
import { packageRoot } from "../package-root.js";
import { listInputs, shardOf } from "./inputs.js";
import { csvHeader, csvRowKey, scoreToLine, type ScoredLine, type SweepInput, type SweepRow } from "./rows.js";
import type { WorkerSetup } from "./worker.js";

export interface SweepOptions {
  source: string;
  output: string;
  format: "jsonl" | "csv";
  baselinePath: string;
  judge: JudgeOptions;
  jobs: number;
  resume: boolean;
  shard?: { index: number; count: number };
  onProgress?: (done: number, total: number) => void;
}

export interface SweepSummary {
  inputs: number;
  skipped: number;
  scored: number;
  failed: number;
  byBand: Record<string, number>;
  top: { id: string; package?: string; risk: number; band?: string }[];
  /** Every row of the final output, parsed on demand (CSV rows carry the summary columns only). */
  rows(): SweepRow[];
}

function workerFile(): string {
  const file = join(packageRoot(), "dist/bundle/sweep-worker.js");
  if (!existsSync(file)) throw new InputError("the sweep worker is not built; run npm run build", { file });
  return file;
}

/** Runs the inputs on `jobs` worker threads (or in this thread for one job), calling `done` per batch of rows. */
async function runPool(inputs: SweepInput[], options: SweepOptions, done: (rows: ScoredLine[]) => void): Promise<void> {
  if (options.jobs <= 1 || inputs.length <= 1) {
    const judge = new Judge(readBaselineFile(options.baselinePath));
    for (let i = 0; i < inputs.length; i += 32) {
      done(inputs.slice(i, i + 32).map((input) => scoreToLine(judge, input, options.judge, options.format)));
      // Let the event loop breathe (progress, signals) between batches.
      await new Promise((r) => setImmediate(r));
    }
    return;
  }
  const setup: WorkerSetup = {
    baselinePath: options.baselinePath,
    format: options.format,
    ...(options.judge.category ? { category: options.judge.category } : {}),
    ...(options.judge.categoryIndex ? { categoryIndex: [...options.judge.categoryIndex] } : {}),
    levels: [...(options.judge.levels ?? new Map())],
  };
  const file = workerFile();
  let next = 0;
  await new Promise<void>((resolve, reject) => {
    let running = 0;
    const workers: Worker[] = [];
    const finish = (err?: Error) => {
      for (const w of workers) void w.terminate();
      if (err) reject(err);
      else resolve();
    };
    const feed = (w: Worker) => {
      if (next >= inputs.length) {
        running--;
        if (running === 0) finish();
        return;
      }
      // Batches shrink towards the end so that the workers finish together.
      const size = Math.max(1, Math.min(32, Math.ceil((inputs.length - next) / (4 * workers.length))));
      w.postMessage(inputs.slice(next, next + size));
      next += size;
    };
    const n = Math.min(options.jobs, inputs.length);
    for (let i = 0; i < n; i++) workers.push(new Worker(file, { workerData: setup }));
    for (const w of workers) {
      running++;
      w.on("message", (rows: ScoredLine[]) => {
        try {
          done(rows);
        } catch (e) {
          finish(e as Error);
          return;
        }
        feed(w);
      });
      w.on("error", (e) => finish(e));
    }
    for (const w of workers) feed(w);
  });
}

/** Running totals for the summary, so that no result has to stay in memory. */
class Tally {
  scored = 0;
  failed = 0;
  readonly byBand: Record<string, number> = {};
  readonly top: { id: string; package?: string; risk: number; band?: string }[] = [];
  add(r: Omit<ScoredLine, "line">): void {
    if (r.status === "scored") this.scored++;
    else this.failed++;
    if (r.band) this.byBand[r.band] = (this.byBand[r.band] ?? 0) + 1;
    if (r.risk === undefined) return;
    const last = this.top[this.top.length - 1];
    if (this.top.length < 10 || r.risk > last.risk || (r.risk === last.risk && r.id < last.id)) {
      this.top.push({ id: r.id, ...(r.package ? { package: r.package } : {}), risk: r.risk, ...(r.band ? { band: r.band } : {}) });
      this.top.sort((x, y) => y.risk - x.risk || x.id.localeCompare(y.id));
      if (this.top.length > 10) this.top.pop();
    }
  }
}

/**
 * Resuming: keeps from the earlier output the last complete row of every input that is unchanged (same
 * size and modification time), drops torn, stale and duplicate lines, and writes the result back
 * atomically. Returns the ids kept.
 */
function compact(options: SweepOptions, inputs: SweepInput[], tally: Tally): Set<string> {
  const kept = new Set<string>();
  if (!existsSync(options.output)) return kept;
  const current = new Map(inputs.map((i) => [i.id, i]));
  const text = readFileSync(options.output, "utf8");
  const lines = text.split("\n");
  if (!text.endsWith("\n")) lines.pop(); // cut short by the interruption
  const latest = new Map<string, number>();
  lines.forEach((line, i) => {
    if (!line) return;
    const r = briefOf(line, options.format);
    const input = r && current.get(r.id);
    if (r && input && r.size === input.size && r.mtimeMs === input.mtimeMs) latest.set(r.id, i);
  });
  let out = options.format === "csv" ? csvHeader() : "";
  for (const [id, i] of latest) {
    out += `${lines[i]}\n`;
    kept.add(id);
    tally.add(briefOf(lines[i], options.format)!);
  }
  writeFileAtomic(options.output, out);
  return kept;
}

/** The summary fields of an output line, or undefined for a line that is not a complete row. */
function briefOf(line: string, format: "jsonl" | "csv"): (Omit<ScoredLine, "line"> & { size: number; mtimeMs: number }) | undefined {
  if (format === "jsonl") {
    try {
      const r = JSON.parse(line) as SweepRow;
      if (typeof r.id !== "string") return undefined;
      return { id: r.id, size: r.size, mtimeMs: r.mtimeMs, status: r.status, ...(r.package ? { package: r.package } : {}), ...(r.risk !== undefined ? { risk: r.risk } : {}), ...(r.band ? { band: r.band } : {}) };
    } catch {
      return undefined;
    }
  }
  const f = splitCsvLine(line);
  const key = f ? csvRowKey(f) : undefined;
  if (!key || key.id === "id") return undefined;
  const r = rowFromLine(line, "csv");
  return { id: key.id, size: key.size, mtimeMs: key.mtimeMs, status: r.status, ...(r.package ? { package: r.package } : {}), ...(r.risk !== undefined ? { risk: r.risk } : {}), ...(r.band ? { band: r.band } : {}) };
}

export async function sweep(options: SweepOptions): Promise<SweepSummary> {
  let inputs = listInputs(options.source);
  if (options.shard) inputs = inputs.filter((i) => shardOf(i.id, options.shard!.count) === options.shard!.index - 1);
  const tally = new Tally();
  const kept = options.resume ? compact(options, inputs, tally) : new Set<string>();
  const todo = inputs.filter((i) => !kept.has(i.id));

  // Append each batch of results as it arrives; on a fresh run, start the file anew.
  let fd: number;
  try {
    // After compaction a resumed output already starts with its CSV header.
    const append = options.resume && existsSync(options.output);
    fd = openSync(options.output, append ? "a" : "w");
    if (!append && options.format === "csv") writeSync(fd, csvHeader());
  } catch (e) {
    throw new OutputError(`cannot be written (${(e as { code?: string }).code ?? (e as Error).message})`, { file: options.output });
  }
  let done = kept.size;
  try {
    await runPool(todo, options, (batch) => {
      // One write per batch of whole lines: an interruption can tear at most the last line.
      let text = "";
      for (const scored of batch) {
        text += `${scored.line}\n`;
        tally.add(scored);
      }
      try {
        writeSync(fd, text);
      } catch (e) {
        throw new OutputError(`cannot be written (${(e as { code?: string }).code ?? (e as Error).message})`, { file: options.output });
      }
      done += batch.length;
      options.onProgress?.(done, inputs.length);
    });
  } finally {
    closeSync(fd);
  }
  return {
    inputs: inputs.length,
    skipped: kept.size,
    scored: tally.scored,
    failed: tally.failed,
    byBand: tally.byBand,
    top: tally.top,
    rows: () =>
      readFileSync(options.output, "utf8")
        .split("\n")
        .filter((l) => l && briefOf(l, options.format))
        .map((l) => rowFromLine(l, options.format))
        .sort((a, b) => (a.id < b.id ? -1 : a.id > b.id ? 1 : 0)),
  };
}

/** A row read back from the output (CSV keeps only the summary columns). */
function rowFromLine(line: string, format: "jsonl" | "csv"): SweepRow {
  if (format === "jsonl") return JSON.parse(line) as SweepRow;
  const f = splitCsvLine(line) ?? [];
  const risk = f[9] ? Number(f[9]) : undefined;
  return {
    id: f[0],
    size: Number(f[1]),
    mtimeMs: Number(f[2]),
    status: f[3] === "failed" ? "failed" : "scored",
    ...(f[4] ? { package: f[4] } : {}),
    ...(risk !== undefined ? { risk } : {}),
    ...(f[10] ? { band: f[10] } : {}),
  };
}
