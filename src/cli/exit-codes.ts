/**
 * Exit codes of the `overask` command: the one table that the code, `--help` and README.md (checked by
 * test/readme.test.ts) take them from.
 */
export const EXIT_CODES = [
  { name: "OK", code: 0, help: "done", meaning: "every input was read and reported" },
  { name: "GATE", code: 1, help: "a --fail-on or --max-risk gate was hit (check, sweep, delta)", meaning: "`check` or `sweep` found something at or above `--fail-on`, or a risk above `--max-risk` (and every input was read); `delta`: the update newly brings something at or above `--fail-on`, or its risk is above `--max-risk`" },
  { name: "USAGE", code: 2, help: "wrong command line", meaning: "the command line is wrong (unknown option or command, missing argument, a category the baseline does not have, a sweep source that is no app, folder or list)" },
  {
    name: "INPUT",
    code: 3,
    help: "an input could not be read (the others were still reported)",
    meaning:
      "at least one input could not be read (a file, a corpus over its reject limit, a baseline of another schema version; for `sweep`, an app in the inventory, or an inventory with nothing to sweep; for `sweep --queue` and `work`, a queue that cannot be reached or a worker whose baseline is not the producer's); the others were still reported, and the error was printed as one line naming the file",
  },
  { name: "INTERNAL", code: 4, help: "internal error (rerun with --debug)", meaning: "an internal error in overask; rerun with `--debug` for the stack trace and report it" },
  { name: "OUTPUT", code: 5, help: "an output could not be written", meaning: "an output could not be written (missing or read-only folder, full disk); an existing file is left as it was" },
  { name: "STOPPED", code: 6, help: "work: stopped before a clean close (a second signal, or Redis unreachable past the grace period)", meaning: "`work` was stopped without finishing the jobs in hand cleanly: a second SIGINT/SIGTERM, or a first one whose grace period (`--grace`) ran out, as when Redis cannot be reached; those jobs return to the queue after the stall check and run on another worker" },
] as const;

type ExitName = (typeof EXIT_CODES)[number]["name"];

/** Exit codes by name: `EXIT.GATE` is 1. */
export const EXIT = Object.fromEntries(EXIT_CODES.map((e) => [e.name, e.code])) as { readonly [K in ExitName]: Extract<(typeof EXIT_CODES)[number], { name: K }>["code"] };

/** The "Exit codes:" section of `--help`. */
export function exitCodesHelp(): string {
  return ["", "Exit codes:", ...EXIT_CODES.map((e) => `  ${e.code}  ${e.help}`)].join("\n");
}
