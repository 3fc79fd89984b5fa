/** Opening a corpus in any of its formats behind one interface. */
import { namedLikeInput } from "../../extract/kinds.js";
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
 * CSV when the first row starts with `file,` or its first field is named like an app or manifest
 * (extract/kinds.ts); a wide CSV otherwise.
 */
export function detectCorpusFormat(head: string): CorpusFormat {
  const text = head.replace(/^\uFEFF/, "").trimStart();
  if (text.startsWith("{")) return "jsonl";
  const first = text.split(/\r?\n/)[0].toLowerCase();
  const field = /^([^,]+?)\s*,/.exec(first)?.[1];
  if (first.startsWith("file,") || (field !== undefined && namedLikeInput(field))) return "files";
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
