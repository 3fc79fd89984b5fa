/** `overask work`: takes a queued sweep's jobs until stopped (SIGINT/SIGTERM finish the jobs in hand first) or drained. */
import { availableParallelism } from "node:os";
import { defaultBaselinePath } from "../ops/baseline.js";
import { parseQueueAddress } from "../ops/queue/address.js";
import { GRACE_MS } from "../ops/queue/serve.js";
import { work } from "../ops/queue/work.js";
import { EXIT } from "./exit-codes.js";
import type { Io } from "./io.js";

export interface WorkCliOptions {
  jobs?: number;
  baseline?: string;
  drain?: boolean;
  /** Seconds a stop waits for the jobs in hand and a clean close (--grace). */
  grace?: number;
}

/** Jobs each thread runs at once: their Redis round trips overlap while one is judged. */
const IN_FLIGHT = 16;

export async function workCommand(url: string, o: WorkCliOptions, io: Io): Promise<number> {
  const address = parseQueueAddress(url, process.env);
  const jobs = o.jobs ?? availableParallelism();
  const stop = new AbortController();
  const graceMs = Math.round(1000 * (o.grace ?? GRACE_MS / 1000));
  // The first signal stops taking jobs and lets those in hand finish (up to the grace period); a second
  // one ends the process at once.
  const onSignal = () => {
    if (stop.signal.aborted) {
      io.stderr.write("overask: stopped at once (second signal); jobs in hand return to the queue after the stall check\n");
      process.exit(EXIT.STOPPED);
    }
    io.stderr.write(`overask: stopping: finishing the jobs in hand (up to ${graceMs / 1000} s; a second signal stops at once)\n`);
    stop.abort();
    process.once("SIGINT", onSignal);
    process.once("SIGTERM", onSignal);
  };
  process.once("SIGINT", onSignal);
  process.once("SIGTERM", onSignal);
  try {
    const r = await work({
      address,
      baselinePath: o.baseline ?? defaultBaselinePath(),
      jobs,
      concurrency: IN_FLIGHT,
      drain: o.drain === true,
      signal: stop.signal,
      graceMs,
      onReady: () => io.stderr.write(`overask: taking jobs from ${address.shown} with ${jobs} thread${jobs === 1 ? "" : "s"}${o.drain ? " until it is empty" : " (Ctrl-C to stop)"}\n`),
    });
    io.stderr.write(`overask: took ${r.jobs} job${r.jobs === 1 ? "" : "s"} from ${address.shown}\n`);
    if (r.forced) {
      io.stderr.write(`overask: ${address.shown}: not closed cleanly within ${graceMs / 1000} s (is Redis reachable?); jobs in hand return to the queue after the stall check\n`);
      return EXIT.STOPPED;
    }
    return EXIT.OK;
  } finally {
    process.off("SIGINT", onSignal);
    process.off("SIGTERM", onSignal);
  }
}
