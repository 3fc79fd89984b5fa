/** `overask sweep`: screening an inventory in parallel, resumably, with an optional HTML report. */
import { availableParallelism } from "node:os";
import { writeFileAtomic } from "../baseline/baseline-file.js";
import { sweepToHtml } from "../report/html.js";
import { wrap } from "../report/style.js";
import { sweep } from "../ops/sweep/sweep.js";
import { parseShard } from "../ops/sweep/inputs.js";
import { judgeOptions, loadJudge, DEFAULT_BASELINE } from "./check-command.js";
import { EXIT } from "./exit-codes.js";
import { UsageError } from "./learn-command.js";
import type { Io } from "./main.js";
import { progressBar } from "./progress.js";

type Opts = Record<string, string | string[] | boolean | undefined>;

export async function sweepCommand(source: string, o: Opts, io: Io): Promise<number> {
  const jobs = o.jobs === undefined ? availableParallelism() : Number(o.jobs);
  if (!Number.isInteger(jobs) || jobs < 1) throw new UsageError(`--jobs must be a whole number ≥ 1 (got "${o.jobs}")`);
  const shard = o.shard === undefined ? undefined : parseShard(o.shard as string);
  if (o.shard !== undefined && !shard) throw new UsageError(`--shard takes i/n with 1 ≤ i ≤ n (got "${o.shard}")`);
  const format = (o.format as "jsonl" | "csv" | undefined) ?? "jsonl";
  const { judge, baselinePath } = loadJudge(o);
  const options = judgeOptions(o);
  const bar = progressBar(io.stderr);
  let summary;
  try {
    summary = await sweep({
      source,
      output: o.output as string,
      format,
      baselinePath: (o.baseline as string | undefined) ?? DEFAULT_BASELINE,
      judge: options,
      jobs,
      resume: o.resume === true,
      ...(shard ? { shard } : {}),
      onProgress: (done, total) => bar.update("sweeping", done, total, "apps"),
    });
  } finally {
    bar.stop();
  }
  if (o.html) {
    writeFileAtomic(
      o.html as string,
      sweepToHtml({
        summary,
        baseline: judge.baseline,
        baselineName: baselinePath,
        caution: judge.file.caution,
        ...(judge.scorer ? { cutPoints: judge.scorer.cuts, baseRate: judge.scorer.model.evaluation.baseRate } : {}),
      }),
    );
  }
  const out: string[] = [];
  out.push(`Swept ${summary.inputs} inputs${shard ? ` (shard ${shard.index}/${shard.count})` : ""}: ${summary.scored} scored, ${summary.failed} could not be read${summary.skipped ? `, ${summary.skipped} kept from the earlier run` : ""}.`);
  const bands = ["high", "elevated", "low"].filter((b) => summary.byBand[b]).map((b) => `${summary.byBand[b]} ${b}`);
  if (bands.length) out.push(`Risk bands: ${bands.join(", ")}.`);
  if (summary.top.length) {
    out.push("Highest risks:");
    for (const t of summary.top.slice(0, 10)) out.push(`  ${(100 * t.risk).toFixed(0).padStart(3)}%  ${t.package ?? ""}  ${t.id}`);
  }
  out.push(`Results: ${o.output}${o.html ? `\nReport:  ${o.html}` : ""}`);
  if (judge.scorer) out.push(...wrap(judge.file.caution, 80, 0));
  io.stdout.write(`${out.join("\n")}\n`);
  return summary.failed > 0 ? EXIT.INPUT : EXIT.OK;
}
