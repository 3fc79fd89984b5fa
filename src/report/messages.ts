/**
 * Every check's message, worded from its finding's data: checks return data (score/checks/), and this is
 * where text, CSV, HTML, SARIF and sweep rows get their words. A test keeps one entry a check.
 */
import type { CodeEvidence, PermissionEvidence } from "../score/code-evidence.js";
import { codeStatusText } from "../score/code-evidence.js";
import { checkIdsTagged } from "../score/registry.js";
import type { NeedReason } from "../score/needed.js";
import type { Finding } from "../score/types.js";
import { pct, short } from "./format.js";
import { PLATFORM_TABLE_API } from "../platform/permissions.js";

type Message = (f: Pick<Finding, "subject" | "data">) => string;

/**
 * One rate and one interval: the category's when the app is judged against a category, the pooled one
 * otherwise. The pooled rate is not repeated beside it: it is smoothed (never exactly 0), so "0 of n apps"
 * beside "0.01% of all apps" would read as a contradiction; JSON keeps it in `pooledRate`.
 */
function rateMessage(f: Pick<Finding, "subject" | "data">): string {
  const d = f.data as { k: number; n: number; lower: number; upper: number; pooledRate: number; threshold: number; confidence: number; category?: string; judgedBy?: string; replacedIn?: number; lineageKind?: string; gives?: string };
  const group = d.category ? `${d.category} apps` : "apps in the pooled baseline";
  const what = d.judgedBy ? `judged by ${short(d.judgedBy)}, which it ${d.lineageKind === "renamed" ? "was renamed from" : "replaced"} in API ${d.replacedIn}: ` : "";
  const gives = d.gives ? ` It ${d.gives}.` : "";
  return `${what}${d.k} of ${d.n} ${group} request${d.judgedBy ? "" : " it"}${d.judgedBy ? ` ${short(d.judgedBy)}` : ""} (${Math.round(100 * d.confidence)}% interval ${pct(d.lower, "rate")}–${pct(d.upper, "rate")}, below ${pct(d.threshold, "rate")}).${gives}`;
}

