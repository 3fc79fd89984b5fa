/** `overask sweep`: screening an inventory in parallel (or through a queue), resumably, with an optional HTML report. */
import { availableParallelism } from "node:os";
import { loadJudge } from "../ops/baseline.js";
import { parseQueueAddress } from "../ops/queue/address.js";
import { sweep, type SweepSummary } from "../ops/sweep/sweep.js";
import { sweepSummaryText } from "../report/sweep-summary.js";
import { gatesOf } from "../score/gates.js";
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
  queue?: string;
  clearQueue?: boolean;
}

export async function sweepCommand(source: string, o: SweepCliOptions, io: Io): Promise<number> {
  const address = o.queue ? parseQueueAddress(o.queue, process.env) : undefined;
  const loaded = loadJudge(o.baseline);
  const { readCode, ...judge } = judgeOptions(o, loaded.judge.baseline);
  const bar = progressBar(io.stderr);
  const common = {
    source,
    output: o.output,
    format: o.format,
    loaded,
    judge,
    readCode: readCode !== false,
    resume: o.resume === true,
    ...(o.shard ? { shard: o.shard } : {}),
    ...(o.html ? { html: o.html } : {}),
    gates: gatesOf(o),
  };
  let summary: SweepSummary;
  try {
    if (address) {
      const { queueSweep } = await import("../ops/queue/produce.js");
      summary = await queueSweep({
        ...common,
        address,
        clearQueue: o.clearQueue === true,
        onProgress: (done, total) => bar.update(`sweeping via ${address.name}`, done, total, "apps"),
        onNote: (line) => {
          bar.stop();
          io.stderr.write(`overask: ${line}\n`);
        },
      });
    } else {
      summary = await sweep({ ...common, jobs: o.jobs ?? availableParallelism(), onProgress: (done, total) => bar.update("sweeping", done, total, "apps") });
    }
  } finally {
    bar.stop();
  }
  io.stdout.write(sweepSummaryText(summary));
  // As for check: an input that could not be read (3) outranks a gate (1).
  return summary.failed > 0 ? EXIT.INPUT : summary.gated ? EXIT.GATE : EXIT.OK;
}
