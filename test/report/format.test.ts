import { describe, expect, it } from "vitest";
import { pct, short } from "../../src/report/format.js";

describe("percents", () => {
  it("give a corpus rate two decimals below 1% and one above", () => {
    expect(pct(0.0042, "rate")).toBe("0.42%");
    expect(pct(0.048, "rate")).toBe("4.8%");
    expect(pct(0.31, "rate")).toBe("31.0%");
  });

  it("give a risk one decimal below 10% and none above", () => {
    expect(pct(0.075)).toBe("7.5%");
    expect(pct(0.31)).toBe("31%");
  });

  it("give a column of figures one decimal always", () => {
    expect(pct(0.3, "fixed")).toBe("30.0%");
    expect(pct(0.0042, "fixed")).toBe("0.4%");
  });
});

describe("short permission names", () => {
  it("drop only the platform's own prefix", () => {
    expect(short("android.permission.READ_SMS")).toBe("READ_SMS");
    expect(short("android.permission.health.READ_STEPS")).toBe("health.READ_STEPS");
    expect(short("com.android.vending.BILLING")).toBe("com.android.vending.BILLING");
  });
});
