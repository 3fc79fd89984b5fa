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
import { LIMITS } from "../limits.js";
import type { Manifest } from "../extract/manifest/model.js";
import { isLauncher, requestedPermissionNames } from "../extract/manifest/model.js";
import { apiPermissionMap, uriEntry, type ApiPermissionMap, type MapEntry } from "../platform/api-map.js";
import { Program, type MethodNode } from "./code/program.js";
import { callbacks, entryClasses, pathsFrom, reachability, type Reachability } from "./code/reach.js";

/**
 * used: reached code (or the manifest) holds evidence; unreached: evidence only in code no entry point
 * reaches (dead code, an unused library); not-seen: the maps cover the permission and nothing is found;
 * not-mappable: the maps tie no API to it.
 */
export type CodeStatus = "used" | "unreached" | "not-seen" | "not-mappable";

export interface EvidenceItem {
  kind: "method" | "field" | "uri" | "action" | "receiver" | "class";
  /** The API, field, URI authority, action or class, as the map names it. */
  what: string;
  /** How many classes reference it (0 for manifest evidence). */
  classes: number;
  /** Whether code the app's entry points reach holds it (manifest evidence always; true when reachability is unknown). */
  reached: boolean;
  /** Package groups of the referencing classes, those in reached code only when any is (top three levels, or the app's own package). */
  packages: string[];
  source: string;
}

export interface PermissionEvidence {
  permission: string;
  status: CodeStatus;
  evidence: EvidenceItem[];
  /** Every package group that reaches it (reached code only, when any), the app's own package first. */
  users: string[];
  /** True when only packages other than the app's own reach it (a bundled library). */
  onlyLibraries: boolean;
}

/** Something the maps cannot see through in this app, so that "not seen" is read with it in mind. */
export interface BlindSpot {
  kind: "class-loader" | "native-code" | "reflection";
  /** Where: classes (with the method) or archive entries, at most ten. */
  where: string[];
}

/** An exported component whose reached code uses a permission: what the re-delegation check judges. */
export interface ComponentUse {
  component: string;
  permission: string;
  /** Entry method → … → the method holding the evidence, then the evidence itself. */
  path: string[];
}

export interface CodeEvidence {
  /** Dex entries read, with their class counts. */
  read: { entry: string; classes: number }[];
  /** One line per dex that could not be read: "could not read classes2.dex: …"; hierarchy loops; a capped call graph. */
  problems: string[];
  permissions: PermissionEvidence[];
  /**
   * Permissions the reached code uses that the manifest does not request — none of an API's alternatives
   * (a call that fails at run time, or a receiver that never fires): one entry per set of alternatives.
   */
  unrequested: { permissions: string[]; evidence: EvidenceItem[] }[];
  /** What no map can see; shown beside "not seen". */
  blindSpots: string;
  /** This app's own blind spots: run-time class loading, native libraries, reflection on names built at run time. */
  blind: BlindSpot[];
  /** The call graph: methods defined and reached, entry classes; absent when capped (then `problems` says so). */
  reachability?: { methods: number; reached: number; entries: number };
  /** Exported components and the permissions their reached code uses, with a path. */
  componentUses: ComponentUse[];
}

export const BLIND_SPOTS = "reflection, native code, dynamically loaded code, WebView bridges and APIs outside the maps are not seen";

/**
 * Packages that hold the app's own code: the manifest package, the packages of the classes the manifest
 * names (components, application), and sibling packages under the same organisation prefix (the manifest
 * package without its last segment, kept to three segments or more) whose classes the app's code reaches.
 */
export interface OwnCode {
  app: string;
  roots: readonly string[];
  sibling?: string;
}

function inRoot(pkg: string, root: string): boolean {
  return pkg === root || pkg.startsWith(root + ".");
}

