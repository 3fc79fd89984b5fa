/**
 * not-seen-in-code: a requested permission that the app's dex code never reaches through anything the
 * API→permission map ties to it (platform/api-map.ts), and no receiver of the manifest needs it. Felt et
 * al. ("Android Permissions Demystified", CCS 2011) found about a third of the apps they studied asked
 * for permissions their code never used. Not proof: reflection, native code, dynamically loaded code and
 * APIs outside the maps are not seen, so the level is note. A permission whose only evidence lies in code
 * no entry point reaches (status "unreached": dead code, an unused library) is reported the same way, and
 * its data says so.
 */
import { isOwnPermission } from "../../baseline/judged.js";
import { evidenceLabel } from "../code-evidence.js";
import type { Check } from "../types.js";

export const notSeenInCode: Check = {
  meta: {
    id: "not-seen-in-code",
    title: "Requested, not seen in reached code",
    description: "The app's code references nothing the API-to-permission maps tie to this requested permission, or only in code its entry points never reach.",
    docs: "docs/checks/not-seen-in-code.md",
    defaultLevel: "note",
    tags: ["trim"],
  },
  run(ctx) {
    const code = ctx.code;
    if (!code || code.read.length === 0) return [];
    const out: ReturnType<Check["run"]> = [];
    for (const e of code.permissions) {
      if ((e.status !== "not-seen" && e.status !== "unreached") || isOwnPermission(ctx.manifest, e.permission)) continue;
      const el = ctx.manifest.usesPermissions.find((p) => p.name === e.permission);
      if (el) out.push({ subject: e.permission, location: el.source, data: { dexFiles: code.read.length, partial: code.problems.length > 0, ...(e.status === "unreached" ? { unreached: e.evidence.map(evidenceLabel), classes: e.evidence.reduce((n, x) => n + x.classes, 0) } : {}) } });
    }
    return out;
  },
};
