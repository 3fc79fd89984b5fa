/**
 * Splits one CSV line into fields (RFC 4180 quoting: fields in double quotes may hold commas, and a
 * doubled quote stands for one). Records spanning lines are not supported: corpora here are one
 * record a line. Returns undefined for an unterminated quote.
 */
export function splitCsvLine(line: string): string[] | undefined {
  if (!line.includes('"')) return line.split(",");
  const out: string[] = [];
  let field = "";
  let quoted = false;
  for (let i = 0; i < line.length; i++) {
    const c = line[i];
    if (quoted) {
      if (c === '"') {
        if (line[i + 1] === '"') { field += '"'; i++; } else quoted = false;
      } else field += c;
    } else if (c === '"') quoted = true;
    else if (c === ",") { out.push(field); field = ""; }
    else field += c;
  }
  if (quoted) return undefined;
  out.push(field);
  return out;
}

/** One CSV field, quoted (RFC 4180) when it holds a comma, quote or line break; empty when undefined. */
export function csvCell(v: string | number | undefined): string {
  if (v === undefined) return "";
  const s = String(v);
  return /[",\n\r]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}
