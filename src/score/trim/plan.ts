/**
 * `trim`: the requested permissions worth removing (or limiting), ranked by how much each lowers the
 * risk, with the exact change to the source manifest.
 */
import type { CodeStatus } from "../code-evidence.js";
import { requestedPermissionNames, type Manifest, type RequestedPermission } from "../../extract/manifest/model.js";
import type { CheckResult } from "../judge.js";
import type { PermissionOrigin } from "../merge-report.js";
import { checkIdsTagged } from "../registry.js";
import { neededByManifest, type NeedReason } from "../needed.js";
import { levelRank, type FindingData, type Level } from "../types.js";

const TRIM_CHECKS = checkIdsTagged("trim");

export type TrimAction =
  /** Delete the element from the app's own manifest. */
  | { kind: "delete" }
  /** Keep the request for older devices only. */
  | { kind: "limit"; maxSdkVersion: number }
  /** The permission comes from a library: drop it at merge time. */
  | { kind: "merge-remove" };

export interface TrimCandidate {
  permission: string;
  /** Check ids and levels that make it worth a look, most severe first. */
  reasons: { checkId: string; level: Level; data: FindingData }[];
  action: TrimAction;
  /** The element in the given manifest, when it declares the request. */
  element?: RequestedPermission;
  /** Risk without this permission (when the baseline has a model). */
  riskWithout?: number;
  libraries?: string[];
  /** Why removing (or limiting) it is safe (report/trim-delta.ts words each); empty when it is not. */
  safe: SafeReason[];
  /** What the app's code shows for it, when the code was read (docs/code-evidence.md). */
  code?: { status: CodeStatus; users: string[] };
}

/** Why acting on a candidate is safe, one a reason. */
export type SafeReason =
  | "older-devices-keep-it"
  | "ignored-at-target"
  | "not-granted-to-store-apps"
  | "nothing-without-foreground-location"
  | "no-such-permission"
  | "forbidden-by-policy"
  | "not-seen-in-code"
  | "not-seen-in-code-some-hidden"
  | "nothing-in-manifest-needs-it"
  | "nothing-in-manifest-needs-it-code-unread";

export interface TrimPlan {
  package: string;
  risk?: number;
  riskWithoutAll?: number;
  /** The base rate the risk is relative to, its figure at the user's prevalence, and the atypicality. */
  baseRate?: number;
  prevalence?: { share: number; probability: number };
  atypicality?: { percentile: number; category?: string };
  candidates: TrimCandidate[];
  /** Flagged permissions trim leaves alone because the manifest shows the app needs them. */
  kept: { permission: string; reasons: KeptReason[] }[];
  /** Likely typos: not trimmed, but to be fixed. */
  typos: { permission: string; nearest: string }[];
}

/**
 * `source` is the plain manifest a patch would change: the input itself when it is one, or the app's
 * source manifest given beside a merged manifest or APK. A permission the source does not declare
 * comes from a library and is dropped at merge time.
 */
