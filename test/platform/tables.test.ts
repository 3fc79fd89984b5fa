import { describe, expect, it } from "vitest";
import { rowsOf } from "../../src/platform/tables.js";

describe("generated platform tables", () => {
  it("read rows by column name, a missing trailing field as empty", () => {
    expect(rowsOf(["permission", "api", "source"], [["android.permission.CAMERA", "1", "reference"], ["android.permission.X", "33"]])).toEqual([
      { permission: "android.permission.CAMERA", api: "1", source: "reference" },
      { permission: "android.permission.X", api: "33", source: "" },
    ]);
  });
});
