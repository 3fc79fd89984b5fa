/**
 * `check`: judging files (or pre-extracted records) against a baseline, and the gates a build uses
 * (`--fail-on`, `--max-risk`).
 */
import { InputError } from "../errors.js";
import type { CheckRun } from "../report/check.js";
import { parseCategoryIndex } from "../score/category.js";
import type { CheckResult, Judge, JudgeOptions } from "../score/judge.js";
import { scoreRecord, type RecordScore } from "../score/records.js";
import { tripsGate, worstOf, type Gates } from "../score/gates.js";
import { openCorpusFile, type CorpusFileOptions } from "./corpus.js";
import { readTextFile } from "./files.js";
import { readAppFile } from "./read-manifest.js";
import type { ReadOptions } from "../extract/read.js";
import { CorpusError } from "../errors.js";

/** Reads a `package,category` CSV (header optional). */
export function readCategoryIndex(path: string): Map<string, string> {
  return parseCategoryIndex(readTextFile(path, CorpusError), path);
}

/** Whether a judged app trips a gate. */
function tripsOn(result: CheckRun["result"], gates: Gates): boolean {
  return result !== undefined && tripsGate({ worst: worstOf(result.findings.map((f) => f.level)), ...(result.risk ? { risk: result.risk.probability } : {}) }, gates);
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
  return { runs, failed, gated: runs.some((r) => tripsOn(r.result, gates)) };
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
    const score = scoreRecord(judge, record, { ...(options.category ? { category: options.category } : {}), ...(options.levels ? { levels: options.levels } : {}) });
    records++;
    if (tripsGate(score, gates)) gated = true;
    emit(score);
  }
  const rep = opened.report;
  return { rows: rep.rows, records, rejected: rep.rejected, ...(rep.rejects[0] ? { firstReject: rep.rejects[0] } : {}), gated };
}
