/**
 * Reading a sweep's output back: for `--resume` (which rows to keep) and for the report (every row).
 */
import { existsSync, readFileSync } from "node:fs";
import { csvHeader, rowFromCsv } from "../../report/csv.js";
import type { AppRow } from "../../score/row.js";
import { splitCsvLine } from "../../util/csv.js";
import { writeFileAtomic } from "../files.js";
import { briefOf, type ScoredLine, type SweepFormat, type SweepInput } from "./rows.js";

/** A complete row read back from an output line, or undefined for a torn or foreign line (CSV: summary columns only). */
export function rowFromLine(line: string, format: SweepFormat): AppRow | undefined {
  if (format === "jsonl") {
    try {
      const r = JSON.parse(line) as AppRow;
      return typeof r?.id === "string" ? r : undefined;
    } catch {
      return undefined;
    }
  }
  const f = splitCsvLine(line);
  return f ? rowFromCsv(f) : undefined;
}

/** Every row of an output file, sorted by id. */
export function readRows(path: string, format: SweepFormat): AppRow[] {
  return readFileSync(path, "utf8")
    .split("\n")
    .map((l) => (l ? rowFromLine(l, format) : undefined))
    .filter((r): r is AppRow => r !== undefined)
    .sort((a, b) => (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));
}

/**
 * Resuming: keeps from the earlier output the last complete row of every input that is unchanged (same
 * size and modification time), drops torn, stale and duplicate lines, and writes the result back
 * atomically. Calls `kept` with each row kept; returns their ids.
 */
export function compactOutput(output: string, format: SweepFormat, inputs: SweepInput[], kept: (row: Omit<ScoredLine, "line">) => void): Set<string> {
  const ids = new Set<string>();
  if (!existsSync(output)) return ids;
  const current = new Map(inputs.map((i) => [i.id, i]));
  const text = readFileSync(output, "utf8");
  const lines = text.split("\n");
  if (!text.endsWith("\n")) lines.pop(); // cut short by the interruption
  const latest = new Map<string, { index: number; row: AppRow }>();
  lines.forEach((line, index) => {
    if (!line) return;
    const row = rowFromLine(line, format);
    const input = row && current.get(row.id);
    if (row && input && row.size === input.size && row.mtimeMs === input.mtimeMs) latest.set(row.id, { index, row });
  });
  let out = format === "csv" ? csvHeader() : "";
  for (const [id, { index, row }] of latest) {
    out += `${lines[index]}\n`;
    ids.add(id);
    kept(briefOf(row));
  }
  writeFileAtomic(output, out);
  return ids;
}
