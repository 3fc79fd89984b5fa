/**
 * Reading and judging one sweep input into its row (score/row.ts), and the row as the output file gets
 * it. A bad file becomes a failed row, never an exception.
 */
import { InputError } from "../../errors.js";
import { rowLine } from "../../report/rows.js";
import type { Judge, JudgeOptions } from "../../score/judge.js";
import type { Policy } from "../../score/policy/policy.js";
import type { Level } from "../../score/types.js";
import { failedRow, rowOf, type AppRow } from "../../score/row.js";
import { judgeFile } from "../check.js";

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

/**
 * A sweep's settings as plain data, so that they cross to a worker thread or through a queue as they are:
 * everything a worker needs besides the baseline itself.
 */
export interface SweepSetup {
  format: SweepFormat;
  /** Read each app's dex code for code evidence. */
  readCode: boolean;
  category?: string;
  categoryIndex?: [string, string][];
  levels?: [string, Level | "off"][];
  /** Policies in force (plain data). */
  policies?: Policy[];
  prevalence?: number;
}

/** The plain-data settings of a sweep's judging options. */
export function setupOf(judge: JudgeOptions, format: SweepFormat, readCode: boolean): SweepSetup {
  return {
    format,
    readCode,
    ...(judge.category ? { category: judge.category } : {}),
    ...(judge.categoryIndex ? { categoryIndex: [...judge.categoryIndex] } : {}),
    levels: [...(judge.levels ?? new Map())],
    ...(judge.policies ? { policies: [...judge.policies] } : {}),
    ...(judge.prevalence !== undefined ? { prevalence: judge.prevalence } : {}),
  };
}

/** The judging options of plain-data settings (the inverse of setupOf). */
export function judgeOptionsOf(setup: SweepSetup): JudgeOptions {
  return {
    ...(setup.category ? { category: setup.category } : {}),
    ...(setup.categoryIndex ? { categoryIndex: new Map(setup.categoryIndex) } : {}),
    levels: new Map(setup.levels ?? []),
    ...(setup.policies ? { policies: setup.policies } : {}),
    ...(setup.prevalence !== undefined ? { prevalence: setup.prevalence } : {}),
  };
}

/** What a file that a worker could not open says about it: the worker's host, on shared storage. */
const ACCESS_PROBLEM = /^(no such file|permission denied|is not a regular file)/;

/**
 * Reads and judges one input, with its code evidence unless `readCode` is false. `host`, for a queue
 * worker: named in the row of a file it could not open (the inputs must be on storage every worker reads).
 */
export function scoreInput(judge: Judge, input: SweepInput, options: JudgeOptions, readCode = true, host?: string): AppRow {
  try {
    return rowOf(input, judgeFile(judge, input.file, { ...(input.category ? { ...options, category: input.category } : options), readCode }, { resolveResources: false }));
  } catch (e) {
    if (e instanceof InputError) {
      const message = e.detail();
      return failedRow(input, { kind: e.name, message: host && ACCESS_PROBLEM.test(message) ? `${message} (on worker host ${host})` : message });
    }
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
export function scoreToLine(judge: Judge, input: SweepInput, options: JudgeOptions, format: SweepFormat, readCode = true, host?: string): ScoredLine {
  return scoredLine(scoreInput(judge, input, options, readCode, host), format);
}

/** A row as the output file gets it (one line, no newline), with its summary fields. */
export function scoredLine(row: AppRow, format: SweepFormat): ScoredLine {
  return { ...briefOf(row), line: rowLine(row, format) };
}
