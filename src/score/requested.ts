/**
 * Every requested permission of a judged app beside its category's rate: the data behind the check
 * report's bars. Frequency is asked the same way the checks ask it (score/frequency.ts), so a bar never
 * says something a finding contradicts.
 */
import { requestedPermissionNames } from "../extract/manifest/model.js";
import { isSensitive } from "../platform/sensitivity.js";
import { judgeFrequency } from "../baseline/judged.js";
import { reportedByAnotherCheck } from "./uncommon.js";
import type { CheckResult, Judge } from "./judge.js";

export interface RequestedRate {
  permission: string;
  sensitive: boolean;
  /** Apps of the group requesting it (or its predecessor), of how many; absent when not judged by frequency. */
  k?: number;
  n?: number;
  lower?: number;
  upper?: number;
  uncommon?: boolean;
  /** The older permission whose rate stands in for it (era rule). */
  judgedBy?: string;
  /** Why frequency does not judge it. */
  notJudged?: "own-permission" | "made-explicit" | "required-alongside" | "no-evidence";
}

export function requestedRates(judge: Judge, result: CheckResult): RequestedRate[] {
  const cat = result.category.category ?? result.category.requested;
  const rate = (p: string) => judge.rate(cat, p);
  return requestedPermissionNames(result.manifest).map((p) => {
    const j = judgeFrequency(result.manifest, judge.baseline, result.category.category, p, rate);
    const base = { permission: p, sensitive: isSensitive(p) };
    if (j.kind !== "rate") return { ...base, notJudged: j.kind };
    const r = j.rate;
    return { ...base, k: r.k, n: r.n, lower: r.lower, upper: r.upper, uncommon: r.uncommon && !reportedByAnotherCheck(p), ...(j.judgedBy ? { judgedBy: j.judgedBy.permission } : {}) };
  });
}
