import { describe, expect, it } from "vitest";
import { csvCell, splitCsvLine } from "../../src/util/csv.js";

// RFC 4180 §2: fields holding commas, quotes or line breaks are quoted; a quote inside is doubled.
describe("splitCsvLine", () => {
  it("splits plain and quoted fields", () => {
    expect(splitCsvLine("a,b,,c")).toEqual(["a", "b", "", "c"]);
    expect(splitCsvLine('"a,1","say ""hi""",x')).toEqual(["a,1", 'say "hi"', "x"]);
  });
  it("returns undefined for an unterminated quote", () => {
    expect(splitCsvLine('"open,field')).toBeUndefined();
  });
});

describe("csvCell", () => {
  it("quotes only what needs quoting, and round-trips through splitCsvLine", () => {
    expect(csvCell("plain")).toBe("plain");
    expect(csvCell(3.5)).toBe("3.5");
    expect(csvCell(undefined)).toBe("");
    const values = ["a,b", 'q"uote', "line\nbreak", "plain"];
    expect(splitCsvLine(values.filter((v) => !v.includes("\n")).map(csvCell).join(","))).toEqual(values.filter((v) => !v.includes("\n")));
    expect(csvCell("line\nbreak")).toBe('"line\nbreak"');
  });
});

describe("index CSV lines", () => {
  it("skip blank lines, comments and a header on line 1, and trim fields", async () => {
    const { indexRows } = await import("../../src/util/csv.js");
    const text = "File,Category\n\n# the shop's apps\n apps/a.apk , TOOLS \n\"apps/b,c.apk\",GAMES\n\"broken,x\n";
    expect([...indexRows(text, "file")]).toEqual([
      { line: 4, fields: ["apps/a.apk", "TOOLS"] },
      { line: 5, fields: ["apps/b,c.apk", "GAMES"] },
      { line: 6 },
    ]);
  });

  it("keep a first line that is not the header", async () => {
    const { indexLine } = await import("../../src/util/csv.js");
    expect(indexLine("org.example.a,TOOLS", 1, "package")).toEqual({ kind: "row", fields: ["org.example.a", "TOOLS"] });
    expect(indexLine("package,category", 2, "package")).toEqual({ kind: "row", fields: ["package", "category"] });
  });
});
