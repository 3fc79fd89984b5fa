import { describe, expect, it } from "vitest";
import { cli } from "../helpers/cli.js";
import { FIXTURES } from "../helpers/paths.js";

const OWN = `${FIXTURES}policies/harbourview.json`;

describe("overask rules", () => {
  it("lists the bundled policies when none is given, and the given ones with their sources", async () => {
    const bundled = (await cli(["rules"])).stdout;
    expect(bundled).toMatch(/install-time-rules \(9 rules\)/);
    expect(bundled).toMatch(/store-declarations \(11 rules\)/);
    const own = JSON.parse((await cli(["rules", "--policy", OWN, "-f", "json"])).stdout);
    expect(own.bundled).toBe(false);
    expect(own.policies[0].rules.map((r: { id: string; summary: string }) => [r.id, r.summary])).toContainEqual(["kids-risk-cap", "caps the risk at 30%; only in EDUCATION"]);
  });
});
