import { describe, expect, it } from "vitest";
import { baselineToJson, baselineToText } from "../../src/report/baseline-view.js";
import { defaultJudge } from "../helpers/judge.js";

const view = (o: { category?: string; permission?: string }) => ({ name: "default", file: defaultJudge.file, baseline: defaultJudge.baseline, ...o });

describe("what a baseline knows, as text and JSON", () => {
  it("lists its categories with their apps, its era and its caution", () => {
    const text = baselineToText(view({}));
    // baselines/README.md: MapperDroid's four categories, TOOLS 2,318 apps; era API 29, apps of 2020.
    expect(text).toMatch(/TOOLS +2318 apps/);
    expect(text).toMatch(/era API 29, apps of 2020/);
    expect(text).toContain(defaultJudge.file.caution.split(" ").slice(0, 5).join(" "));
  });

  it("gives a permission's rate in every category with what check makes of it", () => {
    const json = JSON.parse(baselineToJson(view({ permission: "android.permission.READ_SMS" })));
    const tools = json.permissionRates.rates.find((r: { category: string }) => r.category === "TOOLS");
    // 18 of 2318 TOOLS apps request READ_SMS (the bundled counts); uncommon there (check: sensitive-uncommon).
    expect(tools).toMatchObject({ k: 18, n: 2318, uncommon: true, judged: "by-rate" });
    expect(json.permissionRates.rates.at(-1).category).toBeNull(); // the pooled row last
  });

  it("lists a category's permissions, most requested first", () => {
    const rates = JSON.parse(baselineToJson(view({ category: "TOOLS" }))).categoryRates.rates;
    expect(rates[0].permission).toBe("android.permission.INTERNET");
    expect(rates.map((r: { k: number }) => r.k)).toEqual([...rates.map((r: { k: number }) => r.k)].sort((a: number, b: number) => b - a));
  });
});
