import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { corpusFile, openCorpusFile } from "../../src/ops/corpus.js";
import { CorpusError } from "../../src/errors.js";
import { FIXTURES } from "../helpers/paths.js";

describe("corpus files on disk", () => {
  it("streams a JSONL corpus's records, with its report filled in as it goes", async () => {
    const c = openCorpusFile(`${FIXTURES}corpus/harbourview.jsonl`, { labelField: "flagged", positive: ["yes"] });
    let n = 0;
    for await (const r of c.records) if (r.permissions.length >= 0) n++;
    expect(n).toBe(c.report.accepted);
    expect(c.report.rows).toBe(1500); // fixtures/corpus/harbourview.jsonl: 1,500 invented apps
  });

  it("reads an index CSV's apps with overask's own manifest reader, relative to the index", async () => {
    const dir = mkdtempSync(join(tmpdir(), "overask-corpus-"));
    writeFileSync(join(dir, "index.csv"), `file,category\n${FIXTURES}apk/tidewatch.apk,Weather\n`);
    const c = openCorpusFile(join(dir, "index.csv"));
    const records = [];
    for await (const r of c.records) records.push(r);
    expect(records.map((r) => [r.id, r.category])).toEqual([["org.example.tidewatch", "Weather"]]);
  });

  it("says plainly when the path is a folder or missing", () => {
    expect(() => corpusFile(FIXTURES)).toThrow(/is a directory/);
    expect(() => corpusFile(join(FIXTURES, "no-such.jsonl"))).toThrow(CorpusError);
  });
});
