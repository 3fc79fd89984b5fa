/**
 * What a sweep report shows, computed over every row in one streaming pass with bounded memory: the risk
 * histogram by band, counts per category and per check, the permissions flagged most (and, in a second
 * pass, their share per category), and which rows to embed. Below EMBED_ALL_UP_TO rows every row is
 * embedded; above it, the riskiest rows, the rows with the most warnings and errors, and every row that
 * could not be read — the page says where the full results are.
 */
import type { Baseline } from "../baseline/rates.js";
import { wilsonInterval } from "../baseline/stats/wilson.js";
import type { Heatmap } from "./heatmap-types.js";
import { POOLED_COLUMN } from "./heatmap.js";
import { checkIdsTagged } from "./registry.js";
import type { AppRow } from "./row.js";

/** Reports of sweeps up to this many rows embed every row. */
export const EMBED_ALL_UP_TO = 5_000;
/** Above it: this many of the riskiest rows, and as many with the most warnings and errors. */
export const EMBED_TOP = 1_000;
/** Risk histogram bins over [0, 1]. */
export const HISTOGRAM_BINS = 20;

export interface SweepDigest {
  rows: number;
  scored: number;
  failed: number;
  byBand: Record<string, number>;
  /** histogram[i][band]: rows with risk in [i/20, (i+1)/20). */
  histogram: Record<string, number>[];
  byCategory: Record<string, number>;
  /** Rows with at least one finding of each check. */
  byCheck: Record<string, number>;
  /** The rows the page embeds, sorted by id. */
  embedded: AppRow[];
  /** Whether every row is embedded. */
  complete: boolean;
  heatmap: Heatmap;
}

/** A bounded list keeping the `size` largest items by `key` (ties: smaller id first). */
class TopN {
  readonly items: { key: number; row: AppRow }[] = [];
  constructor(private readonly size: number) {}
  offer(key: number, row: AppRow): void {
    if (this.items.length >= this.size) {
      const last = this.items[this.items.length - 1];
      if (key < last.key || (key === last.key && row.id > last.row.id)) return;
    }
    let i = this.items.length;
    while (i > 0 && (this.items[i - 1].key < key || (this.items[i - 1].key === key && this.items[i - 1].row.id > row.id))) i--;
    this.items.splice(i, 0, { key, row });
    if (this.items.length > this.size) this.items.pop();
  }
}

/** Keeps what the page needs of a row (the permissions list only feeds the heatmap). */
function slim(r: AppRow): AppRow {
  const { permissions: _p, size: _s, mtimeMs: _m, ...rest } = r;
  return { ...rest, size: r.size, mtimeMs: r.mtimeMs };
}

export class SweepDigester {
  private readonly d: Omit<SweepDigest, "embedded" | "complete" | "heatmap"> = {
    rows: 0,
    scored: 0,
    failed: 0,
    byBand: {},
    histogram: Array.from({ length: HISTOGRAM_BINS }, () => ({})),
    byCategory: {},
    byCheck: {},
  };
  private readonly all: AppRow[] = [];
  private overflow = false;
  private readonly byRisk = new TopN(EMBED_TOP);
  private readonly byFindings = new TopN(EMBED_TOP);
  private readonly failedRows: AppRow[] = [];
  private readonly flagged = new Map<string, number>();
  /** permission → category → apps flagged for it there. */
  private readonly flaggedByCategory = new Map<string, Map<string, number>>();
  private readonly rateChecks = checkIdsTagged("rate");

