/**
 * service-type-permission: a foreground service needs FOREGROUND_SERVICE (targetSdk 28+) and, from
 * targetSdk 34, the FOREGROUND_SERVICE_<TYPE> permission of each type it declares; without them starting
 * it in the foreground fails with a SecurityException. Sources: src/platform/foreground-services.ts.
 */
import { requestedPermissionNames } from "../../extract/manifest/model.js";
import { SERVICE_TYPE_PERMISSIONS_FROM_SDK, serviceType } from "../../platform/foreground-services.js";
import type { Check } from "../types.js";

/** FOREGROUND_SERVICE became required at targetSdk 28 (from memory: Android 9 behaviour changes). */
const FOREGROUND_SERVICE_FROM_SDK = 28;

export const serviceTypePermission: Check = {
  meta: {
    id: "service-type-permission",
    title: "Foreground service without the permission its type needs",
    description: "A service declares a foregroundServiceType whose permission the app does not request (FOREGROUND_SERVICE from targetSdk 28, FOREGROUND_SERVICE_<TYPE> from targetSdk 34): starting it in the foreground fails.",
    docs: "docs/checks/service-type-permission.md",
    defaultLevel: "warning",
    tags: [],
  },
  run(ctx) {
    const target = ctx.manifest.targetSdk ?? 0;
    const have = new Set(requestedPermissionNames(ctx.manifest));
    return ctx.manifest.components.flatMap((c) => {
      if (c.kind !== "service" || !c.foregroundServiceType?.length) return [];
      const missing: string[] = [];
      if (target >= FOREGROUND_SERVICE_FROM_SDK && !have.has("android.permission.FOREGROUND_SERVICE")) missing.push("android.permission.FOREGROUND_SERVICE");
      if (target >= SERVICE_TYPE_PERMISSIONS_FROM_SDK) {
        for (const t of c.foregroundServiceType) {
          const p = serviceType(t)?.permission;
          if (p && !have.has(p)) missing.push(p);
        }
      }
      return missing.length ? [{ subject: c.name, location: c.source, data: { types: c.foregroundServiceType, missing, targetSdk: target } }] : [];
    });
  },
};
