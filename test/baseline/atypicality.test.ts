import { describe, expect, it } from "vitest";
import { atypicalityTable, percentileOf } from "../../src/baseline/atypicality.js";
import { defaultJudge } from "../helpers/judge.js";

describe("atypicality", () => {
  it("places a value among stored points by linear interpolation", () => {
    const points = [0, 10, 20, 30, 40];
    expect(percentileOf(points, -1)).toBe(0);
    expect(percentileOf(points, 20)).toBe(50);
    expect(percentileOf(points, 25)).toBe(62.5);
    expect(percentileOf(points, 99)).toBe(100);
    expect(percentileOf([], 1)).toBeNaN();
  });

  it("ranks an app asking for rare permissions above one asking for common ones", () => {
    const apps = Array.from({ length: 200 }, (_, i) => ({ category: "TOOLS", permissions: i % 2 ? ["android.permission.INTERNET"] : ["android.permission.INTERNET", "android.permission.CAMERA"] }));
    const t = atypicalityTable(defaultJudge.baseline, apps);
    expect(t.categories.TOOLS.length).toBeGreaterThan(1);
    const points = t.categories.TOOLS;
    expect([...points]).toEqual([...points].sort((a, b) => a - b));
  });
});
