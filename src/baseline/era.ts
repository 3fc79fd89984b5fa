/**
 * A baseline's era: the newest platform level its corpus can speak for. Permissions added after it were
 * not there to be requested when the corpus was collected, so their absence from it says nothing.
 */
import { compareText } from "../util/compare.js";
import { addedIn, judgeByEra, type EraJudgement } from "../platform/eras.js";
import type { CountTable } from "./counts.js";
import type { Baseline } from "./rates.js";

export interface BaselineEra {
  /** The newest "added in" API level among the permissions the corpus requests with real support. */
  api: number;
  /** The permission that sets it, and how many apps request it. */
  permission?: string;
  apps?: number;
  /** When the corpus's apps were collected, as the user said (`learn --corpus-years`). */
  years?: string;
}

/** Real support: at least this many apps … */
export const ERA_MIN_APPS = 5;
/** … and at least this share of the corpus. */
export const ERA_MIN_SHARE = 0.001;

/**
 * The corpus era: the newest API level (by the reference's "Added in API level", bounds ignored) among the
 * permissions requested by at least ERA_MIN_APPS apps and ERA_MIN_SHARE of the corpus. A handful of apps
 * requesting a permission from a later release (pre-release builds, typos) does not move it.
 * @example corpusEra(counts) // → { api: 29, permission: "android.permission.ACCESS_BACKGROUND_LOCATION", apps: 91 } for the bundled corpus
 */
export function corpusEra(counts: CountTable, years?: string): BaselineEra {
  const need = Math.max(ERA_MIN_APPS, Math.ceil(ERA_MIN_SHARE * counts.pooled.apps));
  let best: BaselineEra = { api: 1 };
  for (const [permission, apps] of counts.pooled.permissions) {
    const a = addedIn(permission);
    if (!a || a.basis !== "reference" || apps < need) continue;
    if (a.api > best.api || (a.api === best.api && apps > (best.apps ?? 0))) best = { api: a.api, permission, apps };
  }
  return years ? { ...best, years } : best;
}

/** Whose rate judges a requested permission under the era rule, or why none does. */
export type FrequencyBasis =
  | { kind: "own"; basis: string }
  | { kind: "predecessor"; basis: string; judgement: Extract<EraJudgement, { kind: "predecessor" }> }
  | { kind: "made-explicit" | "alongside" | "no-evidence"; judgement: Exclude<EraJudgement, { kind: "own" | "predecessor" }> };

/**
 * The era rule for one permission against a baseline: its own rate when the corpus could have seen it;
 * else the rate of the most requested predecessor it took over from; else no rate at all.
 */
export function frequencyBasis(baseline: Pick<Baseline, "era" | "rate">, category: string | undefined, permission: string): FrequencyBasis {
  const j = judgeByEra(permission, baseline.era);
  if (j.kind === "own") return { kind: "own", basis: permission };
  if (j.kind === "predecessor") {
    const basis = j.predecessors.map((p) => ({ p, rate: baseline.rate(category, p).rate })).sort((a, b) => b.rate - a.rate || compareText(a.p, b.p))[0].p;
    return { kind: "predecessor", basis, judgement: j };
  }
  return { kind: j.kind, judgement: j };
}
