/**
 * Shared by the two rate checks: which requested permissions are uncommon for the app's category, with the
 * numbers behind it. Frequency judges only what it can (score/frequency.ts): never the app's own
 * permissions, and a permission newer than the baseline's era only through the one it took over from.
 */
import { codeStatusText } from "../code-evidence.js";
import { requestedPermissionNames } from "../../extract/manifest/model.js";
import { platformPermission } from "../../platform/permissions.js";
import { sensitivityOf, storeAppCanHold } from "../../platform/sensitivity.js";
import type { CheckContext, Finding, FindingData } from "../types.js";

const pct = (x: number) => `${(100 * x).toFixed(x < 0.01 ? 2 : 1)}%`;
const short = (n: string) => n.replace(/^android\.permission\./, "");

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
    const j = ctx.frequency(name);
    if (j.kind !== "rate" || !j.rate.uncommon) continue;
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

/**
 * One rate and one interval: the category's when the app is judged against a category, the pooled one
 * otherwise. The pooled rate is not repeated beside it: it is smoothed (never exactly 0), so "0 of n apps"
 * beside "0.01% of all apps" would read as a contradiction; JSON keeps it in `pooledRate`.
 */
/** " Code: used only by org.example.adnet." — what the code evidence (score/judge.ts) adds to a finding. */
export function codeSuffix(data: Finding["data"]): string {
  if (data.code !== "used" && data.code !== "not-seen" && data.code !== "not-mappable") return "";
  return ` Code: ${codeStatusText(data.code, Array.isArray(data.codeUsers) ? data.codeUsers : [], data.codeOnlyLibraries === true)}.`;
}

export function rateMessage(f: Pick<Finding, "subject" | "data">): string {
  const d = f.data as { k: number; n: number; lower: number; upper: number; pooledRate: number; threshold: number; confidence: number; category?: string; judgedBy?: string; replacedIn?: number; lineageKind?: string; gives?: string };
  const group = d.category ? `${d.category} apps` : "apps in the pooled baseline";
  const what = d.judgedBy ? `judged by ${short(d.judgedBy)}, which it ${d.lineageKind === "renamed" ? "was renamed from" : "replaced"} in API ${d.replacedIn}: ` : "";
  const gives = d.gives ? ` It ${d.gives}.` : "";
  return `${what}${d.k} of ${d.n} ${group} request${d.judgedBy ? "" : " it"}${d.judgedBy ? ` ${short(d.judgedBy)}` : ""} (${Math.round(100 * d.confidence)}% interval ${pct(d.lower)}–${pct(d.upper)}, below ${pct(d.threshold)}).${gives}${codeSuffix(f.data)}`;
}
