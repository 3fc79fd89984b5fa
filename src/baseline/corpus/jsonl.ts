/** JSONL corpora: one JSON object an app a line, with configurable field names. */
import type { Ledger } from "./common.js";
import type { CorpusOptions, CorpusRecord, CorpusSource } from "./types.js";

export async function* readJsonl(source: CorpusSource, options: CorpusOptions, ledger: Ledger): AsyncGenerator<CorpusRecord> {
  const idField = options.idField ?? "id";
  const categoryField = options.categoryField ?? "category";
  const permissionsField = options.permissionsField ?? "permissions";
  const labelField = options.labelField ?? "label";
  for await (const { text, line } of source.lines(options.onProgress)) {
    if (text.trim() === "") continue;
    ledger.report.rows++;
    let row: unknown;
    try {
      row = JSON.parse(text);
    } catch (e) {
      ledger.reject(line, `not valid JSON (${(e as Error).message})`);
      continue;
    }
    if (typeof row !== "object" || row === null || Array.isArray(row)) {
      ledger.reject(line, "not a JSON object");
      continue;
    }
    const r = row as Record<string, unknown>;
    const perms = r[permissionsField];
    if (!Array.isArray(perms) || !perms.every((p) => typeof p === "string")) {
      ledger.reject(line, `field "${permissionsField}" is not a list of permission names`);
      continue;
    }
    const category = r[categoryField];
    if (category !== undefined && category !== null && typeof category !== "string") {
      ledger.reject(line, `field "${categoryField}" is not text`);
      continue;
    }
    const id = r[idField];
    const record = ledger.accept(line, id === undefined || id === null ? `line ${line}` : String(id), (category as string | null) ?? undefined, r[labelField], perms as string[]);
    if (record) yield record;
  }
}
