/** no-effect-at-target: permissions that do nothing at the app's targetSdk. */
import { noEffectAt } from "../../platform/sdk-facts.js";
import type { Check } from "../types.js";

export const noEffectAtTarget: Check = {
  meta: {
    id: "no-effect-at-target",
    title: "Permission with no effect at the target SDK",
    description: "The request does nothing at the app's targetSdk (the platform replaced or removed the permission); it can be removed or limited with maxSdkVersion.",
    docs: "docs/checks/no-effect-at-target.md",
    defaultLevel: "note",
    tags: ["trim"],
  },
  run(ctx) {
    const target = ctx.manifest.targetSdk ?? ctx.manifest.minSdk ?? 1;
    return ctx.manifest.usesPermissions.flatMap((p) => {
      if (p.removedByTools) return [];
      const fact = noEffectAt(p.name, target, p.maxSdkVersion);
      if (!fact) return [];
      return [{ subject: p.name, location: p.source, data: { targetSdk: target, why: fact.why, instead: fact.instead, limitTo: fact.unlessMaxSdkAtMost, source: fact.source } }];
    });
  },
  message(f) {
    const d = f.data as { targetSdk: number; why: string; instead?: string[]; limitTo?: number };
    const instead = d.instead?.length ? `; request ${d.instead.map((i) => i.replace(/^android\.permission\./, "")).join(" / ")} instead` : "";
    const limit = d.limitTo !== undefined ? `; or keep it for older devices with android:maxSdkVersion="${d.limitTo}"` : "";
    return `no effect at targetSdk ${d.targetSdk}: ${d.why}${instead}${limit}`;
  },
};
