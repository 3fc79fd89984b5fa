/** `overask baseline`: what a baseline knows (categories, era, provenance, rates). */
import { UsageError } from "../errors.js";
import { loadJudge } from "../ops/baseline.js";
import { normalizePermissionName } from "../platform/permissions.js";
import { baselineToJson, baselineToText } from "../report/baseline-view.js";
import { pickStyle } from "../report/style.js";
import { categoryList, nearestCategory, resolveCategory } from "../score/category.js";
import { EXIT } from "./exit-codes.js";
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
      throw new UsageError(`--category "${o.category}" is not a category of the baseline${near ? `; did you mean "${near}"?` : ""} Its categories: ${categoryList(b)}`);
    }
    const wanted = b.aliases.get(o.category) ?? o.category;
    category = r.category ?? [...b.counts.categories.keys()].find((c) => c.toLowerCase() === wanted.toLowerCase());
  }
  const view = { name: baselineName, file: judge.file, baseline: b, ...(category ? { category } : {}), ...(o.permission ? { permission: normalizePermissionName(o.permission) } : {}) };
  io.stdout.write(o.format === "json" ? baselineToJson(view) : baselineToText(view, pickStyle(io.stdout, io.env)));
  return EXIT.OK;
}
