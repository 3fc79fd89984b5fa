/** `overask work`: takes a queued sweep's jobs until stopped (SIGINT/SIGTERM finish the jobs in hand first) or drained. */
import { availableParallelism } from "node:os";
import { defaultBaselinePath } from "../ops/baseline.js";
import { parseQueueAddress } from "../ops/queue/address.js";
import { work } from "../ops/queue/work.js";
import { EXIT } from "./exit-codes.js";
import type { Io } from "./io.js";

export interface WorkCliOptions {
  jobs?: number;
  baseline?: string;
  drain?: boolean;
}

/** Jobs each thread runs at once: their Redis round trips overlap while one is judged. */
const IN_FLIGHT = 16;

export async function workCommand(url: string, o: WorkCliOptions, io: Io): Promise<number> {
  const address = parseQueueAddress(url, process.env);
  const jobs = o.jobs ?? availableParallelism();
  const stop = new AbortController();
  const onSignal = () => stop.abort();
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
      onReady: () => io.stderr.write(`overask: taking jobs from ${address.shown} with ${jobs} thread${jobs === 1 ? "" : "s"}${o.drain ? " until it is empty" : " (Ctrl-C to stop)"}\n`),
    });
    io.stderr.write(`overask: took ${r.jobs} job${r.jobs === 1 ? "" : "s"} from ${address.shown}\n`);
    return EXIT.OK;
  } finally {
    process.off("SIGINT", onSignal);
    process.off("SIGTERM", onSignal);
  }
}
