/** `overask learn` and `overask fold`: option parsing and output, around src/baseline. */
import { appendFileSync, writeFileSync } from "node:fs";
import { foldBaselines, readBaselineFile, serializeBaseline, writeFileAtomic } from "../baseline/baseline-file.js";
import type { CorpusOptions } from "../baseline/corpus/types.js";
import { learn } from "../baseline/learn.js";
import { OutputError } from "../errors.js";
import { baselineSummary } from "../report/learn.js";
import { pickStyle } from "../report/style.js";
import { EXIT } from "./exit-codes.js";
import type { Io } from "./main.js";
import { progressBar } from "./progress.js";

type Opts = Record<string, string | string[] | undefined>;

/** A usage error found after commander's own checks (a bad number, a malformed alias). */
export class UsageError extends Error {
  override name = "UsageError";
}

function num(o: Opts, key: string, check: (n: number) => boolean, what: string): number {
  const v = Number(o[key]);
  if (!Number.isFinite(v) || !check(v)) throw new UsageError(`--${key.replace(/[A-Z]/g, (c) => `-${c.toLowerCase()}`)} must be ${what} (got "${o[key]}")`);
  return v;
}

export function corpusOptions(o: Opts): CorpusOptions {
  const c: CorpusOptions = {};
  if (o.format) c.format = o.format as CorpusOptions["format"];
  if (o.idField) c.idField = o.idField as string;
  if (o.categoryField) c.categoryField = o.categoryField as string;
  if (o.permissionsField) c.permissionsField = o.permissionsField as string;
  if (o.labelField ?? o.labelColumn) c.labelField = (o.labelField ?? o.labelColumn) as string;
  if (o.positive) c.positive = o.positive as string[];
  if (o.columnsFrom) c.columnsFrom = o.columnsFrom as string;
  if (o.columnsKind) c.columnsKind = o.columnsKind as string;
  return c;
}

export async function learnCommand(corpora: string[], o: Opts, io: Io): Promise<number> {
  const aliases = new Map<string, string>();
  for (const a of (o.alias as string[] | undefined) ?? []) {
    const m = /^([^=]+)=(.+)$/.exec(a);
    if (!m) throw new UsageError(`--alias takes from=to (got "${a}")`);
    aliases.set(m[1].trim(), m[2].trim());
  }
  const parameters = {
    prior: { method: o.prior as "fixed" | "empirical-bayes", strength: num(o, "priorStrength", (n) => n >= 0, "a number ≥ 0") },
    confidence: num(o, "confidence", (n) => n > 0 && n < 1, "between 0 and 1"),
    minSupport: num(o, "minSupport", (n) => Number.isInteger(n) && n >= 0, "a whole number ≥ 0"),
    uncommonBelow: num(o, "uncommonBelow", (n) => n > 0 && n < 1, "between 0 and 1"),
  };
  const model = {
    seed: num(o, "seed", Number.isInteger, "a whole number"),
    folds: num(o, "folds", (n) => Number.isInteger(n) && n >= 2, "a whole number ≥ 2"),
    maxRows: num(o, "maxTrainRows", (n) => Number.isInteger(n) && n >= 10, "a whole number ≥ 10"),
  };
  const rejectLimit = num(o, "rejectLimit", (n) => n >= 0 && n <= 1, "between 0 and 1");
  const rejectsFile = o.rejects as string | undefined;
  if (rejectsFile) {
    try {
      writeFileSync(rejectsFile, "file,line,reason\n");
    } catch (e) {
      throw new OutputError(`cannot be written (${(e as Error).message})`, { file: rejectsFile });
    }
  }
  const options = corpusOptions(o);
  const progress = progressBar(io.stderr);
  try {
    const result = await learn({
      frequencies: corpora.map((path) => ({ path, options, ...(o.licence ? { licence: o.licence as string } : {}) })),
      ...(o.labels ? { labels: { path: o.labels as string, options, ...(o.labelsLicence ? { licence: o.labelsLicence as string } : {}) } } : {}),
      ...(o.labelsName ? { labelsName: o.labelsName as string } : {}),
      parameters,
      aliases,
      rejectLimit,
      model,
      onProgress: (source, done, total) => progress.update(source, done, total),
      ...(rejectsFile ? { onReject: (source: string, line: number, reason: string) => appendFileSync(rejectsFile, `${csv(source)},${line},${csv(reason)}\n`) } : {}),
    });
    progress.stop();
    writeFileAtomic(o.output as string, serializeBaseline(result.file));
    io.stdout.write(baselineSummary(result.file, o.output as string, pickStyle(io.stdout, io.env)));
    return EXIT.OK;
  } finally {
    progress.stop();
  }
}

export async function foldCommand(files: string[], output: string, io: Io): Promise<number> {
  const inputs = files.map((path) => ({ path, file: readBaselineFile(path) }));
  const folded = foldBaselines(inputs);
  writeFileAtomic(output, serializeBaseline(folded));
  io.stdout.write(`Folded ${files.length} baselines into ${output}: ${folded.counts.pooled.apps} apps in ${Object.keys(folded.counts.categories).length} categories.\n`);
  for (const n of folded.provenance.notes.slice(-1)) if (folded.model === null && inputs.some((i) => i.file.model)) io.stderr.write(`overask: note: ${n}\n`);
  return EXIT.OK;
}

function csv(s: string): string {
  return /[",\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