/** The package group of a class: the app's own package when under one of its roots, else its top three package levels. */
export function packageGroup(className: string, own: string | OwnCode, reached = true): string {
  const o: OwnCode = typeof own === "string" ? { app: own, roots: own ? [own] : [] } : own;
  const pkg = className.includes(".") ? className.slice(0, className.lastIndexOf(".")) : "(default package)";
  if (o.roots.some((r) => inRoot(pkg, r))) return o.app;
  if (reached && o.sibling && inRoot(pkg, o.sibling)) return o.app;
  return pkg.split(".").slice(0, 3).join(".");
}

function ownCode(manifest: Manifest, manifestClasses: readonly string[]): OwnCode {
  const app = manifest.package;
  const roots = new Set<string>(app ? [app] : []);
  for (const c of manifestClasses) if (c.includes(".")) roots.add(c.slice(0, c.lastIndexOf(".")));
  const parts = app.split(".");
  const sibling = parts.length >= 4 ? parts.slice(0, -1).join(".") : undefined;
  return { app, roots: [...roots], ...(sibling ? { sibling } : {}) };
}

/** Every class the manifest asks the platform to create. */
function manifestClassNames(manifest: Manifest): string[] {
  const a = manifest.application;
  return [
    ...manifest.components.map((c) => c.name),
    ...manifest.components.flatMap((c) => (c.targetActivity ? [c.targetActivity] : [])),
    ...[a.className, a.backupAgent, a.appComponentFactory].filter((x): x is string => !!x),
    ...(manifest.instrumentation ?? []).map((i) => i.name),
  ].filter(Boolean);
}

interface Hit {
  item: Omit<EvidenceItem, "classes" | "packages" | "reached">;
  permissions: readonly string[];
  /** Methods (program ids) holding it; -1 for manifest evidence. */
  methods: number[];
  classes: Set<string>;
  /** The class last added (methods of a class come one after another): skips most set lookups. */
  last?: string;
}

type Hits = Map<string, Hit>;

const CLASS_LOADERS = new Set(["Ldalvik/system/DexClassLoader;", "Ldalvik/system/PathClassLoader;", "Ldalvik/system/InMemoryDexClassLoader;", "Ldalvik/system/DelegateLastClassLoader;", "Ldalvik/system/BaseDexClassLoader;"]);

/** Per dex, each referenced id looked up in the maps once. */
interface DexLookups {
  methods: ({ key: string; what: string; entry: MapEntry } | null | undefined)[];
  /** Per method id: 1 a class loader's constructor, 2 a native-library load, 0 neither. */
  blind: Int8Array;
  fields: ({ key: string; what: string; entry: MapEntry } | null | undefined)[];
  strings: ({ key: string; what: string; kind: "uri" | "action"; entry: MapEntry } | null | undefined)[];
  types: ({ key: string; what: string; entry: MapEntry } | null | undefined)[];
}

let ownerDescriptors: Set<string> | undefined;
let ownerDescriptorsOf: ApiPermissionMap | undefined;

/** The classes that declare a mapped method, as type descriptors (made once per map). */
function mappedOwners(map: ApiPermissionMap): Set<string> {
  if (ownerDescriptorsOf !== map) {
    ownerDescriptors = new Set([...map.methodOwners].map((c) => `L${c.replace(/\./g, "/")};`));
    ownerDescriptorsOf = map;
  }
  return ownerDescriptors!;
}

/**
 * The map entry a call lands on: through the app's own superclasses to the framework class it inherits the
 * member from, then up the framework's superclasses; a member the app itself defines is app code, not an API.
 */
