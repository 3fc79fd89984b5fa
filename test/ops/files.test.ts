import { mkdtempSync, readdirSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { CorpusError, InputError, OutputError } from "../../src/errors.js";
import { readTextFile, writeFileAtomic } from "../../src/ops/files.js";

const dir = mkdtempSync(join(tmpdir(), "overask-files-"));

describe("writeFileAtomic", () => {
  it("replaces a file's content and leaves no temporary file behind", () => {
    const p = join(dir, "out.txt");
    writeFileSync(p, "old\n");
    writeFileAtomic(p, "new\n");
    expect(readFileSync(p, "utf8")).toBe("new\n");
    expect(readdirSync(dir).filter((f) => f.endsWith(".tmp"))).toEqual([]);
  });

  it("says in words why a file cannot be written", () => {
    expect(() => writeFileAtomic(join(dir, "no/such/folder/out.txt"), "x")).toThrow(OutputError);
    expect(() => writeFileAtomic(join(dir, "no/such/folder/out.txt"), "x")).toThrow(/the folder does not exist/);
  });
});

describe("readTextFile", () => {
  it("raises the error type asked for, naming the file", () => {
    const p = join(dir, "missing.csv");
    expect(() => readTextFile(p, CorpusError)).toThrow(CorpusError);
    try {
      readTextFile(p);
    } catch (e) {
      expect(e).toBeInstanceOf(InputError);
      expect((e as InputError).describe()).toBe(`${p}: no such file`);
    }
  });
});
