/**
 * `sweep`: screens an inventory. Inputs are spread over worker threads; each result is appended to the
 * output as soon as it is known (one line, one write), so an interrupted run loses nothing; `--resume`
 * skips inputs already in the output with the same size and modification time. At the end the output is
 * rewritten sorted by id (atomically), so two runs on the same inputs give the same file.
 */
import { closeSync, existsSync, openSync, readFileSync, writeSync } from "node:fs";
import { join } from "node:path";
import { Worker } from "node:worker_threads";
import { readBaselineFile, writeFileAtomic } from "../baseline/baseline-file.js";
import { splitCsvLine } from "../baseline/corpus/csv.js";
import { InputError, OutputError } from "../errors.js";
import { Judge, type JudgeOptions } from "../score/check-app.js";
import { packageRoot } from "../util/package-root.js";
import { listInputs, shardOf } from "./inputs.js";
import { csvHeader, csvRowKey, rowToCsv, scoreInput, type SweepInput, type SweepRow } from "./row.js";
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
  rows: SweepRow[];
}

/** Reads what an earlier (perhaps interrupted) run wrote: complete rows by id; torn or foreign lines are dropped. */
export function readExisting(path: string, format: "jsonl" | "csv"): Map<string, { size: number; mtimeMs: number; line: string; row?: SweepRow }> {
  const out = new Map<string, { size: number; mtimeMs: number; line: string; row?: SweepRow }>();
  if (!existsSync(path)) return out;
  const text = readFileSync(path, "utf8");
  const lines = text.split("\n");
  // A last line without its newline was cut short by the interruption.
  if (!text.endsWith("\n")) lines.pop();
  for (const line of lines) {
    if (!line) continue;
    if (format === "jsonl") {
      try {
        const row = JSON.parse(line) as SweepRow;
        if (typeof row.id === "string") out.set(row.id, { size: row.size, mtimeMs: row.mtimeMs, line, row });
      } catch {
        /* torn line: the input is swept again */
      }
    } else {
      const fields = splitCsvLine(line);
      const key = fields ? csvRowKey(fields) : undefined;
      if (key && key.id !== "id") out.set(key.id, { size: key.size, mtimeMs: key.mtimeMs, line });
    }
  }
  return out;
}

function workerFile(): string {
  const file = join(packageRoot(), "dist/bundle/sweep-worker.js");
  if (!existsSync(file)) throw new InputError("the sweep worker is not built; run npm run build", { file });
  return file;
}

/** Runs `each` over the inputs on `jobs` worker threads (or in this thread for one job), calling `done` per row. */
async function runPool(inputs: SweepInput[], options: SweepOptions, done: (row: SweepRow) => void): Promise<void> {
  if (options.jobs <= 1 || inputs.length <= 1) {
    const judge = new Judge(readBaselineFile(options.baselinePath));
    for (const input of inputs) {
      done(scoreInput(judge, input, options.judge));
      // Let the event loop breathe (progress, signals) now and then.
      if (Math.random() < 0.01) await new Promise((r) => setImmediate(r));
    }
    return;
  }
  const setup: WorkerSetup = {
    baselinePath: options.baselinePath,
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
      const seq = next++;
      w.postMessage({ seq, input: inputs[seq] });
    };
    const n = Math.min(options.jobs, inputs.length);
    for (let i = 0; i < n; i++) {
      const w = new Worker(file, { workerData: setup });
      workers.push(w);
      running++;
      w.on("message", (msg: { seq: number; row: SweepRow }) => {
        try {
          done(msg.row);
        } catch (e) {
          finish(e as Error);
          return;
        }
        feed(w);
      });
      w.on("error", (e) => finish(e));
      feed(w);
    }
  });
}

export async function sweep(options: SweepOptions): Promise<SweepSummary> {
  let inputs = listInputs(options.source);
  if (options.shard) inputs = inputs.filter((i) => shardOf(i.id, options.shard!.count) === options.shard!.index - 1);
  const existing = options.resume ? readExisting(options.output, options.format) : new Map();
  const kept = new Map<string, string>(); // id → line, from the earlier run
  const todo: SweepInput[] = [];
  for (const input of inputs) {
    const prior = existing.get(input.id);
    if (prior && prior.size === input.size && prior.mtimeMs === input.mtimeMs) kept.set(input.id, prior.line);
    else todo.push(input);
  }

  // Append as results arrive; on a fresh run, start the file anew.
  let fd: number;
  try {
    fd = openSync(options.output, options.resume ? "a" : "w");
    if (!options.resume && options.format === "csv") writeSync(fd, csvHeader());
  } catch (e) {
    throw new OutputError(`cannot be written (${(e as { code?: string }).code ?? (e as Error).message})`, { file: options.output });
  }
  const rows: SweepRow[] = [];
  const lines = new Map<string, string>(kept);
  try {
    await runPool(todo, options, (row) => {
      const line = options.format === "jsonl" ? `${JSON.stringify(row)}\n` : rowToCsv(row);
      try {
        writeSync(fd, line);
      } catch (e) {
        throw new OutputError(`cannot be written (${(e as { code?: string }).code ?? (e as Error).message})`, { file: options.output });
      }
      lines.set(row.id, line.slice(0, -1));
      rows.push(row);
      options.onProgress?.(kept.size + rows.length, inputs.length);
    });
  } finally {
    closeSync(fd);
  }

  // The final file: every input of this run once, sorted by id.
  const ids = inputs.map((i) => i.id);
  const body = ids.map((id) => lines.get(id)).filter((l): l is string => l !== undefined).join("\n");
  writeFileAtomic(options.output, `${options.format === "csv" ? csvHeader() : ""}${body}${body ? "\n" : ""}`);

  const fresh = new Map(rows.map((r) => [r.id, r]));
  const all: SweepRow[] = ids.filter((id) => lines.has(id)).map((id) => fresh.get(id) ?? rowFromLine(lines.get(id)!, options.format));
  const byBand: Record<string, number> = {};
  for (const r of all) if (r.band) byBand[r.band] = (byBand[r.band] ?? 0) + 1;
  const top = all
    .filter((r) => r.risk !== undefined)
    .sort((a, b) => b.risk! - a.risk! || a.id.localeCompare(b.id))
    .slice(0, 10)
    .map((r) => ({ id: r.id, ...(r.package ? { package: r.package } : {}), risk: r.risk!, ...(r.band ? { band: r.band } : {}) }));
  return {
    inputs: inputs.length,
    skipped: kept.size,
    scored: all.filter((r) => r.status === "scored").length,
    failed: all.filter((r) => r.status === "failed").length,
    byBand,
    top,
    rows: all,
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
