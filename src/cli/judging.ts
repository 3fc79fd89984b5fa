/** The options the judging commands share, turned into what the score layer takes. */
import type { Baseline } from "../baseline/rates.js";
import { UsageError } from "../errors.js";
import { shown } from "./options.js";
import { readCategoryIndex, type FileJudgeOptions } from "../ops/check.js";
import { readPolicyFile } from "../ops/policy.js";
import { policyCategoryErrors } from "../score/policy/policy.js";
import { categoryList, nearestCategory, resolveCategory } from "../score/category.js";
import { checkById, CHECKS } from "../score/registry.js";
import type { Level } from "../score/types.js";

export interface JudgingCliOptions {
  category?: string;
  categories?: string;
  baseline?: string;
  level?: Map<string, Level | "off">;
  prevalence?: number;
  policy?: string[];
  /** false with --no-code (commander's negated option). */
  code?: boolean;
}

/**
 * The judging options. A `--category` the baseline does not know is a usage error naming the nearest
 * category and listing them all (a category given per app, by an index or --categories, is reported per
 * app instead: the others are still judged).
 */
export function judgeOptions(o: JudgingCliOptions, baseline?: Baseline): FileJudgeOptions {
  const options: FileJudgeOptions = { readCode: o.code !== false };
  if (o.category) {
    if (baseline && resolveCategory(baseline, o.category).fallback === "unknown-category") {
      const near = nearestCategory(baseline, o.category);
      throw new UsageError(`--category ${shown(o.category)} is not a category of the baseline${near ? `; did you mean "${near}"?` : ""}; its categories: ${categoryList(baseline)}`);
    }
    options.category = o.category;
  }
  if (o.categories) options.categoryIndex = readCategoryIndex(o.categories);
  for (const id of o.level?.keys() ?? []) {
    if (!checkById(id)) throw new UsageError(`--level names an unknown check ${shown(id)}; the checks are ${CHECKS.map((c) => c.meta.id).join(", ")}`);
  }
  options.levels = o.level ?? new Map();
  if (o.prevalence !== undefined) options.prevalence = o.prevalence;
  if (o.policy?.length) {
    const policies = o.policy.map(readPolicyFile);
    const errors = baseline ? policies.flatMap((p) => policyCategoryErrors(p, baseline)) : [];
    if (errors.length) throw new UsageError(errors.join("\n"));
    options.policies = policies;
  }
  return options;
}
