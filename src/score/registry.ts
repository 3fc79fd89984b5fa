/** Every check, sorted by id. A test keeps this list, the docs pages and the tests in step. */
import { backgroundLocationAlone } from "./checks/background-location-alone.js";
import { debuggable } from "./checks/debuggable.js";
import { exportedMissing } from "./checks/exported-missing.js";
import { exportedUnguarded } from "./checks/exported-unguarded.js";
import { noEffectAtTarget } from "./checks/no-effect-at-target.js";
import { notSeenInCode } from "./checks/not-seen-in-code.js";
import { permissionRedelegation } from "./checks/permission-redelegation.js";
import { sensitiveUncommon } from "./checks/sensitive-uncommon.js";
import { serviceTypePermission } from "./checks/service-type-permission.js";
import { specialAccessComponent } from "./checks/special-access-component.js";
import { specialAccessPermission } from "./checks/special-access-permission.js";
import { targetBelowInstallable } from "./checks/target-below-installable.js";
import { uncommonForCategory } from "./checks/uncommon-for-category.js";
import { ungrantablePermission } from "./checks/ungrantable-permission.js";
import { unknownPermission } from "./checks/unknown-permission.js";
import { weakCustomPermission } from "./checks/weak-custom-permission.js";
import { weakGuard } from "./checks/weak-guard.js";
import type { Check, CheckTag } from "./types.js";

export const CHECKS: readonly Check[] = [
  backgroundLocationAlone,
  debuggable,
  exportedMissing,
  exportedUnguarded,
  noEffectAtTarget,
  notSeenInCode,
  permissionRedelegation,
  sensitiveUncommon,
  serviceTypePermission,
  specialAccessComponent,
  specialAccessPermission,
  targetBelowInstallable,
  uncommonForCategory,
  ungrantablePermission,
  unknownPermission,
  weakCustomPermission,
  weakGuard,
];

export function checkById(id: string): Check | undefined {
  return CHECKS.find((c) => c.meta.id === id);
}

/** The ids of the checks carrying `tag`. */
export function checkIdsTagged(tag: CheckTag): ReadonlySet<string> {
  return new Set(CHECKS.filter((c) => c.meta.tags.includes(tag)).map((c) => c.meta.id));
}
