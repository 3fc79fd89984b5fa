/**
 * Which framework APIs need which permission: the published API-25 maps (Backes et al., "On Demystifying
 * the Android Application Framework", USENIX Security 2016; Apache-2.0, src/platform/data/api-permission-map)
 * plus a table of our own (code-evidence-extra.tsv, each row with its source) for what those maps cannot
 * see: checks made in native code or by group membership (camera, audio recording, sockets) and APIs added
 * after API 25. Several permissions on one entry mean "one or more of these" (the maps' own reading).
 */
import { CODE_CORRECTIONS_HEADER, CODE_CORRECTIONS_ROWS } from "./generated/code-evidence-corrections.js";
import { CODE_EXTRA_HEADER, CODE_EXTRA_ROWS } from "./generated/code-evidence-extra.js";
import { FRAMEWORK_SUPER_HEADER, FRAMEWORK_SUPER_ROWS } from "./generated/framework-superclasses.js";
import { CP_MAP_25 } from "./generated/cp-map-25.js";
import { SDK_MAP_25 } from "./generated/sdk-map-25.js";

export interface MapEntry {
  permissions: readonly string[];
  /** Where the entry comes from: the published map's file, or the own table's source column. */
  source: string;
}

export interface ApiPermissionMap {
  /** `class.method(params)returns`, Java names with `$` for nested classes: exactly one overload. */
  methods: ReadonlyMap<string, MapEntry>;
  /** `class.method`: every overload. */
  methodsAnyOverload: ReadonlyMap<string, MapEntry>;
  /** `class.FIELD` (content URIs). */
  fields: ReadonlyMap<string, MapEntry>;
  /** `content://authority` prefixes a string constant can start with. */
  uris: ReadonlyMap<string, MapEntry>;
  /** Broadcast actions delivered only to holders of the permission. */
  actions: ReadonlyMap<string, MapEntry>;
  /** Classes whose use (instantiated, or named as a class constant) needs the permission: Health Connect record types. */
  classes: ReadonlyMap<string, MapEntry>;
  /**
   * Superclasses of framework classes (framework-superclasses.tsv): a call on a subclass lands on the
   * member its superclass declares, so the lookup continues up this chain.
   */
  frameworkSuper: ReadonlyMap<string, string>;
  /** Rows of the published maps that were dropped, with the reason (code-evidence-corrections.tsv). */
  corrections: readonly { key: string; permission: string; reason: string }[];
  /** Every permission at least one entry ties to an API, URI or action. */
  covered: ReadonlySet<string>;
  /** Classes that declare a mapped method: a reference to any other class needs no lookup. */
  methodOwners: ReadonlySet<string>;
}

const SDK_SOURCE = "sdk-map-25 (Backes et al., USENIX Security 2016)";
const CP_SOURCE = "cp-map-25 (Backes et al., USENIX Security 2016)";

function add(map: Map<string, MapEntry>, key: string, permissions: readonly string[], source: string): void {
  const had = map.get(key);
  if (!had) map.set(key, { permissions: [...permissions], source });
  else map.set(key, { permissions: [...new Set([...had.permissions, ...permissions])], source: had.source === source ? source : `${had.source}; ${source}` });
}

/** Parses the maps' text: `sig  ::  p1, p2` lines and provider lines; anything else is skipped. */
export function parseSdkMap(text: string, into: Map<string, MapEntry>, source = SDK_SOURCE): void {
  for (const line of text.split(/\r?\n/)) {
    const at = line.indexOf("  ::  ");
    if (at < 0) continue;
    const perms = line.slice(at + 6).split(",").map((p) => p.trim()).filter(Boolean);
    if (perms.length) add(into, line.slice(0, at).trim(), perms, source);
  }
}

