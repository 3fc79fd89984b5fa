/**
 * Scoring pre-extracted records (the corpus formats of `learn`) instead of files: how large inventories
 * already extracted elsewhere are screened. One result per record with its id, category and risk.
 */
import type { CorpusRecord } from "../baseline/corpus/types.js";
import type { Judge } from "./judge.js";
import { isSensitive } from "../platform/sensitivity.js";
import { resolveCategory } from "./category.js";
import { bandOf, type Band } from "./risk.js";

export interface RecordScore {
  id: string;
  line: number;
  category?: string;
  fallback?: string;
  risk?: number;
  band?: Band;
  /** Requested permissions uncommon for the category (sensitive ones first). */
  uncommon: string[];
  sensitiveUncommon: number;
}

export function scoreRecord(judge: Judge, r: CorpusRecord, category?: string): RecordScore {
  const resolved = resolveCategory(judge.baseline, category ?? r.category);
  const uncommon: string[] = [];
  let sensitiveUncommon = 0;
  for (const p of r.permissions) {
    const rate = judge.rate(resolved.category, p);
    if (rate.uncommon) {
      uncommon.push(p);
      if (isSensitive(p)) sensitiveUncommon++;
    }
  }
  const out: RecordScore = { id: r.id, line: r.line, uncommon, sensitiveUncommon };
  if (resolved.category !== undefined) out.category = resolved.category;
  if (resolved.fallback) out.fallback = resolved.fallback;
  if (judge.scorer) {
    out.risk = judge.scorer.probability(resolved.category, r.permissions);
    out.band = bandOf(out.risk, judge.scorer.cuts);
  }
  return out;
}
