/** `overask trim`. */
import { loadJudge } from "../ops/baseline.js";
import { trim } from "../ops/trim.js";
import { pickStyle } from "../report/style.js";
import { trimToJson, trimToText } from "../report/trim-delta.js";
import { EXIT } from "./exit-codes.js";
import type { Io } from "./io.js";
import { judgeOptions, type JudgingCliOptions } from "./judging.js";
import { short } from "../report/format.js";

export interface TrimCliOptions extends JudgingCliOptions {
  format: "text" | "json";
  mergeReport?: string;
  source?: string;
  keep?: string[];
  write?: string;
  inPlace?: boolean;
  removeUsed?: boolean;
}

export async function trimCommand(file: string, o: TrimCliOptions, io: Io): Promise<number> {
  const { judge } = loadJudge(o.baseline);
  const { plan, written, unchanged, heldBack } = trim(judge, file, {
    judge: judgeOptions(o, judge.baseline),
    ...(o.mergeReport ? { mergeReport: o.mergeReport } : {}),
    ...(o.source ? { source: o.source } : {}),
    ...(o.keep ? { keep: o.keep } : {}),
    ...(o.write ? { write: o.write } : {}),
    ...(o.inPlace ? { inPlace: true } : {}),
    ...(o.removeUsed ? { removeUsed: true } : {}),
  });
  const caution = judge.scorer ? judge.file.caution : undefined;
  io.stdout.write(o.format === "json" ? trimToJson(plan, file) : trimToText(plan, file, caution, pickStyle(io.stdout, io.env)));
  if (unchanged) io.stderr.write(`overask: nothing to change in ${o.source ?? file}; left it as it was\n`);
  const changes = plan.candidates.length - (heldBack?.length ?? 0);
  if (written) io.stderr.write(`overask: wrote ${written} (${changes} change${changes === 1 ? "" : "s"})\n`);
  if (heldBack?.length) io.stderr.write(`overask: left ${heldBack.map(short).join(", ")}: the app's code uses ${heldBack.length === 1 ? "it" : "them"}; say --remove-used to remove ${heldBack.length === 1 ? "it" : "them"} too\n`);
  return EXIT.OK;
}
