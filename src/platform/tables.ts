/** Reading the generated platform tables (rows of fields under a header) by column name. */

/** The rows as objects keyed by the header's column names. */
export function rowsOf(header: readonly string[], rows: readonly (readonly string[])[]): Record<string, string>[] {
  return rows.map((r) => Object.fromEntries(header.map((h, i) => [h, r[i] ?? ""])));
}
