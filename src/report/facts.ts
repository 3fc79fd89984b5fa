/**
 * Formatters for `overask facts`: pure functions from results to text.
 */
import { MANIFEST_SCHEMA_VERSION, type Component, type Manifest, type RequestedPermission } from "../extract/manifest/model.js";
import { REMOVED_PERMISSION_SHORT } from "../platform/sdk-facts.js";
import { BLIND_SPOTS, blindSpotText, codeStatusText, evidenceLabel, type CodeEvidence, type EvidenceItem, type PermissionEvidence } from "../score/code-evidence.js";
import { TOOL_VERSION } from "../version.js";
import { PLAIN, fit, wrap, type Style } from "./style.js";
import { PLATFORM_PREFIX, short } from "./format.js";
import { KIND_INFO } from "../extract/kinds.js";
import { isSpecialAccess } from "../platform/sensitivity.js";

export interface FactsResult {
  file: string;
  manifest?: Manifest;
  /** Code evidence per requested permission (archives only; absent with --no-code). */
  code?: CodeEvidence;
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
    if (r.manifest) parts.push(manifestText(r.file, r.manifest, style, r.code));
    else parts.push(`${style.alert("error")} ${r.file}: ${r.error?.message ?? "unreadable"}\n`);
  }
  return parts.join("\n");
}

function inputText(m: Manifest): string {
  const kind = KIND_INFO[m.input.kind].name;
  const enc = { "binary-utf8": "UTF-8 strings", "binary-utf16": "UTF-16 strings", protobuf: "protobuf XML", text: "text" }[m.input.encoding];
  return m.input.kind === "plain-xml" ? kind : `${kind}, ${enc}`;
}

/**
 * What a requested permission means to the user, in groups: asked at run time, granted as special access in
 * settings, granted at install, out of a store app's reach, not the platform's, or the app's own.
 */
type GroupId = "runtime" | "special" | "install" | "unreachable" | "undefined" | "own";

const PERMISSION_GROUPS: { id: GroupId; title: string }[] = [
  { id: "runtime", title: "Runtime: the user is asked when the app uses it" },
  { id: "special", title: "Special access: the user grants it by hand (settings, developer options)" },
  { id: "install", title: "Install-time: granted without asking" },
  { id: "unreachable", title: "Out of reach: a store app is not granted it" },
  { id: "undefined", title: "Not defined by the platform" },
  { id: "own", title: "The app's own" },
];

function groupOf(m: Manifest, p: RequestedPermission): GroupId {
  const f = p.facts;
  if (f.origin === "app" || (m.package !== "" && p.name.startsWith(`${m.package}.`))) return "own";
  if (f.origin !== "platform") return "undefined";
  if (f.base === "dangerous") return "runtime";
  if (isSpecialAccess(f, p.name)) return "special";
  if (f.base === "normal") return "install";
  return "unreachable";
}

/** The code column: "code: used by org.example.adnet", "code: not seen", "code: not mappable". */
export function codeNote(e: PermissionEvidence | undefined): string | undefined {
  return e ? `code: ${codeStatusText(e.status, e.users, e.onlyLibraries)}` : undefined;
}

function permissionNotes(p: RequestedPermission, group: GroupId, code?: CodeEvidence): string {
  const f = p.facts;
  const notes: string[] = [];
  const c = codeNote(code?.permissions.find((e) => e.permission === p.name));
  if (c) notes.push(c);
  if (group === "undefined") notes.push(f.unknownPlatformName ? "an android.permission name the platform does not define" : "another app's permission");
  if (group === "unreachable" || group === "special") notes.push([f.base, ...(f.flags ?? [])].filter(Boolean).join(", "));
  if (f.module === "health-connect") notes.push("Health Connect");
  if (f.featureFlag) notes.push(`defined under feature flag ${f.featureFlag}`);
  if (f.hardRestricted) notes.push("hard-restricted");
  if (f.softRestricted) notes.push("soft-restricted");
  if (f.removed) notes.push(REMOVED_PERMISSION_SHORT);
  else if (f.docNote) notes.push(f.docNote);
  if (p.maxSdkVersion !== undefined) notes.push(`up to SDK ${p.maxSdkVersion}`);
  if (p.element !== "uses-permission") notes.push(`<${p.element}>`);
  if (p.removedByTools) notes.push('tools:node="remove"');
  if (p.module && p.module !== "base") notes.push(`from ${p.module}`);
  return notes.join(", ");
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
  return [why, guard ? `requires ${short(guard)}` : "no permission required"];
}


