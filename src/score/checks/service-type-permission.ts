/**
 * service-type-permission: a foreground service needs FOREGROUND_SERVICE (targetSdk 28+) and, from
 * targetSdk 34, the FOREGROUND_SERVICE_<TYPE> permission of each type it declares and one of the runtime
 * permissions the type requires (a health service: ACTIVITY_RECOGNITION, BODY_SENSORS or
 * HIGH_SAMPLING_RATE_SENSORS …); without them starting it in the foreground fails with a SecurityException.
 * Sources: src/platform/foreground-services.ts.
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
    description: "A service declares a foregroundServiceType whose permissions the app does not request (FOREGROUND_SERVICE from targetSdk 28; from targetSdk 34 FOREGROUND_SERVICE_<TYPE> and one of the runtime permissions the type requires): starting it in the foreground fails.",
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
      /** Per type whose runtime prerequisites the app requests none of: the type, then the permissions (any one will do). */
      const missingOneOf: string[] = [];
      if (target >= FOREGROUND_SERVICE_FROM_SDK && !have.has("android.permission.FOREGROUND_SERVICE")) missing.push("android.permission.FOREGROUND_SERVICE");
      if (target >= SERVICE_TYPE_PERMISSIONS_FROM_SDK) {
        for (const name of c.foregroundServiceType) {
          const t = serviceType(name);
          if (t?.permission && !have.has(t.permission)) missing.push(t.permission);
          if (t?.prerequisites.length && !t.prerequisites.some((p) => have.has(p))) missingOneOf.push(`${name}:${t.prerequisites.join("|")}`);
        }
      }
      if (!missing.length && !missingOneOf.length) return [];
      return [{ subject: c.name, location: c.source, data: { types: c.foregroundServiceType, missing, ...(missingOneOf.length ? { missingOneOf } : {}), targetSdk: target } }];
    });
  },
};
