/**
 * One sweep result row: an input and what became of it. The same shape for JSONL and (flattened) CSV.
 * `id` is the input's path as listed, stable across runs; `size` and `mtimeMs` identify its content for
 * `--resume`.
 */
import { InputError } from "../../errors.js";
import { readManifestFile } from "../../extract/index.js";
import type { Judge, JudgeOptions } from "../../score/judge.js";
import type { Level } from "../../score/types.js";

export const SWEEP_SCHEMA_VERSION = 1;

export interface SweepInput {
  /** The path as listed (relative to the sweep root, or as given). */
  id: string;
  /** Where to read it. */
  file: string;
  category?: string;
  size: number;
  mtimeMs: number;
}

export interface SweepRow {
  id: string;
  size: number;
  mtimeMs: number;
  status: "scored" | "failed";
  package?: string;
  versionName?: string;
  versionCode?: number;
  category?: string;
  fallback?: string;
  risk?: number;
  band?: string;
  counts?: Record<Level, number>;
  findings?: { checkId: string; level: Level; subject: string }[];
  whatIf?: { permission: string; without: number }[];
  permissions?: string[];
  error?: { kind: string; message: string };
}

/** Reads and judges one input; a bad file becomes a failed row, never an exception. */
export function scoreInput(judge: Judge, input: SweepInput, options: JudgeOptions): SweepRow {
  const base = { id: input.id, size: input.size, mtimeMs: input.mtimeMs };
  try {
    const m = readManifestFile(input.file, { resolveResources: false });
    const r = judge.judge(m, input.category ? { ...options, category: input.category } : options);
    const counts: Record<Level, number> = { error: 0, warning: 0, note: 0 };
    for (const f of r.findings) counts[f.level]++;
    const row: SweepRow = {
      ...base,
      status: "scored",
      package: m.package,
      ...(m.versionName !== undefined ? { versionName: m.versionName } : {}),
      ...(m.versionCode !== undefined ? { versionCode: m.versionCode } : {}),
      ...(r.category.category ? { category: r.category.category } : {}),
      ...(r.category.fallback ? { fallback: r.category.fallback } : {}),
      counts,
      findings: r.findings.map((f) => ({ checkId: f.checkId, level: f.level, subject: f.subject })),
      permissions: [...new Set(m.usesPermissions.filter((p) => !p.removedByTools).map((p) => p.name))].sort(),
    };
    if (r.risk) {
      row.risk = r.risk.probability;
      row.band = r.risk.band;
      row.whatIf = r.risk.whatIf.filter((w) => w.change < 0).slice(0, 5).map((w) => ({ permission: w.permission, without: w.without }));
    }
    return row;
  } catch (e) {
    if (e instanceof InputError) return { ...base, status: "failed", error: { kind: e.name, message: e.message } };
    return { ...base, status: "failed", error: { kind: "InternalError", message: e instanceof Error ? e.message : String(e) } };
  }
}

/** A scored input as the output gets it: its line, and the few fields the summary needs. */
export interface ScoredLine {
  id: string;
  line: string;
  status: SweepRow["status"];
  package?: string;
  risk?: number;
  band?: string;
}

/** Scores an input and serializes the row where it was scored (a worker), so that only a string travels. */
export function scoreToLine(judge: Judge, input: SweepInput, options: JudgeOptions, format: "jsonl" | "csv"): ScoredLine {
  const row = scoreInput(judge, input, options);
  const line = format === "jsonl" ? JSON.stringify(row) : rowToCsv(row).slice(0, -1);
  return {
    id: row.id,
    line,
    status: row.status,
    ...(row.package !== undefined ? { package: row.package } : {}),
    ...(row.risk !== undefined ? { risk: row.risk } : {}),
    ...(row.band !== undefined ? { band: row.band } : {}),
  };
}

const CSV_COLUMNS = ["id", "size", "mtimeMs", "status", "package", "versionName", "versionCode", "category", "fallback", "risk", "band", "errors", "warnings", "notes", "checks", "errorKind", "errorMessage"] as const;

export function csvHeader(): string {
  return `${CSV_COLUMNS.join(",")}\n`;
}

export function rowToCsv(r: SweepRow): string {
  const cells: Record<(typeof CSV_COLUMNS)[number], string | number | undefined> = {
    id: r.id,
    size: r.size,
    mtimeMs: r.mtimeMs,
    status: r.status,
    package: r.package,
    versionName: r.versionName,
    versionCode: r.versionCode,
    category: r.category,
    fallback: r.fallback,
    risk: r.risk !== undefined ? r.risk.toFixed(4) : undefined,
    band: r.band,
    errors: r.counts?.error,
    warnings: r.counts?.warning,
    notes: r.counts?.note,
    checks: r.findings ? [...new Set(r.findings.map((f) => f.checkId))].join(" ") : undefined,
    errorKind: r.error?.kind,
    errorMessage: r.error?.message,
  };
  return `${CSV_COLUMNS.map((c) => csvCell(cells[c])).join(",")}\n`;
}

function csvCell(v: string | number | undefined): string {
  if (v === undefined) return "";
  const s = String(v);
  return /[",\n\r]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

/** Reads back, from a CSV row written by rowToCsv, what `--resume` needs. */
export function csvRowKey(fields: string[]): { id: string; size: number; mtimeMs: number; status: string } | undefined {
  if (fields.length !== CSV_COLUMNS.length || !fields[0]) return undefined;
  return { id: fields[0], size: Number(fields[1]), mtimeMs: Number(fields[2]), status: fields[3] };
}
