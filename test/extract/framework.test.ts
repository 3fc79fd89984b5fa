/**
 * The platform's own binary manifest: AndroidManifest.xml of framework-res.apk from Debian's
 * android-framework-res (API 29; Apache-2.0, see NOTICE), about 222 KB with a UTF-16 string pool.
 * Reference: `aapt dump xmltree` of the same file (fixtures/platform/*.xmltree.txt, Debian aapt 1:10.0.0+r36-10).
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { decodeBinaryXml } from "../../src/extract/binary/binary-xml.js";
import { readManifestBytes } from "../../src/extract/index.js";
import { protectionFromInt } from "../../src/platform/protection.js";
import { diffAgainstDump, readXmltree } from "../helpers/aapt-dump.js";
import { FIXTURES } from "../helpers/paths.js";

const BIN = readFileSync(`${FIXTURES}platform/framework-res-AndroidManifest.xml`);
const DUMP = readXmltree(`${FIXTURES}platform/framework-res-AndroidManifest.xmltree.txt`);

describe("the platform's framework manifest (API 29)", () => {
  const doc = decodeBinaryXml(BIN);
  const m = readManifestBytes(BIN, "framework-res-AndroidManifest.xml");

  it("is stored with a UTF-16 string pool", () => {
    expect(doc.encoding).toBe("binary-utf16");
  });

  it("decodes element for element as `aapt dump xmltree` shows it", () => {
    expect(diffAgainstDump(doc.root, DUMP)).toBeUndefined();
  });

  it("declares the same <permission> elements, with the same protection levels, as the dump", () => {
    const dumped = DUMP.children
      .filter((e) => e.name === "permission")
      .map((e) => {
        const name = e.attributes.find((a) => a.id === 0x01010003)!.value;
        const level = e.attributes.find((a) => a.id === 0x01010009)?.value;
        return { name: name.kind === "string" ? name.value : "?", level: level?.kind === "typed" ? level.data : 0 };
      });
    // The dump lists 533 <permission> elements (the count is read from it, not from memory).
    expect(dumped).toHaveLength(533);
    expect(m.declaredPermissions.map((d) => ({ name: d.name, level: d.protectionLevel.value }))).toEqual(dumped);
  });

  it("names protection levels as the platform's attribute definition does", () => {
    const byName = new Map(m.declaredPermissions.map((d) => [d.name, d.protectionLevel]));
    // Levels as given in the API 29 framework manifest, cross-checked with the API 34 table in
    // src/platform/data (SOURCES.md) where they did not change.
    expect(byName.get("android.permission.READ_CONTACTS")).toMatchObject({ base: "dangerous", flags: [] });
    expect(byName.get("android.permission.CAMERA")).toMatchObject({ base: "dangerous", flags: ["instant"] });
    expect(byName.get("android.permission.INSTALL_PACKAGES")).toMatchObject({ base: "signature", flags: ["privileged"] });
    expect(byName.get("android.permission.SYSTEM_ALERT_WINDOW")?.flags).toEqual(expect.arrayContaining(["appop", "pre23", "development"]));
    expect(protectionFromInt(0x12).flags).toEqual(["privileged"]);
  });

  it("reads 14 requested permissions and 54 components", () => {
    // Counts taken from the dump: 14 <uses-permission> and 54 component elements under <application>.
    const countIn = (names: string[]) => DUMP.children.filter((e) => names.includes(e.name)).length
      + (DUMP.children.find((e) => e.name === "application")?.children.filter((e) => names.includes(e.name)).length ?? 0);
    expect(m.usesPermissions).toHaveLength(countIn(["uses-permission"]));
    expect(m.components).toHaveLength(countIn(["activity", "activity-alias", "service", "receiver", "provider"]));
  });
});
