/**
 * Formatters for `overask facts`: pure functions from results to text.
 */
import { MANIFEST_SCHEMA_VERSION, type Component, type Manifest, type RequestedPermission } from "../extract/manifest/model.js";
import { REMOVED_PERMISSION_SHORT } from "../platform/sdk-facts.js";
import { TOOL_VERSION } from "../version.js";
import { PLAIN, fit, wrap, type Style } from "./style.js";

export interface FactsResult {
  file: string;
  manifest?: Manifest;
  error?: { kind: string; message: string };
}

/** JSON: one document for all inputs, so that a failed input is a result, not a lost run. */
export function factsToJson(results: FactsResult[]): string {
  return `${JSON.stringify({ tool: "overask", version: TOOL_VERSION, schemaVersion: MANIFEST_SCHEMA_VERSION, results }, null, 2)}\n`;
}

const WIDTH = 80;

export function factsToText(results: FactsResult[], style: Style = PLAIN): string {
  const parts: string[] = [];
  for (const r of results) {
    if (r.manifest) parts.push(manifestText(r.file, r.manifest, style));
    else parts.push(`${style.alert("error")} ${r.file}: ${r.error?.message ?? "unreadable"}\n`);
  }
  return parts.join("\n");
}

function inputText(m: Manifest): string {
  const kind = {
    apk: "APK",
    "proto-apk": "proto-format APK",
    "app-bundle": "app bundle",
    "multi-apk": "multi-APK archive",
    "binary-xml": "binary manifest",
    "proto-xml": "protobuf manifest",
    "plain-xml": "source manifest",
  }[m.input.kind];
  const enc = { "binary-utf8": "UTF-8 strings", "binary-utf16": "UTF-16 strings", protobuf: "protobuf XML", text: "text" }[m.input.encoding];
  return m.input.kind === "plain-xml" ? kind : `${kind}, ${enc}`;
}

function permissionNotes(p: RequestedPermission): string {
  const f = p.facts;
  const notes: string[] = [];
  if (f.origin === "app") notes.push("declared by this app");
  if (f.origin === "other") notes.push(f.unknownPlatformName ? "not defined by the platform" : "not a platform permission");
  if (f.hardRestricted) notes.push("hard-restricted");
  if (f.softRestricted) notes.push("soft-restricted");
  if (f.removed) notes.push(REMOVED_PERMISSION_SHORT);
  else if (f.docNote) notes.push(f.docNote);
  if (f.flags?.includes("appop")) notes.push("appop");
  if (f.flags?.includes("privileged")) notes.push("privileged");
  if (p.maxSdkVersion !== undefined) notes.push(`up to SDK ${p.maxSdkVersion}`);
  if (p.element !== "uses-permission") notes.push(`<${p.element}>`);
  if (p.removedByTools) notes.push('tools:node="remove"');
  if (p.module && p.module !== "base") notes.push(`from ${p.module}`);
  return notes.join(", ");
}

function levelText(p: RequestedPermission, style: Style): string {
  const base = p.facts.base ?? "—";
  if (base === "dangerous") return style.warn(fit(base, 10));
  if (base === "signature" || base === "internal" || base === "signatureOrSystem") return style.alert(fit(base, 10));
  return fit(base, 10);
}

function exportText(c: Component): string[] {
  const guard = c.permission ?? (c.kind === "provider" ? c.readPermission ?? c.writePermission : undefined);
  const why = {
    explicit: "android:exported=true",
    "intent-filter-default": "exported by default (intent filter, targetSdk < 31)",
    "provider-legacy-default": "exported by default (provider, targetSdk <= 16)",
    "no-intent-filter": "",
    "missing-at-target-31": "",
  }[c.exportedReason];
  return [why, guard ? `requires ${shortName(guard)}` : "no permission required"];
}

const PLATFORM_PREFIX = "android.permission.";

/** Permission names in tables drop the `android.permission.` prefix; the table heading says so. */
function shortName(name: string): string {
  return name.startsWith(PLATFORM_PREFIX) ? name.slice(PLATFORM_PREFIX.length) : name;
}

