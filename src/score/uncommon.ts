/**
 * Which requested permissions `check` reports as uncommon for the category: the baseline's one rule
 * (baseline/judged.ts), less the permissions another check speaks for first — one the platform cannot grant
 * a store app (ungrantable-permission), and an `android.permission.*` name the platform does not define
 * (unknown-permission). The rate checks and `check --records` both ask here, so a permission list reads the
 * same as a record and as a file.
 */
import { isJudgedUncommon, judgeFrequency, type AppIdentity, type FrequencyJudgement } from "../baseline/judged.js";
import type { Baseline, PermissionRate } from "../baseline/rates.js";
import { platformPermission } from "../platform/permissions.js";
import { storeAppCanHold } from "../platform/sensitivity.js";

export type UncommonJudgement = Extract<FrequencyJudgement, { kind: "rate" }>;

/** Whether another check reports this permission instead of the rate checks. */
export function reportedByAnotherCheck(permission: string): boolean {
  const platform = platformPermission(permission);
  if (platform) return !storeAppCanHold(platform);
  return permission.startsWith("android.permission.");
}

/** The frequency judgement of a permission `check` reports as uncommon; undefined when it does not. */
export function uncommonJudgement(
  app: AppIdentity | undefined,
  baseline: Pick<Baseline, "era" | "rate">,
  category: string | undefined,
  permission: string,
  rate?: (p: string) => PermissionRate,
): UncommonJudgement | undefined {
  if (reportedByAnotherCheck(permission)) return undefined;
  const j = judgeFrequency(app, baseline, category, permission, rate);
  return isJudgedUncommon(j) ? j : undefined;
}
