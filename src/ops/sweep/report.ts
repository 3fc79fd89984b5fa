/**
 * Writing a sweep's HTML report from its output file, in two streaming passes (score/sweep-digest.ts), so
 * that a sweep of any size makes a page of bounded size in bounded memory.
 */
import { closeSync, openSync, readSync } from "node:fs";
import { sweepToHtml } from "../../report/html/sweep-report.js";
import type { AppRow } from "../../score/row.js";
import { countRequests, SweepDigester } from "../../score/sweep-digest.js";
import type { LoadedJudge } from "../baseline.js";
import { writeFileAtomic } from "../files.js";
import { rowFromLine } from "./resume.js";
import type { SweepFormat } from "./rows.js";

/** Calls `each` with every complete row of an output file, reading it in 1 MiB chunks. */
export function forEachRow(path: string, format: SweepFormat, each: (row: AppRow) => void): void {
  const fd = openSync(path, "r");
  try {
    const buf = Buffer.alloc(1 << 20);
    let rest = "";
    for (let n; (n = readSync(fd, buf, 0, buf.length, null)) > 0; ) {
      const text = rest + buf.toString("utf8", 0, n);
      const lines = text.split("\n");
      rest = lines.pop()!;
      for (const line of lines) {
        const row = line ? rowFromLine(line, format) : undefined;
        if (row) each(row);
      }
    }
    // A last line without its newline was cut short by an interruption: not a complete row.
  } finally {
    closeSync(fd);
  }
}

export function writeSweepReport(o: { output: string; format: SweepFormat; html: string; loaded: LoadedJudge; inputs: number }): void {
  const digester = new SweepDigester();
  forEachRow(o.output, o.format, (r) => digester.add(r));
  const requests = countRequests(digester.heatmapPermissions());
  forEachRow(o.output, o.format, (r) => requests.add(r));
  const { judge, baselineName } = o.loaded;
  writeFileAtomic(
    o.html,
    sweepToHtml({
      digest: digester.finish(judge.baseline, requests.shares),
      results: o.output,
      inputs: o.inputs,
      baselineName,
      caution: judge.file.caution,
      ...(judge.scorer ? { cutPoints: judge.scorer.cuts, baseRate: judge.scorer.model.evaluation.baseRate } : {}),
    }),
  );
}
