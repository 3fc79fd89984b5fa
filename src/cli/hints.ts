/**
 * The CLI's word on an error the library raised: the error's own line, and for a problem the command line
 * can fix, the options to look at. The library describes problems; only the CLI knows its options.
 */
import type { ErrorCode, OveraskError } from "../errors.js";

const HINTS: Record<ErrorCode, string> = {
  "labels-one-class": "check --label-field and --positive",
  "validation-labels-one-class": "check --validate-label-field and --validate-positive",
  "fold-parameters-differ": "learn both with the same --prior, --prior-strength, --min-support, --confidence, --uncommon-below and --alias",
  "fold-same-baseline": "give each baseline once",
  "reject-limit": "list them with --rejects FILE, or raise --reject-limit",
};

/** One line for a person: `file: message; what to do`. */
export function describeForCli(e: OveraskError): string {
  const hint = e.code ? HINTS[e.code] : undefined;
  return hint ? `${e.describe()}; ${hint}` : e.describe();
}
