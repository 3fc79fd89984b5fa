/** unknown-permission: an android.permission.* name the platform does not define. */
import { nearestPlatformPermission } from "../../platform/permissions.js";
import { editDistance } from "../../util/edit-distance.js";
import type { Check } from "../types.js";

export { editDistance, nearestPlatformPermission };

/** Up to this many edits, a near platform name is reported as a likely typo. */
const TYPO_DISTANCE = 2;

export const unknownPermission: Check = {
  meta: {
    id: "unknown-permission",
    title: "Permission not defined by the platform",
    description: "The app requests an android.permission.* name that the platform does not define: a typo, or a permission from another platform version.",
    docs: "docs/checks/unknown-permission.md",
    defaultLevel: "warning",
    tags: ["trim"],
  },
  run(ctx) {
    const seen = new Set<string>();
    return ctx.manifest.usesPermissions
      .filter((p) => p.facts.unknownPlatformName && !p.removedByTools && !seen.has(p.name) && seen.add(p.name))
      .map((p) => {
        const near = nearestPlatformPermission(p.name);
        return { subject: p.name, location: p.source, data: { nearest: near.name, distance: near.distance, likelyTypo: near.distance <= TYPO_DISTANCE } };
      });
  },
};
