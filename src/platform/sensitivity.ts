/**
 * Which platform permissions are sensitive, what each gives access to, and which a store app can hold at
 * all. The sensitive set is data (src/platform/data/sensitivity.tsv: a reason per entry, documented in
 * docs/checks/sensitive-uncommon.md); these rules are used by the checks, the risk model's features,
 * record scoring and trim, and live here once.
 */
import { SENSITIVITY_HEADER, SENSITIVITY_ROWS } from "./generated/sensitivity.js";
import { platformPermission } from "./permissions.js";
import type { BaseLevel } from "./protection.js";
import { rowsOf } from "./tables.js";
import { OTHER_GRANT_PATHS } from "./sdk-facts.js";

export interface Sensitivity {
  sensitive: boolean;
  /** One plain sentence of what the permission gives the app. */
  gives: string;
  /** Why it is, or is not, counted as sensitive. */
  reason: string;
}

let table: Map<string, Sensitivity> | undefined;

/** The sensitivity row of a platform permission (every dangerous, app-op or restricted one has one). */
export function sensitivityOf(permission: string): Sensitivity | undefined {
  table ??= new Map(rowsOf(SENSITIVITY_HEADER, SENSITIVITY_ROWS).map((r) => [r.permission, { sensitive: r.sensitive === "yes", gives: r.gives, reason: r.reason }]));
  return table.get(permission);
}

/** Sensitive: marked so in the sensitivity table (dangerous, app-op and restricted permissions, less the harmless ones). */
export function isSensitive(permission: string): boolean {
  return sensitivityOf(permission)?.sensitive ?? false;
}

/** Dangerous on the platform (a runtime permission the user is asked for). */
export function isDangerous(permission: string): boolean {
  return platformPermission(permission)?.base === "dangerous";
}

/**
 * Whether an app installed from a store can be granted a permission of this protection level: normal ones
 * at install, dangerous ones by the user at run time, and app-op ones as special access in settings.
 * Signature, privileged and internal ones go to the platform and preinstalled apps only.
 */
export function storeAppCanHold(level: { base?: BaseLevel; flags?: readonly string[] }): boolean {
  return level.base === "normal" || level.base === "dangerous" || (level.flags?.includes("appop") ?? false);
}

/**
 * Special access: a permission the user grants by hand — in settings (an app-op permission whose base
 * level is not normal: all-files access, drawing over other apps, usage access …; a normal app-op one such
 * as FOREGROUND_SERVICE_SPECIAL_USE is granted at install) or in developer options (sdk-facts.ts,
 * OTHER_GRANT_PATHS: the mock location app).
 */
export function isSpecialAccess(facts: { base?: string; flags?: readonly string[] }, name: string): boolean {
  if (OTHER_GRANT_PATHS.has(name)) return true;
  return (facts.flags?.includes("appop") ?? false) && facts.base !== "normal" && facts.base !== "dangerous";
}
