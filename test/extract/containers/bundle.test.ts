/**
 * App bundles and multi-APK archives. Outside check: Debian's aapt2 wrote the protobuf manifests
 * (`aapt2 link --proto-format`) and converted the same build back to binary (`aapt2 convert`); both forms
 * must decode to the same model, and the toolchain's dumps (fixtures/dumps) give the permission lists.
 */
import { readFileSync } from "node:fs";
import AdmZip from "adm-zip";
import { describe, expect, it } from "vitest";
import { InputError, ProtoXmlError } from "../../../src/errors.js";
import { decodeProtoXml } from "../../../src/extract/proto/proto-xml.js";
import { readManifestBytes } from "../../../src/extract/index.js";
import { readManifestFile } from "../../../src/ops/read-manifest.js";
import type { Manifest } from "../../../src/extract/manifest/model.js";
import { diffAgainstDump, parsePermissionsDump, readXmltree } from "../../helpers/aapt-dump.js";
import { DUMP_DIR, FIXTURES } from "../../helpers/paths.js";

const B = `${FIXTURES}bundle/`;

function comparable(m: Manifest): unknown {
  const { input: _i, notes: _n, modules: _mo, compileSdk: _c, compileSdkCodename: _cc, ...rest } = m;
  return JSON.parse(JSON.stringify({ ...rest, usesPermissions: rest.usesPermissions.map(({ module: _m, ...p }) => p) }));
}

describe("protobuf manifests", () => {
  it("decode to the same tree as the binary form aapt2 converts them to (per `aapt dump xmltree`)", () => {
    const doc = decodeProtoXml(readFileSync(`${B}tidewatch-proto-AndroidManifest.pb`));
    expect(doc.encoding).toBe("protobuf");
    expect(diffAgainstDump(doc.root, readXmltree(`${DUMP_DIR}tidewatch-from-proto.xmltree.txt`))).toBeUndefined();
  });

  it("give the same model as the converted binary APK and as the plain source", () => {
    const proto = readManifestFile(`${B}tidewatch-proto-AndroidManifest.pb`);
    const binary = readManifestFile(`${B}tidewatch-from-proto.apk`);
    const source = readManifestFile(`${FIXTURES}apps/tidewatch/AndroidManifest.xml`);
    expect(proto.input.kind).toBe("proto-xml");
    const { label: _l1, labelSource: _s1, ...p } = comparable(proto) as Record<string, unknown>;
    const { label: _l2, labelSource: _s2, ...b } = comparable(binary) as Record<string, unknown>;
    const { label: _l3, labelSource: _s3, ...s } = comparable(source) as Record<string, unknown>;
    expect(p).toEqual(b);
    expect(p).toEqual(s);
  });

  it("refuse bytes that are not a protobuf manifest with a typed error", () => {
    expect(() => decodeProtoXml(Uint8Array.from([0x0a, 0xff, 0xff, 0xff, 0xff, 0x0f]))).toThrow(ProtoXmlError);
    expect(() => readManifestBytes(Uint8Array.from([0x0a, 0x05, 0x01]), "x.pb")).toThrow(/^not a protobuf XML manifest|protobuf/);
  });
});

