/** ungrantable-permission: signature, privileged or internal permissions a store app cannot be granted. */
import { storeAppCanHold } from "../../platform/sensitivity.js";
import type { Check } from "../types.js";

export const ungrantablePermission: Check = {
  meta: {
    id: "ungrantable-permission",
    title: "Permission a store app cannot be granted",
    description: "The app requests a signature, privileged or internal platform permission, which only the platform itself or preinstalled apps can hold; the request grants nothing to a store app.",
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
        if (storeAppCanHold(f)) return false;
        seen.add(p.name);
        return true;
      })
      .map((p) => ({ subject: p.name, location: p.source, data: { protectionLevel: p.facts.protectionLevel, role: p.facts.flags?.includes("role") ?? false } }));
  },
  message: (f) =>
    `protection level ${f.data.protectionLevel}: only the platform or preinstalled apps signed for it can hold this${f.data.role ? " (or an app given a matching system role)" : ""}; a store app's request is ignored`,
};
