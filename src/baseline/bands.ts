/**
 * Risk bands from a model's calibration. Apart from the training code (model.ts) so that judging an app
 * loads no training library.
 */
import type { Evaluation } from "./model.js";

export type Band = "low" | "elevated" | "high";

/**
 * Band cut points from the model's out-of-fold calibration (bins by predicted risk): `elevated` starts at
 * the first bin in which flagged apps are more common than in the whole corpus (observed share above the
 * base rate), `high` at the first whose flagged share reaches halfway from the base rate to 1. Read: low —
 * apps like these were flagged no more often than apps in general; elevated — more often; high — most of
 * them were.
 */
export function bandCutPoints(model: { evaluation: Pick<Evaluation, "baseRate" | "calibration"> }): { elevated?: number; high?: number } {
  const base = model.evaluation.baseRate;
  const bins = [...model.evaluation.calibration].sort((a, b) => a.meanPredicted - b.meanPredicted);
  const highMark = (1 + base) / 2;
  const elevated = bins.find((b) => b.observed > base)?.from;
  const high = bins.find((b) => b.observed >= highMark)?.from;
  return { ...(elevated !== undefined ? { elevated } : {}), ...(high !== undefined ? { high } : {}) };
}

export function bandOf(p: number, cuts: { elevated?: number; high?: number }): Band {
  if (cuts.high !== undefined && p >= cuts.high) return "high";
  if (cuts.elevated !== undefined && p >= cuts.elevated) return "elevated";
  return "low";
}