describe("app bundles (.aab)", () => {
  const m = readManifestFile(`${B}tidewatch.aab`);

  it("read the base module's manifest, with its label resolved through base/resources.pb", () => {
    expect(m.input.kind).toBe("app-bundle");
    expect(m.package).toBe("org.example.tidewatch");
    expect(m.label).toBe("Tidewatch – Gezeiten & Hafen"); // as `aapt dump badging` gives it for the APK
  });

  it("add the feature modules' permissions, saying which module requested what", () => {
    const base = parsePermissionsDump(readFileSync(`${DUMP_DIR}tidewatch.permissions.txt`, "utf8")).map((p) => p.name);
    const feature = parsePermissionsDump(readFileSync(`${DUMP_DIR}tidewatch-ar.permissions.txt`, "utf8")).map((p) => p.name);
    expect(m.modules).toEqual([
      { name: "base", kind: "base", permissions: [...base].sort() },
      { name: "tide_ar", kind: "feature", permissions: [...feature].sort() },
    ]);
    const byModule = Object.fromEntries(m.usesPermissions.map((p) => [p.name, p.module]));
    expect(byModule["android.permission.CAMERA"]).toBe("tide_ar");
    expect(byModule["android.permission.INTERNET"]).toBe("base"); // requested by both: the base's request stands
    expect(new Set(m.usesPermissions.map((p) => p.name))).toEqual(new Set([...base, ...feature]));
  });

  it("refuse a bundle without a base module", () => {
    const z = new AdmZip();
    z.addFile("feature/manifest/AndroidManifest.xml", readFileSync(`${B}tidewatch-proto-AndroidManifest.pb`));
    expect(() => readManifestBytes(z.toBuffer(), "x.aab")).toThrow(/no base\/manifest\/AndroidManifest.xml/);
  });
});

describe("multi-APK archives", () => {
  const m = readManifestFile(`${B}tidewatch-splits.apks`);

  it("take the requested permissions from the base APK, and note what splits ask for", () => {
    expect(m.input.kind).toBe("multi-apk");
    const base = parsePermissionsDump(readFileSync(`${DUMP_DIR}tidewatch.permissions.txt`, "utf8")).map((p) => p.name);
    expect(m.usesPermissions.map((p) => p.name)).toEqual(base);
    expect(m.modules?.map((x) => [x.name, x.kind])).toEqual([["base", "base"], ["tide_ar", "split"]]);
    expect(m.notes.join("\n")).toMatch(/split tide_ar requests android\.permission\.ACCESS_FINE_LOCATION, android\.permission\.CAMERA/);
  });

  it("refuse an archive with two base APKs", () => {
    const z = new AdmZip();
    const apk = readFileSync(`${FIXTURES}apk/tidewatch.apk`);
    z.addFile("a.apk", apk);
    z.addFile("b.apk", apk);
    expect(() => readManifestBytes(z.toBuffer(), "two.apks")).toThrow(InputError);
    expect(() => readManifestBytes(z.toBuffer(), "two.apks")).toThrow(/2 base APKs/);
  });
});

describe("every command takes bundles and multi-APK archives", () => {
  it("check judges the bundle with its feature module's permissions", async () => {
    const { cli } = await import("../../helpers/cli.js");
    const { code, stdout } = await cli(["check", "--format", "json", "-c", "TOOLS", `${B}tidewatch.aab`, `${B}tidewatch-splits.apks`]);
    expect(code).toBe(0);
    const [aab, apks] = JSON.parse(stdout).results;
    expect(aab.package).toBe("org.example.tidewatch");
    expect(apks.package).toBe("org.example.tidewatch");
    // The feature module's CAMERA counts for the bundle; the split's does not for the multi-APK archive.
    expect(aab.risk.whatIf.map((w: { permission: string }) => w.permission)).toContain("android.permission.CAMERA");
    expect(apks.risk.whatIf.map((w: { permission: string }) => w.permission)).not.toContain("android.permission.CAMERA");
  });
});

describe("an APK-shaped zip with a protobuf manifest (aapt2 link --proto-format)", () => {
  it("reads like the binary build of the same manifest", () => {
    // fixtures/bundle/tidewatch-proto.apk: aapt2's --proto-format output; tidewatch.apk: the binary build of the same app.
    const proto = readManifestFile(`${B}tidewatch-proto.apk`);
    const binary = readManifestFile(`${FIXTURES}apk/tidewatch.apk`);
    expect(proto.input.kind).toBe("proto-apk");
    expect([proto.package, proto.versionCode, proto.label]).toEqual([binary.package, binary.versionCode, binary.label]);
    expect(proto.usesPermissions.map((p) => p.name)).toEqual(binary.usesPermissions.map((p) => p.name));
  });
});
