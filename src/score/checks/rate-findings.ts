/**
 * Shared by the two rate checks: which requested permissions `check` reports as uncommon for the app's
 * numbers behind it. Frequency judges only what it can (score/frequency.ts): never the app's own
 * permissions, and a permission newer than the baseline's era only through the one it took over from.
 */
import { requestedPermissionNames } from "../../extract/manifest/model.js";
import { sensitivityOf } from "../../platform/sensitivity.js";
import { uncommonJudgement } from "../uncommon.js";
import type { CheckContext, Finding, FindingData } from "../types.js";


export function rateFindings(ctx: CheckContext, select: (permission: string) => boolean): Omit<Finding, "level" | "checkId">[] {
  const out: Omit<Finding, "level" | "checkId">[] = [];
  // A test APK runs with the permissions of the app it instruments: how common its own requests are says nothing.
  if (ctx.instruments) return out;
  const first = new Map(ctx.manifest.usesPermissions.map((p) => [p.name, p] as const).reverse());
  for (const name of requestedPermissionNames(ctx.manifest)) {
    // A permission the manifest shows the app needs is not judged by how common it is (score/needed.ts).
    if (!select(name) || ctx.needed.has(name)) continue;
    const j = uncommonJudgement(ctx.manifest, ctx.baseline, ctx.category.category, name, ctx.rate);
    if (!j) continue;
    const r = j.rate;
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
      gives: sensitivityOf(name)?.sensitive ? sensitivityOf(name)!.gives : undefined,
    };
    if (j.judgedBy) {
      data.judgedBy = j.judgedBy.permission;
      data.replacedIn = j.judgedBy.lineage.api;
      data.lineageKind = j.judgedBy.lineage.kind;
    }
    out.push({ subject: name, location: first.get(name)!.source, data });
  }
  return out;
}

