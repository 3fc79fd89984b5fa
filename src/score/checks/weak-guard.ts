/**
 * weak-guard: an exported component whose guard does not keep other apps out — a provider guarded only
 * for reading (writes are open), or a component guarded by a platform permission of protection level
 * normal, which every app that asks is granted at install (platform table, API 34).
 */
import { platformPermission } from "../../platform/permissions.js";
import type { Check } from "../types.js";

export const weakGuard: Check = {
  meta: {
    id: "weak-guard",
    title: "Exported component with a guard that keeps no one out",
    description: "An exported provider is guarded for reading only (any app can write), or an exported component is guarded by a normal-level platform permission that any app gets at install.",
    docs: "docs/checks/weak-guard.md",
    defaultLevel: "warning",
    tags: [],
  },
  run(ctx) {
    return ctx.manifest.components.flatMap((c) => {
      if (!c.effectiveExported || c.enabled === false) return [];
      const out: ReturnType<Check["run"]> = [];
      if (c.kind === "provider" && c.readPermission && !c.writePermission && !c.permission) {
        out.push({ subject: c.name, location: c.source, data: { kind: c.kind, weakness: "read-only-guard", permission: c.readPermission } });
      }
      for (const g of new Set([c.permission, c.readPermission, c.writePermission].filter((x): x is string => x !== undefined))) {
        if (platformPermission(g)?.base === "normal") out.push({ subject: c.name, location: c.source, data: { kind: c.kind, weakness: "normal-platform-permission", permission: g } });
      }
      return out;
    });
  },
};
