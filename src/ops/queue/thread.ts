/** A queue worker thread (`overask work -j N` starts N): serves the queue, then says how many jobs it took. */
import { parentPort, workerData } from "node:worker_threads";
import { OveraskError } from "../../errors.js";
import { serveQueue, type ServeOptions } from "./serve.js";

const o = workerData as Omit<ServeOptions, "signal" | "onReady">;
const stop = new AbortController();
parentPort!.on("message", (m: string) => {
  if (m === "stop") stop.abort();
});
serveQueue({ ...o, signal: stop.signal, onReady: () => parentPort!.postMessage({ ready: true }) }).then(
  (r) => parentPort!.postMessage({ done: r.jobs, ...(r.forced ? { forced: true } : {}) }),
  (e: unknown) => parentPort!.postMessage({ error: e instanceof OveraskError ? { name: e.name, message: e.message, file: e.file } : { name: "Error", message: e instanceof Error ? e.message : String(e) } }),
);
