/**
 * `overask work`: takes a queued sweep's jobs with `jobs` threads, each a BullMQ worker of its own (the
 * judging is synchronous, so threads, not a worker's concurrency, use the cores).
 */
import { existsSync } from "node:fs";
import { join } from "node:path";
import { Worker } from "node:worker_threads";
import { InputError, QueueError } from "../../errors.js";
import { packageRoot } from "../package-root.js";
import { GRACE_MS, serveQueue, type ServeOptions, type ServeResult } from "./serve.js";

export interface WorkOptions extends ServeOptions {
  /** Threads, each with its own worker and connection. */
  jobs: number;
}

type ThreadMessage = { ready: true } | { done: number; forced?: boolean } | { error: { name: string; message: string; file?: string } };

export async function work(o: WorkOptions): Promise<ServeResult> {
  const { jobs, ...serve } = o;
  if (jobs <= 1) return serveQueue(serve);
  const file = join(packageRoot(), "dist/bundle/queue-worker.js");
  if (!existsSync(file)) throw new InputError("the queue worker is not built; run npm run build", { file });
  const { signal, onReady, ...data } = serve;
  let ready = 0;
  const results = await Promise.all(
    Array.from({ length: jobs }, () => {
      const t = new Worker(file, { workerData: data });
      return new Promise<ThreadMessage>((resolve, reject) => {
        signal?.addEventListener(
          "abort",
          () => {
            t.postMessage("stop");
            // A thread that cannot close within its grace (and a little more) is ended from here.
            const kill = setTimeout(() => {
              resolve({ done: 0, forced: true });
              void t.terminate();
            }, (serve.graceMs ?? GRACE_MS) + 1000);
            kill.unref();
          },
          { once: true },
        );
        t.on("message", (m: ThreadMessage) => {
          if ("ready" in m) {
            if (++ready === jobs) onReady?.();
            return;
          }
          resolve(m);
          void t.terminate();
        });
        t.on("error", reject);
      });
    }),
  );
  const failure = results.find((r): r is Extract<ThreadMessage, { error: unknown }> => "error" in r);
  if (failure) throw failure.error.name === "QueueError" ? new QueueError(failure.error.message, { file: failure.error.file ?? o.address.shown }) : new InputError(failure.error.message, { file: failure.error.file ?? o.address.shown });
  const forced = results.some((r) => "done" in r && r.forced);
  return { jobs: results.reduce((n, r) => n + ("done" in r ? r.done : 0), 0), ...(forced ? { forced: true } : {}) };
}
