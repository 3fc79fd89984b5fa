/**
 * When each permission appeared, and what it split off from, replaced or made explicit: the data behind
 * judging apps of any era against a baseline of another (src/platform/data/permission-added-in.tsv and
 * permission-lineage.tsv, each row with its source).
 */
import { ADDED_IN_HEADER, ADDED_IN_ROWS } from "./generated/permission-added-in.js";
import { LINEAGE_HEADER, LINEAGE_ROWS } from "./generated/permission-lineage.js";
import { platformPermissions } from "./permissions.js";
import { rowsOf } from "./tables.js";

export interface AddedIn {
  /** The API level that added the permission. */
  api: number;
  /** `reference`: the API reference's "Added in API level"; `upper-bound`/`lower-bound`: a bound from the platform's manifests. */
  basis: "reference" | "upper-bound" | "lower-bound";
  source: string;
}

/**
 * - `split`, `renamed`, `replacement`: it took over from its predecessors, so their rates speak for it;
 * - `alongside`: it is needed together with its predecessors, not instead (a foreground-service type's own
 *   permission beside FOREGROUND_SERVICE; partial photo access beside READ_MEDIA_IMAGES): their rates say
 *   nothing about it;
 * - `made-explicit`: it made explicit what every app could do before.
 */
export type LineageKind = "split" | "renamed" | "replacement" | "alongside" | "made-explicit";

export interface Lineage {
  permission: string;
  /** What it split off from, was renamed from or replaced (empty for made-explicit). */
  predecessors: string[];
  /** The API level at which it took over. */
  api: number;
  kind: LineageKind;
  source: string;
  note: string;
}

let added: Map<string, AddedIn> | undefined;
let lineage: Map<string, Lineage> | undefined;

/**
 * When the platform added `permission`: the added-in table's row, else, for a permission the API-34
 * framework table lacks, the level the later tables first show it at (an upper bound); undefined otherwise.
 */
export function addedIn(permission: string): AddedIn | undefined {
  if (!added) {
    added = new Map(rowsOf(ADDED_IN_HEADER, ADDED_IN_ROWS).map((r) => [r.name, { api: Number(r.added_in), basis: r.basis as AddedIn["basis"], source: r.source }]));
    for (const p of platformPermissions().values()) {
      if (p.tableAddedIn === undefined || added.has(p.name)) continue;
      const source =
        p.definedBy === "health-connect"
          ? "health-connect-permissions.tsv: the Health Connect module's releases (a platform module from Android 14, developer.android.com/health-and-fitness/health-connect/get-started)"
          : `changes-api34-35-36.tsv: added ${p.tableAddedIn - 1}->${p.tableAddedIn} in the framework manifest`;
      added.set(p.name, { api: p.tableAddedIn, basis: "upper-bound", source });
    }
  }
  return added.get(permission);
}

/** Every row of the added-in table. */
export function addedInTable(): ReadonlyMap<string, AddedIn> {
  addedIn("");
  return added!;
}

/** What `permission` split off from, replaced or made explicit, if the lineage table says. */
export function lineageOf(permission: string): Lineage | undefined {
  lineage ??= new Map(
    rowsOf(LINEAGE_HEADER, LINEAGE_ROWS).map((r) => [
      r.permission,
      { permission: r.permission, predecessors: r.predecessors ? r.predecessors.split("|") : [], api: Number(r.api), kind: r.kind as LineageKind, source: r.source, note: r.note },
    ]),
  );
  return lineage.get(permission);
}

/** Every row of the lineage table. */
export function lineageTable(): ReadonlyMap<string, Lineage> {
  lineageOf("");
  return lineage!;
}

/** How a baseline of era `era` (an API level) can judge a requested permission. */
export type EraJudgement =
  /** The baseline's corpus could have seen it: judge it by its own rate. */
  | { kind: "own" }
  /** Newer than the era, but it took over from older permissions: judge it by the most requested of them. */
  | { kind: "predecessor"; predecessors: string[]; addedIn: number; lineage: Lineage }
  /** It made explicit what every app could do before: how often apps request it says nothing yet. */
  | { kind: "made-explicit"; addedIn: number; lineage: Lineage }
  /** It is needed alongside older permissions, not instead of them: their rates say nothing about it. */
  | { kind: "alongside"; addedIn: number; lineage: Lineage }
  /** Newer than the era, with nothing before it: no frequency evidence. */
  | { kind: "no-evidence"; addedIn: number };

/**
 * The era rule: a permission added after the baseline's era is never judged uncommon for lack of data.
 * Predecessors are followed back (READ_MEDIA_VISUAL_USER_SELECTED → READ_MEDIA_IMAGES →
 * READ_EXTERNAL_STORAGE) until they are within the era.
 */
export function judgeByEra(permission: string, era: number | undefined): EraJudgement {
  const a = addedIn(permission);
  if (era === undefined || !a || a.api <= era) return { kind: "own" };
  const l = lineageOf(permission);
  if (l?.kind === "made-explicit") return { kind: "made-explicit", addedIn: a.api, lineage: l };
  if (l?.kind === "alongside") return { kind: "alongside", addedIn: a.api, lineage: l };
  if (l && l.predecessors.length) {
    const within = new Set<string>();
    const seen = new Set<string>([permission]);
    let frontier = l.predecessors;
    for (let hop = 0; frontier.length && hop < 8; hop++) {
      const next: string[] = [];
      for (const p of frontier) {
        if (seen.has(p)) continue;
        seen.add(p);
        const pa = addedIn(p);
        if (!pa || pa.api <= era) within.add(p);
        else next.push(...(lineageOf(p)?.predecessors ?? []));
      }
      frontier = next;
    }
    if (within.size) return { kind: "predecessor", predecessors: [...within], addedIn: a.api, lineage: l };
  }
  return { kind: "no-evidence", addedIn: a.api };
}
