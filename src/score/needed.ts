/**
 * Which requested permissions the manifest itself shows the app needs: the one rule `check` (such a
 * permission is never judged uncommon: it says "needed by …" instead) and `trim` (never a candidate) share.
 *
 * - the app's own permissions, and any permission guarding one of its components;
 * - for every service with a foreground-service type: FOREGROUND_SERVICE, the type's own permission, and
 *   the runtime permissions the type requires before the service starts (src/platform/foreground-services.ts,
 *   after developer.android.com/develop/background-work/services/fgs/service-types);
 * - MANAGE_OWN_CALLS, when the app declares a self-managed ConnectionService (a service guarded by
 *   BIND_TELECOM_CONNECTION_SERVICE that handles android.telecom.ConnectionService; from memory:
 *   developer.android.com/develop/connectivity/telecom/selfManaged);
 * - USE_FULL_SCREEN_INTENT for a calling app (a ConnectionService or a phoneCall service): Android 14 keeps
 *   full-screen notifications for calling and alarm apps (from memory:
 *   developer.android.com/about/versions/14/behavior-changes-all, full-screen intent permissions);
 * - the Health Connect permissions (android.permission.health.*), when the app declares the activity that
 *   shows its rationale for them (action androidx.health.ACTION_SHOW_PERMISSIONS_RATIONALE, or the
 *   VIEW_PERMISSION_USAGE alias with category HEALTH_PERMISSIONS from Android 14; from memory:
 *   developer.android.com/health-and-fitness/health-connect/get-started).
 *
 * What the app's code uses is left out here on purpose: until code evidence says which calls the app
 * reaches, "used" includes dead library code, and a permission would be excused by code that never runs.
 */
import { isOwnPermission } from "../baseline/judged.js";
import { requestedPermissionNames, type Component, type Manifest } from "../extract/manifest/model.js";
import { serviceType } from "../platform/foreground-services.js";

/** Why the manifest shows a permission is needed; data for report/ to word. */
export type NeedReason =
  | { kind: "own-permission" }
  | { kind: "guards-component"; component: string; componentKind: Component["kind"] }
  | { kind: "foreground-service"; service: string; types: string[] }
  | { kind: "service-type"; service: string; type: string }
  | { kind: "service-type-prerequisite"; service: string; type: string; anyOf: string[] }
  | { kind: "self-managed-calls"; service: string }
  | { kind: "calling-app"; service: string }
  | { kind: "health-connect"; activity: string };

const FOREGROUND_SERVICE = "android.permission.FOREGROUND_SERVICE";
const MANAGE_OWN_CALLS = "android.permission.MANAGE_OWN_CALLS";
const FULL_SCREEN_INTENT = "android.permission.USE_FULL_SCREEN_INTENT";
const BIND_CONNECTION_SERVICE = "android.permission.BIND_TELECOM_CONNECTION_SERVICE";
const HEALTH_PREFIX = "android.permission.health.";
const HEALTH_RATIONALE = "androidx.health.ACTION_SHOW_PERMISSIONS_RATIONALE";

/** The requested permissions the manifest shows the app needs, each with every reason it gives. */
export function neededByManifest(m: Manifest): ReadonlyMap<string, NeedReason[]> {
  const requested = new Set(requestedPermissionNames(m));
  const out = new Map<string, NeedReason[]>();
  const add = (p: string, r: NeedReason) => {
    if (!requested.has(p)) return;
    const list = out.get(p) ?? [];
    if (!list.some((x) => JSON.stringify(x) === JSON.stringify(r))) list.push(r);
    out.set(p, list);
  };
  for (const p of requested) if (isOwnPermission(m, p)) add(p, { kind: "own-permission" });
  for (const c of m.components) {
    for (const g of [c.permission, c.readPermission, c.writePermission]) if (g) add(g, { kind: "guards-component", component: c.name, componentKind: c.kind });
    if (c.kind === "service" && c.foregroundServiceType?.length) {
      add(FOREGROUND_SERVICE, { kind: "foreground-service", service: c.name, types: c.foregroundServiceType });
      for (const name of c.foregroundServiceType) {
        const t = serviceType(name);
        if (!t) continue;
        if (t.permission) add(t.permission, { kind: "service-type", service: c.name, type: name });
        // The platform enforces them from targetSdk 34; at any target the type shows what the service does.
        for (const p of t.prerequisites) add(p, { kind: "service-type-prerequisite", service: c.name, type: name, anyOf: t.prerequisites });
      }
    }
    if (isSelfManagedConnectionService(c)) add(MANAGE_OWN_CALLS, { kind: "self-managed-calls", service: c.name });
    if (isSelfManagedConnectionService(c) || (c.kind === "service" && c.foregroundServiceType?.includes("phoneCall"))) add(FULL_SCREEN_INTENT, { kind: "calling-app", service: c.name });
  }
  const rationale = m.components.find(showsHealthRationale);
  if (rationale) for (const p of requested) if (p.startsWith(HEALTH_PREFIX)) add(p, { kind: "health-connect", activity: rationale.name });
  return out;
}

function isSelfManagedConnectionService(c: Component): boolean {
  return c.kind === "service" && c.permission === BIND_CONNECTION_SERVICE && c.intentFilters.some((f) => f.actions.includes("android.telecom.ConnectionService"));
}

function isHealthRationaleFilter(f: Component["intentFilters"][number]): boolean {
  return f.actions.includes(HEALTH_RATIONALE) || (f.actions.includes("android.intent.action.VIEW_PERMISSION_USAGE") && f.categories.includes("android.intent.category.HEALTH_PERMISSIONS"));
}

function showsHealthRationale(c: Component): boolean {
  if (c.kind !== "activity" && c.kind !== "activity-alias") return false;
  return c.intentFilters.some(isHealthRationaleFilter);
}

/**
 * An activity whose every intent filter is Health Connect's rationale: it must be exported, since Health
 * Connect starts it from outside the app (sources above), and it only shows the app's privacy text.
 */
export function onlyShowsHealthRationale(c: Component): boolean {
  if (c.kind !== "activity" && c.kind !== "activity-alias") return false;
  return c.intentFilters.length > 0 && c.intentFilters.every(isHealthRationaleFilter);
}
