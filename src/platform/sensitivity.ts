/**
 * Which platform permissions are sensitive, and which a store app can hold at all. These rules are used by
 * the checks, the risk model's features, record scoring and trim: they live here once.
 */
import { platformPermission } from "./permissions.js";
import type { BaseLevel } from "./protection.js";

/** Dangerous, app-op, or hard/soft-restricted on the platform (API 34 table). */
export function isSensitive(permission: string): boolean {
  const p = platformPermission(permission);
  if (!p) return false;
  return p.base === "dangerous" || p.flags.includes("appop") || p.hardRestricted || p.softRestricted;
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