function lookupMethod(p: Program, map: ApiPermissionMap, d: number, i: number): { what: string; entry: MapEntry } | null {
  const ref = p.ref(d, i);
  let owner: string | undefined = ref.owner;
  if (p.classes.has(owner)) {
    const own = p.resolve(owner, ref.sig);
    if (own && own.def.at >= 0) return null;
    owner = p.firstFramework(owner);
  }
  const owners = mappedOwners(map);
  for (let depth = 0; owner && depth < 32; depth++) {
    if (owners.has(owner)) {
      const cls = javaName(owner);
      const exact = `${cls}.${ref.name}(${ref.params.map(javaName).join(",")})${javaName(ref.returns)}`;
      const e = map.methods.get(exact);
      const any = map.methodsAnyOverload.get(`${cls}.${ref.name}`);
      const entry = e && any ? { permissions: [...new Set([...e.permissions, ...any.permissions])], source: `${e.source}; ${any.source}` } : (e ?? any);
      if (entry) return { what: e ? exact : `${cls}.${ref.name}`, entry };
    }
    const next = p.superOf(owner);
    owner = next === "Ljava/lang/Object;" ? undefined : next;
  }
  return null;
}

function blindKind(p: Program, d: number, i: number): number {
  const ref = p.ref(d, i);
  if (ref.name === "<init>" && CLASS_LOADERS.has(ref.owner)) return 1;
  if ((ref.name === "loadLibrary" || ref.name === "load") && (ref.owner === "Ljava/lang/System;" || ref.owner === "Ljava/lang/Runtime;")) return 2;
  return 0;
}

/** Every mapped method, field, content URI, broadcast action and class each method's code refers to; and the app's blind spots. */
function scanProgram(p: Program, map: ApiPermissionMap, hits: Hits, blind: Map<BlindSpot["kind"], Set<string>>): void {
  const lookups: DexLookups[] = p.dexes.map((d) => ({ methods: new Array(d.methodCount), blind: new Int8Array(d.methodCount).fill(-1), fields: new Array(d.fieldCount), strings: new Array(d.stringCount), types: new Array(d.typeCount) }));
  const add = (key: string, kind: EvidenceItem["kind"], what: string, entry: MapEntry, m: MethodNode) => {
    let h = hits.get(key);
    if (!h) hits.set(key, (h = { item: { kind, what, source: entry.source }, permissions: entry.permissions, methods: [], classes: new Set() }));
    h.methods.push(m.id);
    if (h.last !== m.cls.descriptor) h.classes.add((h.last = m.cls.descriptor));
  };
  const note = (kind: BlindSpot["kind"], where: string) => {
    let set = blind.get(kind);
    if (!set) blind.set(kind, (set = new Set()));
    if (set.size < 10) set.add(where);
  };
  for (const m of p.methods) {
    if (m.def.at < 0) continue;
    const d = m.cls.dex;
    const dex: DexFile = p.dexes[d];
    const L = lookups[d];
    // The method's packed references (extract/dex/dex.ts, methodCode), read in place.
    const c = dex.code;
    let at = m.def.at;
    const [ni, nf, ns, nt] = [c[at], c[at + 1], c[at + 2], c[at + 3]];
    at += 4;
    for (const end = at + ni; at < end; at++) {
      const i = c[at] >>> 3;
      let r = L.methods[i];
      if (r === undefined) {
        const found = lookupMethod(p, map, d, i);
        r = L.methods[i] = found ? { key: `method ${found.what}`, ...found } : null;
      }
      if (r) add(r.key, "method", r.what, r.entry, m);
      let b = L.blind[i];
      if (b < 0) b = L.blind[i] = blindKind(p, d, i);
      if (b === 1) note("class-loader", `${javaName(p.ref(d, i).owner).split(".").pop()} in ${javaName(m.cls.descriptor)}.${m.name}`);
      else if (b === 2) note("native-code", `${javaName(m.cls.descriptor)}.${m.name} loads a native library`);
    }
    for (const end = at + nf; at < end; at++) {
      const i = c[at];
      let e = L.fields[i];
      if (e === undefined) {
        const f = dex.field(i);
        const what = `${javaName(f.owner)}.${f.name}`;
        const entry = map.fields.get(what);
        e = L.fields[i] = entry ? { key: `field ${what}`, what, entry } : null;
      }
      if (e) add(e.key, "field", e.what, e.entry, m);
    }
    for (const end = at + ns; at < end; at++) {
      const i = c[at];
      let r = L.strings[i];
      if (r === undefined) {
        r = null;
        // Only content URIs and broadcast actions matter: other strings are never decoded.
        if (dex.stringStartsWith(i, "content://")) {
          const u = uriEntry(map, dex.string(i));
          if (u) r = { key: `uri ${u.uri}`, what: u.uri, kind: "uri", entry: u.entry };
        } else if (dex.stringStartsWith(i, "android.")) {
          const s = dex.string(i);
          const a = map.actions.get(s);
          if (a) r = { key: `action ${s}`, what: s, kind: "action", entry: a };
        }
        L.strings[i] = r;
      }
      if (r) add(r.key, r.kind, r.what, r.entry, m);
    }
    for (const end = at + nt; at < end; at++) {
      const i = c[at];
      let e = L.types[i];
      if (e === undefined) {
        const what = javaName(dex.type(i));
        const entry = map.classes.get(what);
        e = L.types[i] = entry ? { key: `class ${what}`, what, entry } : null;
      }
      if (e) add(e.key, "class", e.what, e.entry, m);
    }
  }
}

