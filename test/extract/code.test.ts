import { readFileSync } from "node:fs";
import AdmZip from "adm-zip";
import { describe, expect, it } from "vitest";
import { DEX_ENTRY, readDexEntries } from "../../src/extract/code.js";
import { openArchiveBytes } from "../../src/extract/containers/zip.js";
import { APK_DIR, FIXTURES } from "../helpers/paths.js";

describe("the app's dex entries", () => {
  // fixtures/apk/beamtorch-code.apk holds classes.dex and classes2.dex (unzip -v: fixtures/dumps/beamtorch-code.entries.txt).
  const apk = readFileSync(`${APK_DIR}beamtorch-code.apk`);

  it("are read in their natural order, each with its classes", () => {
    const a = openArchiveBytes(apk);
    const dexes = readDexEntries(a);
    expect(dexes.map((d) => d.entry)).toEqual(["classes.dex", "classes2.dex"]);
    expect(dexes.every((d) => d.dex && d.dex.classes.length > 0)).toBe(true);
  });

  it("put classes10.dex after classes2.dex, as the platform loads them", () => {
    const z = new AdmZip();
    for (const n of ["classes.dex", "classes10.dex", "classes2.dex"]) z.addFile(n, readFileSync(`${FIXTURES}dex/beamtorch-classes2.dex`));
    expect(readDexEntries(openArchiveBytes(z.toBuffer())).map((d) => d.entry)).toEqual(["classes.dex", "classes2.dex", "classes10.dex"]);
  });

  it("cost only their own evidence when damaged: the problem is said, the rest still read", () => {
    const z = new AdmZip(apk);
    z.updateFile("classes2.dex", Buffer.from("dex\n035\0 not really a dex"));
    const dexes = readDexEntries(openArchiveBytes(z.toBuffer()));
    expect(dexes[0].dex).toBeDefined();
    expect(dexes[1]).toMatchObject({ entry: "classes2.dex" });
    expect(dexes[1].problem).toMatch(/./);
  });

  it("are found in a bundle's modules and inside a multi-APK archive's APKs", () => {
    expect(DEX_ENTRY.test("base/dex/classes.dex")).toBe(true);
    expect(DEX_ENTRY.test("feature/dex/classes3.dex")).toBe(true);
    expect(DEX_ENTRY.test("lib/classes.dex")).toBe(false);
    const z = new AdmZip();
    z.addFile("base.apk", apk);
    expect(readDexEntries(openArchiveBytes(z.toBuffer())).map((d) => d.entry)).toEqual(["base.apk!classes.dex", "base.apk!classes2.dex"]);
  });
});
