/**
 * Taking a queued sweep's jobs: one BullMQ worker (on this thread) that reads and judges each input it is
 * given, stores the row under the job's id (first write wins) and lists the id as done. Runs until told to
 * stop, or with `drain` until the queue has nothing left to run.
 */
import { readFileSync } from "node:fs";
import { hostname } from "node:os";
import { Queue, Worker, type Job } from "bullmq";
import { QueueError } from "../../errors.js";
import { Judge } from "../../score/judge.js";
import type { JudgeOptions } from "../../score/judge.js";
import { readBaselineFile } from "../baseline.js";
import { judgeOptionsOf, scoreToLine, type SweepSetup } from "../sweep/rows.js";
import type { QueueAddress } from "./address.js";
import { keysOf, PREFIX, shortHash, STALL, type JobData } from "./jobs.js";
import { connectRedis } from "./redis.js";

export interface ServeOptions {
  address: QueueAddress;
  baselinePath: string;
  /** Jobs this worker runs at once (overlapping Redis round trips; the judging itself is synchronous). */
  concurrency: number;
  /** Stop once the queue has nothing left to run. */
  drain: boolean;
  /** Called once the worker is connected and taking jobs. */
  onReady?: () => void;
  /** Stop early (a signal): finish the jobs in hand, then return. */
  signal?: AbortSignal;
  /**
   * How long a stop may wait for the jobs in hand and a clean close (default GRACE_MS): past it the worker
   * lets go of the connection and returns, even when Redis cannot be reached. Jobs it held return to the
   * queue after the stall check and run on another worker.
   */
  graceMs?: number;
}

export interface ServeResult {
  jobs: number;
  /** The grace period ran out before a clean close (Redis unreachable, or jobs that would not finish). */
  forced?: boolean;
}

/** Default grace of a stop: well under an orchestrator's usual wait (Kubernetes: 30 s) before it kills. */
export const GRACE_MS = 8000;

/** Resolves true when `p` settles within `ms`, false otherwise (the timer never keeps the process alive). */
function within(p: Promise<unknown>, ms: number): Promise<boolean> {
  return new Promise((resolve) => {
    const t = setTimeout(() => resolve(false), ms);
    t.unref();
    p.then(
      () => (clearTimeout(t), resolve(true)),
      () => (clearTimeout(t), resolve(true)),
    );
  });
}

/** A mismatch between this worker's baseline and the sweep's: the worker stops rather than judge differently. */
function baselineMismatch(a: QueueAddress, mine: string, theirs: string): QueueError {
  return new QueueError(`this worker's baseline (${mine}) is not the sweep's (${theirs}); start it with the producer's -b baseline`, { file: a.shown });
}

export async function serveQueue(o: ServeOptions): Promise<ServeResult> {
  const judge = new Judge(readBaselineFile(o.baselinePath));
  const mine = shortHash(readFileSync(o.baselinePath));
  const host = hostname();
  const client = await connectRedis(o.address);
  const keys = keysOf(o.address.name);
  const current = await client.hget(keys.meta, "baseline");
  if (current && current !== mine) {
    client.disconnect();
    throw baselineMismatch(o.address, mine, current);
  }
  const settings = new Map<string, { setup: SweepSetup; options: JudgeOptions }>();
  let jobs = 0;
  let stopWith: Error | undefined;
  const process = async (job: Job<JobData>) => {
    const d = job.data;
    if (d.baseline !== mine) {
      stopWith = baselineMismatch(o.address, mine, d.baseline);
      throw stopWith;
    }
    let s = settings.get(d.sweep);
    if (!s) {
      const raw = await client.hget(keys.meta, "setup");
      if (!raw) throw new Error("the sweep's settings are gone from the queue");
      const setup = JSON.parse(raw) as SweepSetup;
      s = { setup, options: judgeOptionsOf(setup) };
      settings.set(d.sweep, s);
    }
    const scored = scoreToLine(judge, d.input, s.options, s.setup.format, s.setup.readCode, host);
    // First write wins: a job run twice leaves one row; the id is listed for the producer either way.
    await client.multi().hsetnx(keys.rows, job.id!, JSON.stringify(scored)).rpush(keys.done, job.id!).exec();
    jobs++;
  };
  const worker = new Worker<JobData>(o.address.name, process, { connection: client, prefix: PREFIX, concurrency: o.concurrency, ...STALL, autorun: false });
  worker.on("error", () => {});
  const queue = o.drain ? new Queue(o.address.name, { connection: client, prefix: PREFIX }) : undefined;
  queue?.on("error", () => {});
  const running = worker.run();
  o.onReady?.();
  await new Promise<void>((resolveStop) => {
    const stop = () => resolveStop();
    o.signal?.addEventListener("abort", stop, { once: true });
    worker.on("failed", () => {
      if (stopWith) stop();
    });
    if (queue) {
      // Drain: done when nothing is waiting, running, delayed or retrying — twice in a row, a second apart
      // (a job whose worker died is "active" until the stall check returns it to the queue).
      let empty = 0;
      const timer = setInterval(() => {
        void queue
          .getJobCounts("waiting", "active", "delayed", "prioritized")
          .then((c) => {
            empty = Object.values(c).every((n) => n === 0) ? empty + 1 : 0;
            if (empty >= 2) {
              clearInterval(timer);
              stop();
            }
          })
          .catch(() => {});
      }, 1000);
      o.signal?.addEventListener("abort", () => clearInterval(timer), { once: true });
      worker.on("closing", () => clearInterval(timer));
    }
  });
  // A clean close waits for the jobs in hand and for Redis; with Redis gone it would wait for ever.
  const grace = o.graceMs ?? GRACE_MS;
  const clean = await within(Promise.all([worker.close(), running.catch(() => {}), queue?.close().catch(() => {})]), grace);
  if (!clean) void worker.close(true).catch(() => {});
  client.disconnect();
  if (stopWith) throw stopWith;
  return { jobs, ...(clean ? {} : { forced: true }) };
}
