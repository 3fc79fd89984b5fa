/** The options the judging commands share, turned into what the score layer takes. */
import { UsageError } from "../errors.js";
import { readCategoryIndex } from "../ops/check.js";
import type { JudgeOptions } from "../score/judge.js";
import { checkById, CHECKS } from "../score/registry.js";
import type { Level } from "../score/types.js";

export interface JudgingCliOptions {
  category?: string;
  categories?: string;
  baseline?: string;
  level?: Map<string, Level | "off">;
}

export function judgeOptions(o: JudgingCliOptions): JudgeOptions {
  const options: JudgeOptions = {};
  if (o.category) options.category = o.category;
  if (o.categories) options.categoryIndex = readCategoryIndex(o.categories);
  for (const id of o.level?.keys() ?? []) {
    if (!checkById(id)) throw new UsageError(`--level names an unknown check "${id}"; the checks are ${CHECKS.map((c) => c.meta.id).join(", ")}`);
  }
  options.levels = o.level ?? new Map();
  return options;
}
