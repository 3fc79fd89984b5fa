import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { LIMITS } from "../src/limits.js";
import { ROOT } from "./helpers/paths.js";

describe("the named caps on untrusted input", () => {
  it("are positive whole numbers", () => {
    for (const [name, v] of Object.entries(LIMITS)) expect(Number.isInteger(v) && v > 0, name).toBe(true);
  });

  it("are each named in the robustness or reading docs, so a user who meets one can look it up", () => {
    const docs = ["docs/robustness.md", "docs/reading-manifests.md", "docs/code-evidence.md", "docs/baselines.md", "docs/sweep.md"].map((d) => { try { return readFileSync(`${ROOT}${d}`, "utf8"); } catch { return ""; } }).join("\n");
    const unnamed = Object.keys(LIMITS).filter((n) => !docs.includes(n));
    expect(unnamed).toEqual([]);
  });
});
