/** The heatmap's shape, in a module of its own with no imports, so that the report page's browser code can share it. */

export interface HeatmapCell {
  /** Share of the swept apps of the category that request the permission, how many that is, and of how many. */
  sweep: number;
  sweepK: number;
  sweepN: number;
  /** The lower end of the 95% Wilson interval of the swept share: what the shading weighs, so one app is no proof. */
  sweepLower: number;
  /** Apps of the category flagged for the permission (its rate check, folded reasons included). */
  flagged: number;
  /** The baseline's raw share for the category (k / n), and its n. */
  baseline: number;
  baselineN: number;
}

export interface Heatmap {
  permissions: string[];
  categories: string[];
  /** cells[i][j]: permission i, category j. */
  cells: HeatmapCell[][];
  /** How many apps were flagged for each permission. */
  flaggedCounts: number[];
}
