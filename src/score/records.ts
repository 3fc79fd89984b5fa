/**
 * Scoring pre-extracted records (the corpus formats of `learn`) instead of files: how large inventories
 * already extracted elsewhere are screened. One result per record with its id, category and risk.
 */
import type { CorpusRecord } from "../baseline/corpus/types.js";
import type { Judge } from "./judge.js";
import { isSensitive } from "../platform/sensitivity.js";
import { resolveCategory } from "./category.js";
import { isOwnPermission, recordIdentity } from "../baseline/judged.js";
import { uncommonJudgement } from "./uncommon.js";
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
  const app = recordIdentity(r.id);
  // The same rule as `check` on a file (score/uncommon.ts): the era rule, and the app's own permissions
  // (those under its package, when the id is one) never judged by frequency.
  const rate = (p: string) => judge.rate(resolved.category, p);
  const uncommon = r.permissions.filter((p) => uncommonJudgement(app, judge.baseline, resolved.category, p, rate) !== undefined);
  const sensitiveFirst = [...uncommon.filter(isSensitive), ...uncommon.filter((p) => !isSensitive(p))];
  const out: RecordScore = { id: r.id, line: r.line, uncommon: sensitiveFirst, sensitiveUncommon: uncommon.filter(isSensitive).length };
  if (resolved.category !== undefined) out.category = resolved.category;
  if (resolved.fallback) out.fallback = resolved.fallback;
  if (judge.scorer) {
    // As for a file, the app's own permissions say nothing about it against other apps.
    out.risk = judge.scorer.probability(resolved.category, r.permissions.filter((p) => !isOwnPermission(app, p)));
    out.band = bandOf(out.risk, judge.scorer.cuts);
  }
  return out;
}
