/**
 * `sweep --queue`: the producer of a distributed sweep. It lists the inputs, enqueues one BullMQ job per
 * input (job id from the stable row id, size and modification time: enqueuing again adds nothing), waits
 * while any number of `overask work` processes take the jobs, and collects the finished rows from Redis
 * into the same outputs as a local sweep: each input exactly once, however often its job ran.
 */
import { readFileSync } from "node:fs";
import { resolve } from "node:path";
import { Queue } from "bullmq";
import type { Redis } from "ioredis";
import { UsageError } from "../../errors.js";
import type { JudgeOptions } from "../../score/judge.js";
import { failedRow } from "../../score/row.js";
import type { LoadedJudge } from "../baseline.js";
import { scoredLine, setupOf, type ScoredLine, type SweepInput } from "../sweep/rows.js";
import { SweepOutput, sweepInputs, type OutputOptions, type SweepSummary } from "../sweep/sweep.js";
import type { QueueAddress } from "./address.js";
import { JOB_OPTIONS, jobIdOf, keysOf, PREFIX, shortHash, type JobData, type SweepMeta } from "./jobs.js";
import { connectRedis } from "./redis.js";

export interface QueueSweepOptions extends OutputOptions {
  source: string;
  address: QueueAddress;
  loaded: LoadedJudge;
  judge: JudgeOptions;
  readCode: boolean;
  /** Drop another sweep's jobs found in the queue instead of refusing. */
  clearQueue: boolean;
  /** How often to look for finished rows, in ms. */
  pollMs?: number;
  onProgress?: (done: number, total: number, counts: Record<string, number>) => void;
  /** A line for the user while waiting (no worker yet). */
  onNote?: (line: string) => void;
}

const ENQUEUE_CHUNK = 500;
const FETCH_CHUNK = 1000;
/** Queue states that mean work is still to come. */
const OPEN_STATES = ["waiting", "active", "delayed", "prioritized", "waiting-children"] as const;

export async function queueSweep(o: QueueSweepOptions): Promise<SweepSummary> {
  const { inputs, notManifests } = sweepInputs(o.source, o.shard);
  // Workers elsewhere read the same paths: make them absolute (they must be on storage every worker reads).
  for (const i of inputs) i.file = resolve(i.file);
  const baseline = shortHash(readFileSync(o.loaded.baselinePath));
  const setup = setupOf(o.judge, o.format, o.readCode);
  const fingerprint = shortHash(JSON.stringify({ source: resolve(o.source), shard: o.shard ?? null, baseline, setup }));
  const client = await connectRedis(o.address);
  const queue = new Queue(o.address.name, { connection: client, prefix: PREFIX });
  queue.on("error", () => {});
  const keys = keysOf(o.address.name);
  try {
    await claimQueue(client, queue, o, { sweep: fingerprint, baseline, setup, source: resolve(o.source), started: new Date().toISOString(), total: inputs.length }, keys.meta);
    const out = new SweepOutput(o, inputs);
    try {
      await run(o, client, queue, keys, inputs, out, { sweep: fingerprint, baseline });
    } finally {
      out.close();
    }
    // Every row is in the output: the queue's work is done, and its keys go.
    await queue.obliterate({ force: true });
    await client.del(keys.meta, keys.rows, keys.done);
    return out.finish(o.loaded, inputs.length, notManifests);
  } finally {
    await queue.close().catch(() => {});
    client.disconnect();
  }
}

/** Takes the queue for this sweep: refuses one holding another sweep's jobs unless told to clear it. */
async function claimQueue(client: Redis, queue: Queue, o: QueueSweepOptions, meta: SweepMeta, metaKey: string): Promise<void> {
  const found = await client.hgetall(metaKey);
  const counts = await queue.getJobCounts(...OPEN_STATES, "failed", "completed");
  const busy = Object.values(counts).some((n) => n > 0);
  if (found.sweep === meta.sweep) return; // the same sweep again: carry on where it is
  if (found.sweep || busy) {
    if (!o.clearQueue) {
      const what = found.sweep ? `another sweep's jobs (of ${found.source}, started ${found.started})` : "jobs that are not this sweep's";
      throw new UsageError(`queue ${o.address.shown} already holds ${what}; name another queue, or give --clear-queue to drop them`);
    }
    await queue.obliterate({ force: true });
    const k = keysOf(o.address.name);
    await client.del(k.meta, k.rows, k.done);
  }
  await client.hset(metaKey, { sweep: meta.sweep, baseline: meta.baseline, setup: JSON.stringify(meta.setup), source: meta.source, started: meta.started, total: String(meta.total) });
}

