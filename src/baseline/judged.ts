/**
 * The one rule for "is this requested permission judged uncommon here": used by `check` and its rate
 * checks, `check --records`, `sweep`, `trim`, `delta`, the risk model's features and `overask baseline -p`.
 *
 * A permission is judged by frequency only when frequency can speak for it: never the app's own
 * permissions; a permission newer than the baseline's era only through the permission it took over from
 * (baseline/era.ts); one that made an old behaviour explicit, or has nothing before it, not at all.
 * Judged, it is uncommon when the upper end of its rate's interval is below the baseline's threshold.
 */
import { frequencyBasis } from "./era.js";
import type { Baseline, PermissionRate } from "./rates.js";
import type { Lineage } from "../platform/eras.js";

export type FrequencyJudgement =
  | { kind: "rate"; rate: PermissionRate; judgedBy?: { permission: string; addedIn: number; lineage: Lineage } }
  | { kind: "own-permission" }
  | { kind: "made-explicit"; addedIn: number; lineage: Lineage }
  | { kind: "required-alongside"; addedIn: number; lineage: Lineage }
  | { kind: "no-evidence"; addedIn: number };

/** What the rule needs to know of an app: its package and the permissions it declares itself. */
export interface AppIdentity {
  package: string;
  declaredPermissions?: readonly { name: string }[];
}

/**
 * The app's own permissions: those its manifest declares, and those named under its package (for example
 * `<package>.DYNAMIC_RECEIVER_NOT_EXPORTED_PERMISSION`, which the AndroidX core library adds to apps).
 */
export function isOwnPermission(app: AppIdentity, permission: string): boolean {
  return (app.declaredPermissions?.some((d) => d.name === permission) ?? false) || (app.package !== "" && permission.startsWith(`${app.package}.`));
}

/** How a requested permission is judged by frequency for one app (see the module comment). */
export function judgeFrequency(
  app: AppIdentity | undefined,
  baseline: Pick<Baseline, "era" | "rate">,
  category: string | undefined,
  permission: string,
  rate: (p: string) => PermissionRate = (p) => baseline.rate(category, p),
): FrequencyJudgement {
  if (app && isOwnPermission(app, permission)) return { kind: "own-permission" };
  const basis = frequencyBasis(baseline, category, permission);
  if (basis.kind === "own") return { kind: "rate", rate: rate(permission) };
  if (basis.kind === "predecessor") return { kind: "rate", rate: rate(basis.basis), judgedBy: { permission: basis.basis, addedIn: basis.judgement.addedIn, lineage: basis.judgement.lineage } };
  if (basis.judgement.kind === "alongside") return { kind: "required-alongside", addedIn: basis.judgement.addedIn, lineage: basis.judgement.lineage };
  return basis.judgement.kind === "made-explicit"
    ? { kind: "made-explicit", addedIn: basis.judgement.addedIn, lineage: basis.judgement.lineage }
    : { kind: "no-evidence", addedIn: basis.judgement.addedIn };
}

/** The rule's verdict: judged by frequency, and uncommon for the category. */
export function isJudgedUncommon(j: FrequencyJudgement): j is Extract<FrequencyJudgement, { kind: "rate" }> {
  return j.kind === "rate" && j.rate.uncommon;
}

/**
 * A record's id stands for its package when it reads like one (`org.example.app`), so its own permissions
 * are recognised as they are in a manifest; an id that is a line number or a file path is no package.
 */
export function recordIdentity(id: string): AppIdentity {
  return /^[A-Za-z][\w]*(\.[A-Za-z_][\w]*)+$/.test(id) ? { package: id } : { package: "" };
}
