/**
 * overask's layout of a finding in text, the same in `check`, `trim`, `delta` and the sweep summary:
 * the subject first, with its level and check in parentheses after it, then the message indented below.
 *
 *   READ_SMS  (warning: sensitive-uncommon)
 *     18 of 2318 TOOLS apps request it (95% interval 0.49%–1.2%, below 5.0%).
 *     It reads the user's text messages.
 *     also (no-effect-at-target): …
 */
import type { Finding, Level } from "../score/types.js";
import { wrap, type Style } from "./style.js";
import { short } from "./format.js";


/** The verdict after the subject: `(warning: sensitive-uncommon)`, coloured by level on a terminal. */
export function verdict(level: Level, checkId: string, s: Style): string {
  const word = level === "error" ? s.alert(level) : level === "warning" ? s.warn(level) : level;
  return `(${word}: ${checkId})`;
}

/**
 * The lines of one finding: subject and verdict, then `message`, then each folded reason (`also`), wrapped
 * to `width` with the body indented by `indent + 2`.
 */
export function findingLines(f: Pick<Finding, "subject" | "level" | "checkId">, message: string, also: { checkId: string; message: string }[], s: Style, indent = 2, width = 80): string[] {
  const pad = " ".repeat(indent);
  const body = indent + 2;
  // The verdict's plain length decides the layout (colour codes take no room on screen).
  const plain = `${pad}${short(f.subject)}  (${f.level}: ${f.checkId})`;
  const out = plain.length <= width ? [`${pad}${short(f.subject)}  ${verdict(f.level, f.checkId, s)}`] : [...wrap(`${pad}${short(f.subject)}`, width, body + 2), `${" ".repeat(body)}${verdict(f.level, f.checkId, s)}`];
  out.push(...wrap(`${" ".repeat(body)}${message}`, width, body).map((l) => s.dim(l)));
  for (const a of also) out.push(...wrap(`${" ".repeat(body)}also (${a.checkId}): ${a.message}`, width, body + 2).map((l) => s.dim(l)));
  return out;
}
