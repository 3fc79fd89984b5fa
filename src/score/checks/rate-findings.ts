/** Shared by the two rate checks: which requested permissions are uncommon, with the numbers behind it. */
import { requestedPermissionNames } from "../../extract/manifest/model.js";
import { platformPermission } from "../../platform/permissions.js";
import { storeAppCanHold } from "../../platform/sensitivity.js";
import type { CheckContext, Finding, FindingData } from "../types.js";

const pct = (x: number) => `${(100 * x).toFixed(x < 0.01 ? 2 : 1)}%`;

export function rateFindings(ctx: CheckContext, select: (permission: string) => boolean): Omit<Finding, "level" | "checkId">[] {
  const out: Omit<Finding, "level" | "checkId">[] = [];
  const first = new Map(ctx.manifest.usesPermissions.map((p) => [p.name, p] as const).reverse());
  for (const name of requestedPermissionNames(ctx.manifest)) {
    if (!select(name)) continue;
    // A permission the platform cannot grant is reported by ungrantable-permission instead.
    const platform = platformPermission(name);
    if (platform && !storeAppCanHold(platform)) continue;
    // So is an android.permission.* name the platform does not define (unknown-permission).
    if (!platform && name.startsWith("android.permission.")) continue;
    const r = ctx.rate(name);
    if (!r.uncommon) continue;
    const data: FindingData = {
      k: r.k,
      n: r.n,
      rate: r.rate,
      lower: r.lower,
      upper: r.upper,
      pooledRate: r.pooledRate,
      threshold: ctx.baseline.parameters.uncommonBelow,
      confidence: ctx.baseline.parameters.confidence,
      category: r.category,
      fallback: r.fallback,
    };
    out.push({ subject: name, location: first.get(name)!.source, data });
  }
  return out;
}

export function rateMessage(f: Pick<Finding, "subject" | "data">): string {
  const d = f.data as { k: number; n: number; lower: number; upper: number; pooledRate: number; threshold: number; confidence: number; category?: string };
  const group = d.category ? `${d.category} apps` : "apps in the pooled baseline";
  return `${d.k} of ${d.n} ${group} request it (${pct(d.k / d.n)}; ${Math.round(100 * d.confidence)}% interval ${pct(d.lower)}–${pct(d.upper)}, below ${pct(d.threshold)}); across all categories ${pct(d.pooledRate)}`;
}
