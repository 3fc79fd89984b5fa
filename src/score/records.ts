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
import { worstOf } from "./gates.js";
import { checkById } from "./registry.js";
import type { Level } from "./types.js";
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
  /** The level of the most severe of those findings, as `check` would give them (what `--fail-on` looks at). */
  worst?: Level;
}

/** What a record is scored with: a category for every record, and the checks' level overrides (`--level`). */
export interface RecordOptions {
  category?: string;
  levels?: ReadonlyMap<string, Level | "off">;
}

export function scoreRecord(judge: Judge, r: CorpusRecord, options: RecordOptions = {}): RecordScore {
  const resolved = resolveCategory(judge.baseline, options.category ?? r.category);
  const app = recordIdentity(r.id);
  // The same rule as `check` on a file (score/uncommon.ts): the era rule, and the app's own permissions
  // (those under its package, when the id is one) never judged by frequency.
  const rate = (p: string) => judge.rate(resolved.category, p);
  // Each at the level of the check that reports it for a file (sensitive-uncommon, uncommon-for-category).
  const levelOf = (id: string) => options.levels?.get(id) ?? checkById(id)!.meta.defaultLevel;
  const reported = r.permissions
    .filter((p) => uncommonJudgement(app, judge.baseline, resolved.category, p, rate) !== undefined)
    .map((p) => ({ p, sensitive: isSensitive(p), level: levelOf(isSensitive(p) ? "sensitive-uncommon" : "uncommon-for-category") }))
    .filter((x): x is typeof x & { level: Level } => x.level !== "off");
  const uncommon = [...reported.filter((x) => x.sensitive), ...reported.filter((x) => !x.sensitive)].map((x) => x.p);
  const out: RecordScore = { id: r.id, line: r.line, uncommon, sensitiveUncommon: reported.filter((x) => x.sensitive).length };
  const worst = worstOf(reported.map((x) => x.level));
  if (worst) out.worst = worst;
  if (resolved.category !== undefined) out.category = resolved.category;
  if (resolved.fallback) out.fallback = resolved.fallback;
  if (judge.scorer) {
    // As for a file, the app's own permissions say nothing about it against other apps.
    out.risk = judge.scorer.probability(resolved.category, r.permissions.filter((p) => !isOwnPermission(app, p)));
    out.band = bandOf(out.risk, judge.scorer.cuts);
  }
  return out;
}
