/**
 * The platform's own permission definitions: the framework manifest's as of Android 16 (API 36), with the
 * feature flag an entry is defined under, and the Health Connect module's (a platform module since Android
 * 14); see src/platform/data/SOURCES.md and SOURCES-api35-36-health.md. Protection level, flags and
 * restrictions for each permission. The table is compiled into the code at build time (scripts/gen.mjs),
 * so nothing is read from disk.
 */
import { PERMISSION_TABLE_HEADER, PERMISSION_TABLE_ROWS } from "./generated/permission-table.js";
import { protectionFromText, type BaseLevel } from "./protection.js";
import { editDistanceWithin } from "../util/edit-distance.js";

export const PLATFORM_TABLE_VERSION = "android-36 (framework core/res/AndroidManifest.xml, with feature flags) + Health Connect module; see src/platform/data/SOURCES*.md";

/** The newest platform level the table speaks for, as messages name it. */
export const PLATFORM_TABLE_API = 36;

export interface PlatformPermission {
  name: string;
  protectionLevel: string;
  base: BaseLevel;
  flags: string[];
  hardRestricted: boolean;
  softRestricted: boolean;
  /** Kept by the platform only for backwards compatibility. */
  removed: boolean;
  backgroundPermission?: string;
  /** `deprecated`, `removed` or `no-longer-supported` from the platform's documentation comment. */
  docNote?: string;
  /** The aconfig flag the platform defines it under (`!flag`: only while the flag is off). */
  featureFlag?: string;
  /** Who defines it: the framework manifest, or the Health Connect module. */
  definedBy: "framework" | "health-connect";
  /** For one the API-34 table lacks: the level the later tables show it at (35 or 36; Health Connect 34–36). */
  tableAddedIn?: number;
}


let table: Map<string, PlatformPermission> | undefined;

/** Parses the platform permission TSV (header row, tab-separated). */
export function parsePlatformTable(tsv: string): Map<string, PlatformPermission> {
  const lines = tsv.split(/\r?\n/).filter((l) => l !== "");
  return tableFromRows(lines[0].split("\t"), lines.slice(1).map((l) => l.split("\t")));
}

/** Builds the table from a header and rows of fields (the generated module's shape). */
function tableFromRows(header: readonly string[], rows: readonly (readonly string[])[]): Map<string, PlatformPermission> {
  const col = (name: string) => {
    const i = header.indexOf(name);
    if (i < 0) throw new Error(`platform table lacks column ${name}`);
    return i;
  };
  const c = {
    name: col("name"),
    level: col("protection_level"),
    hard: col("hard_restricted"),
    soft: col("soft_restricted"),
    removed: col("removed"),
    background: col("background_permission"),
    note: col("doc_note"),
    flag: header.indexOf("feature_flag"),
    by: header.indexOf("defined_by"),
    added: header.indexOf("table_added_in"),
  };
  const out = new Map<string, PlatformPermission>();
  for (const f of rows) {
    const level = protectionFromText(f[c.level]);
    const p: PlatformPermission = {
      name: f[c.name],
      protectionLevel: f[c.level],
      base: level.base,
      flags: level.flags,
      hardRestricted: f[c.hard] === "yes",
      softRestricted: f[c.soft] === "yes",
      removed: f[c.removed] === "yes",
      definedBy: f[c.by] === "health-connect" ? "health-connect" : "framework",
    };
    if (c.flag >= 0 && f[c.flag]) p.featureFlag = f[c.flag];
    if (c.added >= 0 && f[c.added]) p.tableAddedIn = Number(f[c.added]);
    if (f[c.background]) p.backgroundPermission = f[c.background];
    if (f[c.note]) p.docNote = f[c.note];
    out.set(p.name, p);
  }
  return out;
}

/** All platform permissions by full name. */
export function platformPermissions(): ReadonlyMap<string, PlatformPermission> {
  table ??= tableFromRows(PERMISSION_TABLE_HEADER, PERMISSION_TABLE_ROWS);
  return table;
}

/** The platform definition of `name`, if the platform defines it. */
export function platformPermission(name: string): PlatformPermission | undefined {
  return platformPermissions().get(name);
}

let bareNames: Map<string, string | null> | undefined;

/**
 * Normalizes a permission name: a bare platform name becomes the full one when the platform defines
 * exactly one permission of that name (`SEND_SMS` → `android.permission.SEND_SMS`, `ADD_VOICEMAIL` →
 * `com.android.voicemail.permission.ADD_VOICEMAIL`); any other name is kept as written.
 */
export function normalizePermissionName(name: string): string {
  const trimmed = name.trim();
  if (trimmed.includes(".")) return trimmed;
  if (!bareNames) {
    bareNames = new Map();
    for (const full of platformPermissions().keys()) {
      const bare = full.slice(full.lastIndexOf(".") + 1);
      // android.permission.* wins over other namespaces; other clashes make the bare name ambiguous.
      const prior = bareNames.get(bare);
      if (prior === undefined) bareNames.set(bare, full);
      else if (full.startsWith("android.permission.")) bareNames.set(bare, full);
      else if (prior !== null && !prior.startsWith("android.permission.")) bareNames.set(bare, null);
    }
  }
  return bareNames.get(trimmed) ?? trimmed;
}

/** Nearest-name answers kept per name: a sweep meets the same misspelling in app after app. Bounded. */
const nearestCache = new Map<string, { name: string; distance: number }>();
const NEAREST_CACHE_LIMIT = 10_000;
let byLength: Map<number, { name: string; index: number }[]> | undefined;

/**
 * The `android.permission.*` platform name nearest to `name` by edit distance (optimal string alignment),
 * ties to the one first in the table: the answer of a scan over every name, found by looking at names in
 * order of how far their length is from `name`'s and stopping once no length can beat the best, each
 * comparison itself stopped at the best distance so far; and remembered per name.
 */
export function nearestPlatformPermission(name: string): { name: string; distance: number } {
  const cached = nearestCache.get(name);
  if (cached) return cached;
  if (!byLength) {
    byLength = new Map();
    let index = 0;
    for (const p of platformPermissions().keys()) {
      if (!p.startsWith("android.permission.")) continue;
      const list = byLength.get(p.length) ?? [];
      list.push({ name: p, index: index++ });
      byLength.set(p.length, list);
    }
  }
  let best = { name: "", distance: Infinity, index: Infinity };
  const lengths = [...byLength.keys()].sort((a, b) => Math.abs(a - name.length) - Math.abs(b - name.length) || a - b);
  for (const len of lengths) {
    if (Math.abs(len - name.length) > best.distance) break;
    for (const c of byLength.get(len)!) {
      const bound = Number.isFinite(best.distance) ? best.distance : Math.max(name.length, len);
      const d = editDistanceWithin(name, c.name, bound);
      if (d < best.distance || (d === best.distance && c.index < best.index)) best = { name: c.name, distance: d, index: c.index };
    }
  }
  const answer = { name: best.name, distance: best.distance };
  if (nearestCache.size >= NEAREST_CACHE_LIMIT) nearestCache.clear();
  nearestCache.set(name, answer);
  return answer;
}
