/**
 * Typed option parsers for commander: each turns the option's text into its value or raises
 * InvalidArgumentError, which commander reports as `error: option '--x <n>' argument 'y' is invalid. …`
 * with exit code 2.
 */
import { InvalidArgumentError } from "commander";
import type { Level } from "../score/types.js";

/** A number that satisfies `ok`; `what` says what is expected. */
export function numberParser(ok: (n: number) => boolean, what: string): (value: string) => number {
  return (value) => {
    const n = Number(value);
    if (value.trim() === "" || !Number.isFinite(n) || !ok(n)) throw new InvalidArgumentError(`It must be ${what}.`);
    return n;
  };
}

export const wholeNumber = (min: number) => numberParser((n) => Number.isInteger(n) && n >= min, `a whole number ≥ ${min}`);
export const anInteger = numberParser(Number.isInteger, "a whole number");
export const nonNegative = numberParser((n) => n >= 0, "a number ≥ 0");
/**
 * A share, as a fraction (0.3) or a percent (30%), the way every output prints it; `ok` checks the fraction.
 */
export function shareParser(ok: (n: number) => boolean, what: string): (value: string) => number {
  const fraction = numberParser(ok, what);
  return (value) => {
    const t = value.trim();
    if (!t.endsWith("%")) return fraction(t);
    const n = Number(t.slice(0, -1));
    if (t.length === 1 || !Number.isFinite(n) || !ok(n / 100)) throw new InvalidArgumentError(`It must be ${what}.`);
    return n / 100;
  };
}

export const openUnit = shareParser((n) => n > 0 && n < 1, "between 0 and 1 (or 0% and 100%)");
export const closedUnit = shareParser((n) => n >= 0 && n <= 1, "between 0 and 1 (or 0% and 100%)");

/** A value the user gave, as an error message quotes it: cut to 60 characters, so a huge value stays one line. */
export function shown(value: string): string {
  const flat = value.replace(/\s+/g, " ");
  return `"${flat.length > 60 ? `${flat.slice(0, 57)}…` : flat}"`;
}

/** Repeatable options collect into a list. */
export function collect(value: string, previous: string[] = []): string[] {
  return [...previous, value];
}

/** `from=to` pairs (repeatable), e.g. category aliases. */
export function collectPairs(value: string, previous: [string, string][] = []): [string, string][] {
  const m = /^([^=]+)=(.+)$/.exec(value);
  if (!m) throw new InvalidArgumentError("It takes from=to.");
  return [...previous, [m[1].trim(), m[2].trim()]];
}

/**
 * `check-id=level` (repeatable): a check's level, or `off`. Whether the check exists is asked when the
 * command runs (the check registry is not loaded for parsing).
 */
export function collectLevels(value: string, previous: Map<string, Level | "off"> = new Map()): Map<string, Level | "off"> {
  const m = /^([\w-]+)=(error|warning|note|off)$/.exec(value);
  if (!m) throw new InvalidArgumentError("It takes check-id=error|warning|note|off.");
  return new Map(previous).set(m[1], m[2] as Level | "off");
}

/** `i/n` with 1 ≤ i ≤ n: this machine takes the i-th of n stable parts. */
export function shardParser(value: string): { index: number; count: number } {
  const m = /^(\d+)\/(\d+)$/.exec(value);
  const index = m ? Number(m[1]) : NaN;
  const count = m ? Number(m[2]) : NaN;
  if (!(count >= 1 && index >= 1 && index <= count)) throw new InvalidArgumentError("It takes i/n with 1 ≤ i ≤ n.");
  return { index, count };
}