async function run(
  o: QueueSweepOptions,
  client: Redis,
  queue: Queue,
  keys: ReturnType<typeof keysOf>,
  inputs: SweepInput[],
  out: SweepOutput,
  tag: { sweep: string; baseline: string },
): Promise<void> {
  const pending = new Map<string, SweepInput>();
  for (const i of inputs) if (!out.kept.has(i.id)) pending.set(jobIdOf(i), i);
  let cursor = 0;
  const total = inputs.length;
  const collect = async (): Promise<number> => {
    let got = 0;
    for (;;) {
      const ids = await client.lrange(keys.done, cursor, cursor + FETCH_CHUNK - 1);
      cursor += ids.length;
      // A job that ran twice is listed twice; its row is written once.
      const fresh = [...new Set(ids)].filter((id) => pending.has(id));
      if (fresh.length) {
        const lines = await client.hmget(keys.rows, ...fresh);
        const batch: ScoredLine[] = [];
        fresh.forEach((id, k) => {
          const line = lines[k];
          if (line === null) return;
          batch.push(JSON.parse(line) as ScoredLine);
          pending.delete(id);
        });
        out.write(batch);
        got += batch.length;
      }
      if (ids.length < FETCH_CHUNK) return got;
    }
  };
  // Rows finished in an earlier run of this same sweep are collected first, and not enqueued again.
  await collect();
  await enqueue(queue, [...pending.entries()], tag);
  const started = Date.now();
  let noted = false;
  let idleRounds = 0;
  for (;;) {
    await collect();
    const counts = await queue.getJobCounts(...OPEN_STATES, "failed");
    o.onProgress?.(total - pending.size, total, counts);
    if (pending.size === 0) return;
    const open = OPEN_STATES.reduce((n, s) => n + (counts[s] ?? 0), 0);
    if (open === 0) {
      // Nothing left to run: the jobs that failed for good become failed rows; vanished ones are enqueued again.
      if ((counts.failed ?? 0) > 0) await failedRows(queue, pending, out);
      if (pending.size === 0) continue;
      if (++idleRounds >= 3) {
        await enqueue(queue, [...pending.entries()], tag);
        idleRounds = 0;
      }
    } else idleRounds = 0;
    if (!noted && Date.now() - started > 10_000 && total - pending.size === 0 && (await queue.getWorkersCount()) === 0) {
      noted = true;
      o.onNote?.(`waiting: no worker is taking jobs from ${o.address.shown}; start \`overask work ${o.address.shown}\` on machines that can read the inputs`);
    }
    await new Promise((r) => setTimeout(r, o.pollMs ?? 200));
  }
}

async function enqueue(queue: Queue, jobs: [string, SweepInput][], tag: { sweep: string; baseline: string }): Promise<void> {
  for (let i = 0; i < jobs.length; i += ENQUEUE_CHUNK) {
    await queue.addBulk(
      jobs.slice(i, i + ENQUEUE_CHUNK).map(([jobId, input]) => ({ name: "app", data: { input, ...tag } satisfies JobData, opts: { ...JOB_OPTIONS, jobId } })),
    );
  }
}

/** Jobs that failed for good (every attempt's worker failed): a failed row each, with the reason. */
async function failedRows(queue: Queue, pending: Map<string, SweepInput>, out: SweepOutput): Promise<void> {
  const failed = await queue.getFailed(0, -1);
  const batch: ScoredLine[] = [];
  for (const job of failed) {
    const input = job.id ? pending.get(job.id) : undefined;
    if (!input) continue;
    batch.push(scoredLine(failedRow(input, { kind: "QueueError", message: `no worker finished it in ${job.attemptsMade} attempts: ${job.failedReason}` }), out.format));
    pending.delete(job.id!);
  }
  out.write(batch);
}

