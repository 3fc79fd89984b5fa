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

/**
 * One line of an index CSV (`package,category`, `file,category[,label]`): the one reader every index
 * goes through. Blank lines and `#` comments are skipped, and so is a header on line 1 whose first field is
 * `header` (any case). Fields come back trimmed; an unterminated quote is a bad line.
 */
export type IndexLine = { kind: "skip" } | { kind: "bad" } | { kind: "row"; fields: string[] };

export function indexLine(text: string, line: number, header: string): IndexLine {
  const t = text.trim();
  if (t === "" || t.startsWith("#")) return { kind: "skip" };
  const f = splitCsvLine(t);
  if (!f) return { kind: "bad" };
  const fields = f.map((x) => x.trim());
  if (line === 1 && fields[0].toLowerCase() === header) return { kind: "skip" };
  return { kind: "row", fields };
}

/** Every row of an index CSV's text, with its 1-based line number (see indexLine). */
export function* indexRows(text: string, header: string): Generator<{ line: number; fields?: string[] }> {
  const lines = text.split(/\r?\n/);
  for (let i = 0; i < lines.length; i++) {
    const r = indexLine(lines[i], i + 1, header);
    if (r.kind === "row") yield { line: i + 1, fields: r.fields };
    else if (r.kind === "bad") yield { line: i + 1 };
  }
}
