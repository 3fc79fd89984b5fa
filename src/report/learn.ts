/**
 * Text summary of a learned baseline, for a person: what was read, the categories, and how the risk
 * model compares with the simple reference scores.
 */
import type { BaselineFile } from "../baseline/baseline-file.js";
import { FEATURE_DESCRIPTIONS, type FeatureName } from "../baseline/features.js";
import { PLAIN, fit, wrap, type Style } from "./style.js";

const pct = (x: number) => `${(100 * x).toFixed(1)}%`;

export function baselineSummary(file: BaselineFile, outPath: string, s: Style = PLAIN): string {
  const out: string[] = [];
  out.push(s.bold(`Baseline written to ${outPath}`));
  out.push("", s.bold("Inputs"));
  for (const i of file.provenance.inputs) {
    out.push(`  ${i.path}`);
    out.push(`    ${i.role}, ${i.format}${i.licence ? `, licence ${i.licence}` : ""}: ${i.accepted} of ${i.rows} rows read, ${i.rejected} rejected` + (i.duplicateIds ? `, ${i.duplicateIds} duplicate ids` : "") + (i.labeled ? `, ${i.positives} of ${i.labeled} labeled rows flagged` : ""));
  }
  const cats = Object.entries(file.counts.categories);
  out.push("", s.bold(`Categories (${cats.length}; ${file.counts.pooled.apps} apps pooled)`));
  for (const [name, g] of cats) {
    const pooled = g.apps < file.parameters.minSupport;
    out.push(`  ${fit(name, 28)} ${String(g.apps).padStart(7)} apps${pooled ? s.warn(`  below ${file.parameters.minSupport}: uses the pooled baseline`) : ""}`);
  }
  const p = file.parameters;
  if (file.era) {
    const e = file.era;
    out.push("", ...wrap(`  era: API ${e.api}${e.years ? ` (apps of ${e.years})` : ""}${e.permission ? `, the newest level among permissions with real support (${e.permission.replace(/^android\.permission\./, "")}, ${e.apps} apps)` : ""}; newer permissions are judged by what they replaced, or not at all`, 80, 4));
  }
  out.push("", `  rates shrink toward the pooled rate (${p.prior.method === "fixed" ? `${p.prior.strength} pooled pseudo-apps` : `empirical-Bayes strength, capped at ${p.prior.strength}`}); uncommon: the ${pct(p.confidence)} Wilson interval lies below ${pct(p.uncommonBelow)}`);
  const m = file.model;
  if (!m) out.push("", s.bold("Risk model"), "  none: " + (file.provenance.notes[0] ?? "no labeled corpus"));
  else {
    out.push("", s.bold(`Risk model (labeled corpus: ${m.corpus})`));
    if (m.sample) out.push(`  trained on a seeded stratified sample of ${m.sample.taken} of ${m.sample.of} labeled rows (seed ${m.sample.seed})`);
    const crossFitted = file.provenance.inputs.some((i) => i.role === "frequencies+labels");
    out.push(`  features ${m.featureBasis === "pooled" ? "against the pooled baseline (the labeled corpus has no categories)" : "against each app's category"}${crossFitted ? ", cross-fitted (each app left out of the counts behind its own features)" : ""}`);
    m.features.forEach((f, j) => out.push(`  + ${m.coefficients[j].toFixed(4).padStart(8)} × ${FEATURE_DESCRIPTIONS[f as FeatureName] ?? f}`));
    for (const d of m.dropped) out.push(s.dim(`    dropped ${d.feature} (coefficient ${d.coefficient.toFixed(4)} < 0 would break monotonicity)`));
    out.push(`  fit ${m.training.converged ? "converged" : s.warn("did not converge")} (largest gradient ${m.training.gradientMax.toExponential(1)}, ${m.training.steps} steps)`);
    const e = m.evaluation;
    out.push("", `  ${e.folds}-fold cross-validation (seed ${e.seed}), ${m.training.rows} rows, ${pct(e.baseRate)} flagged:`);
    out.push(s.dim(`    ${fit("score", 38)} ${"ROC AUC".padStart(8)} ${"Brier".padStart(8)}`));
    out.push(`    ${fit("this model", 38)} ${e.auc.toFixed(3).padStart(8)} ${e.brier.toFixed(4).padStart(8)}`);
    out.push(`    ${fit("number of dangerous permissions", 38)} ${e.references.dangerousCount.auc.toFixed(3).padStart(8)} ${e.references.dangerousCount.brier.toFixed(4).padStart(8)}`);
    out.push(`    ${fit("summed surprisal", 38)} ${e.references.surprisal.auc.toFixed(3).padStart(8)} ${e.references.surprisal.brier.toFixed(4).padStart(8)}`);
    out.push(`    ${fit("always the base rate", 38)} ${"0.500".padStart(8)} ${e.brierOfBaseRate.toFixed(4).padStart(8)}`);
    out.push("", "  calibration by decile of predicted risk, ties kept together (predicted → observed, n):");
    for (const b of e.calibration) out.push(`    ${pct(b.meanPredicted).padStart(6)} → ${pct(b.observed).padStart(6)}  (${b.n})`);
  }
  if (file.provenance.notes.length) {
    out.push("", s.bold("Notes"));
    for (const n of file.provenance.notes) out.push(`  - ${n}`);
  }
  out.push("", ...wrap(file.caution, 80, 0).map((l) => s.dim(l)));
  return `${out.flatMap((l) => (l.length > 80 && !l.includes("\u001b") ? wrap(l, 80, 6) : [l])).join("\n")}\n`;
}
