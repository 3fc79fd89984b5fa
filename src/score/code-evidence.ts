/**
 * Code evidence: for each requested permission, whether the app's dex code (or its manifest) reaches
 * something the API→permission map ties to it. Framework references keep their real names even in an
 * obfuscated app, so renamed app classes do not matter; what the maps cannot see (reflection, native
 * code, dynamically loaded code, WebView bridges, APIs outside the maps) is said beside every "not seen".
 */
import { compareText } from "../util/compare.js";
import type { DexInput } from "../extract/code.js";
import { javaName, type DexFile } from "../extract/dex/dex.js";
import { InputError } from "../errors.js";
import type { Manifest } from "../extract/manifest/model.js";
import { requestedPermissionNames } from "../extract/manifest/model.js";
import { apiPermissionMap, uriEntry, type ApiPermissionMap, type MapEntry } from "../platform/api-map.js";

export type CodeStatus = "used" | "not-seen" | "not-mappable";

export interface EvidenceItem {
  kind: "method" | "field" | "uri" | "action" | "receiver";
  /** The API, field, URI authority or action, as the map names it. */
  what: string;
  /** How many classes reference it (0 for manifest evidence). */
  classes: number;
  /** Package groups of the referencing classes (top three levels, or the app's own package). */
  packages: string[];
  source: string;
}

export interface PermissionEvidence {
  permission: string;
  status: CodeStatus;
  evidence: EvidenceItem[];
  /** Every package group that reaches it, the app's own package first. */
  users: string[];
  /** True when only packages other than the app's own reach it (a bundled library). */
  onlyLibraries: boolean;
}

export interface CodeEvidence {
  /** Dex entries read, with their class counts. */
  read: { entry: string; classes: number }[];
  /** One line per dex that could not be read: "could not read classes2.dex: …". */
  problems: string[];
  permissions: PermissionEvidence[];
  /**
   * APIs the code reaches that need a permission the manifest does not request — none of the entry's
   * alternatives (dead code, a call that fails at run time, or a receiver that never fires).
   */
  unrequested: { permissions: string[]; evidence: EvidenceItem }[];
  /** What no map can see; shown beside "not seen". */
  blindSpots: string;
}

export const BLIND_SPOTS = "reflection, native code, dynamically loaded code, WebView bridges and APIs outside the maps are not seen";

/** The package group of a class: the app's own package when under it, else its top three package levels. */
export function packageGroup(className: string, appPackage: string): string {
  const pkg = className.includes(".") ? className.slice(0, className.lastIndexOf(".")) : "(default package)";
  if (appPackage && (pkg === appPackage || pkg.startsWith(appPackage + "."))) return appPackage;
  return pkg.split(".").slice(0, 3).join(".");
}

interface Hit {
  item: Omit<EvidenceItem, "classes" | "packages">;
  permissions: readonly string[];
  classes: Set<string>;
  packages: Set<string>;
}

type Hits = Map<string, Hit>;

/** Notes one piece of evidence, credited to the class (or manifest component) that holds it. */
function addHit(hits: Hits, appPackage: string, kind: EvidenceItem["kind"], what: string, entry: MapEntry, cls?: string): void {
  const key = `${kind} ${what}`;
  let h = hits.get(key);
  if (!h) hits.set(key, (h = { item: { kind, what, source: entry.source }, permissions: entry.permissions, classes: new Set(), packages: new Set() }));
  if (cls !== undefined) {
    h.classes.add(cls);
    h.packages.add(packageGroup(cls, appPackage));
  }
}

/** Every mapped method, field, content URI and broadcast action the dex's classes refer to. */
function scanDex(dex: DexFile, map: ApiPermissionMap, hits: Hits, appPackage: string): void {
  // Each referenced method/field/string is looked up once per dex, then credited to its classes.
  const methodKeys = new Map<number, { what: string; entry: MapEntry } | null>();
  const methodEntry = (i: number) => {
    let r = methodKeys.get(i);
    if (r === undefined) {
      const m = dex.method(i);
      const owner = javaName(m.owner);
      if (!map.methodOwners.has(owner)) {
        methodKeys.set(i, null);
        return null;
      }
      const exact = `${owner}.${m.name}(${m.params.map(javaName).join(",")})${javaName(m.returns)}`;
      // The published map names one overload; the own table every overload. Both count.
      const e = map.methods.get(exact);
      const any = map.methodsAnyOverload.get(`${owner}.${m.name}`);
      const entry = e && any ? { permissions: [...new Set([...e.permissions, ...any.permissions])], source: `${e.source}; ${any.source}` } : (e ?? any);
      r = entry ? { what: e ? exact : `${owner}.${m.name}`, entry } : null;
      methodKeys.set(i, r);
    }
    return r;
  };
  for (const c of dex.classes) {
    const cls = javaName(c.descriptor);
    for (const i of c.methodRefs) {
      const r = methodEntry(i);
      if (r) addHit(hits, appPackage, "method", r.what, r.entry, cls);
    }
    for (const i of c.fieldRefs) {
      const f = dex.field(i);
      const what = `${javaName(f.owner)}.${f.name}`;
      const e = map.fields.get(what);
      if (e) addHit(hits, appPackage, "field", what, e, cls);
    }
    for (const i of c.stringRefs) {
      // Only content URIs and broadcast actions matter: other strings are never decoded.
      if (dex.stringStartsWith(i, "content://")) {
        const u = uriEntry(map, dex.string(i));
        if (u) addHit(hits, appPackage, "uri", u.uri, u.entry, cls);
      } else if (dex.stringStartsWith(i, "android.")) {
        const s = dex.string(i);
        const a = map.actions.get(s);
        if (a) addHit(hits, appPackage, "action", s, a, cls);
      }
    }
  }
}

