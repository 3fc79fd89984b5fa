/**
 * What every corpus reader shares: the report, duplicate detection, permission normalization and label
 * parsing.
 */
import { normalizePermissionName } from "../../platform/permissions.js";
import { hash52 } from "../../util/hash.js";
import { DUPLICATE_CHECK_ROWS, REPORTED_REJECTS, type CorpusFormat, type CorpusOptions, type CorpusRecord, type CorpusReport } from "./types.js";

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
