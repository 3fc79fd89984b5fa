/**
 * exported-missing: at targetSdk 31 and above, a component with an intent filter must say whether it is
 * exported; without android:exported the platform refuses to install the app (Android 12 behaviour change,
 * from memory of developer.android.com/about/versions/12/behavior-changes-12#exported).
 */
import type { Check } from "../types.js";

export const exportedMissing: Check = {
  meta: {
    id: "exported-missing",
    title: "Component with an intent filter but no android:exported",
    description: "At targetSdk 31 and above every component with an intent filter must set android:exported; without it the platform refuses to install the app.",
    docs: "docs/checks/exported-missing.md",
    defaultLevel: "error",
    tags: [],
  },
  run(ctx) {
    return ctx.manifest.components
      .filter((c) => c.exportedReason === "missing-at-target-31")
      .map((c) => ({ subject: c.name, location: c.source, data: { kind: c.kind, targetSdk: ctx.manifest.targetSdk } }));
  },
};
