/** `overask check`: reading inputs, judging them, printing, and the exit code that gates a build. */
import { join } from "node:path";
import { packageRoot } from "../ops/package-root.js";
import { readBaselineFile } from "../baseline/baseline-file.js";
import { openCorpus } from "../baseline/corpus/index.js";
import { InputError } from "../errors.js";
import { readManifestFile } from "../extract/index.js";
import { checkToJson, checkToText, type CheckRun } from "../report/check.js";
import { checkToSarif } from "../report/sarif.js";
import { pickStyle } from "../report/style.js";
import { readCategoryIndex } from "../score/category.js";
import { Judge, type JudgeOptions } from "../score/judge.js";
import { scoreRecord } from "../score/records.js";
import { checkById } from "../score/registry.js";
import { levelRank, type Level } from "../score/types.js";
import { EXIT } from "./exit-codes.js";
import { corpusOptions, UsageError } from "./learn-command.js";
import type { Io } from "./main.js";

export const DEFAULT_BASELINE = join(packageRoot(), "baselines/default.json");

type Opts = Record<string, string | string[] | boolean | undefined>;

export function judgeOptions(o: Opts): JudgeOptions {
  const options: JudgeOptions = {};
  if (o.category) options.category = o.category as string;
  if (o.categories) options.categoryIndex = readCategoryIndex(o.categories as string);
  const levels = new Map<string, Level | "off">();
  for (const spec of (o.level as string[] | undefined) ?? []) {
    const m = /^([\w-]+)=(error|warning|note|off)$/.exec(spec);
    if (!m) throw new UsageError(`--level takes check-id=error|warning|note|off (got "${spec}")`);
    if (!checkById(m[1])) throw new UsageError(`--level names an unknown check "${m[1]}"`);
    levels.set(m[1], m[2] as Level | "off");
  }
  options.levels = levels;
  return options;
}

export function loadJudge(o: Opts): { judge: Judge; baselinePath: string } {
  const baselinePath = (o.baseline as string | undefined) ?? DEFAULT_BASELINE;
  return { judge: new Judge(readBaselineFile(baselinePath)), baselinePath: o.baseline ? baselinePath : "the bundled default baseline (baselines/default.json)" };
}

export async function checkCommand(files: string[], o: Opts, io: Io): Promise<number> {
  const failOn = o.failOn as Level | undefined;
  const maxRisk = o.maxRisk === undefined ? undefined : Number(o.maxRisk);
  if (maxRisk !== undefined && !(maxRisk >= 0 && maxRisk <= 1)) throw new UsageError(`--max-risk must be between 0 and 1 (got "${o.maxRisk}")`);
  const { judge, baselinePath } = loadJudge(o);
  const options = judgeOptions(o);

  if (o.records) return recordsCommand(o.records as string, o, judge, options, maxRisk, io);
  if (files.length === 0) throw new UsageError("give files to check, or --records CORPUS");

  const runs: CheckRun[] = [];
  let failed = false;
  for (const file of files) {
    try {
      runs.push({ file, result: judge.judge(readManifestFile(file), options) });
    } catch (e) {
      if (!(e instanceof InputError)) throw e;
      runs.push({ file, error: { kind: e.name, message: e.message } });
      io.stderr.write(`overask: ${e.describe()}\n`);
      failed = true;
    }
  }
  const info = { baseline: baselinePath, caution: judge.file.caution };
  const format = (o.format as string) ?? "text";
  io.stdout.write(format === "json" ? checkToJson(runs, info) : format === "sarif" ? checkToSarif(runs, info) : checkToText(runs, info, pickStyle(io.stdout, io.env)));

  const gated = runs.some(
    (r) =>
      (failOn !== undefined && r.result?.findings.some((f) => levelRank(f.level) >= levelRank(failOn))) ||
      (maxRisk !== undefined && r.result?.risk !== undefined && r.result.risk.probability > maxRisk),
  );
  if (failed) return EXIT.INPUT;
  return gated ? EXIT.GATE : EXIT.OK;
}

async function recordsCommand(path: string, o: Opts, judge: Judge, options: JudgeOptions, maxRisk: number | undefined, io: Io): Promise<number> {
  // --format is the output format here; the corpus format is told from its content.
  const { format: _output, ...rest } = o;
  const corpus = openCorpus(path, corpusOptions(rest as Record<string, string | string[] | undefined>));
  let gated = false;
  let buffer = "";
  for await (const record of corpus.records) {
    const score = scoreRecord(judge, record, options.category);
    if (maxRisk !== undefined && score.risk !== undefined && score.risk > maxRisk) gated = true;
    buffer += `${JSON.stringify(score)}\n`;
    if (buffer.length > 1 << 16) {
      io.stdout.write(buffer);
      buffer = "";
    }
  }
  io.stdout.write(buffer);
  const rep = corpus.report;
  if (rep.rejected > 0) {
    io.stderr.write(`overask: ${path}: ${rep.rejected} of ${rep.rows} records could not be read; first at line ${rep.rejects[0].line}: ${rep.rejects[0].reason}\n`);
    return EXIT.INPUT;
  }
  return gated ? EXIT.GATE : EXIT.OK;
}