/** Provider lines: `<class>  content://<authority>  [<path…>]  [R|W|RW|grant-uri-permission]  [<permission>]`. */
export function parseProviderMap(text: string, into: Map<string, MapEntry>, source = CP_SOURCE): void {
  for (const line of text.split(/\r?\n/)) {
    const cells = line.trim().split(/\s{2,}/);
    const uri = cells.find((c) => c.startsWith("content://"));
    const permission = cells[cells.length - 1];
    if (!uri || !permission || !/^[A-Za-z_][\w.]*\.[A-Z_0-9]+$/.test(permission)) continue;
    add(into, uri, [permission], source);
  }
}

/** Drops `permission` from the entry `key` (every entry for `*`); an entry left with none is removed. */
function correct(map: Map<string, MapEntry>, key: string, permission: string): void {
  for (const k of key === "*" ? [...map.keys()] : [key]) {
    const e = map.get(k);
    if (!e || !e.permissions.includes(permission)) continue;
    const rest = e.permissions.filter((p) => p !== permission);
    if (rest.length) map.set(k, { ...e, permissions: rest });
    else map.delete(k);
  }
}

let built: ApiPermissionMap | undefined;

/** The bundled map (built once). */
export function apiPermissionMap(): ApiPermissionMap {
  if (built) return built;
  const methods = new Map<string, MapEntry>();
  const methodsAnyOverload = new Map<string, MapEntry>();
  const fields = new Map<string, MapEntry>();
  const uris = new Map<string, MapEntry>();
  const actions = new Map<string, MapEntry>();
  const classes = new Map<string, MapEntry>();
  parseSdkMap(SDK_MAP_25, methods);
  parseProviderMap(CP_MAP_25, uris);
  const col = (name: string) => CODE_EXTRA_HEADER.indexOf(name);
  const [kind, key, perms, source] = [col("kind"), col("key"), col("permissions"), col("source")];
  for (const row of CODE_EXTRA_ROWS) {
    const target = { method: methodsAnyOverload, field: fields, string: uris, action: actions, class: classes }[row[kind] as "method"];
    if (!target) throw new Error(`code-evidence-extra.tsv: unknown kind ${row[kind]}`);
    add(target, row[key], row[perms].split(","), row[source]);
  }
  const corrections = CODE_CORRECTIONS_ROWS.map((r) => ({ key: r[CODE_CORRECTIONS_HEADER.indexOf("key")], permission: r[CODE_CORRECTIONS_HEADER.indexOf("permission")], reason: r[CODE_CORRECTIONS_HEADER.indexOf("reason")] }));
  const all = [methods, methodsAnyOverload, fields, uris, actions, classes];
  for (const c of corrections) for (const m of all) correct(m, c.key, c.permission);
  const frameworkSuper = new Map(FRAMEWORK_SUPER_ROWS.map((r) => [r[FRAMEWORK_SUPER_HEADER.indexOf("class")], r[FRAMEWORK_SUPER_HEADER.indexOf("superclass")]] as const));
  const covered = new Set<string>();
  for (const m of all) for (const e of m.values()) for (const p of e.permissions) covered.add(p);
  const methodOwners = new Set<string>();
  for (const key of [...methods.keys(), ...methodsAnyOverload.keys()]) {
    const paren = key.indexOf("(");
    const name = paren < 0 ? key : key.slice(0, paren);
    methodOwners.add(name.slice(0, name.lastIndexOf(".")));
  }
  built = { methods, methodsAnyOverload, fields, uris, actions, classes, frameworkSuper, corrections, covered, methodOwners };
  return built;
}

/** The map entry for a string constant: a `content://` URI under a mapped authority (then `/`, `?` or its end). */
export function uriEntry(map: ApiPermissionMap, text: string): { uri: string; entry: MapEntry } | undefined {
  if (!text.startsWith("content://")) return undefined;
  const end = text.slice(10).search(/[/?#]/);
  const authority = "content://" + (end < 0 ? text.slice(10) : text.slice(10, 10 + end));
  const entry = map.uris.get(authority);
  return entry ? { uri: authority, entry } : undefined;
}
