/** `overask baseline`: what a baseline knows (categories, era, provenance, rates). */
import { UsageError } from "../errors.js";
import { loadJudge } from "../ops/baseline.js";
import { nearestPlatformPermission, normalizePermissionName, platformPermission } from "../platform/permissions.js";
import { baselineToJson, baselineToText } from "../report/baseline-view.js";
import { pickStyle } from "../report/style.js";
import { categoryList, nearestCategory, resolveCategory } from "../score/category.js";
import { EXIT } from "./exit-codes.js";
import { shown } from "./options.js";
import type { Io } from "./io.js";

export interface BaselineCliOptions {
  category?: string;
  permission?: string;
  format: "text" | "json";
}

export function baselineCommand(file: string | undefined, o: BaselineCliOptions, io: Io): number {
  const { judge, baselineName } = loadJudge(file);
  const b = judge.baseline;
  let category: string | undefined;
  if (o.category) {
    const r = resolveCategory(b, o.category);
    if (r.fallback === "unknown-category") {
      const near = nearestCategory(b, o.category);
      throw new UsageError(`--category ${shown(o.category)} is not a category of the baseline${near ? `; did you mean "${near}"?` : ""}; its categories: ${categoryList(b)}`);
    }
    const wanted = b.aliases.get(o.category) ?? o.category;
    category = r.category ?? [...b.counts.categories.keys()].find((c) => c.toLowerCase() === wanted.toLowerCase());
  }
  const permission = o.permission ? normalizePermissionName(o.permission) : undefined;
  if (permission && !platformPermission(permission) && !b.counts.pooled.permissions.has(permission)) {
    // Neither the platform nor any app of the baseline knows it: zeros would read as "rare", not as "misspelt".
    const near = nearestPlatformPermission(permission.includes(".") ? permission : `android.permission.${permission}`);
    const hint = near.distance <= 3 ? `; did you mean ${near.name.replace(/^android\.permission\./, "")}?` : "";
    throw new UsageError(`--permission ${shown(o.permission!)} is not a permission the platform defines or any app of the baseline requests${hint}`);
  }
  const view = { name: baselineName, file: judge.file, baseline: b, ...(category ? { category } : {}), ...(permission ? { permission } : {}) };
  io.stdout.write(o.format === "json" ? baselineToJson(view) : baselineToText(view, pickStyle(io.stdout, io.env)));
  return EXIT.OK;
}
