/**
 * SARIF 2.1.0 (OASIS) for `overask check`: one run, rule descriptors from the check metadata, results
 * pointing at the line of a plain manifest or, for binary input, at the file with a logical location
 * (the element path). `results` is always present, even when empty.
 */
import type { Log, Result, ReportingDescriptor } from "sarif";
import { policyCheckId } from "../score/policy/policy.js";
import { CHECKS } from "../score/registry.js";
import { TOOL_VERSION } from "../version.js";
import { codeLookup } from "./messages.js";
import { alsoMessages, messageOf, type CheckRun, type CheckRunInfo } from "./check.js";

export function checkToSarif(runs: CheckRun[], info: CheckRunInfo): string {
  const rules: ReportingDescriptor[] = CHECKS.map((c) => ({
    id: c.meta.id,
    name: c.meta.title.replace(/[^A-Za-z0-9]+(.)?/g, (_, ch: string | undefined) => (ch ? ch.toUpperCase() : "")),
    shortDescription: { text: c.meta.title },
    fullDescription: { text: c.meta.description },
    // helpUri must be an absolute URI (SARIF 2.1.0 §3.49.12); the docs are files of the package, so the
    // help text carries the description and where the page is instead.
    help: { text: `${c.meta.description} Documentation: ${c.meta.docs} in the overask package.` },
    defaultConfiguration: { level: c.meta.defaultLevel },
  }));
  // Policy rules in force are rules of the run too, described from the policy file.
  for (const p of info.policies ?? []) {
    for (const r of p.rules) {
      rules.push({
        id: policyCheckId(r),
        name: r.id,
        shortDescription: { text: r.message },
        fullDescription: { text: `${r.message} (policy ${p.name}; source: ${r.source})` },
        help: { text: `Rule ${r.id} of ${p.file}, line ${r.line}. Source: ${r.source}` },
        defaultConfiguration: { level: r.level },
        properties: { policy: p.name, file: p.file, line: r.line },
      });
    }
  }
  const results: Result[] = [];
  for (const run of runs) {
    const m = run.result?.manifest;
    if (!run.result || !m) continue;
    for (const f of run.result.findings) {
      const physical = m.input.kind === "plain-xml" && f.location.line !== undefined
        ? { artifactLocation: { uri: toUri(run.file) }, region: { startLine: f.location.line } }
        : { artifactLocation: { uri: toUri(run.file) } };
      results.push({
        ruleId: f.checkId,
        ruleIndex: rules.findIndex((r) => r.id === f.checkId),
        level: f.level,
        message: { text: [`${f.subject}: ${messageOf(f, codeLookup(run.result.code))}`, ...alsoMessages(f).map((a) => `Also: ${a.message}`)].join(" ") },
        locations: [{ physicalLocation: physical, logicalLocations: [{ fullyQualifiedName: f.location.path, kind: "element" }] }],
        properties: { package: m.package, subject: f.subject },
      });
    }
  }
  const log: Log = {
    $schema: "https://json.schemastore.org/sarif-2.1.0.json",
    version: "2.1.0",
    runs: [
      {
        tool: { driver: { name: "overask", version: TOOL_VERSION, rules } },
        // Inputs that could not be read, where a code-scanning service shows tool problems (SARIF §3.20.21).
        invocations: [
          {
            executionSuccessful: runs.every((r) => r.result),
            toolExecutionNotifications: runs
              .filter((r) => !r.result)
              .map((r) => ({ level: "error" as const, message: { text: `${r.file}: ${r.error?.message ?? "could not be read"}` }, locations: [{ physicalLocation: { artifactLocation: { uri: toUri(r.file) } } }], properties: { kind: r.error?.kind } })),
          },
        ],
        results,
        properties: {
          baseline: info.baseline,
          caution: info.caution,
          apps: runs.map((r) => ({ file: r.file, package: r.result?.manifest.package, risk: r.result?.risk?.probability, band: r.result?.risk?.band, error: r.error?.message })),
        },
      },
    ],
  };
  return `${JSON.stringify(log, null, 2)}\n`;
}

/** Relative paths stay relative (SARIF allows URI references); spaces and the like are escaped. */
function toUri(path: string): string {
  return path.split("/").map(encodeURIComponent).join("/");
}
