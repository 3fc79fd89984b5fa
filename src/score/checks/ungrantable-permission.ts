/**
 * ungrantable-permission: signature, privileged or internal permissions a store app cannot be granted.
 * Two flags open a way for a store app, and the message says so instead of "ignored" (platform table,
 * API 34; meaning of the flags from memory of the platform's PermissionInfo documentation):
 * `development` — the user (or a developer) can grant it over adb (`pm grant`); `role` — the platform grants
 * it to the holder of a role whose definition lists it (the role definitions of the permission controller
 * decide; a default SMS, dialer or assistant app does not receive every role permission). A permission
 * granted another way (the mock location app) is left to special-access-permission.
 */
import { OTHER_GRANT_PATHS } from "../../platform/sdk-facts.js";
import { storeAppCanHold } from "../../platform/sensitivity.js";
import type { Check } from "../types.js";

export const ungrantablePermission: Check = {
  meta: {
    id: "ungrantable-permission",
    title: "Permission a store app cannot be granted",
    description: "The app requests a signature, privileged or internal platform permission, which only the platform itself or preinstalled apps can hold, unless the user grants it over adb (development) or gives the app a system role (role).",
    docs: "docs/checks/ungrantable-permission.md",
    defaultLevel: "note",
    tags: ["trim"],
  },
  run(ctx) {
    const seen = new Set<string>();
    return ctx.manifest.usesPermissions
      .filter((p) => {
        const f = p.facts;
        if (f.origin !== "platform" || p.removedByTools || seen.has(p.name)) return false;
        if (storeAppCanHold(f) || OTHER_GRANT_PATHS.has(p.name)) return false;
        seen.add(p.name);
        return true;
      })
      .map((p) => ({
        subject: p.name,
        location: p.source,
        data: { protectionLevel: p.facts.protectionLevel, role: p.facts.flags?.includes("role") ?? false, development: p.facts.flags?.includes("development") ?? false },
      }));
  },
};
