import { describe, expect, it } from "vitest";
import { editDistance } from "../../../src/score/checks/unknown-permission.js";
import { findingsOf, manifestText } from "../../helpers/judge.js";

describe("unknown-permission", () => {
  it("names the nearest platform permission for a likely typo", () => {
    const f = findingsOf("unknown-permission", manifestText({ permissions: ["ACCESS_FINE_LOCATON", "REDA_CONTACTS"] }));
    expect(f.map((x) => [x.subject, x.data.nearest, x.data.distance, x.data.likelyTypo])).toEqual([
      ["android.permission.ACCESS_FINE_LOCATON", "android.permission.ACCESS_FINE_LOCATION", 1, true],
      ["android.permission.REDA_CONTACTS", "android.permission.READ_CONTACTS", 1, true], // a swap of adjacent letters is one edit
    ]);
  });

  it("calls a far-off name undefined rather than a typo", () => {
    const f = findingsOf("unknown-permission", manifestText({ permissions: ["TELEPORT_USER"] }));
    expect(f[0].data.likelyTypo).toBe(false);
  });

  it("does not fire for platform permissions or other namespaces", () => {
    expect(findingsOf("unknown-permission", manifestText({ permissions: ["CAMERA", "com.example.vendor.permission.X"] }))).toEqual([]);
  });

  it("measures edits with adjacent swaps (common practice: optimal string alignment)", () => {
    expect(editDistance("ca", "ac")).toBe(1);
    expect(editDistance("kitten", "sitting")).toBe(3);
  });
});
