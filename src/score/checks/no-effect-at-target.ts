/**
 * no-effect-at-target: permissions that do nothing at the app's targetSdk. A permission the platform
 * replaced at API N still works on devices older than N: while minSdk is below N the request is limited
 * with android:maxSdkVersion="N−1", not removed ("no effect" only when minSdk is already past the change).
 */
import { noEffectAt, stillUsedBelow } from "../../platform/sdk-facts.js";
import type { Check } from "../types.js";


export const noEffectAtTarget: Check = {
  meta: {
    id: "no-effect-at-target",
    title: "Permission with no effect at the target SDK",
    description: "The request does nothing at the app's targetSdk on current devices (the platform replaced or removed the permission); remove it, or limit it with maxSdkVersion while older devices still use it.",
    docs: "docs/checks/no-effect-at-target.md",
    defaultLevel: "note",
    tags: ["trim"],
  },
  run(ctx) {
    const m = ctx.manifest;
    const target = m.targetSdk ?? m.minSdk ?? 1;
    return m.usesPermissions.flatMap((p) => {
      if (p.removedByTools) return [];
      const fact = noEffectAt(p.name, target, p.maxSdkVersion);
      if (!fact) return [];
      const below = stillUsedBelow(fact, m.minSdk);
      const data = { targetSdk: target, minSdk: m.minSdk, why: fact.why, instead: fact.instead, source: fact.source, ...(below !== undefined ? { stillUsedBelow: below, limitTo: below - 1 } : {}) };
      return [{ subject: p.name, location: p.source, data }];
    });
  },
};
