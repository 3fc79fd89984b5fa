/**
 * `delta`: what changed between two versions of an app that a reviewer of an update needs to see.
 */
import type { CodeEvidence, EvidenceItem, PermissionEvidence } from "./code-evidence.js";
import { requestedPermissionNames } from "../extract/manifest/model.js";
import type { CheckResult } from "./judge.js";
import { checkIdsTagged } from "./registry.js";
import type { Finding, Level } from "./types.js";
import { worstOf } from "./gates.js";

export interface AppVersion {
  package: string;
  versionName?: string;
  versionCode?: number;
  targetSdk?: number;
  risk?: number;
  band?: string;
  baseRate?: number;
  /** The risk at the user's prevalence (`--prevalence`). */
  riskAtPrevalence?: number;
  /** Atypicality percentile among the baseline's apps of the category. */
  atypicality?: number;
}

export interface PermissionChange {
  permission: string;
  base?: string;
  flags?: string[];
  restricted?: "hard" | "soft";
}

function change(r: CheckResult, permission: string): PermissionChange {
  const f = r.manifest.usesPermissions.find((p) => p.name === permission)?.facts;
  return {
    permission,
    ...(f?.base ? { base: f.base } : {}),
    ...(f?.flags?.length ? { flags: f.flags } : {}),
    ...(f?.hardRestricted ? { restricted: "hard" as const } : f?.softRestricted ? { restricted: "soft" as const } : {}),
  };
}

export interface Delta {
  before: AppVersion;
  after: AppVersion;
  samePackage: boolean;
  /** Permissions requested now and not before, and the other way round, each with its platform protection and restrictions. */
  added: PermissionChange[];
  removed: PermissionChange[];
  /** Uncommon-permission findings of the new version that the old one did not have. */
  newlyUncommon: Finding[];
  /** What the new version's code shows for those permissions, when its code was read. */
  codeNow?: PermissionEvidence[];
  /** Special-access components that appeared or disappeared. */
  specialAccess: { added: Finding[]; removed: Finding[] };
  /** Policy rules the new version breaks and the old one did not. */
  newlyBroken: Finding[];
  /** Components other apps can reach now that they could not before. */
  newlyExported: { kind: string; name: string }[];
  /** What the code shows that changed, when both versions' code was read (docs/code-evidence.md). */
  code?: CodeDelta;
  /** Changes a reviewer of an update should weigh: a lower target, debugging or cleartext traffic turned on. */
  regressions: Regression[];
}

/** A change for the worse between two versions, with the level a gate weighs it at. */
export type Regression =
  | { kind: "target-downgrade"; level: Level; before: number; after: number }
  | { kind: "debuggable-on"; level: Level }
  | { kind: "cleartext-on"; level: Level };

/** The most severe level among what an update newly brings (what `delta --fail-on` looks at). */
export function deltaWorst(d: Delta): Level | undefined {
  return worstOf([...d.newlyUncommon, ...d.newlyBroken, ...d.specialAccess.added, ...d.regressions].map((f) => f.level));
}

export interface CodeDelta {
  /** Evidence (an API, URI, field, action or receiver) present now and not before, with the permissions it needs. */
  /** Evidence in one version and not the other; `reached` false: only in code no entry point reaches. */
  appeared: { kind: EvidenceItem["kind"]; what: string; permissions: string[]; packages: string[]; reached: boolean }[];
  vanished: { kind: EvidenceItem["kind"]; what: string; permissions: string[]; packages: string[]; reached: boolean }[];
  /** Permissions requested in both versions whose code status changed (`not-seen` → `used` …). */
  statusChanged: { permission: string; before: string; after: string }[];
}

/** Every piece of evidence of a version, keyed by kind and what, with the permissions it needs. */
function evidenceOf(code: CodeEvidence): Map<string, CodeDelta["appeared"][number]> {
  const out = new Map<string, CodeDelta["appeared"][number]>();
  const add = (e: EvidenceItem, permissions: readonly string[]) => {
    const key = `${e.kind} ${e.what}`;
    const had = out.get(key);
    out.set(key, { kind: e.kind, what: e.what, permissions: [...new Set([...(had?.permissions ?? []), ...permissions])].sort(), packages: e.packages, reached: e.reached || (had?.reached ?? false) });
  };
  for (const p of code.permissions) for (const e of p.evidence) add(e, [p.permission]);
  for (const u of code.unrequested) for (const e of u.evidence) add(e, u.permissions);
  return out;
}

