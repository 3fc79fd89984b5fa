import { describe, expect, it } from "vitest";
import { CountTable } from "../../src/baseline/counts.js";
import { corpusEra, frequencyBasis } from "../../src/baseline/era.js";
import { defaultJudge } from "../helpers/judge.js";

function table(apps: string[][]): CountTable {
  const t = new CountTable();
  for (const permissions of apps) t.add({ category: "Tools", permissions });
  return t;
}

describe("corpusEra", () => {
  it("is the newest added-in level among permissions with real support", () => {
    const apps = [...Array(20)].map((_, i) => ["android.permission.INTERNET", ...(i < 6 ? ["android.permission.ACCESS_BACKGROUND_LOCATION"] : []), ...(i < 2 ? ["android.permission.POST_NOTIFICATIONS"] : [])]);
    // ACCESS_BACKGROUND_LOCATION (API 29) in 6 apps counts; POST_NOTIFICATIONS (33) in 2 apps is below ERA_MIN_APPS.
    expect(corpusEra(table(apps), "2020")).toEqual({ api: 29, permission: "android.permission.ACCESS_BACKGROUND_LOCATION", apps: 6, years: "2020" });
  });

  it("is API 29 for the bundled store corpus (2020 apps)", () => {
    expect(defaultJudge.baseline.era).toBe(29);
  });
});

describe("frequencyBasis", () => {
  it("rates a newer permission by its most requested predecessor", () => {
    const b = frequencyBasis(defaultJudge.baseline, "TOOLS", "android.permission.BLUETOOTH_CONNECT");
    expect(b.kind).toBe("predecessor");
    const rates = ["android.permission.BLUETOOTH", "android.permission.BLUETOOTH_ADMIN"].map((p) => [p, defaultJudge.baseline.rate("TOOLS", p).rate] as const).sort((x, y) => y[1] - x[1]);
    expect(b.kind === "predecessor" && b.basis).toBe(rates[0][0]);
  });

  it("gives no basis for what is simply new", () => {
    expect(frequencyBasis(defaultJudge.baseline, "TOOLS", "android.permission.UWB_RANGING").kind).toBe("no-evidence");
  });
});
