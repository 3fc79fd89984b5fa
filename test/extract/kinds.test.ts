import { describe, expect, it } from "vitest";
import { containerOf, CONTAINERS, KIND_INFO, kindsInWords, namedLikeInput, namedLikeManifest, wantedCodeEntry, wantedManifestEntry } from "../../src/extract/kinds.js";

const entry = (name: string) => ({ name, compressedSize: 1, uncompressedSize: 1, method: 0, offset: 0 }) as never;

describe("the registry of input kinds", () => {
  it("names every kind a manifest can record, and tells containers apart in order", () => {
    expect(Object.keys(KIND_INFO).sort()).toEqual(["apk", "app-bundle", "binary-xml", "multi-apk", "plain-xml", "proto-apk", "proto-xml"]);
    // An APK holds AndroidManifest.xml at the top; a bundle base/manifest/AndroidManifest.xml (bundletool's
    // layout, from memory); a multi-APK archive holds APKs at the top.
    expect(containerOf([entry("AndroidManifest.xml"), entry("classes.dex")])?.id).toBe("apk");
    expect(containerOf([entry("base/manifest/AndroidManifest.xml"), entry("base/dex/classes.dex")])?.id).toBe("app-bundle");
    expect(containerOf([entry("base.apk"), entry("split_config.en.apk")])?.id).toBe("multi-apk");
    expect(containerOf([entry("notes.txt")])).toBeUndefined();
    expect(CONTAINERS.map((c) => c.id)).toEqual(["apk", "app-bundle", "multi-apk"]);
  });

  it("opens only the entries its readers need", () => {
    for (const n of ["AndroidManifest.xml", "resources.arsc", "resources.pb", "base/resources.pb", "feature/manifest/AndroidManifest.xml", "split.apk"]) expect(wantedManifestEntry(n), n).toBe(true);
    for (const n of ["res/layout/main.xml", "classes.dex", "lib/arm64-v8a/libx.so"]) expect(wantedManifestEntry(n), n).toBe(false);
    for (const n of ["classes.dex", "classes12.dex", "base/dex/classes2.dex", "split.apk"]) expect(wantedCodeEntry(n), n).toBe(true);
    for (const n of ["assets/classes.dex", "classes.dex.bak"]) expect(wantedCodeEntry(n), n).toBe(false);
  });

  it("says which file names a folder sweep takes without looking inside", () => {
    for (const n of ["a.apk", "B.AAB", "c.apks", "AndroidManifest.xml"]) expect(namedLikeInput(n), n).toBe(true);
    for (const n of ["notes.txt", "a.apk.txt", "image.png"]) expect(namedLikeInput(n), n).toBe(false);
    expect(namedLikeManifest("strings.xml")).toBe(true);
    expect(namedLikeManifest("a.apk")).toBe(false);
  });

  it("words the kinds for help texts", () => {
    expect(kindsInWords()).toBe("APK (.apk), proto-format APK, app bundle (.aab), multi-APK archive (.apks), binary manifest (.xml), protobuf manifest, source manifest (.xml)");
  });
});
