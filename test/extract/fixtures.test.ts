/**
 * Every fixture APK against the Android toolchain's own view of it. The dumps under fixtures/dumps/ were
 * written by Debian's aapt 1:10.0.0+r36-10 (`aapt dump permissions|xmltree|badging`) from APKs built by
 * the same toolchain (scripts/build-fixtures.sh): an outside source for every value compared here.
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import AdmZip from "adm-zip";
import { decodeBinaryXml } from "../../src/extract/binary/binary-xml.js";
import { readManifestFile } from "../../src/ops/read-manifest.js";
import type { Manifest } from "../../src/extract/manifest/model.js";
import { diffAgainstDump, parsePermissionsDump, readXmltree } from "../helpers/aapt-dump.js";
import { APK_DIR, APK_VARIANTS, DUMP_DIR, FIXTURES, appOf } from "../helpers/paths.js";

function manifestBytes(variant: string, entry = "AndroidManifest.xml"): Uint8Array {
  return new AdmZip(`${APK_DIR}${variant}.apk`).getEntry(entry)!.getData();
}

/** The parts of the model that must not depend on how the manifest was stored. */
function comparable(m: Manifest): unknown {
  const { input: _input, label: _label, labelSource: _ls, compileSdk: _c, compileSdkCodename: _cc, notes: _n, ...rest } = m;
  return JSON.parse(JSON.stringify(rest));
}

describe("fixture APKs built by the Android toolchain", () => {
  it("has the variants the tests rely on", () => {
    expect(APK_VARIANTS).toEqual(["beamtorch", "beamtorch-code", "chirpchat", "echomemo", "flashdeck", "harbourtalk", "lumenedit", "pocketlamp", "quillnote", "quillnote-test", "snapqr", "snapshare", "stridecoach", "tidewatch", "tidewatch-next", "tidewatch-stored", "townsquare", "townsquare-nons"]);
  });

  for (const variant of APK_VARIANTS) {
    describe(variant, () => {
      const apk = `${APK_DIR}${variant}.apk`;
      const m = readManifestFile(apk);

      it("requests exactly the permissions `aapt dump permissions` lists, in order", () => {
        // Source: Debian aapt 1:10.0.0+r36-10, `aapt dump permissions` (fixtures/dumps/<variant>.permissions.txt).
        const dumped = parsePermissionsDump(readFileSync(`${DUMP_DIR}${variant}.permissions.txt`, "utf8"));
        const decoded = m.usesPermissions.map((p) => ({ element: p.element, name: p.name, ...(p.maxSdkVersion !== undefined ? { maxSdkVersion: p.maxSdkVersion } : {}) }));
        expect(decoded).toEqual(dumped);
      });

      it("decodes every element, attribute id, value and line as `aapt dump xmltree` shows them", () => {
        // Source: Debian aapt, `aapt dump xmltree <apk> AndroidManifest.xml`.
        const doc = decodeBinaryXml(manifestBytes(variant));
        expect(diffAgainstDump(doc.root, readXmltree(`${DUMP_DIR}${variant}.xmltree.txt`))).toBeUndefined();
      });

      it("gives the same package, versions, SDKs and label as `aapt dump badging`", () => {
        // Source: Debian aapt, `aapt dump badging` (fixtures/dumps/<variant>.badging.txt).
        const badging = readFileSync(`${DUMP_DIR}${variant}.badging.txt`, "utf8");
        const pkg = /^package: name='([^']*)' versionCode='(\d+)' versionName='([^']*)'/m.exec(badging)!;
        expect([m.package, String(m.versionCode), m.versionName]).toEqual([pkg[1], pkg[2], pkg[3]]);
        expect(String(m.minSdk)).toBe(/^sdkVersion:'(\d+)'/m.exec(badging)![1]);
        expect(String(m.targetSdk)).toBe(/^targetSdkVersion:'(\d+)'/m.exec(badging)![1]);
        // badging prints application-label only for a label from resources; a literal one is in the xmltree dump.
        const label = /^application-label:'(.*)'$/m.exec(badging)?.[1] ?? /android:label\(0x01010001\)="([^"]*)"/.exec(readFileSync(`${DUMP_DIR}${variant}.xmltree.txt`, "utf8"))?.[1];
        expect(m.label).toBe(label);
        const compile = /compileSdkVersion='(\d+)'/.exec(badging);
        if (compile) expect(m.compileSdk).toBe(Number(compile[1]));
      });

      it("decodes to the same model as its plain source manifest", () => {
        const source = readManifestFile(`${FIXTURES}apps/${appOf(variant)}/AndroidManifest.xml`);
        expect(comparable(m)).toEqual(comparable(source));
      });
    });
  }

  it("reads stored and deflated manifest entries alike", () => {
    const stored = readManifestFile(`${APK_DIR}tidewatch-stored.apk`);
    const deflated = readManifestFile(`${APK_DIR}tidewatch.apk`);
    expect(stored.input.entry?.method).toBe("stored");
    expect(deflated.input.entry?.method).toBe("deflated");
    expect(comparable(stored)).toEqual(comparable(deflated));
  });

  it("resolves the label through resources.arsc, non-ASCII text included", () => {
    const m = readManifestFile(`${APK_DIR}tidewatch.apk`);
    expect(m.label).toBe("Tidewatch – Gezeiten & Hafen");
    expect(m.labelSource).toBe("resource");
    expect(m.application.networkSecurityConfig).toBe(true);
  });

  it("keeps a literal non-ASCII label and a 40,000-unit string (UTF-16 two-unit length)", () => {
    const m = readManifestFile(`${APK_DIR}flashdeck.apk`);
    expect(m.label).toBe("Lernkarten · 学习卡 · Карточки");
    expect(m.labelSource).toBe("literal");
    expect(m.metaData[0].value).toHaveLength(40000);
    expect(m.input.encoding).toBe("binary-utf16");
    expect(m.appCategory).toBe("productivity");
  });

  it("decodes a toolchain-written UTF-8 binary XML (res/xml) as `aapt dump xmltree` shows it", () => {
    const bytes = manifestBytes("tidewatch", "res/xml/network_security_config.xml");
    const doc = decodeBinaryXml(bytes);
    expect(doc.encoding).toBe("binary-utf8");
    expect(diffAgainstDump(doc.root, readXmltree(`${DUMP_DIR}tidewatch.network_security_config.xmltree.txt`))).toBeUndefined();
  });

  it("resolves attributes by resource id in a build without XML namespaces", () => {
    const stripped = readManifestFile(`${APK_DIR}townsquare-nons.apk`);
    const normal = readManifestFile(`${APK_DIR}townsquare.apk`);
    expect(comparable(stripped)).toEqual(comparable(normal));
  });

  it("reads a bare binary AndroidManifest.xml taken out of an APK", async () => {
    const { readManifestBytes } = await import("../../src/extract/index.js");
    const m = readManifestBytes(manifestBytes("chirpchat"), "AndroidManifest.xml");
    expect(m.input.kind).toBe("binary-xml");
    expect(m.label).toBe("@0x7f010000"); // no resources.arsc beside a bare manifest: shown, never dropped
    expect(m.labelSource).toBe("unresolved");
  });
});
