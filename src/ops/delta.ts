/** `delta`: what changed between two versions of an app, both judged against the newer one's category. */
import { compareVersions, type Delta } from "../score/delta.js";
import type { Judge } from "../score/judge.js";
import { judgeFile, type FileJudgeOptions } from "./check.js";

export function delta(judge: Judge, before: string, after: string, options: FileJudgeOptions): Delta {
  const newer = judgeFile(judge, after, options);
  // Judge the old version against the new one's category, so that the two are comparable.
  const older = judgeFile(judge, before, { ...options, ...(newer.category.category ? { category: newer.category.category } : {}) });
  return compareVersions(older, newer);
}
