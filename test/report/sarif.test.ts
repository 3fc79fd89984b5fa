/**
 * SARIF 2.1.0 (OASIS Static Analysis Results Interchange Format, version 2.1.0): rule descriptors from the
 * check metadata, results pointing at lines of plain manifests, `results` present even when empty. The
 * full log is validated against the published schema in test/cli/check.test.ts.
 */
import { describe, expect, it } from "vitest";
import { checkToSarif } from "../../src/report/sarif.js";
import { CHECKS } from "../../src/score/registry.js";
import { defaultJudge, judgeText, manifestText } from "../helpers/judge.js";

const info = { baseline: "the demo baseline", caution: "not evidence of intent or harm" };

describe("checkToSarif", () => {
  it("has one rule per check and an empty results list when nothing was found", () => {
    const log = JSON.parse(checkToSarif([], info));
    expect(log.version).toBe("2.1.0");
    expect(log.runs[0].tool.driver.rules.map((r: { id: string }) => r.id)).toEqual(CHECKS.map((c) => c.meta.id));
    expect(log.runs[0].results).toEqual([]);
  });

  it("points a finding in a plain manifest at its line, with the rule's index", () => {
    const text = manifestText({ permissions: ["INTERNET", "READ_SMS"] });
    const log = JSON.parse(checkToSarif([{ file: "app dir/AndroidManifest.xml", result: judgeText(text, { category: "TOOLS" }, defaultJudge) }], info));
    const r = log.runs[0].results.find((x: { properties: { subject: string } }) => x.properties.subject === "android.permission.READ_SMS");
    expect(r.locations[0].physicalLocation.artifactLocation.uri).toBe("app%20dir/AndroidManifest.xml");
    // READ_SMS is on line 4 of the manifest manifestText writes (manifest, uses-sdk, INTERNET, READ_SMS).
    expect(r.locations[0].physicalLocation.region.startLine).toBe(4);
    expect(log.runs[0].tool.driver.rules[r.ruleIndex].id).toBe(r.ruleId);
  });
});
