/** sensitive-uncommon: like uncommon-for-category, for dangerous, app-op and restricted permissions. */
import { isSensitive } from "../../platform/sensitivity.js";
import { rateFindings } from "./rate-findings.js";
import type { Check } from "../types.js";

export const sensitiveUncommon: Check = {
  meta: {
    id: "sensitive-uncommon",
    title: "Sensitive permission uncommon for the category",
    description: "The app requests a dangerous, app-op or restricted permission that few apps of its category request.",
    docs: "docs/checks/sensitive-uncommon.md",
    defaultLevel: "warning",
    tags: ["rate", "trim"],
  },
  run: (ctx) => rateFindings(ctx, isSensitive),
};
