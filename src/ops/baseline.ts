/** Baselines on disk: the bundled default, reading one with a one-line error, and a judge made from it. */
import { join } from "node:path";
import { parseBaselineFile, serializeBaseline, type BaselineFile } from "../baseline/baseline-file.js";
import { BaselineError } from "../errors.js";
import { Judge } from "../score/judge.js";
import { readTextFile, writeFileAtomic } from "./files.js";
import { packageRoot } from "./package-root.js";

/** The bundled default baseline's path. */
export function defaultBaselinePath(): string {
  return join(packageRoot(), "baselines/default.json");
}

/** How outputs name the bundled default baseline. */
export const DEFAULT_BASELINE_NAME = "the bundled default baseline (baselines/default.json)";

/** Reads and checks a baseline file. */
export function readBaselineFile(path: string): BaselineFile {
  return parseBaselineFile(readTextFile(path, BaselineError), path);
}

/** Writes a baseline file atomically. */
export function writeBaselineFile(path: string, file: BaselineFile): void {
  writeFileAtomic(path, serializeBaseline(file));
}

export interface LoadedJudge {
  judge: Judge;
  /** The file read. */
  baselinePath: string;
  /** How outputs name it (the bundled one by its role, others by path). */
  baselineName: string;
}

/** A judge from the given baseline, or from the bundled default. */
export function loadJudge(baseline?: string): LoadedJudge {
  const baselinePath = baseline ?? defaultBaselinePath();
  return { judge: new Judge(readBaselineFile(baselinePath)), baselinePath, baselineName: baseline ? baselinePath : DEFAULT_BASELINE_NAME };
}
