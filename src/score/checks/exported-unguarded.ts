/** exported-unguarded: components other apps can reach without holding any permission. */
import { isLauncher } from "../../extract/manifest/model.js";
import { onlyShowsHealthRationale } from "../needed.js";
import type { Check } from "../types.js";

export const exportedUnguarded: Check = {
  meta: {
    id: "exported-unguarded",
    title: "Exported component without a permission",
    description: "Other apps can start, bind or query this component without holding any permission: attack surface worth a look.",
    docs: "docs/checks/exported-unguarded.md",
    defaultLevel: "note",
    tags: [],
  },
  run(ctx) {
    return ctx.manifest.components
      .filter((c) => c.effectiveExported && c.enabled !== false && !isLauncher(c) && !onlyShowsHealthRationale(c)) // the launcher, and Health Connect's rationale screen, are meant for everyone
      .filter((c) => !c.permission && !(c.kind === "provider" && (c.readPermission || c.writePermission)))
      .map((c) => ({ subject: c.name, location: c.source, data: { kind: c.kind, reason: c.exportedReason } }));
  },
};
