/**
 * Ordering text by UTF-16 code units: the same on every machine and locale, and free of the collator that
 * `localeCompare` builds on its first call (milliseconds at start-up, for names that are ASCII anyway).
 * @example ["b", "B", "a"].sort(compareText) // → ["B", "a", "b"]
 */
export function compareText(a: string, b: string): number {
  return a < b ? -1 : a > b ? 1 : 0;
}