  /** First pass: every row once. */
  add(r: AppRow): void {
    const d = this.d;
    d.rows++;
    if (r.status === "failed") {
      d.failed++;
      this.failedRows.push({ id: r.id, size: r.size, mtimeMs: r.mtimeMs, status: "failed", ...(r.error ? { error: r.error } : {}) });
    } else d.scored++;
    if (r.band) d.byBand[r.band] = (d.byBand[r.band] ?? 0) + 1;
    if (r.risk !== undefined) {
      const bin = d.histogram[Math.min(HISTOGRAM_BINS - 1, Math.floor(r.risk * HISTOGRAM_BINS))];
      const band = r.band ?? "low";
      bin[band] = (bin[band] ?? 0) + 1;
    }
    if (r.status === "scored") {
      const c = r.category ?? POOLED_COLUMN;
      d.byCategory[c] = (d.byCategory[c] ?? 0) + 1;
    }
    for (const id of new Set((r.findings ?? []).map((f) => f.checkId))) d.byCheck[id] = (d.byCheck[id] ?? 0) + 1;
    for (const f of r.findings ?? []) {
      // A rate finding may be folded under a more severe one on the same permission (`also`): it counts too.
      if (!this.rateChecks.has(f.checkId) && !(f.also ?? []).some((a) => this.rateChecks.has(a.checkId))) continue;
      this.flagged.set(f.subject, (this.flagged.get(f.subject) ?? 0) + 1);
      const cat = r.category ?? POOLED_COLUMN;
      const byCat = this.flaggedByCategory.get(f.subject) ?? new Map<string, number>();
      byCat.set(cat, (byCat.get(cat) ?? 0) + 1);
      this.flaggedByCategory.set(f.subject, byCat);
    }
    if (r.status !== "scored") return;
    const row = slim(r);
    if (!this.overflow) {
      this.all.push(row);
      if (this.all.length > EMBED_ALL_UP_TO) {
        this.overflow = true;
        for (const x of this.all) this.offer(x);
        this.all.length = 0;
      }
    } else this.offer(row);
  }

  private offer(r: AppRow): void {
    if (r.risk !== undefined) this.byRisk.offer(r.risk, r);
    const c = r.counts;
    if (c) this.byFindings.offer(c.error * 1000 + c.warning, r);
  }

  /** The permissions the heatmap shows (known after the first pass). */
  heatmapPermissions(top = 15): string[] {
    return [...this.flagged.entries()].sort((a, b) => b[1] - a[1] || a[0].localeCompare(b[0])).slice(0, top).map(([p]) => p);
  }

  /**
   * The digest. `shares` comes from a second pass over the rows (`countRequests`), or is computed from the
   * embedded rows when they are all of them.
   */
  finish(baseline: Baseline, shares?: RequestShares): SweepDigest {
    const complete = !this.overflow;
    const embedded = complete
      ? [...this.all, ...this.failedRows]
      : [...new Map([...this.byRisk.items, ...this.byFindings.items].map((x) => [x.row.id, x.row])).values(), ...this.failedRows];
    embedded.sort((a, b) => (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));
    const permissions = this.heatmapPermissions();
    const categories = Object.keys(this.d.byCategory).sort((a, b) => (a === POOLED_COLUMN ? 1 : b === POOLED_COLUMN ? -1 : a.localeCompare(b)));
    const cells = permissions.map((p) =>
      categories.map((c) => {
        const n = this.d.byCategory[c] ?? 0;
        const k = shares?.get(p)?.get(c) ?? 0;
        const b = baseline.rate(c === POOLED_COLUMN ? undefined : c, p);
        return { sweep: n ? k / n : 0, sweepK: k, sweepN: n, sweepLower: n ? wilsonInterval(k, n).lower : 0, flagged: this.flaggedByCategory.get(p)?.get(c) ?? 0, baseline: b.n ? b.k / b.n : 0, baselineN: b.n };
      }),
    );
    return { ...this.d, embedded, complete, heatmap: { permissions, categories, cells, flaggedCounts: permissions.map((p) => this.flagged.get(p) ?? 0) } };
  }
}

/** permission → category → apps requesting it. */
export type RequestShares = Map<string, Map<string, number>>;

/** Second pass: how many scored rows of each category request each of `permissions`. */
export function countRequests(permissions: readonly string[]): { add(r: AppRow): void; shares: RequestShares } {
  const wanted = new Set(permissions);
  const shares: RequestShares = new Map(permissions.map((p) => [p, new Map()]));
  return {
    shares,
    add(r) {
      if (r.status !== "scored") return;
      const c = r.category ?? POOLED_COLUMN;
      for (const p of r.permissions ?? []) {
        if (!wanted.has(p)) continue;
        const m = shares.get(p)!;
        m.set(c, (m.get(c) ?? 0) + 1);
      }
    },
  };
}
