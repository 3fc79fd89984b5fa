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
export const openUnit = numberParser((n) => n > 0 && n < 1, "between 0 and 1");
export const closedUnit = numberParser((n) => n >= 0 && n <= 1, "between 0 and 1");

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