export interface CodeEvidenceOptions {
  map?: ApiPermissionMap;
  /** Archive entries of native libraries (`lib/arm64-v8a/libfoo.so`): a blind spot. */
  nativeLibraries?: readonly string[];
  /** Methods beyond which no call graph is built (default LIMITS.MAX_CALL_GRAPH_METHODS). */
  maxMethods?: number;
}

export function codeEvidence(manifest: Manifest, dexes: readonly DexInput[], options: CodeEvidenceOptions | ApiPermissionMap = {}): CodeEvidence {
  const opts: CodeEvidenceOptions = "methods" in options ? { map: options as ApiPermissionMap } : (options as CodeEvidenceOptions);
  const map = opts.map ?? apiPermissionMap();
  const hits: Hits = new Map();
  const read: CodeEvidence["read"] = [];
  const problems: string[] = [];
  const good: DexFile[] = [];
  for (const input of dexes) {
    if (!input.dex) {
      problems.push(`could not read ${input.entry}: ${input.problem ?? "unknown problem"}`);
      continue;
    }
    good.push(input.dex);
    read.push({ entry: input.entry, classes: input.dex.classes.length });
  }
  const blind = new Map<BlindSpot["kind"], Set<string>>();
  const program = new Program(good);
  let reach: Reachability | undefined;
  const classNames = manifestClassNames(manifest);
  const maxMethods = opts.maxMethods ?? LIMITS.MAX_CALL_GRAPH_METHODS;
  try {
    scanProgram(program, map, hits, blind);
    if (program.methods.length > maxMethods) problems.push(`call graph capped at ${maxMethods} methods (the code defines ${program.methods.length}): evidence shown without reachability`);
    else reach = reachability(program, entryClasses(program, classNames));
  } catch (e) {
    // A string decoded only now can still be damaged: what was found so far is kept, and the damage said.
    if (!(e instanceof InputError)) throw e;
    problems.push(`could not read the code: ${e.detail()}`);
    reach = undefined;
  }
  problems.push(...program.problems);
  for (const lib of opts.nativeLibraries ?? []) {
    let set = blind.get("native-code");
    if (!set) blind.set("native-code", (set = new Set()));
    if (set.size < 10) set.add(lib);
  }
  if (reach?.nonConstantReflection.length) blind.set("reflection", new Set(reach.nonConstantReflection.slice(0, 10)));
  for (const comp of manifest.components) {
    if (comp.kind !== "receiver") continue;
    for (const f of comp.intentFilters)
      for (const action of f.actions) {
        const e = map.actions.get(action);
        if (!e) continue;
        const key = `receiver ${action}`;
        if (!hits.has(key)) hits.set(key, { item: { kind: "receiver", what: action, source: e.source }, permissions: e.permissions, methods: [-1], classes: new Set([comp.name]) });
      }
  }
  const own = ownCode(manifest, classNames);
  const reachedClasses = new Set<string>();
  if (reach) for (const m of program.methods) if (reach.reached[m.id]) reachedClasses.add(m.cls.descriptor);
  const reachedClass = (d: string) => !reach || reachedClasses.has(d);
  const group = (descriptorOrName: string) => {
    const name = descriptorOrName.startsWith("L") && descriptorOrName.endsWith(";") ? javaName(descriptorOrName) : descriptorOrName;
    return packageGroup(name, own, !reach || reachedClass(descriptorOrName));
  };
  const anyRead = read.length > 0;
  const componentUses = reach && anyRead ? usesOfExported(manifest, program, reach, hits) : [];
  return {
    read,
    problems,
    ...byPermission(manifest, hits, map, anyRead, reach, group, (id) => program.methods[id].cls.descriptor),
    blindSpots: BLIND_SPOTS,
    blind: (["class-loader", "native-code", "reflection"] as const).filter((k) => blind.get(k)?.size).map((kind) => ({ kind, where: [...blind.get(kind)!].sort(compareText) })),
    ...(reach ? { reachability: { methods: program.methods.length, reached: reach.count, entries: reach.instantiated.size } } : {}),
    componentUses,
  };
}

