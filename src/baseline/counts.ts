/**
 * Counting: per category and pooled, the number of apps and, per permission, how many of them request
 * it. Counts (not rates) are what a baseline stores, so that baselines learned on separate corpora add up
 * exactly (`overask fold`).
 */
import type { CorpusRecord } from "./corpus/types.js";

export interface GroupCounts {
  apps: number;
  permissions: Map<string, number>;
}

export function emptyGroup(): GroupCounts {
  return { apps: 0, permissions: new Map() };
}

export class CountTable {
  readonly pooled: GroupCounts = emptyGroup();
  readonly categories = new Map<string, GroupCounts>();

  /** Adds one app: to its category (when it has one) and to the pooled counts. */
  add(record: Pick<CorpusRecord, "category" | "permissions">): void {
    addTo(this.pooled, record.permissions);
    if (record.category !== undefined) {
      let g = this.categories.get(record.category);
      if (!g) this.categories.set(record.category, (g = emptyGroup()));
      addTo(g, record.permissions);
    }
  }

  /** Adds another table's counts to this one. */
  merge(other: CountTable): void {
    mergeInto(this.pooled, other.pooled);
    for (const [name, g] of other.categories) {
      let mine = this.categories.get(name);
      if (!mine) this.categories.set(name, (mine = emptyGroup()));
      mergeInto(mine, g);
    }
  }

  toJSON(): SerializedCounts {
    const categories: Record<string, SerializedGroup> = {};
    for (const name of [...this.categories.keys()].sort()) categories[name] = groupToJson(this.categories.get(name)!);
    return { pooled: groupToJson(this.pooled), categories };
  }

  static fromJSON(json: SerializedCounts): CountTable {
    const t = new CountTable();
    Object.assign(t.pooled, groupFromJson(json.pooled));
    for (const [name, g] of Object.entries(json.categories)) t.categories.set(name, groupFromJson(g));
    return t;
  }
}

export interface SerializedGroup {
  apps: number;
  permissions: Record<string, number>;
}
export interface SerializedCounts {
  pooled: SerializedGroup;
  categories: Record<string, SerializedGroup>;
}

function addTo(g: GroupCounts, permissions: readonly string[]): void {
  g.apps++;
  for (const p of permissions) g.permissions.set(p, (g.permissions.get(p) ?? 0) + 1);
}

function mergeInto(into: GroupCounts, from: GroupCounts): void {
  into.apps += from.apps;
  for (const [p, k] of from.permissions) into.permissions.set(p, (into.permissions.get(p) ?? 0) + k);
}

function groupToJson(g: GroupCounts): SerializedGroup {
  const permissions: Record<string, number> = {};
  for (const p of [...g.permissions.keys()].sort()) permissions[p] = g.permissions.get(p)!;
  return { apps: g.apps, permissions };
}

/**
 * A group read back from a baseline file. Its map is built when first asked for: judging an app touches
 * one category (and the pooled counts), so the other categories' maps are never built.
 */
function groupFromJson(g: SerializedGroup): GroupCounts {
  let permissions: Map<string, number> | undefined;
  return {
    apps: g.apps,
    get permissions() {
      return (permissions ??= new Map(Object.entries(g.permissions)));
    },
    set permissions(m: Map<string, number>) {
      permissions = m;
    },
  };
}
