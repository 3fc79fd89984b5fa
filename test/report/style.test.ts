import { describe, expect, it } from "vitest";
import { fit, pickStyle, PLAIN, wrap } from "../../src/report/style.js";

describe("text style", () => {
  it("colours only a terminal, and never when NO_COLOR is set (no-color.org, common practice)", () => {
    expect(pickStyle({ isTTY: false }, {}).warn("x")).toBe("x");
    expect(pickStyle({ isTTY: true }, {}).warn("x")).not.toBe("x");
    expect(pickStyle({ isTTY: true }, { NO_COLOR: "1" }).warn("x")).toBe("x");
    expect(PLAIN.bold("x")).toBe("x");
  });

  it("fits a cell to a width, with an ellipsis when cut", () => {
    expect(fit("TOOLS", 8)).toBe("TOOLS   ");
    expect(fit("COMMUNICATION", 6)).toBe("COMMU…");
  });

  it("wraps a long path after its separators, never mid-word, never past the width", () => {
    const lines = wrap(`  file /srv/inventory/org.example.harbourview/releases/2026/ferry-timetable-release.apk read`, 40, 4);
    expect(lines).toEqual(["  file /srv/inventory/org.example.", "    harbourview/releases/2026/", "    ferry-timetable-release.apk read"]);
  });

  it("cuts mid-word only where no separator is in reach", () => {
    const lines = wrap(`  ${"x".repeat(50)}`, 30, 2);
    for (const l of lines) expect(l.length).toBeLessThanOrEqual(30);
    expect(lines.join("").replace(/\s+/g, "")).toBe("x".repeat(50));
  });
});
