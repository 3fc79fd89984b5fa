import { describe, expect, it } from "vitest";
import { editDistance } from "../../src/util/edit-distance.js";

describe("editDistance", () => {
  it("counts insertions, deletions, substitutions and adjacent transpositions as one each (OSA; common practice)", () => {
    expect(editDistance("TOLS", "TOOLS")).toBe(1);
    expect(editDistance("kitten", "sitting")).toBe(3); // the textbook Levenshtein example
    expect(editDistance("LOCATON", "LOCATION")).toBe(1);
    expect(editDistance("ab", "ba")).toBe(1);
    expect(editDistance("", "abc")).toBe(3);
  });
});

describe("editDistanceWithin", () => {
  it("agrees with editDistance up to the bound, and says 'more' past it", async () => {
    const { editDistance, editDistanceWithin } = await import("../../src/util/edit-distance.js");
    const pairs: [string, string][] = [["READ_SMSS", "READ_SMS"], ["CAMREA", "CAMERA"], ["INTERNET", "INTERNET"], ["ACCESS_FINE_LOCATON", "ACCESS_FINE_LOCATION"], ["BLUETOOTH", "BODY_SENSORS"], ["", "ABC"]];
    for (const [a, b] of pairs) {
      const d = editDistance(a, b);
      for (let max = 0; max <= 6; max++) {
        const w = editDistanceWithin(a, b, max);
        if (d <= max) expect(w, `${a} ${b} ${max}`).toBe(d);
        else expect(w, `${a} ${b} ${max}`).toBeGreaterThan(max);
      }
    }
  });
});
