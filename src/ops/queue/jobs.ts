/**
 * What a queued sweep keeps in Redis beside BullMQ's own keys, and what each job carries.
 *
 * - `<prefix>:<queue>:overask:meta` (hash): the sweep's fingerprint, its baseline's hash, its settings, its
 *   source and start time — what workers read once per sweep and what tells one sweep from another.
 * - `<prefix>:<queue>:overask:rows` (hash): job id → the finished row. Written with HSETNX, so a job that
 *   runs twice (a worker killed after finishing but before acknowledging) leaves one row.
 * - `<prefix>:<queue>:overask:done` (list): job ids in the order they finished (duplicates possible); the
 *   producer reads it from a cursor and fetches the rows it has not yet written.
 */
import { createHash } from "node:crypto";
import type { SweepInput, SweepSetup } from "../sweep/rows.js";

/** BullMQ's default key prefix, kept. */
export const PREFIX = "bull";

export function keysOf(queue: string): { meta: string; rows: string; done: string } {
  const base = `${PREFIX}:${queue}:overask`;
  return { meta: `${base}:meta`, rows: `${base}:rows`, done: `${base}:done` };
}

export interface SweepMeta {
  /** The sweep's fingerprint: its source, baseline and settings. */
  sweep: string;
  /** SHA-256 of the baseline file's bytes (first 16 hex digits). */
  baseline: string;
  setup: SweepSetup;
  source: string;
  started: string;
  total: number;
}

export interface JobData {
  input: SweepInput;
  sweep: string;
  baseline: string;
}

/** A short content hash (first 16 hex digits of SHA-256). */
export function shortHash(text: string | Uint8Array): string {
  return createHash("sha256").update(text).digest("hex").slice(0, 16);
}

/**
 * The job id of an input: its stable row id with its size and modification time, hashed (BullMQ ids may
 * not contain ":"), so that enqueuing the same inventory again adds nothing, and a changed file is new work.
 */
export function jobIdOf(input: Pick<SweepInput, "id" | "size" | "mtimeMs">): string {
  return `a${createHash("sha256").update(`${input.id}\0${input.size}\0${input.mtimeMs}`).digest("hex").slice(0, 24)}`;
}

/** Job options: a bad file is a failed row, not a failed job, so attempts only cover a worker's failure. */
export const JOB_OPTIONS = { attempts: 3, backoff: { type: "fixed", delay: 1000 }, removeOnComplete: true, removeOnFail: false } as const;

/** Worker options: a job whose worker died returns to the queue after the stall interval. */
export const STALL = { stalledInterval: 5000, lockDuration: 10000, maxStalledCount: 3 } as const;