export function planTrim(
  result: CheckResult,
  options: { origins?: Map<string, PermissionOrigin>; riskWithout?: (perms: string[]) => number; source?: Manifest } = {},
): TrimPlan {
  const m: Manifest = result.manifest;
  const byPermission = new Map<string, TrimCandidate>();
  const typos: TrimPlan["typos"] = [];
  const source = options.source ?? (m.input.kind === "plain-xml" ? m : undefined);
  const needed = keptReasons(m);
  const kept = new Map<string, KeptReason[]>();
  // Flagged as uncommon but for the manifest's reason (check's `needed`): kept, and said so.
  for (const n of result.needed) kept.set(n.permission, n.reasons);
  // Folded findings (score/judge.ts) carry other checks' reasons in `also`: each is a reason of its own here.
  const all = result.findings.flatMap((f) => [f, ...(f.also ?? []).map((a) => ({ ...f, checkId: a.checkId, level: a.level, data: a.data }))]);
  for (const f of all) {
    // A permission a policy rule forbids is a removal candidate too; the reason names the rule.
    if (!TRIM_CHECKS.has(f.checkId) && !(f.checkId.startsWith("policy:") && f.data.removable)) continue;
    const need = needed.get(f.subject);
    if (need) {
      kept.set(f.subject, need);
      continue;
    }
    if (f.checkId === "unknown-permission" && f.data.likelyTypo) {
      typos.push({ permission: f.subject, nearest: String(f.data.nearest) });
      continue;
    }
    const element = source?.usesPermissions.find((p) => p.name === f.subject && !p.removedByTools);
    let c = byPermission.get(f.subject);
    if (!c) {
      const origin = options.origins?.get(f.subject);
      const fromLibrary = origin ? origin.libraries.length > 0 && !origin.app && !element : source !== undefined && !element;
      c = { permission: f.subject, reasons: [], action: fromLibrary ? { kind: "merge-remove" } : { kind: "delete" }, safe: [] };
      if (element) c.element = element;
      if (origin?.libraries.length) c.libraries = origin.libraries;
      byPermission.set(f.subject, c);
    }
    c.reasons.push({ checkId: f.checkId, level: f.level, data: f.data });
    if (f.checkId === "no-effect-at-target" && typeof f.data.limitTo === "number" && c.action.kind === "delete") {
      c.action = { kind: "limit", maxSdkVersion: f.data.limitTo };
    }
  }
  const candidates = [...byPermission.values()];
  const evidence = new Map((result.code?.permissions ?? []).map((e) => [e.permission, e]));
  for (const c of candidates) {
    const e = evidence.get(c.permission);
    if (e) c.code = { status: e.status, users: e.users };
    // A permission the code uses is not safe to remove, whatever else is said of it.
    c.safe = e?.status === "used" ? [] : safety(c);
    // Code the app loads at run time, or reaches by names built at run time, is out of the maps' sight.
    if (result.code?.blind.some((b) => b.kind !== "native-code")) c.safe = c.safe.map((r) => (r === "not-seen-in-code" ? "not-seen-in-code-some-hidden" : r));
  }
  const requested = requestedPermissionNames(m);
  if (options.riskWithout) {
    for (const c of candidates) c.riskWithout = options.riskWithout(requested.filter((p) => p !== c.permission));
  }
  for (const c of candidates) c.reasons.sort((a, b) => levelRank(b.level) - levelRank(a.level));
  // Not seen, or only in unreached code, first; then what the code cannot show (not mappable, code unread);
  // a permission the code uses after every other: removing it breaks that code.
  const usedTier = (c: TrimCandidate) => (c.code?.status === "used" ? 2 : c.code?.status === "not-seen" || c.code?.status === "unreached" ? 0 : 1);
  candidates.sort(
    (a, b) =>
      usedTier(a) - usedTier(b) ||
      (a.riskWithout ?? 0) - (b.riskWithout ?? 0) ||
      levelRank(b.reasons[0].level) - levelRank(a.reasons[0].level) ||
      a.permission.localeCompare(b.permission),
  );
  const plan: TrimPlan = { package: m.package, candidates, kept: [...kept].map(([permission, reasons]) => ({ permission, reasons })).sort((a, b) => a.permission.localeCompare(b.permission)), typos };
  if (result.risk) {
    plan.risk = result.risk.probability;
    plan.baseRate = result.risk.baseRate;
    if (result.risk.prevalence) plan.prevalence = { share: result.risk.prevalence.share, probability: result.risk.prevalence.probability };
    if (result.risk.atypicality) plan.atypicality = { percentile: result.risk.atypicality.percentile, ...(result.risk.atypicality.category ? { category: result.risk.atypicality.category } : {}) };
    if (options.riskWithout && candidates.length) {
      const gone = new Set(candidates.filter((c) => c.action.kind !== "limit").map((c) => c.permission));
      plan.riskWithoutAll = options.riskWithout(requested.filter((p) => !gone.has(p)));
    }
  }
  return plan;
}

/** The manifest snippet that carries out a candidate's action. */
export function snippetFor(c: TrimCandidate): string {
  switch (c.action.kind) {
    case "limit":
      return `<uses-permission android:name="${c.permission}" android:maxSdkVersion="${c.action.maxSdkVersion}" />`;
    case "merge-remove":
      return `<uses-permission android:name="${c.permission}" tools:node="remove" />`;
    case "delete":
      return `<uses-permission android:name="${c.permission}" />`;
  }
}

const NOTIFICATIONS = "android.permission.POST_NOTIFICATIONS";

/** Why trim leaves a flagged permission alone: the manifest shows the app needs it, or removing it silences the app. */
export type KeptReason = NeedReason | { kind: "notifications" };

/**
 * What trim keeps, with why: every permission the manifest shows the app needs (score/needed.ts), and
 * POST_NOTIFICATIONS, whose removal silences every notification the app posts (no manifest can show that
 * an app posts none).
 */
function keptReasons(m: Manifest): Map<string, KeptReason[]> {
  const kept = new Map<string, KeptReason[]>([...neededByManifest(m)].map(([p, r]) => [p, [...r]]));
  if (!kept.has(NOTIFICATIONS)) kept.set(NOTIFICATIONS, [{ kind: "notifications" }]);
  return kept;
}

/** Why acting on a candidate is safe, from its reasons. */
function safety(c: TrimCandidate): SafeReason[] {
  const ids = new Set(c.reasons.map((r) => r.checkId));
  const out: SafeReason[] = [];
  if (c.action.kind === "limit") out.push("older-devices-keep-it");
  else if (ids.has("no-effect-at-target")) out.push("ignored-at-target");
  if (ids.has("ungrantable-permission")) out.push("not-granted-to-store-apps");
  if (ids.has("background-location-alone")) out.push("nothing-without-foreground-location");
  if (ids.has("unknown-permission")) out.push("no-such-permission");
  if ([...ids].some((i) => i.startsWith("policy:"))) out.push("forbidden-by-policy");
  if (ids.has("not-seen-in-code")) out.push("not-seen-in-code");
  if (ids.has("sensitive-uncommon") || ids.has("uncommon-for-category")) out.push(c.code ? "nothing-in-manifest-needs-it" : "nothing-in-manifest-needs-it-code-unread");
  return out;
}
