/**
 * The one place numbers and names are worded for people: percents and short permission names. Every
 * formatter (text, HTML, the sweep page's script) takes them from here, so one figure reads alike
 * everywhere it appears.
 */

/**
 * How many decimals a percent gets:
 * - `rate`: a share of a corpus's apps, where small values matter (below 1%: two decimals, else one):
 *   0.0042 → "0.42%", 0.048 → "4.8%", 0.31 → "31.0%";
 * - `risk`: a probability as a headline (below 10%: one decimal, else none): 0.075 → "7.5%", 0.31 → "31%";
 * - `fixed`: a table of figures read in a column, always one decimal: 0.3 → "30.0%".
 */
export type PercentStyle = "rate" | "risk" | "fixed";

export function pct(x: number, style: PercentStyle = "risk"): string {
  const digits = style === "fixed" ? 1 : style === "rate" ? (x < 0.01 ? 2 : 1) : x < 0.1 ? 1 : 0;
  return `${(100 * x).toFixed(digits)}%`;
}

export const PLATFORM_PREFIX = "android.permission.";

/** A permission name without the platform's `android.permission.` prefix (reports say so in their headings). */
export function short(name: string): string {
  return name.startsWith(PLATFORM_PREFIX) ? name.slice(PLATFORM_PREFIX.length) : name;
}
