import { describe, expect, it } from "vitest";
import { CountTable } from "../../src/baseline/counts.js";

const apps = [
  { category: "Tools", permissions: ["android.permission.CAMERA", "android.permission.INTERNET"] },
  { category: "Tools", permissions: ["android.permission.INTERNET"] },
  { category: "Social", permissions: ["android.permission.READ_CONTACTS", "android.permission.INTERNET"] },
  { permissions: ["android.permission.VIBRATE"] }, // no category: pooled counts only
];

function table(records: typeof apps): CountTable {
  const t = new CountTable();
  for (const r of records) t.add(r);
  return t;
}

describe("CountTable", () => {
  it("counts apps and requests per category and pooled", () => {
    const t = table(apps).toJSON();
    expect(t.pooled.apps).toBe(4);
    expect(t.pooled.permissions["android.permission.INTERNET"]).toBe(3);
    expect(t.categories.Tools).toEqual({ apps: 2, permissions: { "android.permission.CAMERA": 1, "android.permission.INTERNET": 2 } });
    expect(Object.keys(t.categories)).toEqual(["Social", "Tools"]);
  });

  it("merges two halves into exactly the counts of the whole", () => {
    const a = table(apps.slice(0, 2));
    a.merge(table(apps.slice(2)));
    expect(a.toJSON()).toEqual(table(apps).toJSON());
  });

  it("survives a round trip through its JSON form", () => {
    const json = table(apps).toJSON();
    expect(CountTable.fromJSON(JSON.parse(JSON.stringify(json))).toJSON()).toEqual(json);
  });
});
