/**
 * permission-redelegation: an exported component that any app can reach — unguarded, or guarded by a
 * permission any app can get — whose reached code uses a dangerous, signature-level or special-access
 * permission the app holds. Any app on the device can then have the component do, for it, what that
 * permission allows (permission re-delegation: Felt et al., "Permission Re-Delegation: Attacks and
 * Defenses", USENIX Security 2011; Chin et al., "Analyzing Inter-Application Communication in Android",
 * MobiSys 2011). The evidence is a call path from one of the component's entry methods to the API, found
 * by the call graph (score/code/reach.ts); launcher activities, which everyone is meant to start and the
 * user sees, are left out.
 */
import { isOwnPermission } from "../../baseline/judged.js";
import type { Component, Manifest } from "../../extract/manifest/model.js";
import { isLauncher, requestedPermissionNames } from "../../extract/manifest/model.js";
import { platformPermission } from "../../platform/permissions.js";
import { isSpecialAccess, sensitivityOf } from "../../platform/sensitivity.js";
import type { Check } from "../types.js";

/** Why any app can reach the component, or undefined when a guard keeps other apps out. */
export function openGuard(m: Manifest, c: Component): { guard?: string; why: "none" | "normal" | "undeclared" | "own-normal" | "own-dangerous" } | undefined {
  const guard = c.permission ?? (c.kind === "provider" ? c.readPermission : undefined);
  if (!guard) return { why: "none" };
  const platform = platformPermission(guard);
  if (platform) return platform.base === "normal" ? { guard, why: "normal" } : undefined;
  const own = m.declaredPermissions.find((d) => d.name === guard);
  // A custom permission nobody declares can be declared first by any app, and then granted to it.
  if (!own) return { guard, why: "undeclared" };
  const { base } = own.protectionLevel;
  if (base !== "normal" && base !== "dangerous") return undefined;
  return { guard, why: base === "dangerous" ? "own-dangerous" : "own-normal" };
}

/** What re-delegating the permission would matter for: dangerous, signature-level or special access. */
export function redelegationLevel(permission: string): "dangerous" | "signature" | "special-access" | undefined {
  const p = platformPermission(permission);
  if (!p) return undefined;
  if (isSpecialAccess(p, permission)) return "special-access";
  if (p.base === "dangerous") return "dangerous";
  if (p.base === "signature" || p.base === "internal") return "signature";
  return undefined;
}

export const permissionRedelegation: Check = {
  meta: {
    id: "permission-redelegation",
    title: "Exported component uses a permission on behalf of any app",
    description: "An exported component any app can reach runs code that uses a dangerous, signature-level or special-access permission the app holds: other apps can use the permission through it.",
    docs: "docs/checks/permission-redelegation.md",
    defaultLevel: "warning",
    tags: [],
  },
  run(ctx) {
    const code = ctx.code;
    if (!code?.componentUses.length) return [];
    const held = new Set(requestedPermissionNames(ctx.manifest));
    const out: ReturnType<Check["run"]> = [];
    for (const c of ctx.manifest.components) {
      if (!c.effectiveExported || c.enabled === false || isLauncher(c)) continue;
      const open = openGuard(ctx.manifest, c);
      if (!open) continue;
      const uses = code.componentUses.filter((u) => u.component === c.name && held.has(u.permission) && !isOwnPermission(ctx.manifest, u.permission));
      for (const u of uses) {
        const level = redelegationLevel(u.permission);
        if (!level) continue;
        out.push({
          subject: c.name,
          location: c.source,
          data: { kind: c.kind, permission: u.permission, level, gives: sensitivityOf(u.permission)?.gives ?? "", path: u.path, ...(open.guard ? { guard: open.guard } : {}), openBecause: open.why, exportedReason: c.exportedReason },
        });
      }
    }
    return out;
  },
};
