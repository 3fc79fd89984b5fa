/**
 * Builds the Manifest model from an XML tree, whichever reader produced it. Binary input gives typed
 * values; plain input gives text. The helpers here read both the way the platform's package parser does.
 */
import { serviceTypeNames } from "../../platform/foreground-services.js";
import { ManifestError } from "../../errors.js";
import { normalizePermissionName, platformPermission } from "../../platform/permissions.js";
import { protectionFromInt, protectionFromText } from "../../platform/protection.js";
import { formatResourceId, valueToText, type TypedValue } from "../binary/values.js";
import {
  MANIFEST_SCHEMA_VERSION,
  type Component,
  type ComponentKind,
  type DeclaredPermission,
  type InputInfo,
  type IntentFilter,
  type Manifest,
  type PermissionFacts,
  type RequestedPermission,
  type SourceLocation,
} from "./model.js";
import { ANDROID_NS, TOOLS_NS, type XmlAttribute, type XmlDocument, type XmlElement } from "../xml-tree.js";

/** Resolves a resource reference to its default-configuration value (from resources.arsc). */
export type ReferenceResolver = (id: number) => TypedValue | undefined;

/** The SDK level from which a component with an intent filter must say android:exported (Android 12). */
const EXPORTED_MANDATORY_FROM_SDK = 31;
/** Providers were exported by default for apps targeting SDK 16 or lower (from memory of the platform docs). */
const PROVIDER_EXPORTED_DEFAULT_UP_TO_SDK = 16;

const COMPONENT_KINDS = new Set<ComponentKind>(["activity", "activity-alias", "service", "receiver", "provider"]);

class Reader {
  readonly notes: string[] = [];
  constructor(private readonly resolve?: ReferenceResolver) {}

  /** The android: attribute `name` of `el` (by namespace, or by resource id in namespace-stripped builds). */
  attr(el: XmlElement, name: string): XmlAttribute | undefined {
    return el.attributes.find((a) => a.name === name && (a.ns === ANDROID_NS || (a.ns === undefined && a.resourceId !== undefined)));
  }

  /** A plain (no-namespace) attribute such as `package`. */
  plainAttr(el: XmlElement, name: string): XmlAttribute | undefined {
    return el.attributes.find((a) => a.name === name && a.ns === undefined && a.resourceId === undefined);
  }

  private deref(v: TypedValue): TypedValue {
    if (v.kind === "reference" && this.resolve) return this.resolve(v.id) ?? v;
    return v;
  }

  string(el: XmlElement, name: string): string | undefined {
    const a = this.attr(el, name);
    return a ? valueToText(this.deref(a.value)) : undefined;
  }

  bool(el: XmlElement, name: string): boolean | undefined {
    const a = this.attr(el, name);
    if (!a) return undefined;
    const v = this.deref(a.value);
    if (v.kind === "boolean") return v.value;
    if (v.kind === "int") return v.value !== 0;
    if (v.kind === "string" && (v.value === "true" || v.value === "false")) return v.value === "true";
    this.notes.push(`${el.path}: android:${name} is ${valueToText(v) || "empty"}, not a boolean; treated as unset`);
    return undefined;
  }

  int(el: XmlElement, name: string): number | undefined {
    const a = this.attr(el, name);
    if (!a) return undefined;
    const v = this.deref(a.value);
    if (v.kind === "int") return v.value;
    if (v.kind === "string") {
      const t = v.value.trim();
      if (/^-?\d+$/.test(t)) return Number(t);
      if (/^0x[0-9a-f]+$/i.test(t)) return Number.parseInt(t, 16) | 0;
    }
    return undefined;
  }

  /** SDK levels may be written as a codename (`"UpsideDownCake"`); we keep numbers and note codenames. */
  sdk(el: XmlElement, name: string): number | undefined {
    const n = this.int(el, name);
    if (n !== undefined) return n;
    const s = this.string(el, name);
    if (s !== undefined) this.notes.push(`${el.path}: android:${name}="${s}" is a codename, not an API level`);
    return undefined;
  }

  /** Whether `el` carries tools:node="remove" (source manifests only). */
  toolsRemove(el: XmlElement): boolean {
    return el.attributes.some((a) => a.ns === TOOLS_NS && a.name === "node" && valueToText(a.value) === "remove");
  }
}