export const MESSAGES: Readonly<Record<string, Message>> = {
  debuggable: () => 'android:debuggable="true": a debugger can attach to the app and run code in it with its permissions and data; release builds leave it off',
  "target-below-installable": (f) =>
    `targetSdk ${f.data.targetSdk}: Android ${f.data.android} (API ${f.data.api}) and later refuse to install apps targeting below ${f.data.minTarget}; on older releases its dangerous permissions are granted at install, without the runtime prompt`,
  "special-access-permission": (f) =>
    f.data.where === "developer-options"
      ? `the user can pick the app in developer options (an app-op, not the protection level, decides): it ${f.data.gives ?? "gets special access"}`
      : `special access the user grants by hand in settings${f.data.gives ? `: it ${f.data.gives}` : ""}; stores ask developers to justify it`,
  "background-location-alone": () => "requested without ACCESS_FINE_LOCATION or ACCESS_COARSE_LOCATION: background location extends one of those and grants nothing on its own",
  "exported-missing": (f) => `${f.data.kind} has an intent filter but no android:exported: at targetSdk ${f.data.targetSdk} the platform refuses to install the app; set android:exported="false" (or "true" if other apps must reach it)`,
  "permission-redelegation": (f) => {
    const d = f.data as { kind: string; permission: string; level: string; gives: string; path: string[]; guard?: string; openBecause: string };
    const open = { none: "no permission", normal: `only ${short(d.guard ?? "")}, which any app gets at install`, undeclared: `${d.guard}, which nothing declares (any app can declare it first)`, "own-normal": `${d.guard}, a normal-level permission any app gets`, "own-dangerous": `${d.guard}, a dangerous-level permission any app can ask for` }[d.openBecause] ?? "no permission";
    return `any app can reach this ${d.kind} (it requires ${open}), and its code uses ${short(d.permission)} (${d.level}${d.gives ? `: ${d.gives}` : ""}) on the caller's behalf: ${d.path.join(" → ")}`;
  },
  "exported-unguarded": (f) => `${f.data.kind} reachable by any app without a permission (${f.data.reason === "explicit" ? 'android:exported="true"' : "exported by default because of its intent filter, targetSdk below 31"})`,
  "no-effect-at-target": (f) => {
    const d = f.data as { targetSdk: number; minSdk?: number; why: string; instead?: string[]; stillUsedBelow?: number; limitTo?: number };
    const instead = d.instead?.length ? `; request ${d.instead.map(short).join(" / ")} instead` : "";
    if (d.stillUsedBelow !== undefined) {
      return `no effect on Android API ${d.stillUsedBelow} and later at targetSdk ${d.targetSdk} (${d.why}); still used on devices from minSdk ${d.minSdk ?? 1} to API ${d.stillUsedBelow - 1}: limit it with android:maxSdkVersion="${d.limitTo}"`;
    }
    return `no effect at targetSdk ${d.targetSdk}: ${d.why}${instead}`;
  },
  "not-seen-in-code": (f) =>
    Array.isArray(f.data.unreached)
      ? `only code that no entry point of the app reaches (${f.data.classes} ${f.data.classes === 1 ? "class" : "classes"}) uses it: ${(f.data.unreached as string[]).slice(0, 3).join(", ")}${(f.data.unreached as string[]).length > 3 ? " …" : ""}; reflection and classes created by name from resources are not seen`
      : `nothing in the app's code (${f.data.dexFiles} dex ${f.data.dexFiles === 1 ? "file" : "files"}${f.data.partial ? ", some unreadable" : ""}) reaches an API the permission maps tie to it; reflection, native code, dynamically loaded code and APIs outside the maps are not seen`,
  "sensitive-uncommon": rateMessage,
  "service-type-permission": (f) => {
    const needs = (f.data.missing as string[]).map(short);
    for (const m of (f.data.missingOneOf as string[] | undefined) ?? []) {
      const [type, any] = m.split(":");
      needs.push(`one of ${any.split("|").map(short).join(", ")} (for ${type})`);
    }
    return `foreground service of type ${(f.data.types as string[]).join("|")} at targetSdk ${f.data.targetSdk} needs ${needs.join(" and ")}, which the app does not request: starting it in the foreground fails`;
  },
  "special-access-component": (f) => `${f.data.kind} bound by ${short(String(f.data.permission))}: ${f.data.grants}`,
  "uncommon-for-category": rateMessage,
  "ungrantable-permission": (f) => {
    const ways: string[] = [];
    if (f.data.role) ways.push("the platform grants it to the holder of a system role only where that role's definition lists it (not to every default SMS, dialer or assistant app)");
    if (f.data.development) ways.push("the user can grant it over adb (pm grant), as for development");
    const base = `protection level ${f.data.protectionLevel}: only the platform or apps preinstalled and signed for it hold this`;
    return ways.length ? `${base}; otherwise ${ways.join("; and ")}. A store app gets it no other way` : `${base}; a store app's request is ignored`;
  },
  "unknown-permission": (f) => {
    const d = f.data as { nearest: string; distance: number; likelyTypo: boolean };
    return d.likelyTypo
      ? `not a platform permission; likely a typo for ${d.nearest} (${d.distance} edit${d.distance === 1 ? "" : "s"} away), so the app does not get what it meant to ask for`
      : `not defined by the platform (framework up to API ${PLATFORM_TABLE_API}, Health Connect module): removed, misspelt, or from another platform version; it grants nothing`;
  },
  "weak-custom-permission": (f) => `${f.data.kind} guarded by ${f.data.permission}, which this app declares as ${f.data.level}: any app can ${f.data.level === "normal" ? "get it at install" : "ask the user for it"}; signature would limit it to the developer's own apps`,
  "weak-guard": (f) =>
    f.data.weakness === "read-only-guard"
      ? `provider guarded only for reading (android:readPermission ${f.data.permission}): any app can insert, update or delete through it; set android:writePermission or android:permission`
      : `${f.data.kind} guarded by ${short(String(f.data.permission))}, a normal-level platform permission: every app that asks gets it at install, so the guard keeps no one out`,
};