export function compareCode(before: CodeEvidence, after: CodeEvidence): CodeDelta {
  const b = evidenceOf(before);
  const a = evidenceOf(after);
  const old = new Map(before.permissions.map((p) => [p.permission, p.status]));
  return {
    appeared: [...a].filter(([k]) => !b.has(k)).map(([, v]) => v),
    vanished: [...b].filter(([k]) => !a.has(k)).map(([, v]) => v),
    statusChanged: after.permissions.filter((p) => old.has(p.permission) && old.get(p.permission) !== p.status).map((p) => ({ permission: p.permission, before: old.get(p.permission)!, after: p.status })),
  };
}

function version(r: CheckResult): AppVersion {
  const m = r.manifest;
  return {
    package: m.package,
    ...(m.versionName !== undefined ? { versionName: m.versionName } : {}),
    ...(m.versionCode !== undefined ? { versionCode: m.versionCode } : {}),
    ...(m.targetSdk !== undefined ? { targetSdk: m.targetSdk } : {}),
    ...(r.risk ? { risk: r.risk.probability, band: r.risk.band, baseRate: r.risk.baseRate } : {}),
    ...(r.risk?.prevalence ? { riskAtPrevalence: r.risk.prevalence.probability } : {}),
    ...(r.risk?.atypicality ? { atypicality: r.risk.atypicality.percentile } : {}),
  };
}

const RATE_CHECKS = checkIdsTagged("rate");
const SPECIAL_ACCESS_CHECKS = checkIdsTagged("special-access");

/** Every finding, those folded into another on the same permission (`also`) as findings of their own. */
function unfolded(r: CheckResult): Finding[] {
  return r.findings.flatMap((f) => [f, ...(f.also ?? []).map((a) => ({ ...f, checkId: a.checkId, level: a.level, data: a.data, also: undefined }))]);
}

export function compareVersions(before: CheckResult, after: CheckResult): Delta {
  const old = new Set(requestedPermissionNames(before.manifest));
  const now = new Set(requestedPermissionNames(after.manifest));
  const oldRate = new Set(before.findings.filter((f) => RATE_CHECKS.has(f.checkId)).map((f) => f.subject));
  const special = (r: CheckResult) => r.findings.filter((f) => SPECIAL_ACCESS_CHECKS.has(f.checkId));
  const key = (f: Finding) => `${f.subject}\u0000${f.data.permission}`;
  const oldSpecial = new Set(special(before).map(key));
  const newSpecial = new Set(special(after).map(key));
  const wasExported = new Set(before.manifest.components.filter((c) => c.effectiveExported).map((c) => `${c.kind} ${c.name}`));
  const newlyUncommon = after.findings.filter((f) => RATE_CHECKS.has(f.checkId) && !oldRate.has(f.subject));
  const regressions: Regression[] = [];
  const [t0, t1] = [before.manifest.targetSdk ?? before.manifest.minSdk ?? 1, after.manifest.targetSdk ?? after.manifest.minSdk ?? 1];
  // A lower target turns off behaviour changes the old version lived with (runtime permissions below 23,
  // scoped storage below 30 …): an update should never need it.
  if (t1 < t0) regressions.push({ kind: "target-downgrade", level: "warning", before: t0, after: t1 });
  if (after.manifest.application.debuggable === true && before.manifest.application.debuggable !== true) regressions.push({ kind: "debuggable-on", level: "warning" });
  if (after.manifest.application.usesCleartextTraffic === true && before.manifest.application.usesCleartextTraffic !== true) regressions.push({ kind: "cleartext-on", level: "warning" });
  return {
    before: version(before),
    after: version(after),
    samePackage: before.manifest.package === after.manifest.package,
    added: [...now].filter((p) => !old.has(p)).sort().map((p) => change(after, p)),
    removed: [...old].filter((p) => !now.has(p)).sort().map((p) => change(before, p)),
    newlyUncommon,
    regressions,
    ...(after.code?.read.length && newlyUncommon.length ? { codeNow: after.code.permissions.filter((e) => newlyUncommon.some((f) => f.subject === e.permission)) } : {}),
    specialAccess: {
      added: special(after).filter((f) => !oldSpecial.has(key(f))),
      removed: special(before).filter((f) => !newSpecial.has(key(f))),
    },
    newlyBroken: unfolded(after).filter((f) => f.checkId.startsWith("policy:") && !unfolded(before).some((o) => o.checkId === f.checkId && o.subject === f.subject)),
    newlyExported: after.manifest.components.filter((c) => c.effectiveExported && !wasExported.has(`${c.kind} ${c.name}`)).map((c) => ({ kind: c.kind, name: c.name })),
    ...(before.code?.read.length && after.code?.read.length ? { code: compareCode(before.code, after.code) } : {}),
  };
}
