/** `delta`: what changed between two versions of an app, both judged against the newer one's category. */
import { compareVersions, type Delta } from "../score/delta.js";
import type { Judge, JudgeOptions } from "../score/judge.js";
import { readManifestFile } from "./read-manifest.js";

export function delta(judge: Judge, before: string, after: string, options: JudgeOptions): Delta {
  const newer = judge.judge(readManifestFile(after), options);
  // Judge the old version against the new one's category, so that the two are comparable.
  const older = judge.judge(readManifestFile(before), { ...options, ...(newer.category.category ? { category: newer.category.category } : {}) });
  return compareVersions(older, newer);
}
