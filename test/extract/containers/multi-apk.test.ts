import { readFileSync } from "node:fs";
import AdmZip from "adm-zip";
import { describe, expect, it } from "vitest";
import { InputError } from "../../../src/errors.js";
import { readManifestBytes } from "../../../src/extract/read.js";
import { FIXTURES, APK_DIR } from "../../helpers/paths.js";

describe("a multi-APK archive", () => {
  // fixtures/bundle/tidewatch-splits.apks: base.apk and split_tide_ar.apk (scripts/build-fixtures.sh).
  const bytes = readFileSync(`${FIXTURES}bundle/tidewatch-splits.apks`);

  it("is governed by its base APK, with each split's requests listed by module", () => {
    const m = readManifestBytes(bytes);
    expect(m.input.kind).toBe("multi-apk");
    expect(m.modules?.map((x) => [x.name, x.kind])).toEqual([["base", "base"], ["tide_ar", "split"]]);
    expect(m.usesPermissions.every((p) => p.module === "base")).toBe(true);
  });

  it("refuses an archive with no base APK, or two", () => {
    const two = new AdmZip();
    two.addFile("a.apk", readFileSync(`${APK_DIR}tidewatch.apk`));
    two.addFile("b.apk", readFileSync(`${APK_DIR}chirpchat.apk`));
    expect(() => readManifestBytes(two.toBuffer())).toThrow(/has 2 base APKs/);
  });

  it("names the nested APK in an error inside it", () => {
    const z = new AdmZip();
    z.addFile("base.apk", Buffer.from("PK\x03\x04 not really"));
    try {
      readManifestBytes(z.toBuffer(), "set.apks");
      expect.unreachable();
    } catch (e) {
      expect((e as InputError).describe()).toMatch(/^set\.apks: base\.apk: no end of central directory record/);
    }
  });
});
