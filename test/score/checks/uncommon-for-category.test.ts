import { describe, expect, it } from "vitest";
import { findingsOf, manifestText } from "../../helpers/judge.js";

describe("uncommon-for-category", () => {
  it("fires for a non-sensitive permission few apps of the category request, with the numbers behind it", () => {
    // In the demo baseline, Education apps request INTERNET often and FLASHLIGHT never.
    const f = findingsOf("uncommon-for-category", manifestText({ permissions: ["INTERNET", "FLASHLIGHT", "org.example.partner.permission.PUSH"] }), { category: "Education" });
    expect(f.map((x) => x.subject)).toEqual(["android.permission.FLASHLIGHT", "org.example.partner.permission.PUSH"]);
    expect(f[0].data).toMatchObject({ k: 0, n: 461, category: "Education" });
    expect(f[0].data.upper as number).toBeLessThan(0.05);
    expect(f[0].location).toMatchObject({ line: 4, path: "/manifest/uses-permission[2]" });
  });

  it("does not fire for common permissions, sensitive ones, or undefined platform names", () => {
    const f = findingsOf("uncommon-for-category", manifestText({ permissions: ["INTERNET", "READ_SMS", "ACCESS_FINE_LOCATON"] }), { category: "Education" });
    expect(f).toEqual([]);
  });

  it("uses the pooled baseline for a category below the minimum support, and says so", () => {
    const f = findingsOf("uncommon-for-category", manifestText({ permissions: ["FLASHLIGHT"] }), { category: "Weather" });
    expect(f[0]?.data).toMatchObject({ fallback: "below-min-support", n: 1500 });
  });
});
