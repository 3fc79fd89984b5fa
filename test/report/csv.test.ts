import { describe, expect, it } from "vitest";
import { csvHeader, ROW_CSV_COLUMNS, rowFromCsv, rowToCsv } from "../../src/report/csv.js";
import type { AppRow } from "../../src/score/row.js";
import { splitCsvLine } from "../../src/util/csv.js";

const row: AppRow = {
  id: "apps/odd, name.apk",
  size: 100,
  mtimeMs: 5,
  status: "scored",
  package: "org.example.odd",
  category: "TOOLS",
  risk: 0.123456,
  band: "low",
  counts: { error: 0, warning: 1, note: 2 },
  findings: [{ checkId: "sensitive-uncommon", level: "warning", subject: "android.permission.READ_SMS" }],
};

describe("app rows as CSV", () => {
  it("writes one line with a header of the same columns", () => {
    expect(splitCsvLine(csvHeader().trim())).toEqual([...ROW_CSV_COLUMNS]);
    const fields = splitCsvLine(rowToCsv(row).trim())!;
    expect(fields).toHaveLength(ROW_CSV_COLUMNS.length);
    expect(fields[ROW_CSV_COLUMNS.indexOf("risk")]).toBe("0.1235");
    expect(fields[ROW_CSV_COLUMNS.indexOf("checks")]).toBe("sensitive-uncommon");
  });

  it("reads back the summary columns, and refuses the header or a foreign line", () => {
    expect(rowFromCsv(splitCsvLine(rowToCsv(row).trim())!)).toEqual({ id: row.id, size: 100, mtimeMs: 5, status: "scored", package: "org.example.odd", risk: 0.1235, band: "low" });
    expect(rowFromCsv(splitCsvLine(csvHeader().trim())!)).toBeUndefined();
    expect(rowFromCsv(["a", "b"])).toBeUndefined();
  });

  it("carries the requested permissions for joining with a spreadsheet, and reads them back", () => {
    const withPerms = { ...row, permissions: ["android.permission.CAMERA", "android.permission.READ_SMS"] };
    const fields = splitCsvLine(rowToCsv(withPerms).trim())!;
    expect(fields[ROW_CSV_COLUMNS.indexOf("permissions")]).toBe("android.permission.CAMERA android.permission.READ_SMS");
    expect(rowFromCsv(fields)?.permissions).toEqual(withPerms.permissions);
    // An output written before the column existed still reads (one column fewer).
    expect(rowFromCsv(fields.slice(0, -1))?.id).toBe(row.id);
  });
});
