/**
 * debuggable: `android:debuggable="true"` on the application. Any process on a device with USB debugging
 * can attach a debugger to the app, read its memory and run code in it (from memory: the platform's
 * application element docs; release builds of the Android build system leave it off).
 */
import type { Check } from "../types.js";

export const debuggable: Check = {
  meta: {
    id: "debuggable",
    title: "Debuggable build",
    description: "The application is marked android:debuggable=\"true\": a debugger can attach to it and run code in it with its permissions; release builds leave it off.",
    docs: "docs/checks/debuggable.md",
    defaultLevel: "warning",
    tags: [],
  },
  run(ctx) {
    if (ctx.manifest.application.debuggable !== true) return [];
    return [{ subject: "application", location: ctx.manifest.application.source ?? { path: "/manifest/application" }, data: { package: ctx.manifest.package } }];
  },
};
