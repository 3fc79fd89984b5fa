/**
 * One app's result as a flat row: what a sweep writes per input (JSONL, CSV) and what the sweep report
 * shows. Built from a judgement; an input that could not be read is a failed row with its error.
 * `id` is the input's path as listed, stable across runs; `size` and `mtimeMs` identify its content for
 * `--resume`.
 */
import { requestedPermissionNames } from "../extract/manifest/model.js";
import type { CodeEvidence, PermissionEvidence } from "./code-evidence.js";
import type { CheckResult } from "./judge.js";
import type { Finding, FindingData, Level } from "./types.js";

/** What identifies an input across runs. */
export interface RowKey {
  id: string;
  size: number;
  mtimeMs: number;
}

export interface AppRow extends RowKey {
  status: "scored" | "failed";
  package?: string;
  versionName?: string;
  versionCode?: number;
  category?: string;
  fallback?: string;
  /** The category the app asked for (an index, `-c`, its manifest) when it fell back to the pooled baseline. */
  requestedCategory?: string;
  risk?: number;
  band?: string;
  /** The risk at the user's prevalence (`--prevalence`). */
  riskAtPrevalence?: number;
  /** Atypicality percentile among the baseline's apps of the category (no labels involved). */
  atypicality?: number;
  counts?: Record<Level, number>;
  /** Each finding with its data; the output adds its message (report/rows.ts); rows read back from CSV carry neither. */
  findings?: RowFinding[];
  whatIf?: { permission: string; without: number }[];
  permissions?: string[];
  /** Code evidence, when the app's code was read (archives, unless `--no-code`). */
  code?: RowCode;
  error?: { kind: string; message: string };
}

/** A finding as a row holds it: data for the formatters to word. */
export interface RowFinding {
  checkId: string;
  level: Level;
  subject: string;
  data?: FindingData;
  /** Other checks' reasons on the same permission (Finding.also). */
  also?: { checkId: string; level: Level; data: FindingData }[];
  /** What the app's code shows for the permission concerned, when its code was read. */
  code?: Pick<PermissionEvidence, "status" | "users" | "onlyLibraries">;
  /** The finding in words, as the output file has it (report/rows.ts adds it). */
  message?: string;
}

/** A row's code evidence: requested permissions by what the code shows, sorted. */
export interface RowCode {
  used: string[];
  /** Evidence only in code no entry point reaches (absent in rows written before the call graph). */
  unreached?: string[];
  notSeen: string[];
  notMappable: string[];
  /** Used, but only by bundled libraries' packages (a subset of `used`). */
  libraryOnly: string[];
  /** "could not read classes2.dex: …", one a damaged dex. */
  problems: string[];
}

/** The row form of a judgement's code evidence. */
export function rowCode(code: CodeEvidence): RowCode {
  const by = (status: PermissionEvidence["status"]) => code.permissions.filter((p) => p.status === status).map((p) => p.permission).sort();
  return {
    used: by("used"),
    unreached: by("unreached"),
    notSeen: by("not-seen"),
    notMappable: by("not-mappable"),
    libraryOnly: code.permissions.filter((p) => p.onlyLibraries).map((p) => p.permission).sort(),
    problems: [...code.problems],
  };
}

/** A judged finding as row data, with the code's word on its permission when the code was read. */
function rowFinding(f: Finding, code: CheckResult["code"]): RowFinding {
  const e = code?.read.length ? code.permissions.find((p) => p.permission === f.subject) : undefined;
  return {
    checkId: f.checkId,
    level: f.level,
    subject: f.subject,
    data: f.data,
    ...(f.also ? { also: f.also } : {}),
    ...(e ? { code: { status: e.status, users: e.users, onlyLibraries: e.onlyLibraries } } : {}),
  };
}

/** The row of a judged app. */
export function rowOf(key: RowKey, r: CheckResult): AppRow {
  const m = r.manifest;
  const counts: Record<Level, number> = { error: 0, warning: 0, note: 0 };
  for (const f of r.findings) counts[f.level]++;
  const row: AppRow = {
    id: key.id,
    size: key.size,
    mtimeMs: key.mtimeMs,
    status: "scored",
    package: m.package,
    ...(m.versionName !== undefined ? { versionName: m.versionName } : {}),
    ...(m.versionCode !== undefined ? { versionCode: m.versionCode } : {}),
    ...(r.category.category ? { category: r.category.category } : {}),
    ...(r.category.fallback ? { fallback: r.category.fallback } : {}),
    ...(r.category.fallback && r.category.requested ? { requestedCategory: r.category.requested } : {}),
    counts,
    findings: r.findings.map((f) => rowFinding(f, r.code)),
    permissions: requestedPermissionNames(m).sort(),
    ...(r.code ? { code: rowCode(r.code) } : {}),
  };
  if (r.risk) {
    row.risk = r.risk.probability;
    row.band = r.risk.band;
    if (r.risk.prevalence) row.riskAtPrevalence = r.risk.prevalence.probability;
    if (r.risk.atypicality) row.atypicality = Math.round(10 * r.risk.atypicality.percentile) / 10;
    row.whatIf = r.risk.whatIf.filter((w) => w.change < 0).slice(0, 5).map((w) => ({ permission: w.permission, without: w.without }));
  }
  return row;
}

/** The row of an input that could not be read. */
export function failedRow(key: RowKey, error: { kind: string; message: string }): AppRow {
  return { id: key.id, size: key.size, mtimeMs: key.mtimeMs, status: "failed", error };
}
