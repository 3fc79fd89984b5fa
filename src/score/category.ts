/**
 * Which category an app is judged against, in this order: `--category`; an index mapping package names to
 * categories (`--categories map.csv`); the manifest's `android:appCategory` mapped to a baseline category;
 * otherwise the pooled baseline, and the output says so.
 */
import type { Baseline, Fallback } from "../baseline/rates.js";
import { CorpusError } from "../errors.js";
import type { Manifest } from "../extract/manifest/model.js";
import { indexRows } from "../util/csv.js";
import { editDistance } from "../util/edit-distance.js";

export interface CategoryChoice {
  /** The baseline category used; absent when the pooled baseline is used. */
  category?: string;
  /** The category asked for before any fallback (what the user or manifest said). */
  requested?: string;
  source: "option" | "index" | "appCategory" | "none";
  /** Why the pooled baseline is used, when it is. */
  fallback?: Fallback;
}

/**
 * android:appCategory values and the baseline category names each may match (compared without case).
 * The enum values are the platform's (ApplicationInfo.CATEGORY_*); the matches are overask's choice,
 * written for store category names such as Google Play's.
 */
export const APP_CATEGORY_MATCHES: Record<string, string[]> = {
  game: ["game", "games"],
  audio: ["audio", "music", "music_and_audio", "music & audio"],
  video: ["video", "video_players", "video players & editors", "entertainment"],
  image: ["image", "photography"],
  social: ["social"],
  news: ["news", "news_and_magazines", "news & magazines"],
  maps: ["maps", "maps_and_navigation", "maps & navigation", "travel_and_local", "travel & local"],
  productivity: ["productivity", "tools"],
  accessibility: ["accessibility", "tools"],
};

/** Parses the text of a `package,category` CSV (header optional); `path` names it in errors. */
export function parseCategoryIndex(text: string, path: string): Map<string, string> {
  const map = new Map<string, string>();
  for (const { line, fields: f } of indexRows(text, "package")) {
    if (!f || f.length < 2 || !f[0]) throw new CorpusError(`line ${line}: expected package,category`, { file: path });
    map.set(f[0], f[1]);
  }
  return map;
}

export function chooseCategory(m: Manifest, baseline: Baseline, options: { category?: string; index?: Map<string, string> }): CategoryChoice {
  let requested: string | undefined;
  let source: CategoryChoice["source"] = "none";
  if (options.category) {
    requested = options.category;
    source = "option";
  } else if (options.index?.has(m.package)) {
    requested = options.index.get(m.package);
    source = "index";
  } else if (m.appCategory) {
    const wanted = APP_CATEGORY_MATCHES[m.appCategory] ?? [m.appCategory];
    const names = [...baseline.counts.categories.keys()];
    requested = wanted.map((w) => names.find((n) => n.toLowerCase() === w)).find((n) => n !== undefined) ?? m.appCategory;
    source = "appCategory";
  }
  const resolved = resolveCategory(baseline, requested);
  const choice: CategoryChoice = { source };
  if (requested !== undefined) choice.requested = requested;
  if (resolved.category !== undefined) choice.category = resolved.category;
  if (resolved.fallback) choice.fallback = resolved.fallback;
  return choice;
}

/**
 * The one way a category name someone gave (an option, an index row, a record's field) becomes a baseline
 * category: the baseline's aliases first, then its category names without regard to case (`tools` finds
 * `TOOLS`), then the baseline's own fallback (too few apps, or unknown: the pooled baseline).
 */
export function resolveCategory(baseline: Baseline, requested: string | undefined): { category?: string; fallback?: Fallback } {
  if (requested === undefined) return baseline.resolveCategory(undefined);
  const aliased = baseline.aliases.get(requested) ?? aliasIgnoringCase(baseline, requested);
  return baseline.resolveCategory(aliased ?? matchCase(requested, baseline));
}

function aliasIgnoringCase(baseline: Baseline, name: string): string | undefined {
  const lower = name.toLowerCase();
  for (const [from, to] of baseline.aliases) if (from.toLowerCase() === lower) return to;
  return undefined;
}

/** Baseline categories are matched without regard to case (`tools` finds `TOOLS`). */
function matchCase(name: string, baseline: Baseline): string {
  if (baseline.counts.categories.has(name)) return name;
  const lower = name.toLowerCase();
  return [...baseline.counts.categories.keys()].find((c) => c.toLowerCase() === lower) ?? name;
}

/**
 * For a category name the baseline does not know: the nearest of its categories (case ignored, edit
 * distance), to suggest in an error.
 */
export function nearestCategory(baseline: Baseline, name: string): string | undefined {
  let best: { name: string; d: number } | undefined;
  for (const c of [...baseline.counts.categories.keys(), ...baseline.aliases.keys()]) {
    const d = editDistance(name.toLowerCase(), c.toLowerCase());
    if (!best || d < best.d) best = { name: baseline.aliases.get(c) ?? c, d };
  }
  return best && best.d <= Math.max(2, Math.floor(name.length / 3)) ? best.name : undefined;
}

/** The baseline's categories with their app counts, for messages and `overask baseline`. */
export function categoryList(baseline: Baseline): string {
  return baseline.categorySummary().map((c) => `${c.name} (${c.apps} apps${c.pooled ? ", below the minimum support" : ""})`).join(", ");
}
