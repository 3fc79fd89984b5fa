import { describe, expect, it } from "vitest";
import { countRequests, EMBED_ALL_UP_TO, EMBED_TOP, SweepDigester } from "../../src/score/sweep-digest.js";
import type { AppRow } from "../../src/score/row.js";
import { demoJudge } from "../helpers/judge.js";

const row = (i: number, risk: number, warnings = 0): AppRow => ({
  id: `app/${String(i).padStart(6, "0")}.apk`,
  size: 1,
  mtimeMs: 1,
  status: "scored",
  category: i % 2 ? "Tools" : "Social",
  risk,
  band: risk >= 0.5 ? "high" : "low",
  counts: { error: 0, warning: warnings, note: 0 },
  findings: warnings ? [{ checkId: "sensitive-uncommon", level: "warning", subject: "android.permission.READ_SMS" }] : [],
  permissions: warnings ? ["android.permission.READ_SMS"] : [],
});

describe("SweepDigester", () => {
  it("embeds every row of a small sweep, and counts bands, categories and checks", () => {
    const d = new SweepDigester();
    for (let i = 0; i < 10; i++) d.add(row(i, i / 10, i % 3));
    const req = countRequests(d.heatmapPermissions());
    for (let i = 0; i < 10; i++) req.add(row(i, i / 10, i % 3));
    const g = d.finish(demoJudge.baseline, req.shares);
    expect(g.complete).toBe(true);
    expect(g.embedded).toHaveLength(10);
    expect(g.byBand).toEqual({ low: 5, high: 5 });
    expect(g.byCategory).toEqual({ Social: 5, Tools: 5 });
    expect(g.byCheck["sensitive-uncommon"]).toBe(6);
    expect(g.histogram.reduce((s, b) => s + (b.low ?? 0) + (b.high ?? 0), 0)).toBe(10);
    expect(g.heatmap.permissions).toEqual(["android.permission.READ_SMS"]);
  });

  it("keeps the riskiest rows, the rows with most warnings and every failed row of a large sweep, with figures over all", () => {
    const d = new SweepDigester();
    const n = EMBED_ALL_UP_TO + 3000;
    for (let i = 0; i < n; i++) d.add(row(i, (i * 37 % n) / n, i % 500 === 0 ? 9 : 0));
    d.add({ id: "broken.apk", size: 1, mtimeMs: 1, status: "failed", error: { kind: "ArchiveError", message: "damaged" } });
    const g = d.finish(demoJudge.baseline);
    expect(g.complete).toBe(false);
    expect(g.rows).toBe(n + 1);
    expect(g.embedded.length).toBeLessThanOrEqual(2 * EMBED_TOP + 1);
    const risks = g.embedded.filter((r) => r.status === "scored").map((r) => r.risk!).sort((a, b) => b - a);
    expect(risks[0]).toBeCloseTo((n - 1) / n, 9);
    expect(g.embedded.some((r) => r.id === "broken.apk")).toBe(true);
    expect(g.embedded.filter((r) => r.counts?.warning === 9)).toHaveLength(Math.ceil(n / 500));
    expect(g.histogram.reduce((s, b) => s + (b.low ?? 0) + (b.high ?? 0), 0)).toBe(n);
  });
});
