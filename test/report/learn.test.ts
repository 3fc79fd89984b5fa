import { describe, expect, it } from "vitest";
import { readBaselineFile } from "../../src/ops/baseline.js";
import { baselineSummary } from "../../src/report/learn.js";
import { ROOT } from "../helpers/paths.js";

describe("the summary learn prints", () => {
  const file = readBaselineFile(`${ROOT}baselines/harbourview-demo.json`);
  const text = baselineSummary(file, "out.json");

  it("says where it wrote, what it read and which categories fall back to the pooled baseline", () => {
    expect(text).toMatch(/^Baseline written to out\.json\n/);
    expect(text).toMatch(/fixtures\/corpus\/harbourview\.jsonl/);
    // baselines/README.md: Weather has 22 apps, below the minimum support of 30.
    expect(text).toMatch(/Weather +22 apps {2}below 30: uses the pooled baseline/);
  });

  it("puts the model beside the reference scores on the same rows, with the caution", () => {
    expect(text).toMatch(/this model +0\.\d{3}/);
    expect(text).toMatch(/number of dangerous permissions +0\.\d{3}/);
    expect(text).toContain(file.caution.split(" ").slice(0, 6).join(" "));
  });
});