function where(el: XmlElement): SourceLocation {
  return el.line !== undefined && el.line > 0 ? { path: el.path, line: el.line } : { path: el.path };
}

/** Resolves a component class name as the platform does: `.Foo` and `Foo` are relative to the package. */
export function qualifyClassName(pkg: string, name: string): string {
  if (name.startsWith(".")) return pkg + name;
  if (!name.includes(".")) return `${pkg}.${name}`;
  return name;
}

export function buildManifest(doc: XmlDocument, input: InputInfo, resolve?: ReferenceResolver): Manifest {
  const root = doc.root;
  if (root.name !== "manifest") throw new ManifestError(`root element is <${root.name}>, not <manifest>`);
  const rd = new Reader(resolve);
  const pkgAttr = rd.plainAttr(root, "package");
  const pkg = pkgAttr ? valueToText(pkgAttr.value) : "";
  if (!pkg) throw new ManifestError("<manifest> has no package attribute");

  const m: Manifest = {
    schemaVersion: MANIFEST_SCHEMA_VERSION,
    package: pkg,
    usesPermissions: [],
    declaredPermissions: [],
    permissionGroups: [],
    usesFeatures: [],
    application: { networkSecurityConfig: false },
    components: [],
    queries: { packages: [], intents: [], providers: [] },
    metaData: [],
    input,
    notes: rd.notes,
  };
  const split = rd.plainAttr(root, "split");
  if (split) m.split = valueToText(split.value);
  const versionCode = rd.int(root, "versionCode");
  if (versionCode !== undefined) m.versionCode = versionCode >>> 0;
  const versionName = rd.string(root, "versionName");
  if (versionName !== undefined) m.versionName = versionName;
  const compileSdk = rd.int(root, "compileSdkVersion");
  if (compileSdk !== undefined) m.compileSdk = compileSdk;
  const codename = rd.string(root, "compileSdkVersionCodename");
  if (codename !== undefined) m.compileSdkCodename = codename;

  const pending: { el: XmlElement; kind: ComponentKind }[] = [];
  for (const el of root.children) readTopElement(rd, el, m, pending);

  annotatePermissions(m);
  noteDuplicates(m);
  // Exported defaults depend on targetSdk, which may be declared after <application>; resolve last.
  const target = m.targetSdk ?? m.minSdk ?? 1;
  for (const { el, kind } of pending) m.components.push(readComponent(rd, el, kind, pkg, target));
  return m;
}

/** One child of <manifest>: uses-sdk, permissions requested and declared, features, queries, application. */
function readTopElement(rd: Reader, el: XmlElement, m: Manifest, pending: { el: XmlElement; kind: ComponentKind }[]): void {
  switch (el.name) {
    case "uses-sdk": {
      m.usesSdkSource = where(el);
      const min = rd.sdk(el, "minSdkVersion");
      const target = rd.sdk(el, "targetSdkVersion");
      const max = rd.sdk(el, "maxSdkVersion");
      if (min !== undefined) m.minSdk = min;
      if (target !== undefined) m.targetSdk = target;
      if (max !== undefined) m.maxSdk = max;
      break;
    }
    case "uses-permission":
    case "uses-permission-sdk-23":
    case "uses-permission-sdk-m": {
      const name = rd.string(el, "name");
      if (!name) {
        rd.notes.push(`${el.path}: <${el.name}> without android:name ignored`);
        break;
      }
      const p: RequestedPermission = {
        name,
        element: el.name as RequestedPermission["element"],
        facts: { origin: "other" },
        source: where(el),
      };
      const max = rd.int(el, "maxSdkVersion");
      if (max !== undefined) p.maxSdkVersion = max;
      if (rd.toolsRemove(el)) p.removedByTools = true;
      m.usesPermissions.push(p);
      break;
    }
    case "permission": {
      const name = rd.string(el, "name");
      if (!name) break;
      const a = rd.attr(el, "protectionLevel");
      const v = a?.value;
      const level = !v ? protectionFromInt(0) : v.kind === "int" ? protectionFromInt(v.value) : protectionFromText(valueToText(v));
      const d: DeclaredPermission = { name, protectionLevel: level, source: where(el) };
      const group = rd.string(el, "permissionGroup");
      if (group) d.permissionGroup = group;
      m.declaredPermissions.push(d);
      break;
    }
    case "permission-group": {
      const name = rd.string(el, "name");
      if (name) m.permissionGroups.push({ name, source: where(el) });
      break;
    }
    case "uses-feature": {
      const name = rd.string(el, "name");
      const gl = rd.int(el, "glEsVersion");
      m.usesFeatures.push({
        ...(name ? { name } : {}),
        ...(gl !== undefined ? { glEsVersion: `${gl >>> 16}.${gl & 0xffff}` } : {}),
        required: rd.bool(el, "required") ?? true,
        source: where(el),
      });
      break;
    }
    case "instrumentation": {
      const name = rd.string(el, "name");
      const targetPackage = rd.string(el, "targetPackage");
      if (name && targetPackage) (m.instrumentation ??= []).push({ name: qualifyClassName(m.package, name), targetPackage, source: where(el) });
      break;
    }
    case "queries":
      for (const q of el.children) {
        if (q.name === "package") {
          const n = rd.string(q, "name");
          if (n) m.queries.packages.push(n);
        } else if (q.name === "intent") m.queries.intents.push(readIntentFilter(rd, q));
        else if (q.name === "provider") {
          const a = rd.string(q, "authorities");
          if (a) m.queries.providers.push(a);
        }
      }
      break;
    case "application":
      readApplication(rd, el, m, pending);
      break;
  }
}

