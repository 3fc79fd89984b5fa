/**
 * Per-category permission rates from counts: smoothed toward the pooled rate, with a Wilson interval,
 * falling back to the pooled baseline for categories with too little support. Any app can be left out of
 * the counts on the fly (`exclude`), which makes leave-one-out features exact and cheap.
 */
import { CountTable, type GroupCounts } from "./counts.js";
import { empiricalBayesStrength, shrinkToward } from "./stats/shrink.js";
import { wilsonInterval } from "./stats/wilson.js";

export interface RateParameters {
  /**
   * How far category rates shrink toward the pooled rate: `fixed` adds `strength` pooled pseudo-apps to
   * every category; `empirical-bayes` estimates the strength per permission from the spread between
   * categories (method of moments), capped at `strength`.
   */
  prior: { method: "fixed" | "empirical-bayes"; strength: number };
  /** Confidence level of the Wilson intervals. */
  confidence: number;
  /** Categories with fewer apps use the pooled baseline. */
  minSupport: number;
  /** A permission is uncommon for a category when the upper end of its rate's interval is below this. */
  uncommonBelow: number;
}

export const DEFAULT_RATE_PARAMETERS: RateParameters = {
  prior: { method: "fixed", strength: 10 },
  confidence: 0.95,
  minSupport: 30,
  uncommonBelow: 0.05,
};

export type Fallback = "no-category" | "unknown-category" | "below-min-support";

export interface PermissionRate {
  permission: string;
  /** The category whose counts the rate uses; absent when the pooled baseline was used. */
  category?: string;
  fallback?: Fallback;
  /** Apps requesting the permission, and apps, behind the rate (the category's, or the pooled ones). */
  k: number;
  n: number;
  /** The smoothed rate. */
  rate: number;
  /** Wilson interval of k/n. */
  lower: number;
  upper: number;
  /** The pooled rate (smoothed with a Jeffreys prior, so that a permission never seen is not 0). */
  pooledRate: number;
  /** The prior strength used. */
  strength: number;
  uncommon: boolean;
}

/** An app's own contribution to the counts, to take out for leave-one-out rates. */
export interface Exclusion {
  category?: string;
  permissions: ReadonlySet<string>;
}

export class Baseline {
  private readonly ebCache = new Map<string, number>();

  constructor(
    readonly counts: CountTable,
    readonly parameters: RateParameters = DEFAULT_RATE_PARAMETERS,
    /** Category aliases the baseline was learned with (source name → baseline name). */
    readonly aliases: ReadonlyMap<string, string> = new Map(),
    /** The newest API level the corpus speaks for (baseline/era.ts); undefined: no era rule. */
    readonly era?: number,
  ) {}

  /** The category whose counts apply to `category`, or the reason the pooled ones do. */
  resolveCategory(category: string | undefined, exclude?: Exclusion): { category?: string; fallback?: Fallback } {
    if (category === undefined) return { fallback: "no-category" };
    const g = this.counts.categories.get(category);
    if (!g) return { fallback: "unknown-category" };
    const apps = g.apps - (exclude && exclude.category === category ? 1 : 0);
    if (apps < this.parameters.minSupport) return { fallback: "below-min-support" };
    return { category };
  }

  rate(category: string | undefined, permission: string, exclude?: Exclusion): PermissionRate {
    const p = this.parameters;
    const mine = exclude?.permissions.has(permission) ? 1 : 0;
    const pooled = this.counts.pooled;
    const kp = (pooled.permissions.get(permission) ?? 0) - (exclude ? mine : 0);
    const np = pooled.apps - (exclude ? 1 : 0);
    const pooledRate = (kp + 0.5) / (np + 1);
    const resolved = this.resolveCategory(category, exclude);
    let k: number;
    let n: number;
    let rate: number;
    let strength = 0;
    if (resolved.category !== undefined) {
      const g = this.counts.categories.get(resolved.category)!;
      const own = exclude && exclude.category === resolved.category;
      k = (g.permissions.get(permission) ?? 0) - (own ? mine : 0);
      n = g.apps - (own ? 1 : 0);
      strength = p.prior.method === "fixed" ? p.prior.strength : this.ebStrength(permission);
      rate = shrinkToward(k, n, pooledRate, strength);
    } else {
      k = kp;
      n = np;
      rate = pooledRate;
    }
    const { lower, upper } = n > 0 ? wilsonInterval(k, n, p.confidence) : { lower: 0, upper: 1 };
    const out: PermissionRate = { permission, k, n, rate, lower, upper, pooledRate, strength, uncommon: upper < p.uncommonBelow };
    if (resolved.category !== undefined) out.category = resolved.category;
    if (resolved.fallback) out.fallback = resolved.fallback;
    return out;
  }

  /**
   * Empirical-Bayes strength for one permission, estimated once from the categories with enough support.
   * It is a corpus-level setting: leave-one-out rates reuse it rather than re-estimating it per app.
   */
  private ebStrength(permission: string): number {
    let s = this.ebCache.get(permission);
    if (s === undefined) {
      const groups: { k: number; n: number }[] = [];
      for (const g of this.counts.categories.values()) {
        if (g.apps >= this.parameters.minSupport) groups.push({ k: g.permissions.get(permission) ?? 0, n: g.apps });
      }
      s = empiricalBayesStrength(groups, this.parameters.prior.strength);
      this.ebCache.set(permission, s);
    }
    return s;
  }

  /** Categories and their support, with whether each falls back to the pooled baseline. */
  categorySummary(): { name: string; apps: number; pooled: boolean }[] {
    return [...this.counts.categories.entries()]
      .map(([name, g]: [string, GroupCounts]) => ({ name, apps: g.apps, pooled: g.apps < this.parameters.minSupport }))
      .sort((a, b) => a.name.localeCompare(b.name));
  }
}