function manifestText(file: string, m: Manifest, s: Style): string {
  const out: string[] = [];
  const title = m.label && m.labelSource !== "unresolved" ? `${m.package}  “${m.label}”` : m.package;
  out.push(s.bold(title));
  const row = (k: string, v: string) => out.push(...wrap(`  ${fit(k, 10)}  ${v}`, WIDTH, 14));
  row("file", `${file} (${inputText(m)})`);
  if (m.versionName !== undefined || m.versionCode !== undefined) {
    row("version", [m.versionName, m.versionCode !== undefined ? `(code ${m.versionCode})` : undefined].filter(Boolean).join(" "));
  }
  const sdk = [
    `min ${m.minSdk ?? "—"}`,
    `target ${m.targetSdk ?? "—"}`,
    ...(m.maxSdk !== undefined ? [`max ${m.maxSdk}`] : []),
    ...(m.compileSdk !== undefined ? [`compiled against ${m.compileSdk}`] : []),
  ];
  row("SDK", sdk.join(" · "));
  if (m.label && m.labelSource === "unresolved") row("label", `${m.label} (unresolved reference)`);
  if (m.appCategory) row("category", `${m.appCategory} (android:appCategory)`);
  const a = m.application;
  const flags = [
    a.debuggable ? s.alert("debuggable") : undefined,
    a.usesCleartextTraffic ? s.warn("cleartext traffic allowed") : undefined,
    a.allowBackup === false ? "backup disabled" : a.allowBackup ? "backup allowed" : undefined,
    a.networkSecurityConfig ? "network security config" : undefined,
    a.requestLegacyExternalStorage ? "legacy external storage" : undefined,
    a.testOnly ? "test-only" : undefined,
  ].filter(Boolean);
  if (flags.length) row("app flags", flags.join(", "));

  const perms = m.usesPermissions;
  out.push("", `${s.bold(`Requested permissions (${perms.length})`)}${perms.some((p) => p.name.startsWith(PLATFORM_PREFIX)) ? s.dim(`  names without “${PLATFORM_PREFIX}”`) : ""}`);
  if (perms.length === 0) out.push("  none");
  else {
    const nameWidth = Math.min(30, Math.max(10, ...perms.map((p) => shortName(p.name).length)));
    const notesAt = 2 + nameWidth + 2 + 10 + 2;
    out.push(s.dim(`  ${fit("PERMISSION", nameWidth)}  ${fit("LEVEL", 10)}  NOTES`));
    for (const p of [...perms].sort(byName)) {
      const name = shortName(p.name);
      const head = `  ${fit(name.length > nameWidth ? "" : name, nameWidth)}  ${levelText(p, s)}  `;
      if (name.length > nameWidth) out.push(`  ${name}`);
      const notes = wrap(permissionNotes(p), WIDTH - notesAt, 0);
      out.push(`${head}${notes[0] ?? ""}`.trimEnd(), ...notes.slice(1).map((n) => " ".repeat(notesAt) + n));
    }
  }
  if (m.declaredPermissions.length) {
    out.push("", s.bold(`Declared permissions (${m.declaredPermissions.length})`));
    for (const d of [...m.declaredPermissions].sort(byName)) {
      const level = [d.protectionLevel.base, ...d.protectionLevel.flags].join("|");
      out.push(`  ${d.name}`, s.dim(`      ${level}`));
    }
  }
  const exported = m.components.filter((c) => c.effectiveExported);
  out.push("", s.bold(`Exported components (${exported.length} of ${m.components.length})`));
  if (exported.length === 0) out.push("  none");
  for (const c of exported) {
    out.push(`  ${fit(c.kind, 14)}  ${c.name}`);
    for (const part of exportText(c)) for (const line of wrap(part, WIDTH - 18, 2)) out.push(s.dim(`${" ".repeat(18)}${line}`));
  }
  if (m.notes.length) {
    out.push("", s.bold("Notes"));
    for (const n of m.notes) out.push(...wrap(`  - ${n}`, WIDTH, 4));
  }
  return `${out.join("\n")}\n`;
}

function byName(a: { name: string }, b: { name: string }): number {
  return a.name < b.name ? -1 : a.name > b.name ? 1 : 0;
}
