/**
 * Text summary of a learned baseline, for a person: what was read, the categories, and how the risk
 * model compares with the simple reference scores.
 */
import type { BaselineFile } from "../baseline/baseline-file.js";
import { TERM_DESCRIPTIONS, TERM_NAMES } from "../baseline/features.js";
import { PLAIN, fit, wrap, type Style } from "./style.js";
import { pct, short } from "./format.js";


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
    out.push("", ...wrap(`  era: API ${e.api}${e.years ? ` (apps of ${e.years})` : ""}${e.permission ? `, the newest level among permissions with real support (${short(e.permission)}, ${e.apps} apps)` : ""}; newer permissions are judged by what they replaced, or not at all`, 80, 4));
  }
  out.push("", `  rates shrink toward the pooled rate (${p.prior.method === "fixed" ? `${p.prior.strength} pooled pseudo-apps` : `empirical-Bayes strength, capped at ${p.prior.strength}`}); uncommon: the ${pct(p.confidence, "fixed")} Wilson interval lies below ${pct(p.uncommonBelow, "fixed")}`);
  const m = file.model;
  if (!m) out.push("", s.bold("Risk model"), "  none: " + (file.provenance.notes[0] ?? "no labeled corpus"));
  else {
    out.push("", s.bold(`Risk model (labeled corpus: ${m.corpus})`));
    if (m.sample) out.push(`  trained on a seeded stratified sample of ${m.sample.taken} of ${m.sample.of} labeled rows (seed ${m.sample.seed})`);
    const crossFitted = file.provenance.inputs.some((i) => i.role === "frequencies+labels");
    out.push(...wrap(`  logistic regression with every weight ≥ 0 (removing a permission never raises the risk), L2 penalty ${m.lambda} chosen by ${m.lambdaChoice.length}-way inner cross-validation; one weight per permission of the labeled corpus (${m.vocabulary.length}), and three terms against the app's category in the baseline${m.featureBasis === "pooled" ? " (training rows have no category: pooled)" : ""}${crossFitted ? ", cross-fitted (each app left out of the counts behind its own terms)" : ""}`, 80, 4));
    const top = m.vocabulary.map((p, j) => [p, m.permissionWeights[j]] as const).filter(([, w]) => w > 0).sort((x, y) => y[1] - x[1]);
    out.push(`  ${top.length} of ${m.vocabulary.length} permission weights are above 0; the largest:`);
    for (const [p, w] of top.slice(0, 8)) out.push(`    ${w.toFixed(3).padStart(7)}  ${short(p)}`);
    TERM_NAMES.forEach((t, k) => out.push(`    ${m.termWeights[k].toFixed(3).padStart(7)}  × ${TERM_DESCRIPTIONS[t]}`));
    out.push(`  fit ${m.training.converged ? "converged" : s.warn("did not fully converge")} (KKT residual ${m.training.kktResidual.toExponential(1)}, ${m.training.iterations} iterations)`);
    const e = m.evaluation;
    const row = (name: string, r?: { auc: number; brier: number }) => (r ? `    ${fit(name, 38)} ${r.auc.toFixed(3).padStart(8)} ${Number.isFinite(r.brier) ? r.brier.toFixed(4).padStart(8) : "".padStart(8)}` : undefined);
    out.push("", `  ${e.folds}-fold cross-validation (seed ${e.seed}, penalty chosen inside each fold), ${m.training.rows} rows, ${pct(e.baseRate, "fixed")} flagged:`);
    out.push(s.dim(`    ${fit("score", 38)} ${"ROC AUC".padStart(8)} ${"Brier".padStart(8)}`));
    for (const line of [
      row("this model", e),
      row("the same without the bound (reference)", e.references.unconstrained),
      row("number of dangerous permissions", e.references.dangerousCount),
      row("number of permissions", e.references.permissionCount),
      row("summed surprisal", e.references.surprisal),
      `    ${fit("always the base rate", 38)} ${"0.500".padStart(8)} ${e.brierOfBaseRate.toFixed(4).padStart(8)}`,
    ]) if (line) out.push(line);
    const bands = (b?: Record<string, number>) => (b ? `; bands: ${["low", "elevated", "high"].map((k) => `${pct(b[k] ?? 0, "fixed")} ${k}`).join(", ")}` : "");
  out.push(`  ${e.distinctValues} distinct risk values over ${e.rows} rows${bands(e.bands)}`);
    for (const v of m.validation) {
      out.push("", `  validation on ${v.name} (never seen in training): ${v.rows} rows, ${pct(v.baseRate, "fixed")} flagged, ${pct(v.vocabularyOverlap, "fixed")} of the vocabulary recorded`);
      out.push(s.dim(`    ${fit("score", 38)} ${"ROC AUC".padStart(8)} ${"Brier".padStart(8)}`));
      for (const line of [row("this model", v), row("number of dangerous permissions", v.references.dangerousCount), row("number of permissions", v.references.permissionCount), row("summed surprisal (pooled)", v.references.surprisal)]) if (line) out.push(line);
      out.push(`    ${v.distinctValues} distinct risk values${bands(v.bands)}`);
    }
    out.push("", "  calibration by decile of predicted risk, ties kept together (predicted → observed, n):");
    for (const b of e.calibration) out.push(`    ${pct(b.meanPredicted, "fixed").padStart(6)} → ${pct(b.observed, "fixed").padStart(6)}  (${b.n})`);
  }
  if (file.provenance.notes.length) {
    out.push("", s.bold("Notes"));
    for (const n of file.provenance.notes) out.push(`  - ${n}`);
  }
  out.push("", ...wrap(file.caution, 80, 0).map((l) => s.dim(l)));
  return `${out.flatMap((l) => (l.length > 80 && !l.includes("\u001b") ? wrap(l, 80, 6) : [l])).join("\n")}\n`;
}
