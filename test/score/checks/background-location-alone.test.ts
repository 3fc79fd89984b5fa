import { describe, expect, it } from "vitest";
import { findingsOf, manifestText } from "../../helpers/judge.js";

describe("background-location-alone", () => {
  it("fires for background location without a foreground location permission", () => {
    const f = findingsOf("background-location-alone", manifestText({ permissions: ["ACCESS_BACKGROUND_LOCATION", "CAMERA"] }));
    expect(f.map((x) => [x.subject, x.level])).toEqual([["android.permission.ACCESS_BACKGROUND_LOCATION", "warning"]]);
  });

  it("does not fire beside fine or coarse location", () => {
    for (const fg of ["ACCESS_FINE_LOCATION", "ACCESS_COARSE_LOCATION"]) {
      expect(findingsOf("background-location-alone", manifestText({ permissions: ["ACCESS_BACKGROUND_LOCATION", fg] }))).toEqual([]);
    }
  });
});
