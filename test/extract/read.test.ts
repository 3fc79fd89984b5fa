import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { InputError } from "../../src/errors.js";
import { readManifestBytes } from "../../src/extract/read.js";
import { tinyManifest } from "../helpers/axml.js";
import { APK_DIR, FIXTURES } from "../helpers/paths.js";

describe("reading a manifest from whatever is handed over", () => {
  // Each kind as the toolchain builds it (scripts/build-fixtures.sh): aapt2's APK, its --proto-format APK,
  // an app bundle and a multi-APK archive; the package is what `aapt dump badging` says (fixtures/dumps).
  const cases: [string, string][] = [
    [`${APK_DIR}tidewatch.apk`, "apk"],
    [`${FIXTURES}bundle/tidewatch-proto.apk`, "proto-apk"],
    [`${FIXTURES}bundle/tidewatch.aab`, "app-bundle"],
    [`${FIXTURES}bundle/tidewatch-splits.apks`, "multi-apk"],
    [`${FIXTURES}bundle/tidewatch-proto-AndroidManifest.pb`, "proto-xml"],
    [`${FIXTURES}apps/tidewatch/AndroidManifest.xml`, "plain-xml"],
  ];
  for (const [file, kind] of cases) {
    it(`tells a ${kind} by its content and reads the same package`, () => {
      const m = readManifestBytes(readFileSync(file), file);
      expect(m.input.kind).toBe(kind);
      expect(m.package).toBe("org.example.tidewatch");
    });
  }

  it("reads a bare binary manifest", () => {
    expect(readManifestBytes(tinyManifest("android.permission.CAMERA")).usesPermissions.map((p) => p.name)).toEqual(["android.permission.CAMERA"]);
  });

  it("names the input in one line for empty or unrecognised bytes", () => {
    expect(() => readManifestBytes(new Uint8Array(), "empty.apk")).toThrow(InputError);
    try {
      readManifestBytes(new TextEncoder().encode("GIF89a not an app"), "picture.gif");
    } catch (e) {
      expect((e as InputError).describe()).toBe("picture.gif: is not an APK, a binary AndroidManifest.xml or an XML manifest (unrecognised content)");
    }
    expect.assertions(2);
  });
});
