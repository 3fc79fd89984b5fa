/** `overask sweep`: screening an inventory in parallel, resumably, with an optional HTML report. */
import { availableParallelism } from "node:os";
import { loadJudge } from "../ops/baseline.js";
import { sweep } from "../ops/sweep/sweep.js";
import { sweepSummaryText } from "../report/sweep-summary.js";
import type { Level } from "../score/types.js";
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
  failOn?: Level;
  maxRisk?: number;
}

export async function sweepCommand(source: string, o: SweepCliOptions, io: Io): Promise<number> {
  const loaded = loadJudge(o.baseline);
  const { readCode, ...judge } = judgeOptions(o, loaded.judge.baseline);
  const bar = progressBar(io.stderr);
  let summary;
  try {
    summary = await sweep({
      source,
      output: o.output,
      format: o.format,
      loaded,
      judge,
      readCode: readCode !== false,
      jobs: o.jobs ?? availableParallelism(),
      resume: o.resume === true,
      ...(o.shard ? { shard: o.shard } : {}),
      ...(o.html ? { html: o.html } : {}),
      gates: { ...(o.failOn ? { failOn: o.failOn } : {}), ...(o.maxRisk !== undefined ? { maxRisk: o.maxRisk } : {}) },
      onProgress: (done, total) => bar.update("sweeping", done, total, "apps"),
    });
  } finally {
    bar.stop();
  }
  io.stdout.write(sweepSummaryText(summary));
  // As for check: an input that could not be read (3) outranks a gate (1).
  return summary.failed > 0 ? EXIT.INPUT : summary.gated ? EXIT.GATE : EXIT.OK;
}
