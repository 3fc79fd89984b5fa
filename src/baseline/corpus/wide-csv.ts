/**
 * Wide binary CSV corpora: a header row, one 0/1 column per permission (bare platform names allowed),
 * and optional label, id and category columns.
 */
import { CorpusError } from "../../errors.js";
import { normalizePermissionName, platformPermission } from "../../platform/permissions.js";

/** Most physical lines one CSV record may span (a quoted field with line breaks). */
const MAX_RECORD_LINES = 50;
import type { Ledger } from "./common.js";
import { splitCsvLine } from "../../util/csv.js";
import type { CorpusOptions, CorpusRecord, CorpusSource } from "./types.js";

/**
 * Parses a column list (the text of a `--columns-from` file): the first CSV field of each line names a
 * permission column, kept when `kind` is not given or equals the second field. `path` names it in errors.
 */
export function parseColumnList(text: string, path: string, kind?: string): Set<string> {
  const out = new Set<string>();
  for (const line of text.split(/\r?\n/)) {
    const f = splitCsvLine(line);
    if (!f || f[0].trim() === "") continue;
    if (kind === undefined || (f[1] ?? "").trim() === kind) out.add(f[0].trim());
  }
  if (out.size === 0) throw new CorpusError(`no columns${kind ? ` of kind "${kind}"` : ""} listed`, { file: path });
  return out;
}

export async function* readWideCsv(source: CorpusSource, options: CorpusOptions, ledger: Ledger): AsyncGenerator<CorpusRecord> {
  const path = source.name;
  const labelColumn = options.labelField ?? "label";
  const idColumn = options.idField;
  const categoryColumn = options.categoryField;
  const wanted = options.columns;
  let header: string[] | undefined;
  let permissionIdx: number[] = [];
  let labelIdx = -1;
  let idIdx = -1;
  let categoryIdx = -1;
  let pending: { text: string; line: number; parts: number } | undefined;
  for await (const physical of source.lines(options.onProgress)) {
    // A quoted field may hold a line break (RFC 4180 §2.6): join physical lines until the quotes close.
    let text = physical.text;
    let line = physical.line;
    let parts = 0;
    if (pending) {
      text = `${pending.text}\n${text}`;
      line = pending.line;
      parts = pending.parts;
      pending = undefined;
    }
    if (header && text.includes('"') && splitCsvLine(text) === undefined) {
      if (parts < MAX_RECORD_LINES) {
        pending = { text, line, parts: parts + 1 };
        continue;
      }
    }
    if (!header) {
      header = splitCsvLine(text.replace(/^\uFEFF/, ""))?.map((h) => h.trim());
      if (!header) throw new CorpusError("header row has an unterminated quote", { file: path });
      labelIdx = header.indexOf(labelColumn);
      idIdx = idColumn ? header.indexOf(idColumn) : -1;
      categoryIdx = categoryColumn ? header.indexOf(categoryColumn) : -1;
      // Field options are shared by all corpora of a run; a column this corpus lacks is noted, not fatal.
      if (idColumn && idIdx < 0) ledger.report.notes.push(`no id column "${idColumn}": rows are identified by line number`);
      if (categoryColumn && categoryIdx < 0) ledger.report.notes.push(`no category column "${categoryColumn}"`);
      if (labelIdx < 0) ledger.report.notes.push(`no label column "${labelColumn}"`);
      const special = new Set([labelIdx, idIdx, categoryIdx]);
      permissionIdx = header.map((_, i) => i).filter((i) => !special.has(i) && (!wanted || wanted.has(header![i])) && (!options.platformColumnsOnly || platformPermission(normalizePermissionName(header![i])) !== undefined));
      if (wanted) {
        const missing = [...wanted].filter((w) => !header!.includes(w));
        if (missing.length) throw new CorpusError(`${missing.length} listed permission columns are not in the header (first: ${missing[0]})`, { file: path });
      }
      if (permissionIdx.length === 0) throw new CorpusError("no permission columns", { file: path });
      ledger.report.vocabulary = [...new Set(permissionIdx.map((i) => normalizePermissionName(header![i])))].sort();
      continue;
    }
    if (text.trim() === "") continue;
    ledger.report.rows++;
    const f = splitCsvLine(text);
    if (!f || f.length !== header.length) {
      ledger.reject(line, f ? `${f.length} columns, the header has ${header.length}` : "unterminated quote");
      continue;
    }
    const perms: string[] = [];
    let bad: string | undefined;
    for (const i of permissionIdx) {
      const v = f[i].trim();
      if (v === "1") perms.push(header[i]);
      else if (v !== "0") { bad = `column ${header[i]} holds "${v}", not 0 or 1`; break; }
    }
    if (bad) {
      ledger.reject(line, bad);
      continue;
    }
    const id = idIdx >= 0 ? f[idIdx] : `line ${line}`;
    const record = ledger.accept(line, id, categoryIdx >= 0 ? f[categoryIdx].trim() : undefined, labelIdx >= 0 ? f[labelIdx] : undefined, perms);
    if (record) yield record;
  }
  if (pending) {
    ledger.report.rows++;
    ledger.reject(pending.line, "unterminated quote at the end of the file");
  }
  if (!header) throw new CorpusError("is empty", { file: path });
}
