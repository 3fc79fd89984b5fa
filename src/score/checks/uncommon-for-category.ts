/** uncommon-for-category: a requested permission few apps of the category request. */
import { isSensitive } from "../../platform/sensitivity.js";
import { rateFindings } from "./rate-findings.js";
import type { Check } from "../types.js";

export const uncommonForCategory: Check = {
  meta: {
    id: "uncommon-for-category",
    title: "Permission uncommon for the category",
    description: "The app requests a permission that few apps of its category request: even the upper end of the rate's confidence interval is below the baseline's threshold.",
    docs: "docs/checks/uncommon-for-category.md",
    defaultLevel: "note",
    tags: ["rate", "trim"],
  },
  run: (ctx) => rateFindings(ctx, (p) => !isSensitive(p)),
};
