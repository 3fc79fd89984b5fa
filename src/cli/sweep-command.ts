/** `overask sweep`: screening an inventory in parallel, resumably, with an optional HTML report. */
import { availableParallelism } from "node:os";
import { sweep } from "../ops/sweep/sweep.js";
import { sweepSummaryText } from "../report/sweep-summary.js";
import { EXIT } from "./exit-codes.js";
import type { Io } from "./io.js";
import { judgeOptions, type JudgingCliOptions } from "./judging.js";
import { progressBar } from "./progress.js";

export interface SweepCliOptions extends JudgingCliOptions {
  output: string;
  format: "jsonl" | "csv";
  html?: string;
  jobs?: number;
  resume?: boolean;
  shard?: { index: number; count: number };
}

export async function sweepCommand(source: string, o: SweepCliOptions, io: Io): Promise<number> {
  const bar = progressBar(io.stderr);
  let summary;
  try {
    summary = await sweep({
      source,
      output: o.output,
      format: o.format,
      ...(o.baseline ? { baseline: o.baseline } : {}),
      judge: judgeOptions(o),
      jobs: o.jobs ?? availableParallelism(),
      resume: o.resume === true,
      ...(o.shard ? { shard: o.shard } : {}),
      ...(o.html ? { html: o.html } : {}),
      onProgress: (done, total) => bar.update("sweeping", done, total, "apps"),
    });
  } finally {
    bar.stop();
  }
  io.stdout.write(sweepSummaryText(summary));
  return summary.failed > 0 ? EXIT.INPUT : EXIT.OK;
}
