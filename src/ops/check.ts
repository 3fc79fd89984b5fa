/**
 * `check`: judging files (or pre-extracted records) against a baseline, and the gates a build uses
 * (`--fail-on`, `--max-risk`).
 */
import { InputError } from "../errors.js";
import type { CheckRun } from "../report/check.js";
import { parseCategoryIndex } from "../score/category.js";
import type { CheckResult, Judge, JudgeOptions } from "../score/judge.js";
import { scoreRecord, type RecordScore } from "../score/records.js";
import { levelRank, type Level } from "../score/types.js";
import { openCorpusFile, type CorpusFileOptions } from "./corpus.js";
import { readTextFile } from "./files.js";
import { readAppFile } from "./read-manifest.js";
import type { ReadOptions } from "../extract/read.js";
import { CorpusError } from "../errors.js";

/** Reads a `package,category` CSV (header optional). */
export function readCategoryIndex(path: string): Map<string, string> {
  return parseCategoryIndex(readTextFile(path, CorpusError), path);
}

export interface Gates {
  /** A finding at or above this level fails the run. */
  failOn?: Level;
  /** A risk above this probability fails the run. */
  maxRisk?: number;
}

/** Whether a judged app trips a gate. */
export function tripsGate(result: CheckRun["result"], gates: Gates): boolean {
  if (!result) return false;
  if (gates.failOn !== undefined && result.findings.some((f) => levelRank(f.level) >= levelRank(gates.failOn!))) return true;
  return gates.maxRisk !== undefined && result.risk !== undefined && result.risk.probability > gates.maxRisk;
}

export interface CheckOutcome {
  runs: CheckRun[];
  /** Some input could not be read. */
  failed: boolean;
  /** Some app tripped a gate. */
  gated: boolean;
}

/** Judging options for files on disk: also whether to read the app's dex code for code evidence. */
export type FileJudgeOptions = JudgeOptions & {
  /** Read the app's dex code (archives only) and judge with its evidence; default true (`--no-code`: false). */
  readCode?: boolean;
};

/** Reads a file's manifest and, unless told not to, its code (one opening of the file); then judges it. */
export function judgeFile(judge: Judge, file: string, options: FileJudgeOptions, read: ReadOptions = {}): CheckResult {
  const { readCode = true, ...rest } = options;
  const { manifest, dexes } = readAppFile(file, read, readCode);
  return judge.judge(manifest, dexes?.length ? { ...rest, dexes } : rest);
}

/** Judges each file; an unreadable one is a run with its error, and the rest are still judged. */
export function checkFiles(judge: Judge, files: readonly string[], options: FileJudgeOptions, gates: Gates = {}, onError?: (file: string, e: InputError) => void): CheckOutcome {
  const runs: CheckRun[] = [];
  let failed = false;
  for (const file of files) {
    try {
      runs.push({ file, result: judgeFile(judge, file, options) });
    } catch (e) {
      if (!(e instanceof InputError)) throw e;
      runs.push({ file, error: { kind: e.name, message: e.detail() } });
      onError?.(file, e);
      failed = true;
    }
  }
  return { runs, failed, gated: runs.some((r) => tripsGate(r.result, gates)) };
}

export interface RecordsOutcome {
  /** Rows read, and how many of them were scored and rejected. */
  rows: number;
  records: number;
  rejected: number;
  firstReject?: { line: number; reason: string };
  gated: boolean;
}

/**
 * Scores pre-extracted records (the corpus formats of `learn`), handing each score to `emit` as it is
 * made: inventories extracted elsewhere are screened in constant memory.
 */
export async function checkRecords(judge: Judge, path: string, corpus: CorpusFileOptions, options: JudgeOptions, gates: Gates, emit: (score: RecordScore) => void): Promise<RecordsOutcome> {
  const opened = openCorpusFile(path, corpus);
  let gated = false;
  let records = 0;
  for await (const record of opened.records) {
    const score = scoreRecord(judge, record, options.category);
    records++;
    if (gates.maxRisk !== undefined && score.risk !== undefined && score.risk > gates.maxRisk) gated = true;
    emit(score);
  }
  const rep = opened.report;
  return { rows: rep.rows, records, rejected: rep.rejected, ...(rep.rejects[0] ? { firstReject: rep.rejects[0] } : {}), gated };
}