/** For each exported component: every permission its reached code uses, with the shortest path to the evidence. */
function usesOfExported(manifest: Manifest, p: Program, r: Reachability, hits: Hits): ComponentUse[] {
  // Only reached methods can be on a path.
  const byMethod = new Map<number, Hit[]>();
  for (const h of hits.values())
    for (const id of h.methods) {
      if (id < 0 || !r.reached[id]) continue;
      const list = byMethod.get(id);
      if (list) list.push(h);
      else byMethod.set(id, [h]);
    }
  const out: ComponentUse[] = [];
  for (const comp of manifest.components) {
    // Launcher activities are meant for everyone (the re-delegation check leaves them out).
    if (!comp.effectiveExported || comp.enabled === false || isLauncher(comp)) continue;
    const cls = p.byJavaName(comp.kind === "activity-alias" && comp.targetActivity ? comp.targetActivity : comp.name);
    if (!cls) continue;
    const from: MethodNode[] = [];
    callbacks(p, cls, (m) => from.push(m));
    for (const m of cls.methods.values()) if (m.name === "<init>" || m.name === "<clinit>") from.push(m);
    const paths = pathsFrom(p, r, from, (m) => byMethod.has(m.id));
    const best = new Map<string, string[]>();
    for (const [id, path] of paths) {
      for (const h of byMethod.get(id) ?? []) {
        const steps = [...path.map((m) => `${javaName(m.cls.descriptor)}.${m.name}`), evidenceLabel({ kind: h.item.kind, what: h.item.what })];
        for (const perm of h.permissions) {
          const had = best.get(perm);
          if (!had || steps.length < had.length) best.set(perm, steps);
        }
      }
    }
    for (const [permission, path] of [...best].sort((a, b) => compareText(a[0], b[0]))) out.push({ component: comp.name, permission, path });
  }
  return out;
}

