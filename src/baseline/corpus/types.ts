/**
 * One reader interface over every corpus format: an async stream of app records, plus a report of
 * what was read, rejected and duplicated.
 */

export interface CorpusRecord {
  /** App id (package name, or the id field/column; the line number when there is none). */
  id: string;
  /** Category after aliases; absent when the corpus has none. */
  category?: string;
  /** 1 = flagged (the positive label), 0 = not flagged; absent when the corpus has no label. */
  label?: 0 | 1;
  /** Normalized, de-duplicated permission names. */
  permissions: string[];
  /** Line in the source (1-based; for index CSVs, the index line). */
  line: number;
}

export interface Reject {
  line: number;
  reason: string;
}

export interface CorpusReport {
  source: string;
  format: CorpusFormat;
  rows: number;
  accepted: number;
  rejected: number;
  /** The first rejects, with line numbers (all of them go to --rejects). */
  rejects: Reject[];
  duplicateIds: number;
  duplicateExamples: string[];
  /** Permissions dropped as duplicates within one app. */
  duplicatePermissions: number;
  labeled: number;
  positives: number;
  /** Things the reader noticed about the corpus as a whole (a named column it does not have, …). */
  notes: string[];
  /** Wide CSV: every permission the corpus can record (its normalized permission columns). */
  vocabulary?: string[];
}

export type CorpusFormat = "jsonl" | "wide-csv" | "files";

/**
 * Where a corpus's text comes from. The ops layer adapts a file to this; the readers here never touch
 * the file system, so they can be fed from memory in tests or from any stream.
 */
export interface CorpusSource {
  /** How reports and errors name the corpus (its path). */
  readonly name: string;
  /** The first few kilobytes as text, for telling the format. */
  head(): string;
  /** The lines with their 1-based numbers; `onProgress` gets units done so far and the total. */
  lines(onProgress?: (done: number, total: number) => void): AsyncIterable<{ text: string; line: number }>;
  /** File indexes: reads the app a row names (as listed, relative to the index). */
  readApp?(listed: string): { id: string; permissions: string[] };
}

export interface CorpusOptions {
  format?: CorpusFormat;
  idField?: string;
  categoryField?: string;
  permissionsField?: string;
  labelField?: string;
  /** Label values that mean "flagged" (compared as text; default `1` and `true`). */
  positive?: string[];
  /** Wide CSV: the permission columns to keep (the rest are ignored); every one must be in the header. */
  columns?: ReadonlySet<string>;
  /** Wide CSV without a column list: keep only the columns that name a platform permission (bare names allowed). */
  platformColumnsOnly?: boolean;
  /** Category aliases: source name → baseline name. */
  aliases?: Map<string, string>;
  /** Reject rows without a category (true when the corpus feeds category baselines). */
  requireCategory?: boolean;
  /** Called now and then with bytes read so far and the total. */
  onProgress?: (done: number, total: number) => void;
  /** Called for every reject (for --rejects files). */
  onReject?: (reject: Reject) => void;
}

/** How many rejects a report keeps in memory; the rest are counted and passed to onReject. */
export const REPORTED_REJECTS = 100;
/** Duplicate ids are checked exactly (by 52-bit hash) for up to this many rows. */
export const DUPLICATE_CHECK_ROWS = 5_000_000;
