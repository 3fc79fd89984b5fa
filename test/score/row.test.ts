import { describe, expect, it } from "vitest";
import { failedRow, rowOf } from "../../src/score/row.js";
import { defaultJudge, judgeText, manifestText } from "../helpers/judge.js";

const key = { id: "apps/lantern.xml", size: 512, mtimeMs: 1 };

describe("rowOf", () => {
  const result = judgeText(manifestText({ pkg: "org.example.lantern", permissions: ["INTERNET", "READ_SMS", "SEND_SMS"] }), { category: "TOOLS" }, defaultJudge);
  const row = rowOf(key, result);

  it("keeps the input's key, the app, its category, findings and counts", () => {
    expect(row).toMatchObject({ ...key, status: "scored", package: "org.example.lantern", category: "TOOLS" });
    expect(row.counts!.warning + row.counts!.note + row.counts!.error).toBe(result.findings.length);
    expect(row.permissions).toEqual(["android.permission.INTERNET", "android.permission.READ_SMS", "android.permission.SEND_SMS"]);
  });

  it("keeps up to five permissions whose removal lowers the risk, as the estimate gives them", () => {
    expect(row.risk).toBe(result.risk!.probability);
    for (const w of row.whatIf!) expect(w.without).toBeLessThan(row.risk!);
  });
});

describe("failedRow", () => {
  it("is the key, a failed status and the error", () => {
    expect(failedRow(key, { kind: "ArchiveError", message: "damaged" })).toEqual({ ...key, status: "failed", error: { kind: "ArchiveError", message: "damaged" } });
  });
});
