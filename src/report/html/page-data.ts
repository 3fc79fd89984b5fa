/** The data the sweep report's page script reads (embedded as JSON in the page). Types only. */
import type { Heatmap } from "../../score/heatmap-types.js";

export interface PageFinding {
  checkId: string;
  level: "error" | "warning" | "note";
  subject: string;
  message?: string;
}

export interface PageRow {
  id: string;
  package: string | null;
  category: string | null;
  fallback: string | null;
  requestedCategory: string | null;
  risk: number | null;
  band: string | null;
  atypicality: number | null;
  status: "scored" | "failed";
  counts: { error: number; warning: number; note: number } | null;
  findings: PageFinding[];
  whatIf: { permission: string; without: number }[];
  /** Code evidence (requested permissions by what the code shows); null when the code was not read. */
  code: { used: string[]; unreached?: string[]; notSeen: string[]; notMappable: string[]; libraryOnly: string[]; problems: string[] } | null;
  error: string | null;
}

export interface PageSummary {
  /** histogram[i][band]: apps with risk in [i/20, (i+1)/20), over every row. */
  histogram: Record<string, number>[];
  byCategory: Record<string, number>;
  byCheck: Record<string, number>;
  /** Whether `rows` holds every row; when not, where the full results are. */
  complete: boolean;
  results: string;
}

export interface PageData {
  tool: string;
  baseline: string;
  caution: string;
  cutPoints: { elevated?: number; high?: number };
  baseRate: number | null;
  checks: { id: string; title: string }[];
  rows: PageRow[];
  heatmap: Heatmap;
  summary: PageSummary;
  totals: { inputs: number; scored: number; failed: number; byBand: Record<string, number> };
}
