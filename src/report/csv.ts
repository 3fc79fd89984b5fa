/**
 * App rows as CSV: one line an app with the summary columns (the findings as a list of check ids), and
 * reading those columns back (for `sweep --resume` and its report).
 */
import type { AppRow } from "../score/row.js";
import { csvCell } from "../util/csv.js";

export const ROW_CSV_COLUMNS = ["id", "size", "mtimeMs", "status", "package", "versionName", "versionCode", "category", "fallback", "risk", "band", "errors", "warnings", "notes", "checks", "errorKind", "errorMessage", "findings", "atypicality", "riskAtPrevalence", "codeUsed", "codeNotSeen", "codeNotMappable", "codeLibraryOnly", "codeProblems", "permissions", "codeUnreached"] as const;

export function csvHeader(): string {
  return `${ROW_CSV_COLUMNS.join(",")}\n`;
}

export function rowToCsv(r: AppRow): string {
  const cells: Record<(typeof ROW_CSV_COLUMNS)[number], string | number | undefined> = {
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
    // Every finding in words, one after another: `level checkId subject: message`, separated by " | ".
    atypicality: r.atypicality,
    riskAtPrevalence: r.riskAtPrevalence !== undefined ? r.riskAtPrevalence.toFixed(4) : undefined,
    // Code evidence: requested permissions, space-separated, by what the code shows (empty without code).
    codeUsed: r.code?.used.join(" "),
    codeNotSeen: r.code?.notSeen.join(" "),
    codeNotMappable: r.code?.notMappable.join(" "),
    codeLibraryOnly: r.code?.libraryOnly.join(" "),
    codeProblems: r.code?.problems.join(" | "),
    codeUnreached: r.code?.unreached?.join(" "),
    // The requested permissions, space-separated, for joining with other inventory sheets.
    permissions: r.permissions?.join(" "),
    findings: r.findings?.map((f) => `${f.level} ${f.checkId} ${f.subject}${f.message ? `: ${f.message}` : ""}`).join(" | "),
  };
  return `${ROW_CSV_COLUMNS.map((c) => csvCell(cells[c])).join(",")}\n`;
}

const list = (cell: string) => (cell ? cell.split(" ") : []);

/** The summary columns of a CSV row written by rowToCsv, or undefined when the fields are not such a row. */
export function rowFromCsv(f: readonly string[]): AppRow | undefined {
  // Outputs written before the permissions column (and the codeUnreached one) have one or two columns fewer; they are read the same.
  if (f.length > ROW_CSV_COLUMNS.length || f.length < ROW_CSV_COLUMNS.length - 2 || !f[0] || f[0] === "id") return undefined;
  const risk = f[9] ? Number(f[9]) : undefined;
  return {
    id: f[0],
    size: Number(f[1]),
    mtimeMs: Number(f[2]),
    status: f[3] === "failed" ? "failed" : "scored",
    ...(f[4] ? { package: f[4] } : {}),
    ...(risk !== undefined ? { risk } : {}),
    ...(f[10] ? { band: f[10] } : {}),
    ...(f[8] ? { fallback: f[8] } : {}),
    ...(f[18] ? { atypicality: Number(f[18]) } : {}),
    ...(f[25] ? { permissions: list(f[25]) } : {}),
    ...(f[20] || f[21] || f[22] || f[24] || f[26] ? { code: { used: list(f[20]), ...(f.length === ROW_CSV_COLUMNS.length ? { unreached: list(f[26]) } : {}), notSeen: list(f[21]), notMappable: list(f[22]), libraryOnly: list(f[23]), problems: f[24] ? f[24].split(" | ") : [] } } : {}),
  };
}
