import { mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { compactOutput, readRows, rowFromLine } from "../../../src/ops/sweep/resume.js";
import { rowLine } from "../../../src/report/rows.js";
import { csvHeader } from "../../../src/report/csv.js";
import { failedRow } from "../../../src/score/row.js";

const dir = mkdtempSync(join(tmpdir(), "overask-resume-"));
const row = (id: string, size: number) => failedRow({ id, size, mtimeMs: 1 }, { kind: "InputError", message: "is empty" });
const input = (id: string, size: number) => ({ id, file: id, size, mtimeMs: 1 });

describe("resuming a sweep", () => {
  it("keeps the last complete row of each unchanged input, and drops stale, foreign and torn lines", () => {
    const out = join(dir, "rows.jsonl");
    const lines = [rowLine(row("a.apk", 10), "jsonl"), rowLine(row("b.apk", 20), "jsonl"), "not a row", rowLine(row("a.apk", 10), "jsonl"), rowLine(row("c.apk", 30), "jsonl").slice(0, 15)];
    writeFileSync(out, lines.join("\n")); // the last line torn by an interruption (no newline)
    const kept: string[] = [];
    const ids = compactOutput(out, "jsonl", [input("a.apk", 10), input("b.apk", 21), input("c.apk", 30)], (r) => kept.push(r.id));
    expect([...ids]).toEqual(["a.apk"]); // b.apk changed size; c.apk's line was torn
    expect(kept).toEqual(["a.apk"]);
    expect(readFileSync(out, "utf8")).toBe(`${rowLine(row("a.apk", 10), "jsonl")}\n`);
  });

  it("reads rows back from JSONL and from CSV's summary columns, sorted by id", () => {
    const csv = join(dir, "rows.csv");
    writeFileSync(csv, `${csvHeader()}${rowLine(row("z.apk", 1), "csv")}\n${rowLine(row("m.apk", 2), "csv")}\n`);
    expect(readRows(csv, "csv").map((r) => [r.id, r.status, r.size])).toEqual([["m.apk", "failed", 2], ["z.apk", "failed", 1]]);
    expect(rowFromLine("{\"no\":\"id\"}", "jsonl")).toBeUndefined();
    expect(rowFromLine("id,size", "csv")).toBeUndefined();
  });
});
