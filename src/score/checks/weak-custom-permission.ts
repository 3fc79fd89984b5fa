/** weak-custom-permission: an exported component guarded by the app's own normal or dangerous permission. */
import type { Check } from "../types.js";

export const weakCustomPermission: Check = {
  meta: {
    id: "weak-custom-permission",
    title: "Exported component guarded by a weak custom permission",
    description: "An exported component is guarded by a permission the app declares with protection level normal or dangerous, which any app can request (and, for normal, is granted at install).",
    docs: "docs/checks/weak-custom-permission.md",
    defaultLevel: "warning",
    tags: [],
  },
  run(ctx) {
    const declared = new Map(ctx.manifest.declaredPermissions.map((d) => [d.name, d]));
    return ctx.manifest.components.flatMap((c) => {
      if (!c.effectiveExported) return [];
      const guards = [c.permission, c.readPermission, c.writePermission].filter((g): g is string => g !== undefined);
      return [...new Set(guards)].flatMap((g) => {
        const d = declared.get(g);
        if (!d || (d.protectionLevel.base !== "normal" && d.protectionLevel.base !== "dangerous")) return [];
        return [{ subject: c.name, location: c.source, data: { kind: c.kind, permission: g, level: d.protectionLevel.base } }];
      });
    });
  },
};
