/** Exit codes of the `overask` command (documented in README.md). */
export const EXIT = {
  /** Everything read and reported. */
  OK: 0,
  /** A gate was hit (a finding at or above --fail-on, or a risk above --max-risk). */
  GATE: 1,
  /** The command line is wrong (unknown option, missing argument). */
  USAGE: 2,
  /** At least one input could not be read; the others were still reported. */
  INPUT: 3,
  /** A bug in overask; rerun with --debug and report the stack trace. */
  INTERNAL: 4,
  /** An output could not be written; anything already written is left as it was. */
  OUTPUT: 5,
} as const;
