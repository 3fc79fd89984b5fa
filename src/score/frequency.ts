/**
 * How a requested permission is judged by frequency, for one app: by its own rate, by the rate of the
 * permission it took over from (era rule), or not at all — the app's own permissions, permissions that made
 * an old behaviour explicit, and permissions newer than the baseline with nothing before them.
 */
import { frequencyBasis } from "../baseline/era.js";
import type { Baseline, PermissionRate } from "../baseline/rates.js";
import type { Manifest } from "../extract/manifest/model.js";
import type { Lineage } from "../platform/eras.js";

export type FrequencyJudgement =
  | { kind: "rate"; rate: PermissionRate; judgedBy?: { permission: string; addedIn: number; lineage: Lineage } }
  | { kind: "own-permission" }
  | { kind: "made-explicit"; addedIn: number; lineage: Lineage }
  | { kind: "no-evidence"; addedIn: number };

/**
 * The app's own permissions: those its manifest declares, and those named under its package (for example
 * `<package>.DYNAMIC_RECEIVER_NOT_EXPORTED_PERMISSION`, which the AndroidX core library adds to apps).
 */
export function isOwnPermission(m: Pick<Manifest, "package" | "declaredPermissions">, permission: string): boolean {
  return m.declaredPermissions.some((d) => d.name === permission) || (m.package !== "" && permission.startsWith(`${m.package}.`));
}

export function judgeFrequency(m: Pick<Manifest, "package" | "declaredPermissions">, baseline: Baseline, category: string | undefined, permission: string, rate: (p: string) => PermissionRate): FrequencyJudgement {
  if (isOwnPermission(m, permission)) return { kind: "own-permission" };
  const basis = frequencyBasis(baseline, category, permission);
  if (basis.kind === "own") return { kind: "rate", rate: rate(permission) };
  if (basis.kind === "predecessor") return { kind: "rate", rate: rate(basis.basis), judgedBy: { permission: basis.basis, addedIn: basis.judgement.addedIn, lineage: basis.judgement.lineage } };
  return basis.judgement.kind === "made-explicit"
    ? { kind: "made-explicit", addedIn: basis.judgement.addedIn, lineage: basis.judgement.lineage }
    : { kind: "no-evidence", addedIn: basis.judgement.addedIn };
}
