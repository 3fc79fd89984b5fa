/**
 * The one Manifest model every input is read into (binary manifest, APK, plain source manifest).
 * Documented for JSON consumers in docs/manifest-json.md; bump MANIFEST_SCHEMA_VERSION on any change
 * that could break a reader.
 */
import type { BaseLevel } from "../../platform/protection.js";

export const MANIFEST_SCHEMA_VERSION = 1;

/** Where an element came from: the element path always; the source line when the input records one. */
export interface SourceLocation {
  path: string;
  line?: number;
}

export type InputKind = "apk" | "proto-apk" | "app-bundle" | "multi-apk" | "binary-xml" | "proto-xml" | "plain-xml";

export interface InputInfo {
  kind: InputKind;
  /** Storage of the XML itself. */
  encoding: "binary-utf8" | "binary-utf16" | "protobuf" | "text";
  /** For archives: the entry the manifest was read from, and how it was stored. */
  entry?: { name: string; method: "stored" | "deflated"; compressedSize: number; size: number };
  /** Whether a resources.arsc was available to resolve references. */
  resourceTable: boolean;
}

/** What the platform says about a permission an app requests. */
export interface PermissionFacts {
  /** `platform`: defined by Android itself; `app`: declared by this manifest; `other`: neither (a library's, another app's, or unknown). */
  origin: "platform" | "app" | "other";
  /** Raw protection level, as the platform table (or the app's own <permission>) gives it. */
  protectionLevel?: string;
  base?: BaseLevel;
  flags?: string[];
  hardRestricted?: boolean;
  softRestricted?: boolean;
  /** The platform keeps the name only for backwards compatibility. */
  removed?: boolean;
  docNote?: string;
  /** The aconfig flag the platform defines it under (Android 15+; `!flag`: only while the flag is off). */
  featureFlag?: string;
  /** A platform module defines it rather than the framework (Health Connect). */
  module?: "health-connect";
  /** The name looks like a platform permission (`android.permission.*`) but the platform does not define it. */
  unknownPlatformName?: boolean;
}

export interface RequestedPermission {
  name: string;
  /** For app bundles and multi-APK archives: the module (`base`, a feature module) or split that requests it. */
  module?: string;
  element: "uses-permission" | "uses-permission-sdk-23" | "uses-permission-sdk-m";
  maxSdkVersion?: number;
  /** `tools:node="remove"` in a source manifest: the manifest merger drops this request. */
  removedByTools?: boolean;
  facts: PermissionFacts;
  source: SourceLocation;
}

export interface DeclaredPermission {
  name: string;
  protectionLevel: { base: BaseLevel; flags: string[]; value: number };
  permissionGroup?: string;
  source: SourceLocation;
}

export interface PermissionGroupDeclaration {
  name: string;
  source: SourceLocation;
}

export interface UsesFeature {
  name?: string;
  glEsVersion?: string;
  required: boolean;
  source: SourceLocation;
}

export interface IntentFilter {
  actions: string[];
  categories: string[];
  data: { scheme?: string; host?: string; mimeType?: string; path?: string }[];
  priority?: number;
}

export type ComponentKind = "activity" | "activity-alias" | "service" | "receiver" | "provider";

export interface Component {
  kind: ComponentKind;
  /** Fully-qualified class name (relative names resolved against the package, as the platform does). */
  name: string;
  targetActivity?: string;
  permission?: string;
  readPermission?: string;
  writePermission?: string;
  authorities?: string;
  /** The android:exported attribute, when the manifest sets it. */
  exported?: boolean;
  /** Whether other apps can reach the component, after the platform's defaults. */
  effectiveExported: boolean;
  /** Why `effectiveExported` has its value. */
  exportedReason: "explicit" | "intent-filter-default" | "no-intent-filter" | "provider-legacy-default" | "missing-at-target-31";
  enabled?: boolean;
  /** Services: the android:foregroundServiceType names (`camera`, `location` …). */
  foregroundServiceType?: string[];
  intentFilters: IntentFilter[];
  source: SourceLocation;
}

export interface Queries {
  packages: string[];
  intents: IntentFilter[];
  providers: string[];
}

export interface ApplicationFlags {
  /** Where the <application> element is (absent when the manifest has none). */
  source?: SourceLocation;
  debuggable?: boolean;
  allowBackup?: boolean;
  usesCleartextTraffic?: boolean;
  networkSecurityConfig: boolean;
  requestLegacyExternalStorage?: boolean;
  testOnly?: boolean;
  /** Classes the platform instantiates by name (android:name, android:backupAgent, android:appComponentFactory), qualified. */
  className?: string;
  backupAgent?: string;
  appComponentFactory?: string;
}

export interface MetaData {
  name: string;
  value?: string;
  resource?: string;
  source: SourceLocation;
}

export interface Manifest {
  schemaVersion: typeof MANIFEST_SCHEMA_VERSION;
  package: string;
  versionCode?: number;
  versionName?: string;
  minSdk?: number;
  targetSdk?: number;
  maxSdk?: number;
  compileSdk?: number;
  compileSdkCodename?: string;
  /** The app label, resolved through resources.arsc for binary input; `@0x7f…` when it cannot be. */
  label?: string;
  labelSource?: "literal" | "resource" | "unresolved";
  appCategory?: string;
  usesPermissions: RequestedPermission[];
  declaredPermissions: DeclaredPermission[];
  permissionGroups: PermissionGroupDeclaration[];
  usesFeatures: UsesFeature[];
  application: ApplicationFlags;
  components: Component[];
  queries: Queries;
  metaData: MetaData[];
  /** Where the <uses-sdk> element is, when there is one. */
  usesSdkSource?: SourceLocation;
  /**
   * `<instrumentation>` elements: a test APK names the app it instruments (`targetPackage`); it runs in
   * that app's process, with that app's permissions (from memory: the platform's instrumentation docs).
   */
  instrumentation?: { name: string; targetPackage: string; source: SourceLocation }[];
  input: InputInfo;
  /** The `split` attribute of a split APK's manifest. */
  split?: string;
  /** For app bundles and multi-APK archives: each module or split and the permissions its manifest requests. */
  modules?: { name: string; kind: "base" | "feature" | "split"; permissions: string[] }[];
  /** Things a reader should know about how the manifest was read (duplicates, ignored values). */
  notes: string[];
}

/** A launcher entry point (MAIN + LAUNCHER): meant to be started by everyone, and seen by the user. */
export function isLauncher(c: Component): boolean {
  return c.intentFilters.some((f) => f.actions.includes("android.intent.action.MAIN") && f.categories.includes("android.intent.category.LAUNCHER"));
}

/** The distinct permissions a manifest requests (after tools:node="remove"), sorted. */
export function requestedPermissionNames(m: Manifest): string[] {
  // Asked for many times per app (every check, the risk model, the row): computed once per manifest.
  let names = requestedCache.get(m);
  if (!names || names.source !== m.usesPermissions || names.count !== m.usesPermissions.length) {
    names = { source: m.usesPermissions, count: m.usesPermissions.length, list: [...new Set(m.usesPermissions.filter((p) => !p.removedByTools).map((p) => p.name))].sort() };
    requestedCache.set(m, names);
  }
  return names.list.slice();
}

const requestedCache = new WeakMap<Manifest, { source: Manifest["usesPermissions"]; count: number; list: string[] }>();
