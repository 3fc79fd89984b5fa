/**
 * The permissions a set of judged apps was flagged for most (by the rate-based checks), with the share of
 * apps requesting each per category beside the baseline's share: the figures behind the sweep report's
 * heatmap.
 */
import type { Baseline } from "../baseline/rates.js";
import { wilsonInterval } from "../baseline/stats/wilson.js";
import { checkIdsTagged } from "./registry.js";
import type { Heatmap } from "./heatmap-types.js";
import type { AppRow } from "./row.js";

export type { Heatmap, HeatmapCell } from "./heatmap-types.js";

/** Apps judged against all categories pooled get a column of their own. */
export const POOLED_COLUMN = "(pooled)";

/** The `top` permissions most often flagged as uncommon, with sweep and baseline shares per category. */
export function heatmapData(rows: readonly AppRow[], baseline: Baseline, top = 15): Heatmap {
  const rateChecks = checkIdsTagged("rate");
  // A rate finding may be folded under a more severe one on the same permission (`also`): it counts too.
  const isFlagged = (f: NonNullable<AppRow["findings"]>[number]) => rateChecks.has(f.checkId) || (f.also ?? []).some((a) => rateChecks.has(a.checkId));
  const flagged = new Map<string, number>();
  for (const r of rows) for (const f of r.findings ?? []) if (isFlagged(f)) flagged.set(f.subject, (flagged.get(f.subject) ?? 0) + 1);
  const permissions = [...flagged.entries()].sort((a, b) => b[1] - a[1] || a[0].localeCompare(b[0])).slice(0, top).map(([p]) => p);
  const scored = rows.filter((r) => r.status === "scored");
  const categories = [...new Set(scored.map((r) => r.category ?? POOLED_COLUMN))].sort((a, b) => (a === POOLED_COLUMN ? 1 : b === POOLED_COLUMN ? -1 : a.localeCompare(b)));
  const byCategory = new Map(categories.map((c) => [c, scored.filter((r) => (r.category ?? POOLED_COLUMN) === c)]));
  const cells = permissions.map((p) =>
    categories.map((c) => {
      const inCat = byCategory.get(c)!;
      const k = inCat.filter((r) => r.permissions?.includes(p)).length;
      const b = baseline.rate(c === POOLED_COLUMN ? undefined : c, p);
      const flaggedHere = inCat.filter((r) => (r.findings ?? []).some((f) => f.subject === p && isFlagged(f))).length;
      return {
        sweep: inCat.length ? k / inCat.length : 0,
        sweepK: k,
        sweepN: inCat.length,
        sweepLower: inCat.length ? wilsonInterval(k, inCat.length).lower : 0,
        flagged: flaggedHere,
        baseline: b.n ? b.k / b.n : 0,
        baselineN: b.n,
      };
    }),
  );
  return { permissions, categories, cells, flaggedCounts: permissions.map((p) => flagged.get(p) ?? 0) };
}
