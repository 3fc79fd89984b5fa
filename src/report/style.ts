/**
 * Terminal styling: colour only when writing to a terminal and never when NO_COLOR is set
 * (the no-color.org convention, common practice).
 */
export interface Style {
  bold(s: string): string;
  dim(s: string): string;
  warn(s: string): string;
  alert(s: string): string;
}

const plainStyle: Style = { bold: (s) => s, dim: (s) => s, warn: (s) => s, alert: (s) => s };
const sgr = (code: string) => (s: string) => `\u001b[${code}m${s}\u001b[0m`;
const colourStyle: Style = { bold: sgr("1"), dim: sgr("2"), warn: sgr("33"), alert: sgr("31") };

export function pickStyle(stream: { isTTY?: boolean }, env: Readonly<Record<string, string | undefined>>): Style {
  const noColor = env.NO_COLOR !== undefined && env.NO_COLOR !== "";
  return stream.isTTY && !noColor ? colourStyle : plainStyle;
}

export const PLAIN: Style = plainStyle;

/** Pads `s` to `width` columns, or cuts it with an ellipsis when longer. */
export function fit(s: string, width: number): string {
  if (s.length <= width) return s.padEnd(width);
  return `${s.slice(0, Math.max(0, width - 1))}…`;
}

/**
 * Word-wraps `text` to `width` columns, continuation lines indented by `indent` spaces. A word longer than
 * a whole line (a long path, a package name) is split after a separator — a `/` first, then `.`, `-`, `_`
 * — and only where none is in reach, mid-word; its label is never left alone on a line.
 */
export function wrap(text: string, width: number, indent: number): string[] {
  const lead = /^ */.exec(text)![0];
  const lines: string[] = [];
  const room = Math.max(10, width - indent);
  let line = lead;
  for (let word of text.slice(lead.length).split(" ")) {
    if (word.length > room) {
      // Fill the current line, then go on with the rest.
      while (word.length > 0) {
        const space = width - line.length - (line.trim() ? 1 : 0);
        if (word.length <= space) break;
        if (space < 8) {
          lines.push(line);
          line = " ".repeat(indent);
          continue;
        }
        const cut = cutPoint(word, space, !line.trim());
        if (cut === undefined) {
          // No separator late enough on this line: a fresh line has more room.
          lines.push(line);
          line = " ".repeat(indent);
          continue;
        }
        lines.push(line.trim() ? `${line} ${word.slice(0, cut)}` : line + word.slice(0, cut));
        line = " ".repeat(indent);
        word = word.slice(cut);
      }
      if (!word) continue;
    }
    if (line.trim() && line.length + 1 + word.length > width) {
      lines.push(line);
      line = " ".repeat(indent) + word;
    } else line = line.trim() ? `${line} ${word}` : line + word;
  }
  if (line.trim()) lines.push(line);
  return lines;
}

/**
 * Where to split a long word so that its first part fits in `space` columns: after the last `/` in the
 * second half of the room, else after the last `.`, `-` or `_` there. On a line that is already fresh
 * (`space` is all there is), after any separator at all, else at `space` itself. Undefined: move to a
 * fresh line first.
 */
function cutPoint(word: string, space: number, fresh = false): number | undefined {
  const within = word.slice(0, space);
  const last = (chars: string) => Math.max(...[...chars].map((c) => within.lastIndexOf(c)));
  const slash = last("/");
  if (slash + 1 >= space / 2) return slash + 1;
  const other = last(".-_");
  if (other + 1 >= space / 2) return other + 1;
  if (!fresh) return undefined;
  const any = Math.max(slash, other);
  return any >= 0 ? any + 1 : space;
}
