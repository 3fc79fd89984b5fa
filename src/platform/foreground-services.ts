/**
 * Foreground-service types: the values of `android:foregroundServiceType` and, from targetSdk 34, the
 * permission each type requires (FOREGROUND_SERVICE_<TYPE>).
 *
 * Flag values: dataSync 0x1, mediaPlayback 0x2, phoneCall 0x4, location 0x8, connectedDevice 0x10 and
 * mediaProjection 0x20 are the six flags the API 29 framework defines (`aapt dump --values resources` of
 * Debian's framework-res.apk lists them for attr 0x01010599); their names and the later values are from
 * memory of the platform's attrs_manifest.xml. Type → permission, and the target-34 rule: from memory of
 * developer.android.com/about/versions/14/changes/fgs-types-required.
 */

export interface ServiceType {
  name: string;
  flag: number;
  /** The permission a service of this type needs from targetSdk 34 (shortService needs none). */
  permission?: string;
}

const P = (s: string) => `android.permission.FOREGROUND_SERVICE_${s}`;

export const SERVICE_TYPES: readonly ServiceType[] = [
  { name: "dataSync", flag: 0x1, permission: P("DATA_SYNC") },
  { name: "mediaPlayback", flag: 0x2, permission: P("MEDIA_PLAYBACK") },
  { name: "phoneCall", flag: 0x4, permission: P("PHONE_CALL") },
  { name: "location", flag: 0x8, permission: P("LOCATION") },
  { name: "connectedDevice", flag: 0x10, permission: P("CONNECTED_DEVICE") },
  { name: "mediaProjection", flag: 0x20, permission: P("MEDIA_PROJECTION") },
  { name: "camera", flag: 0x40, permission: P("CAMERA") },
  { name: "microphone", flag: 0x80, permission: P("MICROPHONE") },
  { name: "health", flag: 0x100, permission: P("HEALTH") },
  { name: "remoteMessaging", flag: 0x200, permission: P("REMOTE_MESSAGING") },
  { name: "systemExempted", flag: 0x400, permission: P("SYSTEM_EXEMPTED") },
  { name: "shortService", flag: 0x800 },
  { name: "fileManagement", flag: 0x1000, permission: P("FILE_MANAGEMENT") },
  { name: "specialUse", flag: 0x40000000, permission: P("SPECIAL_USE") },
];

/** From this targetSdk a foreground service needs the permission of each of its types. */
export const SERVICE_TYPE_PERMISSIONS_FROM_SDK = 34;

/** Type names of a flags value or of the text form (`"camera|location"`); unknown bits stay as hex. */
export function serviceTypeNames(value: number | string): string[] {
  if (typeof value === "string") return value.split("|").map((s) => s.trim()).filter(Boolean);
  const names = SERVICE_TYPES.filter((t) => (value & t.flag) !== 0).map((t) => t.name);
  const unknown = SERVICE_TYPES.reduce((v, t) => v & ~t.flag, value);
  return unknown ? [...names, `0x${(unknown >>> 0).toString(16)}`] : names;
}

export function serviceType(name: string): ServiceType | undefined {
  return SERVICE_TYPES.find((t) => t.name === name);
}
