/** Opening a corpus in any of its formats behind one interface. */
import { closeSync, openSync, readSync } from "node:fs";
import { CorpusError } from "../../errors.js";
import { Ledger } from "./common.js";
import { readFileIndex } from "./files.js";
import { readJsonl } from "./jsonl.js";
import type { CorpusFormat, CorpusOptions, CorpusRecord, CorpusReport } from "./types.js";
import { readWideCsv } from "./wide-csv.js";

export interface Corpus {
  records: AsyncGenerator<CorpusRecord>;
  /** Filled in as records are read; complete once `records` is exhausted. */
  report: CorpusReport;
}

/**
 * Tells a corpus format from the file: JSONL when the first non-blank character is `{`; an index CSV
 * when the first row starts with `file,` or names an .apk/.xml; a wide CSV otherwise.
 */
export function detectCorpusFormat(path: string): CorpusFormat {
  const fd = openSync(path, "r");
  const head = Buffer.alloc(4096);
  const n = readSync(fd, head, 0, head.length, 0);
  closeSync(fd);
  const text = head.toString("utf8", 0, n).replace(/^\uFEFF/, "").trimStart();
  if (text.startsWith("{")) return "jsonl";
  const first = text.split(/\r?\n/)[0].toLowerCase();
  if (first.startsWith("file,") || /^[^,]+\.(apk|xml)\s*,/.test(first)) return "files";
  return "wide-csv";
}

export function openCorpus(path: string, options: CorpusOptions = {}): Corpus {
  let format: CorpusFormat;
  try {
    format = options.format ?? detectCorpusFormat(path);
  } catch (e) {
    const code = (e as { code?: string }).code;
    throw new CorpusError(code === "ENOENT" ? "no such file" : code === "EISDIR" ? "is a directory; give the corpus file (JSONL, wide CSV or an index CSV)" : String((e as Error).message), { file: path });
  }
  const ledger = new Ledger(path, format, options);
  const reader = format === "jsonl" ? readJsonl : format === "wide-csv" ? readWideCsv : readFileIndex;
  return { records: reader(path, options, ledger), report: ledger.report };
}

export type { CorpusFormat, CorpusOptions, CorpusRecord, CorpusReport } from "./types.js";