function readApplication(rd: Reader, app: XmlElement, m: Manifest, pending: { el: XmlElement; kind: ComponentKind }[]): void {
  m.application.source = where(app);
  const labelAttr = rd.attr(app, "label");
  if (labelAttr) {
    const raw = labelAttr.value;
    const label = rd.string(app, "label") ?? "";
    m.label = label;
    if (raw.kind === "reference") m.labelSource = label === formatResourceId(raw.id) ? "unresolved" : "resource";
    // A source manifest names resources symbolically (`@string/app_name`); only the build resolves them.
    else m.labelSource = raw.kind === "string" && /^@[\w.:]+\/\w/.test(raw.value) ? "unresolved" : "literal";
  }
  const category = rd.attr(app, "appCategory");
  if (category) m.appCategory = appCategoryName(category.value);
  const flags = m.application;
  const set = <K extends keyof typeof flags>(k: K, v: (typeof flags)[K] | undefined) => {
    if (v !== undefined) flags[k] = v;
  };
  set("debuggable", rd.bool(app, "debuggable"));
  set("allowBackup", rd.bool(app, "allowBackup"));
  set("usesCleartextTraffic", rd.bool(app, "usesCleartextTraffic"));
  set("requestLegacyExternalStorage", rd.bool(app, "requestLegacyExternalStorage"));
  set("testOnly", rd.bool(app, "testOnly"));
  flags.networkSecurityConfig = rd.attr(app, "networkSecurityConfig") !== undefined;
  for (const [key, attr] of [["className", "name"], ["backupAgent", "backupAgent"], ["appComponentFactory", "appComponentFactory"]] as const) {
    const v = rd.string(app, attr);
    if (v) flags[key] = qualifyClassName(m.package, v);
  }
  for (const el of app.children) {
    if (COMPONENT_KINDS.has(el.name as ComponentKind)) pending.push({ el, kind: el.name as ComponentKind });
    else if (el.name === "meta-data") {
      const name = rd.string(el, "name");
      if (!name) continue;
      const value = rd.string(el, "value");
      const resource = rd.string(el, "resource");
      m.metaData.push({ name, ...(value !== undefined ? { value } : {}), ...(resource !== undefined ? { resource } : {}), source: where(el) });
    }
  }
}

/** android:appCategory enum values (ApplicationInfo.CATEGORY_*; the attribute's enum in framework-res). */
const APP_CATEGORIES = ["game", "audio", "video", "image", "social", "news", "maps", "productivity", "accessibility"];

function appCategoryName(v: TypedValue): string {
  if (v.kind === "int") return APP_CATEGORIES[v.value] ?? `category-${v.value}`;
  return valueToText(v);
}

