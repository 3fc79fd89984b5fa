import { describe, expect, it } from "vitest";
import { heatmapData, POOLED_COLUMN } from "../../src/score/heatmap.js";
import type { AppRow } from "../../src/score/row.js";
import { defaultJudge } from "../helpers/judge.js";

const SMS = "android.permission.READ_SMS";
const row = (id: string, category: string | undefined, flagged: boolean, perms: string[]): AppRow => ({
  id,
  size: 1,
  mtimeMs: 1,
  status: "scored",
  ...(category ? { category } : {}),
  permissions: perms,
  findings: flagged ? [{ checkId: "sensitive-uncommon", level: "warning", subject: SMS }] : [{ checkId: "exported-unguarded", level: "note", subject: ".Main" }],
});

describe("heatmapData", () => {
  const rows = [row("a", "TOOLS", true, [SMS]), row("b", "TOOLS", false, []), row("c", undefined, true, [SMS]), { id: "d", size: 1, mtimeMs: 1, status: "failed" as const }];
  const h = heatmapData(rows, defaultJudge.baseline);

  it("lists the permissions the rate checks flagged, with how often", () => {
    expect(h.permissions).toEqual([SMS]);
    expect(h.flaggedCounts).toEqual([2]);
  });

  it("gives the swept share per category beside the baseline's share, pooled apps last", () => {
    expect(h.categories).toEqual(["TOOLS", POOLED_COLUMN]);
    expect(h.cells[0][0]).toMatchObject({ sweep: 0.5, sweepN: 2 });
    const b = defaultJudge.baseline.rate("TOOLS", SMS);
    expect(h.cells[0][0].baseline).toBeCloseTo(b.k / b.n, 12);
    expect(h.cells[0][1]).toMatchObject({ sweep: 1, sweepN: 1 });
  });
});