/** " Code: used only by org.example.adnet." — what the app's code shows for a permission finding. */
export function codeSuffix(evidence: PermissionEvidence | undefined): string {
  return evidence ? ` Code: ${codeStatusText(evidence.status, evidence.users, evidence.onlyLibraries)}.` : "";
}

/** What an app's code evidence adds to findings on its requested permissions. */
export type CodeLookup = (permission: string) => PermissionEvidence | undefined;

/** The lookup for one judged app's code evidence, or a list of its permissions' (nothing when no dex was read). */
export function codeLookup(code: CodeEvidence | readonly PermissionEvidence[] | undefined): CodeLookup {
  const list = code === undefined ? [] : "read" in code ? (code.read.length ? code.permissions : []) : code;
  if (!list.length) return () => undefined;
  const by = new Map(list.map((e) => [e.permission, e]));
  return (p) => by.get(p);
}

/** The checks whose messages say what the code shows, beside how common the permission is. */
const RATE_CHECKS = checkIdsTagged("rate");

/**
 * A finding in words: its check's message (with what the code shows, for an uncommon permission, when the
 * app's code was read), or for a policy rule's finding (`policy:<rule>`) the rule's own message with
 * where the rule is.
 */
export function wordFinding(f: Pick<Finding, "checkId" | "subject" | "data">, code: CodeLookup = () => undefined): string {
  if (f.checkId.startsWith("policy:")) return `${f.data.message} (rule ${f.data.rule} of ${f.data.policy}, ${f.data.file}:${f.data.line})`;
  const message = MESSAGES[f.checkId];
  if (!message) return f.checkId;
  const text = message(f);
  return RATE_CHECKS.has(f.checkId) ? `${text}${codeSuffix(code(f.subject))}` : text;
}

/** Why the manifest shows a permission is needed (score/needed.ts), or why trim keeps it, in words. */
export function neededText(r: NeedReason | { kind: "notifications" }): string {
  switch (r.kind) {
    case "own-permission":
      return "the app's own permission";
    case "guards-component":
      return `guards the app's own ${r.componentKind} ${r.component}`;
    case "foreground-service":
      return `needed by the foreground service ${r.service} (${r.types.join("|")})`;
    case "service-type":
      return `needed by the ${r.type} foreground service ${r.service}`;
    case "service-type-prerequisite":
      return r.anyOf.length > 1
        ? `the ${r.type} foreground service ${r.service} needs one of ${r.anyOf.map(short).join(", ")} before it starts`
        : `the ${r.type} foreground service ${r.service} needs it before it starts`;
    case "self-managed-calls":
      return `needed by the self-managed calling service ${r.service}`;
    case "calling-app":
      return `a calling app (${r.service}) shows incoming calls full screen, which Android 14 keeps for calling and alarm apps`;
    case "health-connect":
      return `a Health Connect permission, with the rationale the app shows for it in ${r.activity}`;
    case "notifications":
      return "removing it silences every notification the app posts, and no manifest shows an app posts none";
  }
}

/**
 * Where an app's atypicality falls among the baseline's apps of its category, in words. Below the first
 * percentile, "more atypical than 0%" would read as a figure; it says where the app stands instead.
 */
export function atypicalityText(a: { percentile: number; category?: string }, suffix = " in the baseline"): string {
  const who = `${a.category ?? "all"} apps${suffix}`;
  const p = Math.floor(a.percentile);
  return p < 1 ? `among the 1% least atypical of ${who}` : `more atypical than ${p}% of ${who}`;
}
