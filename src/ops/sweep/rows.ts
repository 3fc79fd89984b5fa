/**
 * Reading and judging one sweep input into its row (score/row.ts), and the row as the output file gets
 * it. A bad file becomes a failed row, never an exception.
 */
import { InputError } from "../../errors.js";
import { rowToCsv } from "../../report/csv.js";
import type { Judge, JudgeOptions } from "../../score/judge.js";
import type { Level } from "../../score/types.js";
import { failedRow, rowOf, type AppRow } from "../../score/row.js";
import { judgeFile } from "../check.js";
import { readManifestFile } from "../read-manifest.js";

export interface SweepInput {
  /** The path as listed (relative to the sweep root, or as given). */
  id: string;
  /** Where to read it. */
  file: string;
  category?: string;
  size: number;
  mtimeMs: number;
}

export type SweepFormat = "jsonl" | "csv";

/** Reads and judges one input, with its code evidence unless `readCode` is false. */
export function scoreInput(judge: Judge, input: SweepInput, options: JudgeOptions, readCode = true): AppRow {
  try {
    const m = readManifestFile(input.file, { resolveResources: false });
    return rowOf(input, judgeFile(judge, input.file, { ...(input.category ? { ...options, category: input.category } : options), readCode }, m));
  } catch (e) {
    if (e instanceof InputError) return failedRow(input, { kind: e.name, message: e.detail() });
    return failedRow(input, { kind: "InternalError", message: e instanceof Error ? e.message : String(e) });
  }
}

/** A scored input as the output gets it: its line, and the few fields the summary needs. */
export interface ScoredLine {
  id: string;
  line: string;
  status: AppRow["status"];
  package?: string;
  risk?: number;
  band?: string;
  fallback?: string;
  /** The most severe finding's level. */
  worst?: Level;
}

/** The summary fields of a row. */
export function briefOf(row: AppRow): Omit<ScoredLine, "line"> {
  return {
    id: row.id,
    status: row.status,
    ...(row.package !== undefined ? { package: row.package } : {}),
    ...(row.risk !== undefined ? { risk: row.risk } : {}),
    ...(row.band !== undefined ? { band: row.band } : {}),
    ...(row.fallback !== undefined ? { fallback: row.fallback } : {}),
    ...(row.counts ? { worst: row.counts.error ? "error" : row.counts.warning ? "warning" : row.counts.note ? "note" : undefined } : {}),
  } as Omit<ScoredLine, "line">;
}

/** Scores an input and serializes the row where it was scored (a worker), so that only a string travels. */
export function scoreToLine(judge: Judge, input: SweepInput, options: JudgeOptions, format: SweepFormat, readCode = true): ScoredLine {
  const row = scoreInput(judge, input, options, readCode);
  return { ...briefOf(row), line: format === "jsonl" ? JSON.stringify(row) : rowToCsv(row).slice(0, -1) };
}