/** The evidence sorted out per requested permission, and what the reached code uses that the app does not request. */
function byPermission(
  manifest: Manifest,
  hits: Hits,
  map: ApiPermissionMap,
  anyRead: boolean,
  reach: Reachability | undefined,
  group: (cls: string) => string,
  classOf: (methodId: number) => string,
): Pick<CodeEvidence, "permissions" | "unrequested"> {
  const items = new Map<Hit, EvidenceItem>();
  for (const h of hits.values()) {
    const manifestEvidence = h.methods[0] === -1;
    const reachedMethods = manifestEvidence || !reach ? h.methods : h.methods.filter((id) => reach.reached[id]);
    const reached = manifestEvidence || !reach || reachedMethods.length > 0;
    const shown = new Set<string>();
    if (!manifestEvidence) {
      // Packages of the reached classes when any are, else of every class holding it.
      const classes = reached && reach ? new Set(reachedMethods.map(classOf)) : h.classes;
      for (const c of classes) if (c) shown.add(group(c));
    } else for (const c of h.classes) shown.add(group(c));
    items.set(h, { ...h.item, classes: manifestEvidence ? 0 : h.classes.size, reached, packages: [...shown].sort(ownFirst(manifest.package)) });
  }
  const byPerm = new Map<string, Hit[]>();
  for (const h of hits.values()) for (const p of h.permissions) byPerm.set(p, [...(byPerm.get(p) ?? []), h]);
  const sortItems = (list: EvidenceItem[]) => list.sort((a, b) => Number(b.reached) - Number(a.reached) || b.classes - a.classes || compareText(a.what, b.what));
  // With no dex read (all damaged), nothing can be said per permission: only the problems.
  const requested = anyRead ? requestedPermissionNames(manifest) : [];
  const permissions = requested.map((permission): PermissionEvidence => {
    const evidence = sortItems((byPerm.get(permission) ?? []).map((h) => items.get(h)!));
    const live = evidence.filter((e) => e.reached);
    const users = [...new Set((live.length ? live : evidence).flatMap((e) => e.packages))].sort(ownFirst(manifest.package));
    const status: CodeStatus = live.length ? "used" : evidence.length ? "unreached" : map.covered.has(permission) ? "not-seen" : "not-mappable";
    return { permission, status, evidence, users, onlyLibraries: users.length > 0 && !users.includes(manifest.package) };
  });
  const asked = new Set(requested);
  const grouped = new Map<string, EvidenceItem[]>();
  for (const h of hits.values()) {
    const item = items.get(h)!;
    if (!item.reached || h.permissions.some((p) => asked.has(p))) continue;
    const key = [...h.permissions].sort().join(",");
    grouped.set(key, [...(grouped.get(key) ?? []), item]);
  }
  const unrequested = [...grouped]
    .map(([key, evidence]) => ({ permissions: key.split(","), evidence: sortItems(evidence) }))
    .sort((a, b) => compareText(a.permissions[0], b.permissions[0]) || a.permissions.length - b.permissions.length);
  return { permissions, unrequested };
}

function ownFirst(own: string): (a: string, b: string) => number {
  return (a, b) => (a === own ? -1 : b === own ? 1 : compareText(a, b));
}

/**
 * What the code shows for a permission, in the words every report uses: "used by org.example.app",
 * "used only by org.example.adnet", "in code, never reached (org.example.oldsdk)", "not seen", "not mappable".
 */
export function codeStatusText(status: CodeStatus, users: readonly string[] = [], onlyLibraries = false): string {
  if (status === "used") return `used${users.length ? ` ${onlyLibraries ? "only by" : "by"} ${users.join(", ")}` : ""}`;
  if (status === "unreached") return `in code, never reached${users.length ? ` (${users.join(", ")})` : ""}`;
  return status === "not-seen" ? "not seen" : "not mappable";
}

/** A piece of evidence, short: "android.telephony.SmsManager.sendTextMessage(…)", "content://sms string", "a receiver listens for …". */
export function evidenceLabel(e: Pick<EvidenceItem, "kind" | "what">): string {
  if (e.kind === "receiver") return `a receiver listens for ${e.what}`;
  if (e.kind === "uri") return `${e.what} string`;
  if (e.kind === "action") return `${e.what} action string`;
  if (e.kind === "class") return `${e.what} class`;
  const paren = e.what.indexOf("(");
  return paren < 0 ? e.what : `${e.what.slice(0, paren)}(…)`;
}

/** An app's blind spot in words: "loads code at run time: DexClassLoader in org.example.app.Plugins.load". */
export function blindSpotText(b: BlindSpot): string {
  const where = b.where.join(", ");
  if (b.kind === "class-loader") return `loads code at run time (${where}): code it loads is not seen`;
  if (b.kind === "native-code") return `ships or loads native code (${where}): what native code does is not seen`;
  return `reflects on names built at run time (${where}): what it calls is not seen, and may not be reached`;
}
