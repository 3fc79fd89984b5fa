/**
 * A sweep row as its output file has it: the row's data, with every finding worded (the message the
 * check report gives for the same finding, and the folded reasons after it). One line, no newline.
 */
import type { AppRow, RowFinding } from "../score/row.js";
import { rowToCsv } from "./csv.js";
import { wordFinding } from "./messages.js";

/** A row finding's message, with the reasons folded into it (`also`), worded by their checks. */
export function rowMessage(f: RowFinding): string {
  if (f.message !== undefined) return f.message; // read back from an output that worded it already
  const data = f.data ?? {};
  const first = wordFinding({ checkId: f.checkId, subject: f.subject, data }, (p) => (p === f.subject && f.code ? { permission: p, evidence: [], ...f.code } : undefined));
  // " — also (check): …": a message need not end in a full stop, so the reasons are set apart plainly.
  return [first, ...(f.also ?? []).map((a) => `also (${a.checkId}): ${wordFinding({ checkId: a.checkId, subject: f.subject, data: a.data })}`)].join(" — ");
}

/** The row with each finding's message. */
export function wordedRow(row: AppRow): AppRow {
  return row.findings ? { ...row, findings: row.findings.map((f) => ({ ...f, message: rowMessage(f) })) } : row;
}

/** A row as one line of the output file (JSONL or CSV), without the newline. */
export function rowLine(row: AppRow, format: "jsonl" | "csv"): string {
  const worded = wordedRow(row);
  return format === "jsonl" ? JSON.stringify(worded) : rowToCsv(worded).slice(0, -1);
}