function manifestText(file: string, m: Manifest, s: Style, code?: CodeEvidence): string {
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
  const nameWidth = Math.min(32, Math.max(10, ...perms.map((p) => short(p.name).length)));
  const notesAt = 4 + nameWidth + 2;
  for (const g of PERMISSION_GROUPS) {
    const members = perms.filter((p) => groupOf(m, p) === g.id).sort(byName);
    if (!members.length) continue;
    // Below targetSdk 23 there is no runtime prompt: dangerous permissions come with the install.
    const title = g.id === "runtime" && (m.targetSdk ?? m.minSdk ?? 1) < 23 ? "Runtime permissions, granted at install at this targetSdk (no prompt; the user can revoke them later)" : g.title;
    out.push(`  ${s.bold(title)} ${s.dim(`(${members.length})`)}`);
    for (const p of members) {
      const name = short(p.name);
      const notes = wrap(permissionNotes(p, g.id, code), WIDTH - notesAt, 0);
      if (name.length > nameWidth) out.push(`    ${name}`);
      const first = `    ${fit(name.length > nameWidth ? "" : name, nameWidth)}  ${notes[0] ?? ""}`.trimEnd();
      if (first.trim()) out.push(first);
      out.push(...notes.slice(1).map((n) => " ".repeat(notesAt) + n));
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
  if (code) out.push("", ...codeText(code, s));
  if (m.notes.length) {
    out.push("", s.bold("Notes"));
    for (const n of m.notes) out.push(...wrap(`  - ${n}`, WIDTH, 4));
  }
  return `${out.join("\n")}\n`;
}

/** The code section: what was read, what the code reaches without asking, and what no map sees. */
export function codeText(code: CodeEvidence, s: Style): string[] {
  const classes = code.read.reduce((n, d) => n + d.classes, 0);
  const out = [s.bold("Code evidence")];
  if (!code.read.length && !code.problems.length) out.push("  no dex code in the archive");
  else out.push(...wrap(`  read ${code.read.length} dex ${code.read.length === 1 ? "file" : "files"} (${classes} ${classes === 1 ? "class" : "classes"}): ${code.read.map((d) => d.entry).join(", ") || "none"}`, WIDTH, 4));
  for (const p of code.problems) out.push(...wrap(`  ${s.warn(p)}`, WIDTH, 4));
  if (code.reachability) {
    const r = code.reachability;
    out.push(...wrap(s.dim(`  call graph: ${r.reached} of ${r.methods} methods reached from the manifest's entry points (${r.entries} classes instantiated)`), WIDTH, 4));
  }
  const used = code.permissions.filter((x) => x.status === "used");
  if (used.length) out.push(`  Requested and used (${used.length})`);
  for (const e of used) {
    out.push(`    ${short(e.permission)}`);
    for (const item of e.evidence.slice(0, 3)) out.push(...wrap(s.dim(`      ${evidenceLine(item)}`), WIDTH, 8));
    if (e.evidence.length > 3) out.push(s.dim(`      and ${e.evidence.length - 3} more`));
  }
  const dead = code.permissions.filter((x) => x.status === "unreached");
  if (dead.length) out.push(`  Requested, only in code never reached (${dead.length})`);
  for (const e of dead) {
    out.push(`    ${short(e.permission)}`);
    for (const item of e.evidence.slice(0, 3)) out.push(...wrap(s.dim(`      ${evidenceLine(item)}`), WIDTH, 8));
    if (e.evidence.length > 3) out.push(s.dim(`      and ${e.evidence.length - 3} more`));
  }
  if (code.unrequested.length) {
    out.push(`  Reached in code, not requested (${code.unrequested.length})`);
    for (const u of code.unrequested) {
      out.push(...wrap(`    ${u.permissions.map(short).join(" or ")}`, WIDTH, 6));
      for (const item of u.evidence.slice(0, 3)) out.push(...wrap(s.dim(`      ${evidenceLine(item)}`), WIDTH, 8));
      if (u.evidence.length > 3) out.push(s.dim(`      and ${u.evidence.length - 3} more`));
    }
  }
  for (const b of code.blind) out.push(...wrap(s.warn(`  ${blindSpotText(b)}`), WIDTH, 4));
  out.push(...wrap(s.dim(`  maps: ${BLIND_SPOTS}`), WIDTH, 4));
  return out;
}

function evidenceLine(item: EvidenceItem): string {
  if (item.kind === "receiver") return `${evidenceLabel(item)} (manifest)`;
  return `${evidenceLabel(item)} in ${item.classes} ${item.classes === 1 ? "class" : "classes"} (${item.packages.join(", ")})${item.reached ? "" : ", never reached"}`;
}

function byName(a: { name: string }, b: { name: string }): number {
  return a.name < b.name ? -1 : a.name > b.name ? 1 : 0;
}
