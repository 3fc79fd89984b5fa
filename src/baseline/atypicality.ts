/**
 * Atypicality: how unusual an app's whole set of permissions is for its category, with no labels at all —
 * the app's summed category-relative surprisal (features.ts) as a percentile among the baseline's own apps
 * of that category ("more atypical than 97% of TOOLS apps"). Because it needs no labeled corpus, it does not
 * inherit what an old labeled corpus taught.
 */
import { appTerms } from "./features.js";
import type { Baseline } from "./rates.js";

/** Percentiles stored per category: the 0th, 1st, … 100th. */
export const ATYPICALITY_POINTS = 101;

export interface AtypicalityTable {
  /** Summed surprisal at each percentile (0…100) among the baseline's apps, per category and pooled. */
  categories: Record<string, number[]>;
  pooled: number[];
  /** How many apps each distribution was computed from. */
  apps: Record<string, number>;
}

const SURPRISAL = 2; // index of the surprisal term in appTerms

/** Percentile points (type 7 interpolation) of a list of values. */
function percentiles(values: number[]): number[] {
  const v = [...values].sort((a, b) => a - b);
  return Array.from({ length: ATYPICALITY_POINTS }, (_, i) => {
    const h = ((v.length - 1) * i) / (ATYPICALITY_POINTS - 1);
    const lo = Math.floor(h);
    return v[lo] + (h - lo) * ((v[Math.min(lo + 1, v.length - 1)] ?? v[lo]) - v[lo]);
  });
}

/**
 * The distributions, from apps of the frequency corpus: each app's surprisal is computed against counts
 * that leave the app itself out (so an app is not typical merely because it is counted).
 */
export function atypicalityTable(baseline: Baseline, apps: readonly { category?: string; permissions: readonly string[] }[]): AtypicalityTable {
  const byCategory = new Map<string, number[]>();
  const pooled: number[] = [];
  for (const a of apps) {
    const exclude = { ...(a.category !== undefined ? { category: a.category } : {}), permissions: new Set(a.permissions) };
    pooled.push(appTerms(baseline, undefined, a.permissions, exclude)[SURPRISAL]);
    if (a.category === undefined) continue;
    const r = baseline.resolveCategory(a.category, exclude);
    if (!r.category) continue;
    let list = byCategory.get(r.category);
    if (!list) byCategory.set(r.category, (list = []));
    list.push(appTerms(baseline, r.category, a.permissions, exclude)[SURPRISAL]);
  }
  const categories: Record<string, number[]> = {};
  const counts: Record<string, number> = { "": pooled.length };
  for (const [c, list] of [...byCategory].sort((x, y) => x[0].localeCompare(y[0]))) {
    categories[c] = percentiles(list);
    counts[c] = list.length;
  }
  return { categories, pooled: pooled.length ? percentiles(pooled) : [], apps: counts };
}

/** The percentile (0–100) of a surprisal value within a stored distribution. */
export function percentileOf(points: readonly number[], value: number): number {
  if (!points.length) return NaN;
  if (value <= points[0]) return 0;
  if (value >= points[points.length - 1]) return 100;
  let i = 0;
  while (i + 1 < points.length && points[i + 1] < value) i++;
  // Between points i and i+1 (ties: the lower percentile of a run of equal points).
  const a = points[i];
  const b = points[i + 1];
  const frac = b > a ? (value - a) / (b - a) : 0;
  return ((i + frac) * 100) / (points.length - 1);
}
