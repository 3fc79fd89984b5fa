import { describe, expect, it } from "vitest";
import { sweepSummaryText } from "../../src/report/sweep-summary.js";

const totals = {
  inputs: 12,
  skipped: 2,
  notManifests: 1,
  unknownCategory: 1,
  gated: 3,
  baseRate: 0.37,
  scored: 10,
  failed: 12,
  failedIds: ["apps/broken.apk", "apps/empty.apk"],
  byBand: { low: 7, elevated: 2, high: 1 },
  top: [
    { id: "apps/lamp.apk", package: "org.example.lamp", risk: 0.912, band: "high" },
    { id: "apps/tides.apk", package: "org.example.tides", risk: 0.075, band: "low" },
  ],
  output: "out.jsonl",
  html: "out.html",
  caution: "These figures are a statistical association, not evidence of intent or harm.",
};

describe("the sweep's text summary", () => {
  const text = sweepSummaryText(totals);

  it("counts what was swept, kept, passed over and could not be read", () => {
    expect(text).toMatch(/^Swept 12 inputs: 10 scored, 12 could not be read, 2 kept from the earlier run\./);
    expect(text).toContain('Could not be read: apps/broken.apk, apps/empty.apk and 10 more (each a row with status "failed" and its error in out.jsonl).');
    expect(text).toContain("Passed over 1 .xml file that are not manifests");
    expect(text).toContain("1 app named a category the baseline does not have");
    expect(text).toContain("3 apps at or above the --fail-on level or over --max-risk.");
  });

  it("gives the bands and the highest risks in the percents every report uses", () => {
    expect(text).toContain("Risk bands: 1 high, 2 elevated, 7 low (risks relative to a base rate of 37% flagged in the labeled corpus).");
    expect(text).toMatch(/\n {4}91% {2}org\.example\.lamp {2}apps\/lamp\.apk\n/);
    expect(text).toMatch(/\n {3}7\.5% {2}org\.example\.tides/);
  });

  it("names the outputs and ends with the caution", () => {
    expect(text).toContain("Results: out.jsonl\nReport:  out.html");
    expect(text.trim().endsWith("not evidence of intent or harm.")).toBe(true);
  });
});
