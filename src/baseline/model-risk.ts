/** Scoring with a trained risk model: kept apart from training so that scoring loads no fitting code. */
import type { RiskModel } from "./model.js";

/** The model's risk for a feature vector in FEATURE_NAMES order (`names` gives that order). */
export function modelRisk(model: Pick<RiskModel, "features" | "intercept" | "coefficients">, names: readonly string[], features: number[]): number {
  let z = model.intercept;
  model.features.forEach((f, j) => (z += model.coefficients[j] * features[names.indexOf(f)]));
  return 1 / (1 + Math.exp(-z));
}
