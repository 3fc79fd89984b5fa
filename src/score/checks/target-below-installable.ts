/**
 * target-below-installable: a targetSdk below what recent Android releases install. Android 14 refuses to
 * install an app targeting below 23, Android 15 below 24 (src/platform/sdk-facts.ts, with sources): users
 * of those releases cannot install it, and its dangerous permissions are granted at install as on Android 5,
 * without the runtime prompt.
 */
import { refusedFrom } from "../../platform/sdk-facts.js";
import type { Check } from "../types.js";

export const targetBelowInstallable: Check = {
  meta: {
    id: "target-below-installable",
    title: "Target SDK too low to install on recent Android",
    description: "The app's targetSdkVersion is below the lowest target recent Android releases install (23 from Android 14, 24 from Android 15).",
    docs: "docs/checks/target-below-installable.md",
    defaultLevel: "error",
    tags: [],
  },
  run(ctx) {
    const m = ctx.manifest;
    // A manifest without targetSdkVersion targets its minSdkVersion, or 1 (the platform's default).
    const target = m.targetSdk ?? m.minSdk ?? 1;
    const r = refusedFrom(target);
    if (!r) return [];
    return [{ subject: "uses-sdk", location: m.usesSdkSource ?? { path: "/manifest" }, data: { targetSdk: target, android: r.android, api: r.api, minTarget: r.minTarget, source: r.source } }];
  },
};
