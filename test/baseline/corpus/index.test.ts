import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { detectCorpusFormat, type CorpusRecord } from "../../../src/baseline/corpus/index.js";
import { corpusFile, openCorpusFile as openCorpus, type CorpusFileOptions as CorpusOptions } from "../../../src/ops/corpus.js";
import { splitCsvLine } from "../../../src/util/csv.js";
import { ROOT } from "../../helpers/paths.js";

const dir = mkdtempSync(join(tmpdir(), "overask-corpus-"));
let n = 0;
function file(text: string, ext = ".txt"): string {
  const p = join(dir, `c${n++}${ext}`);
  writeFileSync(p, text);
  return p;
}
async function readAll(path: string, options: CorpusOptions = {}) {
  const c = openCorpus(path, options);
  const records: CorpusRecord[] = [];
  for await (const r of c.records) records.push(r);
  return { records, report: c.report };
}

describe("JSONL corpora", () => {
  it("reads configurable fields, normalizes bare names and drops duplicate permissions", async () => {
    const p = file(
      [
        JSON.stringify({ package: "org.example.a", cat: "Tools", perms: ["SEND_SMS", "android.permission.SEND_SMS", "org.example.CUSTOM"] }),
        JSON.stringify({ package: "org.example.b", cat: "Tools", perms: ["ADD_VOICEMAIL"] }),
      ].join("\n"),
    );
    const { records, report } = await readAll(p, { idField: "package", categoryField: "cat", permissionsField: "perms" });
    expect(records[0]).toEqual({ id: "org.example.a", category: "Tools", permissions: ["android.permission.SEND_SMS", "org.example.CUSTOM"], line: 1 });
    // A bare name outside android.permission.* maps to the one platform permission of that name.
    expect(records[1].permissions).toEqual(["com.android.voicemail.permission.ADD_VOICEMAIL"]);
    expect(report.duplicatePermissions).toBe(1);
  });

  it("rejects unreadable rows with their line numbers and counts duplicate ids", async () => {
    const p = file(
      [
        `{"id":"x","category":"Tools","permissions":[]}`,
        `{"id":"x","category":"Tools","permissions":["android.permission.CAMERA"]}`,
        `{not json`,
        `{"id":"y","permissions":["android.permission.CAMERA"]}`,
        `{"id":"z","category":"Tools","permissions":"android.permission.CAMERA"}`,
        `[1,2]`,
      ].join("\n"),
    );
    const rejects: number[] = [];
    const { records, report } = await readAll(p, { requireCategory: true, onReject: (r) => rejects.push(r.line) });
    expect(records.map((r) => r.line)).toEqual([1, 2]);
    expect(report).toMatchObject({ rows: 6, accepted: 2, rejected: 4, duplicateIds: 1, duplicateExamples: ["x"] });
    expect(rejects).toEqual([3, 4, 5, 6]);
    expect(report.rejects.map((r) => r.reason)).toEqual([
      expect.stringMatching(/^not valid JSON/),
      "no category",
      'field "permissions" is not a list of permission names',
      "not a JSON object",
    ]);
  });

  it("applies category aliases and reads labels by their positive value", async () => {
    const p = file(
      [
        `{"id":"a","category":"Educational","permissions":[],"label":"bad"}`,
        `{"id":"b","category":"Education","permissions":[],"label":"good"}`,
        `{"id":"c","category":"Education","permissions":[]}`,
      ].join("\n"),
    );
    const { records, report } = await readAll(p, { aliases: new Map([["Educational", "Education"]]), positive: ["bad"] });
    expect(records.map((r) => [r.category, r.label])).toEqual([["Education", 1], ["Education", 0], ["Education", undefined]]);
    expect(report).toMatchObject({ labeled: 2, positives: 1 });
  });
});

describe("wide CSV corpora", () => {
  it("reads 0/1 permission columns, a label column, and columns chosen by a column file", async () => {
    const columns = file("SEND_SMS,Manifest Permission\nbindService,API call signature\nCAMERA,Manifest Permission\n");
    const p = file("SEND_SMS,bindService,CAMERA,class\n1,1,0,S\n0,1,1,B\n0,0,0,B\n");
    const { records, report } = await readAll(p, { labelField: "class", positive: ["S"], columnsFrom: columns, columnsKind: "Manifest Permission" });
    expect(records.map((r) => [r.permissions, r.label])).toEqual([
      [["android.permission.SEND_SMS"], 1],
      [["android.permission.CAMERA"], 0],
      [[], 0],
    ]);
    expect(report.vocabulary).toEqual(["android.permission.CAMERA", "android.permission.SEND_SMS"]);
  });

  it("rejects rows with the wrong column count or a value other than 0 or 1", async () => {
    const p = file("SEND_SMS,CAMERA,class\n1,0,S\n1,?,S\n1,0\n\"1,0,S\n");
    const { report } = await readAll(p, { labelField: "class" });
    expect(report.rejects).toEqual([
      { line: 3, reason: 'column CAMERA holds "?", not 0 or 1' },
      { line: 4, reason: "2 columns, the header has 3" },
      { line: 5, reason: "unterminated quote at the end of the file" },
    ]);
  });

  it("reads a quoted field that holds line breaks as one record (RFC 4180 §2.6)", async () => {
    // As in the KronoDroid files (SOURCES.md: package names with stray line breaks, quoted).
    const p = file('Package,SEND_SMS,CAMERA,Malware\n"org.example\n.odd",1,0,1\norg.example.plain,0,1,0\n');
    const { records, report } = await readAll(p, { labelField: "Malware", idField: "Package" });
    expect(report.rejected).toBe(0);
    expect(records.map((r) => [r.id, r.label, r.line])).toEqual([["org.example\n.odd", 1, 2], ["org.example.plain", 0, 4]]);
  });

  it("keeps only platform permission columns when asked (validation corpora)", async () => {
    const p = file("Package,SEND_SMS,read,Detection_Ratio,Malware\na,1,5,0,1\nb,0,3,0,0\n");
    const { report } = await readAll(p, { labelField: "Malware", idField: "Package", platformColumnsOnly: true } as never);
    expect(report.vocabulary).toEqual(["android.permission.SEND_SMS"]);
  });
});

describe("file corpora", () => {
  it("reads APKs and manifests named by an index CSV, rejecting unreadable files by line", async () => {
    const index = file(
      [
        "file,category,label",
        `${ROOT}fixtures/apk/pocketlamp.apk,Tools,1`,
        `${ROOT}fixtures/apps/tidewatch/AndroidManifest.xml,Tools,0`,
        `${ROOT}fixtures/apk/missing.apk,Tools,0`,
      ].join("\n"),
      ".csv",
    );
    expect(detectCorpusFormat(corpusFile(index).head())).toBe("files");
    const { records, report } = await readAll(index);
    expect(records.map((r) => [r.id, r.category, r.label, r.permissions.length])).toEqual([
      ["org.example.pocketlamp", "Tools", 1, 14],
      ["org.example.tidewatch", "Tools", 0, 5],
    ]);
    expect(report.rejects[0]).toEqual({ line: 4, reason: `${ROOT}fixtures/apk/missing.apk: no such file` });
  });
});

describe("splitCsvLine", () => {
  it("follows RFC 4180 quoting", () => {
    expect(splitCsvLine('a,"b,c","d""e",')).toEqual(["a", "b,c", 'd"e', ""]);
    expect(splitCsvLine('"open')).toBeUndefined();
  });
});
