/**
 * What every corpus reader shares: line streaming with progress, the report, duplicate detection,
 * permission normalization and label parsing.
 */
import { createReadStream, statSync } from "node:fs";
import { createInterface } from "node:readline";
import { normalizePermissionName } from "../../platform/permissions.js";
import { DUPLICATE_CHECK_ROWS, REPORTED_REJECTS, type CorpusFormat, type CorpusOptions, type CorpusRecord, type CorpusReport } from "./types.js";

/** Streams the lines of a file with their 1-based numbers, reporting progress by bytes. */
export async function* lines(path: string, onProgress?: (done: number, total: number) => void): AsyncGenerator<{ text: string; line: number }> {
  const total = statSync(path).size;
  const stream = createReadStream(path, { encoding: "utf8", highWaterMark: 1 << 20 });
  const rl = createInterface({ input: stream, crlfDelay: Infinity });
  let line = 0;
  let done = 0;
  let lastReport = 0;
  for await (const text of rl) {
    line++;
    done += text.length + 1;
    if (onProgress && done - lastReport > 1 << 20) {
      lastReport = done;
      onProgress(Math.min(done, total), total);
    }
    yield { text, line };
  }
  onProgress?.(total, total);
}

/** 52-bit FNV-1a hash of a string, as a safe integer (for compact duplicate detection). */
function hash52(s: string): number {
  let h1 = 0x811c9dc5;
  let h2 = 0x050c5d1f;
  for (let i = 0; i < s.length; i++) {
    const c = s.charCodeAt(i);
    h1 = Math.imul(h1 ^ c, 0x01000193);
    h2 = Math.imul(h2 ^ c, 0x01000193) ^ (h1 >>> 7);
  }
  return (h1 >>> 0) * 0x100000 + ((h2 >>> 0) & 0xfffff);
}

/** Builds a corpus report and the bookkeeping every reader needs. */
export class Ledger {
  readonly report: CorpusReport;
  private readonly seen = new Set<number>();
  private readonly positive: Set<string>;

  constructor(
    source: string,
    format: CorpusFormat,
    private readonly options: CorpusOptions,
  ) {
    this.report = {
      source,
      format,
      rows: 0,
      accepted: 0,
      rejected: 0,
      rejects: [],
      duplicateIds: 0,
      duplicateExamples: [],
      duplicatePermissions: 0,
      labeled: 0,
      positives: 0,
      notes: [],
    };
    this.positive = new Set((options.positive ?? ["1", "true"]).map((v) => v.toLowerCase()));
  }

  reject(line: number, reason: string): void {
    this.report.rejected++;
    if (this.report.rejects.length < REPORTED_REJECTS) this.report.rejects.push({ line, reason });
    this.options.onReject?.({ line, reason });
  }

  /** Applies aliases, category requirement, normalization and duplicate checks; returns the record or undefined if rejected. */
  accept(line: number, id: string, category: string | undefined, label: unknown, permissions: Iterable<string>): CorpusRecord | undefined {
    const cat = category === undefined || category === "" ? undefined : (this.options.aliases?.get(category) ?? category);
    if (this.options.requireCategory && cat === undefined) {
      this.reject(line, "no category");
      return undefined;
    }
    const names = new Set<string>();
    let given = 0;
    for (const p of permissions) {
      given++;
      names.add(normalizePermissionName(p));
    }
    this.report.duplicatePermissions += given - names.size;
    const record: CorpusRecord = { id, permissions: [...names].sort(), line };
    if (cat !== undefined) record.category = cat;
    const parsed = this.parseLabel(label);
    if (parsed !== undefined) {
      record.label = parsed;
      this.report.labeled++;
      this.report.positives += parsed;
    }
    if (this.report.accepted < DUPLICATE_CHECK_ROWS) {
      const h = hash52(id);
      if (this.seen.has(h)) {
        this.report.duplicateIds++;
        if (this.report.duplicateExamples.length < 10) this.report.duplicateExamples.push(id);
      } else this.seen.add(h);
    }
    this.report.accepted++;
    return record;
  }

  private parseLabel(v: unknown): 0 | 1 | undefined {
    if (v === undefined || v === null || v === "") return undefined;
    return this.positive.has(String(v).trim().toLowerCase()) ? 1 : 0;
  }
}
