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
