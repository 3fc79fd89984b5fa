/**
 * special-access-permission: a permission the user grants by hand in settings (all-files access, drawing
 * over other apps, usage access, installing packages …: app-op permissions a store app may get), or in
 * developer options (the mock location app). Always reported, with what it gives: stores ask developers to
 * justify such requests, and a reviewer wants them in front, whatever the category's rates say.
 */
import { isSpecialAccess, sensitivityOf } from "../../platform/sensitivity.js";
import { OTHER_GRANT_PATHS } from "../../platform/sdk-facts.js";
import type { Check } from "../types.js";

export const specialAccessPermission: Check = {
  meta: {
    id: "special-access-permission",
    title: "Special access the user grants by hand",
    description: "The app requests a permission the user grants in settings (or developer options) rather than at install or in a prompt: all-files access, drawing over other apps, usage access, installing packages, the mock location app.",
    docs: "docs/checks/special-access-permission.md",
    defaultLevel: "note",
    tags: [],
  },
  run(ctx) {
    const seen = new Set<string>();
    return ctx.manifest.usesPermissions.flatMap((p) => {
      if (p.removedByTools || seen.has(p.name) || p.facts.origin !== "platform" || !isSpecialAccess(p.facts, p.name)) return [];
      seen.add(p.name);
      const other = OTHER_GRANT_PATHS.get(p.name);
      const gives = other?.gives ?? sensitivityOf(p.name)?.gives;
      return [{ subject: p.name, location: p.source, data: { where: other ? other.how : "settings", ...(gives ? { gives } : {}) } }];
    });
  },
};
