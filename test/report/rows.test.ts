import { describe, expect, it } from "vitest";
import { rowLine, rowMessage } from "../../src/report/rows.js";
import { rowOf } from "../../src/score/row.js";
import { defaultJudge, judgeText, manifestText } from "../helpers/judge.js";

describe("sweep rows as their output has them", () => {
  const result = judgeText(manifestText({ permissions: ["READ_SMS", "BLUETOOTH", "ACCESS_BACKGROUND_LOCATION"], target: 34 }), { category: "TOOLS" }, defaultJudge);
  const row = rowOf({ id: "apps/lamp.apk", size: 10, mtimeMs: 1 }, result);

  it("keep the findings' data in the row, and word them only in the line", () => {
    expect(row.findings!.every((f) => f.message === undefined && f.data !== undefined)).toBe(true);
    const line = JSON.parse(rowLine(row, "jsonl"));
    expect(line.findings.map((f: { message: string }) => f.message)).toEqual(row.findings!.map(rowMessage));
    expect(line.findings[0].data).toEqual(row.findings![0].data);
  });

  it("fold the other reasons into the message after ' — also (check): '", () => {
    // Background location alone, and uncommon for TOOLS: one finding, the rate reason folded in.
    const folded = row.findings!.find((f) => f.subject === "android.permission.ACCESS_BACKGROUND_LOCATION")!;
    expect(folded.checkId).toBe("background-location-alone");
    expect(rowMessage(folded)).toMatch(/grants nothing on its own — also \(sensitive-uncommon\): \d+ of \d+ TOOLS apps request it/);
  });

  it("keep a message read back from an output that worded it", () => {
    expect(rowMessage({ checkId: "x", level: "note", subject: "y", message: "as written" })).toBe("as written");
  });

  it("give CSV a findings column of level, check, subject and message", () => {
    const csv = rowLine(row, "csv");
    expect(csv).toMatch(/warning sensitive-uncommon android\.permission\.READ_SMS: 18 of 2318 TOOLS apps/);
    expect(csv.includes("\n")).toBe(false);
  });
});
