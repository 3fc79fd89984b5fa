import { describe, expect, it } from "vitest";
import { compareText } from "../../src/util/compare.js";

describe("compareText", () => {
  it("orders by code units, as Array.prototype.sort does without a comparator", () => {
    const names = ["android.permission.READ_SMS", "android.permission.READSOMETHING", "B", "a", "", "android.permission.CAMERA"];
    expect([...names].sort(compareText)).toEqual([...names].sort());
    expect(compareText("x", "x")).toBe(0);
  });
});
