/**
 * A progress bar on stderr (cli-progress) for long reads, shown only when stderr is a terminal.
 */
import { createRequire } from "node:module";
import type * as CliProgress from "cli-progress";

export interface Progress {
  update(label: string, done: number, total: number): void;
  stop(): void;
}

const silent: Progress = { update: () => {}, stop: () => {} };

export function progressBar(stream: { isTTY?: boolean }): Progress {
  if (!stream.isTTY) return silent;
  const cp = createRequire(import.meta.url)("cli-progress") as typeof CliProgress;
  const bar = new cp.SingleBar(
    { format: "{label} |{bar}| {percentage}% · {value}/{total} MB · {eta_formatted} left", stream: process.stderr, hideCursor: true, clearOnComplete: true, etaBuffer: 50 },
    cp.Presets.shades_classic,
  );
  let current: string | undefined;
  return {
    update(label, done, total) {
      const mb = (x: number) => Math.round(x / 1e5) / 10;
      if (label !== current) {
        if (current !== undefined) bar.stop();
        bar.start(mb(total), mb(done), { label: label.length > 30 ? `…${label.slice(-29)}` : label });
        current = label;
      } else bar.update(mb(done));
    },
    stop() {
      if (current !== undefined) bar.stop();
      current = undefined;
    },
  };
}
