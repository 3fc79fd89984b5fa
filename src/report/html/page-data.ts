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
  risk: number | null;
  band: string | null;
  status: "scored" | "failed";
  counts: { error: number; warning: number; note: number } | null;
  findings: PageFinding[];
  whatIf: { permission: string; without: number }[];
  error: string | null;
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
  totals: { inputs: number; scored: number; failed: number; byBand: Record<string, number> };
}
