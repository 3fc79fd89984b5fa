/** The few lines `sweep` prints when it is done. */
import { wrap } from "./style.js";
import { pct } from "./format.js";

export interface SweepTotals {
  inputs: number;
  skipped: number;
  /** .xml files in the folder passed over because their root element is not <manifest>. */
  notManifests?: number;
  /** Apps whose category (from an index or --categories) the baseline does not have. */
  unknownCategory?: number;
  /** Apps that tripped --fail-on or --max-risk. */
  gated?: number;
  /** The labeled corpus's base rate the risks are relative to. */
  baseRate?: number;
  scored: number;
  failed: number;
  /** Some of the inputs that could not be read (at most ten). */
  failedIds?: string[];
  byBand: Record<string, number>;
  top: { id: string; package?: string; risk: number; band?: string }[];
  shard?: { index: number; count: number };
  output: string;
  html?: string;
  caution?: string;
}

export function sweepSummaryText(s: SweepTotals): string {
  const out: string[] = [];
  out.push(`Swept ${s.inputs} input${s.inputs === 1 ? "" : "s"}${s.shard ? ` (shard ${s.shard.index}/${s.shard.count})` : ""}: ${s.scored} scored, ${s.failed} could not be read${s.skipped ? `, ${s.skipped} kept from the earlier run` : ""}.`);
  if (s.failed && s.failedIds?.length) {
    const more = s.failed - s.failedIds.length;
    out.push(`Could not be read: ${s.failedIds.join(", ")}${more > 0 ? ` and ${more} more` : ""} (each a row with status "failed" and its error in ${s.output}).`);
  }
  if (s.notManifests) out.push(`Passed over ${s.notManifests} .xml file${s.notManifests === 1 ? "" : "s"} that are not manifests (resource files).`);
  if (s.unknownCategory) out.push(`${s.unknownCategory} app${s.unknownCategory === 1 ? "" : "s"} named a category the baseline does not have: judged against all categories pooled (see the fallback column).`);
  const bands = ["high", "elevated", "low"].filter((b) => s.byBand[b]).map((b) => `${s.byBand[b]} ${b}`);
  if (bands.length) out.push(`Risk bands: ${bands.join(", ")}${s.baseRate !== undefined ? ` (risks relative to a base rate of ${pct(s.baseRate)} flagged in the labeled corpus)` : ""}.`);
  if (s.top.length) {
    out.push("Highest risks:");
    for (const t of s.top.slice(0, 10)) out.push(`  ${pct(t.risk).padStart(5)}  ${t.package ?? ""}  ${t.id}`);
  }
  if (s.gated) out.push(`${s.gated} app${s.gated === 1 ? "" : "s"} at or above the --fail-on level or over --max-risk.`);
  out.push(`Results: ${s.output}${s.html ? `\nReport:  ${s.html}` : ""}`);
  if (s.caution) out.push(...wrap(s.caution, 80, 0));
  return `${out.join("\n")}\n`;
}
