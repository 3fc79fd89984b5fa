/**
 * Foreground-service types: the values of `android:foregroundServiceType`, the permission each type needs
 * from targetSdk 34 (FOREGROUND_SERVICE_<TYPE>, beside FOREGROUND_SERVICE), and the runtime permissions a
 * service of the type must hold before it starts (any one of them). A row of
 * src/platform/data/foreground-service-types.tsv each, with its source: the platform documentation's page
 * of service types (developer.android.com/develop/background-work/services/fgs/service-types), the
 * framework's attribute values (`aapt dump --values resources` of Debian's framework-res.apk, API 29, for
 * the six oldest flags), or "from memory".
 */
import { SERVICE_TYPES_HEADER, SERVICE_TYPES_ROWS } from "./generated/foreground-service-types.js";
import { rowsOf } from "./tables.js";

export interface ServiceType {
  name: string;
  flag: number;
  /** The permission a service of this type needs from targetSdk 34 (shortService needs none). */
  permission?: string;
  /** Runtime permissions of which the app must hold one before it starts such a service (none: no prerequisite). */
  prerequisites: string[];
  /** The API level that added the type. */
  addedIn: number;
  source: string;
}

export const SERVICE_TYPES: readonly ServiceType[] = rowsOf(SERVICE_TYPES_HEADER, SERVICE_TYPES_ROWS).map((r) => ({
  name: r.type,
  flag: Number(r.flag),
  ...(r.permission ? { permission: r.permission } : {}),
  prerequisites: r.prerequisites_any ? r.prerequisites_any.split("|") : [],
  addedIn: Number(r.added_in),
  source: r.source,
}));

/** From this targetSdk a foreground service needs the permission of each of its types, and their prerequisites. */
export const SERVICE_TYPE_PERMISSIONS_FROM_SDK = 34;

/** Type names of a flags value or of the text form (`"camera|location"`); unknown bits stay as hex. */
export function serviceTypeNames(value: number | string): string[] {
  if (typeof value === "string") {
    // In flag order, as the compiled form reads back, so a source and its APK give the same list.
    const names = value.split("|").map((s) => s.trim()).filter(Boolean);
    const rank = (n: string) => SERVICE_TYPES.find((t) => t.name === n)?.flag ?? Number.MAX_SAFE_INTEGER;
    return [...new Set(names)].sort((a, b) => rank(a) - rank(b));
  }
  const names = SERVICE_TYPES.filter((t) => (value & t.flag) !== 0).map((t) => t.name);
  const unknown = SERVICE_TYPES.reduce((v, t) => v & ~t.flag, value);
  return unknown ? [...names, `0x${(unknown >>> 0).toString(16)}`] : names;
}

export function serviceType(name: string): ServiceType | undefined {
  return SERVICE_TYPES.find((t) => t.name === name);
}