export function codeEvidence(manifest: Manifest, dexes: readonly DexInput[], map: ApiPermissionMap = apiPermissionMap()): CodeEvidence {
  const hits: Hits = new Map();
  const read: CodeEvidence["read"] = [];
  const problems: string[] = [];
  for (const input of dexes) {
    if (!input.dex) {
      problems.push(`could not read ${input.entry}: ${input.problem ?? "unknown problem"}`);
      continue;
    }
    try {
      scanDex(input.dex, map, hits, manifest.package);
      read.push({ entry: input.entry, classes: input.dex.classes.length });
    } catch (e) {
      // A string decoded only now can still be damaged: the dex's evidence so far is kept, and the damage said.
      if (!(e instanceof InputError)) throw e;
      problems.push(`could not read ${input.entry}: ${e.detail()}`);
    }
  }
  for (const comp of manifest.components) {
    if (comp.kind !== "receiver") continue;
    for (const f of comp.intentFilters)
      for (const action of f.actions) {
        const e = map.actions.get(action);
        if (e) addHit(hits, manifest.package, "receiver", action, e, comp.name);
      }
  }
  return { read, problems, ...byPermission(manifest, hits, map, read.length > 0), blindSpots: BLIND_SPOTS };
}

/** The evidence sorted out per requested permission, and what the code reaches that the app does not request. */
function byPermission(manifest: Manifest, hits: Hits, map: ApiPermissionMap, anyRead: boolean): Pick<CodeEvidence, "permissions" | "unrequested"> {
  const byPerm = new Map<string, Hit[]>();
  for (const h of hits.values()) for (const p of h.permissions) byPerm.set(p, [...(byPerm.get(p) ?? []), h]);
  const toItems = (list: Hit[] = []): EvidenceItem[] =>
    list
      .map((h) => ({ ...h.item, classes: h.item.kind === "receiver" ? 0 : h.classes.size, packages: [...h.packages].sort(ownFirst(manifest.package)) }))
      .sort((a, b) => b.classes - a.classes || compareText(a.what, b.what));
  // With no dex read (all damaged), nothing can be said per permission: only the problems.
  const requested = anyRead ? requestedPermissionNames(manifest) : [];
  const permissions = requested.map((permission): PermissionEvidence => {
    const evidence = toItems(byPerm.get(permission));
    const users = [...new Set(evidence.flatMap((e) => e.packages))].sort(ownFirst(manifest.package));
    const status: CodeStatus = evidence.length ? "used" : map.covered.has(permission) ? "not-seen" : "not-mappable";
    return { permission, status, evidence, users, onlyLibraries: users.length > 0 && !users.includes(manifest.package) };
  });
  const asked = new Set(requested);
  const unrequested = [...hits.values()]
    .filter((h) => !h.permissions.some((p) => asked.has(p)))
    .map((h) => ({ permissions: [...h.permissions].sort(), evidence: toItems([h])[0] }))
    .sort((a, b) => compareText(a.permissions[0], b.permissions[0]) || compareText(a.evidence.what, b.evidence.what));
  return { permissions, unrequested };
}

function ownFirst(own: string): (a: string, b: string) => number {
  return (a, b) => (a === own ? -1 : b === own ? 1 : compareText(a, b));
}

/**
 * What the code shows for a permission, in the words every report uses: "used by org.example.app",
 * "used only by org.example.adnet", "not seen", "not mappable".
 */
export function codeStatusText(status: CodeStatus, users: readonly string[] = [], onlyLibraries = false): string {
  if (status === "used") return `used${users.length ? ` ${onlyLibraries ? "only by" : "by"} ${users.join(", ")}` : ""}`;
  return status === "not-seen" ? "not seen" : "not mappable";
}

/** A piece of evidence, short: "android.telephony.SmsManager.sendTextMessage(…)", "content://sms string", "a receiver listens for …". */
export function evidenceLabel(e: Pick<EvidenceItem, "kind" | "what">): string {
  if (e.kind === "receiver") return `a receiver listens for ${e.what}`;
  if (e.kind === "uri") return `${e.what} string`;
  if (e.kind === "action") return `${e.what} action string`;
  const paren = e.what.indexOf("(");
  return paren < 0 ? e.what : `${e.what.slice(0, paren)}(…)`;
}
