/**
 * A progress bar on stderr (cli-progress) for long reads, shown only when stderr is a terminal.
 */
import { createRequire } from "node:module";
import type * as CliProgress from "cli-progress";

export interface Progress {
  /** Progress of `label`: `done` of `total` bytes (shown in MB), or items when `unit` is given. */
  update(label: string, done: number, total: number, unit?: string): void;
  stop(): void;
}

const silent: Progress = { update: () => {}, stop: () => {} };


/** A bar on `stream` when it is a terminal; nothing otherwise (a pipe or a file gets no escape codes). */
export function progressBar(stream: { isTTY?: boolean; write(s: string): unknown }): Progress {
  if (!stream.isTTY) return silent;
  const cp = createRequire(import.meta.url)("cli-progress") as typeof CliProgress;
  const bar = new cp.SingleBar(
    { format: "{label} |{bar}| {percentage}% · {value}/{total} {unit} · {rate}/s · {eta_formatted} left", stream: stream as NodeJS.WritableStream, hideCursor: true, clearOnComplete: true, etaBuffer: 50 },
    cp.Presets.shades_classic,
  );
  let current: string | undefined;
  let started = 0;
  return {
    update(label, done, total, unit) {
      const scale = (x: number) => (unit ? x : Math.round(x / 1e5) / 10);
      const seconds = Math.max(0.001, (Date.now() - started) / 1000);
      if (label !== current) {
        if (current !== undefined) bar.stop();
        started = Date.now();
        bar.start(scale(total), scale(done), { label: label.length > 30 ? `…${label.slice(-29)}` : label, unit: unit ?? "MB", rate: "0" });
        current = label;
      } else bar.update(scale(done), { rate: (scale(done) / seconds).toFixed(unit ? 0 : 1) });
    },
    stop() {
      if (current !== undefined) bar.stop();
      current = undefined;
    },
  };
}
