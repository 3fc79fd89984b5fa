/**
 * What checks are and what they produce. A check is one module exporting `{ meta, run }`; `run` returns
 * findings carrying data for the message, never a formatted string, so every formatter words it alike.
 */
import type { Baseline, PermissionRate } from "../baseline/rates.js";
import type { Manifest, SourceLocation } from "../extract/manifest/model.js";
import type { CategoryChoice } from "./category.js";
import type { CodeEvidence } from "./code-evidence.js";
import type { FrequencyJudgement } from "../baseline/judged.js";
import type { NeedReason } from "./needed.js";

/** SARIF's levels, most severe first. */
export const LEVELS = ["error", "warning", "note"] as const;
export type Level = (typeof LEVELS)[number];

export function levelRank(level: Level): number {
  return LEVELS.length - LEVELS.indexOf(level);
}

export interface CheckMeta {
  id: string;
  title: string;
  /** One sentence for SARIF's fullDescription and the docs' first line. */
  description: string;
  /** Path of the check's documentation page, from the project root. */
  docs: string;
  defaultLevel: Level;
  /** What other parts of overask do with its findings (see CHECK_TAGS). */
  tags: readonly CheckTag[];
}

/**
 * Roles a check's findings play beyond being reported:
 * - `rate`: judged against the category's rates (delta's "newly uncommon", the sweep heatmap);
 * - `trim`: the permission concerned is a candidate for removal or limiting (`trim`);
 * - `special-access`: a component claims special access (delta's appeared/disappeared list).
 */
export const CHECK_TAGS = ["rate", "trim", "special-access"] as const;
export type CheckTag = (typeof CHECK_TAGS)[number];

export interface CheckContext {
  manifest: Manifest;
  baseline: Baseline;
  category: CategoryChoice;
  /** Memoized rate lookups for this app's category. */
  rate(permission: string): PermissionRate;
  /** How a requested permission is judged by frequency (own permissions, era rule: score/frequency.ts). */
  frequency(permission: string): FrequencyJudgement;
  /** Code evidence, when the app's dex code was read (absent for bare manifests and with --no-code). */
  code?: CodeEvidence;
  /** The requested permissions the manifest shows the app needs, with why (score/needed.ts). */
  needed: ReadonlyMap<string, NeedReason[]>;
  /** A test APK: the package it instruments (score/judge.ts); such an APK is not judged as a store app. */
  instruments?: string;
}

/** Data a finding carries; each check documents its own keys. */
export type FindingData = Record<string, string | number | boolean | string[] | undefined>;

export interface Finding {
  checkId: string;
  level: Level;
  /** The permission or component the finding concerns. */
  subject: string;
  location: SourceLocation;
  data: FindingData;
  /** Other checks' findings on the same permission, folded into this one (one finding a permission). */
  also?: { checkId: string; level: Level; data: FindingData }[];
}

export interface Check {
  meta: CheckMeta;
  run(ctx: CheckContext): Omit<Finding, "level" | "checkId">[];
}
