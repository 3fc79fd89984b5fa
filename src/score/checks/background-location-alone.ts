/**
 * background-location-alone: ACCESS_BACKGROUND_LOCATION extends a foreground location permission to the
 * background; requested without ACCESS_FINE_LOCATION or ACCESS_COARSE_LOCATION it grants nothing (the
 * platform table lists it as their background permission: `backgroundPermission` of both).
 */
import { requestedPermissionNames } from "../../extract/manifest/model.js";
import type { Check } from "../types.js";

const BACKGROUND = "android.permission.ACCESS_BACKGROUND_LOCATION";
const FOREGROUND = ["android.permission.ACCESS_FINE_LOCATION", "android.permission.ACCESS_COARSE_LOCATION"];

export const backgroundLocationAlone: Check = {
  meta: {
    id: "background-location-alone",
    title: "Background location without foreground location",
    description: "ACCESS_BACKGROUND_LOCATION is requested without ACCESS_FINE_LOCATION or ACCESS_COARSE_LOCATION; on its own it grants nothing.",
    docs: "docs/checks/background-location-alone.md",
    defaultLevel: "warning",
    tags: ["trim"],
  },
  run(ctx) {
    const have = new Set(requestedPermissionNames(ctx.manifest));
    if (!have.has(BACKGROUND) || FOREGROUND.some((p) => have.has(p))) return [];
    const el = ctx.manifest.usesPermissions.find((p) => p.name === BACKGROUND)!;
    return [{ subject: BACKGROUND, location: el.source, data: {} }];
  },
};
