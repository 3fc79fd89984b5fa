/**
 * Permissions that do nothing at some target SDK levels. Each row names its source: the platform's own
 * permission table (src/platform/data, API 34), or "from memory" of the platform's documentation.
 */
import { platformPermissions } from "./permissions.js";

export interface NoEffectFact {
  permission: string;
  /** The request has no effect when targetSdk is at least this (undefined: no lower bound). */
  fromTarget?: number;
  /** The request has no effect when targetSdk is below this. */
  belowTarget?: number;
  /** A maxSdkVersion at or below this makes the request fine (it then applies only where it works). */
  unlessMaxSdkAtMost?: number;
  /** What to request instead, if anything. */
  instead?: string[];
  why: string;
  source: string;
}

const P = (s: string) => `android.permission.${s}`;

const FACTS: NoEffectFact[] = [
  {
    permission: P("WRITE_EXTERNAL_STORAGE"),
    fromTarget: 30,
    unlessMaxSdkAtMost: 29,
    instead: [],
    why: "scoped storage: it gives an app targeting 30 or higher no write access",
    source: "from memory: Android 11 storage behaviour changes (developer documentation)",
  },
  {
    permission: P("READ_EXTERNAL_STORAGE"),
    fromTarget: 33,
    unlessMaxSdkAtMost: 32,
    instead: [P("READ_MEDIA_IMAGES"), P("READ_MEDIA_VIDEO"), P("READ_MEDIA_AUDIO")],
    why: "the READ_MEDIA_* permissions give media access instead",
    source: 'platform table: READ_MEDIA_AUDIO/VIDEO/IMAGES "enforced starting in API level TIRAMISU" (33)',
  },
  ...["READ_MEDIA_IMAGES", "READ_MEDIA_VIDEO", "READ_MEDIA_AUDIO"].map((name) => ({
    permission: P(name),
    belowTarget: 33,
    instead: [P("READ_EXTERNAL_STORAGE")],
    why: "enforced only from targetSdk 33; below it READ_EXTERNAL_STORAGE governs media access",
    source: 'platform table: min_sdk 33, "enforced starting in API level TIRAMISU"',
  })),
  {
    permission: P("POST_NOTIFICATIONS"),
    belowTarget: 33,
    why: "below targetSdk 33 the system asks for notification permission on the app's behalf",
    source: "from memory: Android 13 notification runtime permission (developer documentation)",
  },
  {
    permission: P("BLUETOOTH"),
    fromTarget: 31,
    unlessMaxSdkAtMost: 30,
    instead: [P("BLUETOOTH_CONNECT"), P("BLUETOOTH_SCAN"), P("BLUETOOTH_ADVERTISE")],
    why: "BLUETOOTH_CONNECT, _SCAN and _ADVERTISE give Bluetooth access instead",
    source: "from memory: Android 12 Bluetooth permissions (developer documentation)",
  },
  {
    permission: P("BLUETOOTH_ADMIN"),
    fromTarget: 31,
    unlessMaxSdkAtMost: 30,
    instead: [P("BLUETOOTH_CONNECT"), P("BLUETOOTH_SCAN"), P("BLUETOOTH_ADVERTISE")],
    why: "BLUETOOTH_CONNECT, _SCAN and _ADVERTISE give Bluetooth access instead",
    source: "from memory: Android 12 Bluetooth permissions (developer documentation)",
  },
];

/**
 * What a permission the platform flags `removed` is, said the same way by `facts` and `check`: the
 * framework manifest still defines it (so it is not "unknown"), with permissionFlags="removed", and grants
 * it to no one (platform table, API 34; FLASHLIGHT is one: the torch API needs no permission).
 */
export const REMOVED_PERMISSION_NOTE = "kept by the platform for compatibility only (flagged removed): it grants nothing";
/** The same statement, for a table column. */
export const REMOVED_PERMISSION_SHORT = "compatibility only: grants nothing";

let table: Map<string, NoEffectFact> | undefined;

/** The no-effect facts, including every permission the platform table marks as removed (any target). */
export function noEffectFacts(): ReadonlyMap<string, NoEffectFact> {
  if (!table) {
    table = new Map(FACTS.map((f) => [f.permission, f]));
    for (const p of platformPermissions().values()) {
      if (p.removed && !table.has(p.name)) {
        table.set(p.name, { permission: p.name, why: REMOVED_PERMISSION_NOTE, source: 'platform table: permissionFlags "removed"' });
      }
    }
  }
  return table;
}

/**
 * Where a request still does something although the app's target makes it useless on newer devices: a
 * `fromTarget` fact (from API N the platform ignores the permission for apps targeting N+) still applies
 * on devices older than N, which an app with minSdk below N runs on.
 */
export function stillUsedBelow(f: NoEffectFact, minSdk: number | undefined): number | undefined {
  if (f.fromTarget === undefined) return undefined;
  return (minSdk ?? 1) < f.fromTarget ? f.fromTarget : undefined;
}

/** The fact that makes `permission` useless at `targetSdk` with `maxSdkVersion`, if any. */
export function noEffectAt(permission: string, targetSdk: number, maxSdkVersion?: number): NoEffectFact | undefined {
  const f = noEffectFacts().get(permission);
  if (!f) return undefined;
  if (f.fromTarget !== undefined && targetSdk < f.fromTarget) return undefined;
  if (f.belowTarget !== undefined && targetSdk >= f.belowTarget) return undefined;
  if (f.unlessMaxSdkAtMost !== undefined && maxSdkVersion !== undefined && maxSdkVersion <= f.unlessMaxSdkAtMost) return undefined;
  return f;
}

/**
 * The lowest targetSdk each Android release still installs (an app targeting lower is refused; one already
 * installed stays). Android 14: 23, from developer.android.com/about/versions/14/behavior-changes-all
 * ("Minimum installable target API level"); Android 15: 24, from memory of
 * developer.android.com/about/versions/15/behavior-changes-all.
 */
export const MINIMUM_INSTALLABLE_TARGET: readonly { android: string; api: number; minTarget: number; source: string }[] = [
  { android: "14", api: 34, minTarget: 23, source: "developer.android.com/about/versions/14/behavior-changes-all#minimum-target-api-level" },
  { android: "15", api: 35, minTarget: 24, source: "from memory: developer.android.com/about/versions/15/behavior-changes-all (minimum installable target API level raised to 24)" },
];

/** The first Android release that refuses to install an app of this targetSdk, if any does. */
export function refusedFrom(targetSdk: number): (typeof MINIMUM_INSTALLABLE_TARGET)[number] | undefined {
  return MINIMUM_INSTALLABLE_TARGET.find((r) => targetSdk < r.minTarget);
}

/**
 * Ways to hold a permission that its protection level does not show. ACCESS_MOCK_LOCATION is signature in
 * the platform table, yet declaring it is what lets the user pick the app as the mock location app in
 * developer options (an app-op, from Android 6; from memory of the platform's developer-options docs).
 */
export const OTHER_GRANT_PATHS: ReadonlyMap<string, { how: "developer-options"; gives: string; source: string }> = new Map([
  ["android.permission.ACCESS_MOCK_LOCATION", { how: "developer-options", gives: "feeds made-up locations to every app on the device", source: "from memory: developer.android.com/studio/debug/dev-options (Select mock location app), Android 6 and later" }],
]);