function readIntentFilter(rd: Reader, el: XmlElement): IntentFilter {
  const f: IntentFilter = { actions: [], categories: [], data: [] };
  const priority = rd.int(el, "priority");
  if (priority !== undefined) f.priority = priority;
  for (const c of el.children) {
    const name = rd.string(c, "name");
    if (c.name === "action" && name) f.actions.push(name);
    else if (c.name === "category" && name) f.categories.push(name);
    else if (c.name === "data") {
      const d: IntentFilter["data"][number] = {};
      for (const k of ["scheme", "host", "mimeType", "path"] as const) {
        const v = rd.string(c, k);
        if (v !== undefined) d[k] = v;
      }
      f.data.push(d);
    }
  }
  return f;
}

function readComponent(rd: Reader, el: XmlElement, kind: ComponentKind, pkg: string, targetSdk: number): Component {
  const rawName = rd.string(el, "name") ?? "";
  const intentFilters = el.children.filter((c) => c.name === "intent-filter").map((c) => readIntentFilter(rd, c));
  const c: Component = {
    kind,
    name: rawName ? qualifyClassName(pkg, rawName) : "",
    effectiveExported: false,
    exportedReason: "no-intent-filter",
    intentFilters,
    source: where(el),
  };
  const target = rd.string(el, "targetActivity");
  if (target) c.targetActivity = qualifyClassName(pkg, target);
  for (const k of ["permission", "readPermission", "writePermission", "authorities"] as const) {
    const v = rd.string(el, k);
    if (v !== undefined) c[k] = v;
  }
  const enabled = rd.bool(el, "enabled");
  if (enabled !== undefined) c.enabled = enabled;
  if (kind === "service") {
    // Compiled manifests hold the flags as an integer, source manifests as "camera|location".
    const a = rd.attr(el, "foregroundServiceType");
    if (a) {
      const n = rd.int(el, "foregroundServiceType");
      c.foregroundServiceType = serviceTypeNames(n ?? rd.string(el, "foregroundServiceType") ?? "");
    }
  }
  const exported = rd.bool(el, "exported");
  if (exported !== undefined) {
    c.exported = exported;
    c.effectiveExported = exported;
    c.exportedReason = "explicit";
  } else if (intentFilters.length > 0) {
    if (targetSdk >= EXPORTED_MANDATORY_FROM_SDK) {
      // The platform refuses to install such an app (Android 12 behaviour change); it is not reachable.
      c.exportedReason = "missing-at-target-31";
      rd.notes.push(`${el.path}: has an intent filter but no android:exported; at targetSdk ${targetSdk} the platform refuses to install the app`);
    } else {
      c.effectiveExported = true;
      c.exportedReason = "intent-filter-default";
    }
  } else if (kind === "provider" && targetSdk <= PROVIDER_EXPORTED_DEFAULT_UP_TO_SDK) {
    c.effectiveExported = true;
    c.exportedReason = "provider-legacy-default";
  }
  return c;
}

/** Annotates each requested permission with what the platform, or this app, defines for it. */
function annotatePermissions(m: Manifest): void {
  const declared = new Map(m.declaredPermissions.map((d) => [d.name, d]));
  for (const p of m.usesPermissions) {
    const platform = platformPermission(normalizePermissionName(p.name));
    let facts: PermissionFacts;
    if (platform) {
      facts = {
        origin: "platform",
        protectionLevel: platform.protectionLevel,
        base: platform.base,
        flags: platform.flags,
        hardRestricted: platform.hardRestricted,
        softRestricted: platform.softRestricted,
        removed: platform.removed,
      };
      if (platform.docNote) facts.docNote = platform.docNote;
      if (platform.featureFlag) facts.featureFlag = platform.featureFlag;
      if (platform.definedBy === "health-connect") facts.module = "health-connect";
    } else if (declared.has(p.name)) {
      const d = declared.get(p.name)!;
      facts = { origin: "app", protectionLevel: [d.protectionLevel.base, ...d.protectionLevel.flags].join("|"), base: d.protectionLevel.base, flags: d.protectionLevel.flags };
    } else {
      facts = { origin: "other" };
      if (p.name.startsWith("android.permission.")) facts.unknownPlatformName = true;
    }
    p.facts = facts;
  }
}

function noteDuplicates(m: Manifest): void {
  const seen = new Map<string, RequestedPermission>();
  for (const p of m.usesPermissions) {
    const first = seen.get(p.name);
    if (first) m.notes.push(`${p.source.path}: ${p.name} is requested again (first at ${first.source.path})`);
    else seen.set(p.name, p);
  }
}

