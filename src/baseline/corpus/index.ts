/** Opening a corpus in any of its formats behind one interface. */
import { Ledger } from "./common.js";
import { readFileIndex } from "./files.js";
import { readJsonl } from "./jsonl.js";
import type { CorpusFormat, CorpusOptions, CorpusRecord, CorpusReport, CorpusSource } from "./types.js";
import { readWideCsv } from "./wide-csv.js";

export interface Corpus {
  records: AsyncGenerator<CorpusRecord>;
  /** Filled in as records are read; complete once `records` is exhausted. */
  report: CorpusReport;
}

/**
 * Tells a corpus format from its first text: JSONL when the first non-blank character is `{`; an index
 * CSV when the first row starts with `file,` or names an .apk/.xml; a wide CSV otherwise.
 */
export function detectCorpusFormat(head: string): CorpusFormat {
  const text = head.replace(/^\uFEFF/, "").trimStart();
  if (text.startsWith("{")) return "jsonl";
  const first = text.split(/\r?\n/)[0].toLowerCase();
  if (first.startsWith("file,") || /^[^,]+\.(apk|xml)\s*,/.test(first)) return "files";
  return "wide-csv";
}

export function openCorpus(source: CorpusSource, options: CorpusOptions = {}): Corpus {
  const format = options.format ?? detectCorpusFormat(source.head());
  const ledger = new Ledger(source.name, format, options);
  const reader = format === "jsonl" ? readJsonl : format === "wide-csv" ? readWideCsv : readFileIndex;
  return { records: reader(source, options, ledger), report: ledger.report };
}

export { parseColumnList } from "./wide-csv.js";
export type { CorpusFormat, CorpusOptions, CorpusRecord, CorpusReport, CorpusSource } from "./types.js";
