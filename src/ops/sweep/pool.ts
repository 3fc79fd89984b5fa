/**
 * Spreading sweep inputs over worker threads (or this thread, for one job), in batches that shrink
 * towards the end so that the workers finish together.
 */
import { existsSync } from "node:fs";
import { join } from "node:path";
import { Worker } from "node:worker_threads";
import { InputError } from "../../errors.js";
import { Judge, type JudgeOptions } from "../../score/judge.js";
import { readBaselineFile } from "../baseline.js";
import { packageRoot } from "../package-root.js";
import { scoreToLine, setupOf, type ScoredLine, type SweepFormat, type SweepInput } from "./rows.js";
import type { WorkerSetup } from "./worker.js";

/** Most inputs sent to a worker at once: few enough to keep the workers even, many enough to keep messages cheap. */
const BATCH = 32;

function workerFile(): string {
  const file = join(packageRoot(), "dist/bundle/sweep-worker.js");
  if (!existsSync(file)) throw new InputError("the sweep worker is not built; run npm run build", { file });
  return file;
}

export interface PoolOptions {
  baselinePath: string;
  judge: JudgeOptions;
  format: SweepFormat;
  jobs: number;
  /** Read each app's dex code for code evidence (`--no-code`: false). */
  readCode: boolean;
}

/** Runs the inputs, calling `done` with each batch of rows as it arrives. */
export async function runPool(inputs: SweepInput[], options: PoolOptions, done: (rows: ScoredLine[]) => void): Promise<void> {
  if (options.jobs <= 1 || inputs.length <= 1) {
    const judge = new Judge(readBaselineFile(options.baselinePath));
    for (let i = 0; i < inputs.length; i += BATCH) {
      done(inputs.slice(i, i + BATCH).map((input) => scoreToLine(judge, input, options.judge, options.format, options.readCode)));
      // Let the event loop breathe (progress, signals) between batches.
      await new Promise((r) => setImmediate(r));
    }
    return;
  }
  const setup: WorkerSetup = { baselinePath: options.baselinePath, ...setupOf(options.judge, options.format, options.readCode) };
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
    // Each worker has up to two batches in hand, so that it never waits for the next one to arrive.
    const inHand = new Map<Worker, number>();
    const feed = (w: Worker) => {
      if (next >= inputs.length) {
        if ((inHand.get(w) ?? 0) > 0) return;
        running--;
        if (running === 0) finish();
        return;
      }
      inHand.set(w, (inHand.get(w) ?? 0) + 1);
      const size = Math.max(1, Math.min(BATCH, Math.ceil((inputs.length - next) / (4 * workers.length))));
      w.postMessage(inputs.slice(next, next + size));
      next += size;
    };
    const n = Math.min(options.jobs, inputs.length);
    for (let i = 0; i < n; i++) workers.push(new Worker(file, { workerData: setup }));
    for (const w of workers) {
      running++;
      w.on("message", (rows: ScoredLine[]) => {
        inHand.set(w, inHand.get(w)! - 1);
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
    for (const w of workers) if (next < inputs.length) feed(w);
  });
}
