import AdmZip from "adm-zip";
import { describe, expect, it } from "vitest";
import { BinaryXmlError, LimitError } from "../../../src/errors.js";
import { decodeBinaryXml } from "../../../src/extract/binary/binary-xml.js";
import { ByteReader } from "../../../src/extract/binary/reader.js";
import { StringPool, readChunkHeader } from "../../../src/extract/binary/chunks.js";
import { readManifestBytes } from "../../../src/extract/index.js";
import { chunksOf, endElement, resourceMap, startElement, stringPool, tinyManifest, u16, u32, xmlDocument } from "../../helpers/axml.js";
import { APK_DIR } from "../../helpers/paths.js";

const realManifest = (variant: string) => new AdmZip(`${APK_DIR}${variant}.apk`).getEntry("AndroidManifest.xml")!.getData();

/** Re-encodes the string pool of a real manifest in the other encoding, leaving every other chunk as it was. */
function reencodePool(bytes: Uint8Array, utf8: boolean): Uint8Array {
  const chunks = chunksOf(bytes);
  return xmlDocument(
    ...chunks.map((c) => {
      if (c.type !== 0x0001) return [...c.bytes];
      const r = new ByteReader(c.bytes, (m) => new Error(m));
      const pool = new StringPool(r, readChunkHeader(r, 0, c.bytes.length, "pool"));
      return stringPool(Array.from({ length: pool.count }, (_, i) => pool.get(i) ?? ""), utf8);
    }),
  );
}

describe("decodeBinaryXml", () => {
  it("decodes a hand-built manifest in either string encoding", () => {
    for (const utf8 of [false, true]) {
      const m = readManifestBytes(tinyManifest("android.permission.CAMERA", utf8));
      expect(m.package).toBe("org.example.tiny");
      expect(m.usesPermissions.map((p) => p.name)).toEqual(["android.permission.CAMERA"]);
      expect(m.input.encoding).toBe(utf8 ? "binary-utf8" : "binary-utf16");
    }
  });

  it("reads a toolchain manifest re-encoded with a UTF-8 pool exactly as the UTF-16 original", () => {
    const original = realManifest("chirpchat");
    const utf8 = reencodePool(original, true);
    const a = decodeBinaryXml(original);
    const b = decodeBinaryXml(utf8);
    expect(b.encoding).toBe("binary-utf8");
    expect(b.root).toEqual(a.root);
  });

  it("reads UTF-8 strings over 127 bytes and UTF-16 strings over 32,767 units (two-part lengths)", () => {
    const long8 = "ü".repeat(200); // 200 units, 400 bytes: both lengths take two bytes
    const long16 = "x".repeat(40_000);
    for (const [s, utf8] of [[long8, true], [long16, false]] as const) {
      const m = readManifestBytes(tinyManifest(s, utf8));
      expect(m.usesPermissions[0].name).toBe(s);
    }
  });

  it("names android attributes by resource id even when their name strings are scrambled", () => {
    const strings = ["zz", "http://schemas.android.com/apk/res/android", "package", "manifest", "org.example.tiny", "uses-permission", "android.permission.SEND_SMS"];
    const doc = xmlDocument(
      stringPool(strings, false),
      resourceMap([0x01010003]),
      startElement(3, [{ name: 2, raw: 4, type: 0x03, data: 4 }]),
      startElement(5, [{ ns: 1, name: 0, raw: 6, type: 0x03, data: 6 }], 2),
      endElement(5),
      endElement(3),
    );
    const tree = decodeBinaryXml(doc);
    expect(tree.root.children[0].attributes[0]).toMatchObject({ name: "name", storedName: "zz", resourceId: 0x01010003 });
    expect(readManifestBytes(doc).usesPermissions[0].name).toBe("android.permission.SEND_SMS");
  });

  it("decodes typed values: float, dimension, fraction, colour, hex int, boolean and references", () => {
    const strings = ["manifest", "a", "b", "c", "d", "e", "f", "g", "h"];
    const f32 = new DataView(new ArrayBuffer(4));
    f32.setFloat32(0, 1.5, true);
    const doc = decodeBinaryXml(
      xmlDocument(
        stringPool(strings, true),
        startElement(0, [
          { name: 1, type: 0x04, data: f32.getInt32(0, true) },
          { name: 2, type: 0x05, data: (16 << 8) | 1 }, // 16dp, radix 23p0
          { name: 3, type: 0x06, data: (1 << 8) | (3 << 4) | 0 }, // mantissa 1, radix 0p23
          { name: 4, type: 0x1c, data: 0xff00ff00 | 0 },
          { name: 5, type: 0x11, data: 0x20000 },
          { name: 6, type: 0x12, data: -1 },
          { name: 7, type: 0x01, data: 0x7f010000 },
          { name: 8, type: 0x02, data: 0x01010036 },
        ]),
        endElement(0),
      ),
    );
    const v = doc.root.attributes.map((a) => a.value);
    expect(v[0]).toEqual({ kind: "float", value: 1.5 });
    expect(v[1]).toEqual({ kind: "dimension", value: 16, unit: "dp" });
    expect(v[2]).toMatchObject({ kind: "fraction", unit: "%" });
    expect(v[3]).toEqual({ kind: "color", argb: 0xff00ff00, form: "argb8" });
    expect(v[4]).toEqual({ kind: "int", value: 0x20000, hex: true });
    expect(v[5]).toEqual({ kind: "boolean", value: true });
    expect(v[6]).toEqual({ kind: "reference", id: 0x7f010000, dynamic: false });
    expect(v[7]).toEqual({ kind: "attribute", id: 0x01010036, dynamic: false });
  });

  it("skips unknown chunks by their declared size", () => {
    const bytes = tinyManifest();
    const chunks = chunksOf(bytes).map((c) => [...c.bytes]);
    const unknown = [...u16(0x0777), ...u16(8), ...u32(16), 1, 2, 3, 4, 5, 6, 7, 8];
    const withUnknown = xmlDocument(chunks[0], unknown, ...chunks.slice(1));
    expect(readManifestBytes(withUnknown).usesPermissions[0].name).toBe("android.permission.INTERNET");
  });

  it("ignores trailing bytes after the XML chunk", () => {
    const bytes = tinyManifest();
    const padded = Uint8Array.from([...bytes, 0xde, 0xad, 0xbe, 0xef]);
    expect(readManifestBytes(padded).package).toBe("org.example.tiny");
  });

  it("accepts attribute entries larger than the usual 20 bytes", () => {
    const strings = ["name", "http://schemas.android.com/apk/res/android", "package", "manifest", "org.example.tiny", "uses-permission", "android.permission.CAMERA"];
    const doc = xmlDocument(
      stringPool(strings, false),
      resourceMap([0x01010003]),
      startElement(3, [{ name: 2, raw: 4, type: 0x03, data: 4 }], 1, 0xffffffff, 28),
      startElement(5, [{ ns: 1, name: 0, raw: 6, type: 0x03, data: 6 }], 2, 0xffffffff, 28),
      endElement(5),
      endElement(3),
    );
    expect(readManifestBytes(doc).usesPermissions[0].name).toBe("android.permission.CAMERA");
  });
});

describe("decodeBinaryXml on malformed input", () => {
  it("refuses a file cut short inside a chunk", () => {
    const bytes = tinyManifest();
    expect(() => decodeBinaryXml(bytes.subarray(0, 60))).toThrow(BinaryXmlError);
    expect(() => decodeBinaryXml(bytes.subarray(0, 60))).toThrow(/declares \d+ bytes but only \d+ remain/);
  });

  it("refuses a string offset that points outside the pool", () => {
    const bytes = tinyManifest().slice();
    // First string offset sits right after the 8-byte document header and the 28-byte pool header.
    new DataView(bytes.buffer).setUint32(8 + 28, 0x00ffffff, true);
    expect(() => decodeBinaryXml(bytes)).toThrow(BinaryXmlError);
  });

  it("refuses a pool declaring more strings than MAX_STRING_COUNT", () => {
    const bytes = tinyManifest().slice();
    new DataView(bytes.buffer).setUint32(8 + 8, 9_000_000, true); // ResStringPool_header.stringCount
    expect(() => decodeBinaryXml(bytes)).toThrow(LimitError);
    expect(() => decodeBinaryXml(bytes)).toThrow(/string count of 9000000; the limit \(MAX_STRING_COUNT\)/);
  });

  it("refuses an element declaring more attributes than its chunk holds", () => {
    const strings = ["manifest", "a"];
    const el = startElement(0, [{ name: 1, type: 0x10, data: 1 }]);
    el[16 + 12] = 0xff; // attributeCount = 255 while one is present
    expect(() => decodeBinaryXml(xmlDocument(stringPool(strings, false), el, endElement(0)))).toThrow(/declares 255 attributes, more than its chunk holds/);
  });

  it("refuses nesting deeper than MAX_DEPTH", () => {
    const strings = ["e"];
    const opens = Array.from({ length: 300 }, () => startElement(0, []));
    expect(() => decodeBinaryXml(xmlDocument(stringPool(strings, false), ...opens))).toThrow(/MAX_DEPTH/);
  });

  it("refuses element data before the string pool", () => {
    expect(() => decodeBinaryXml(xmlDocument(startElement(0, [])))).toThrow(/before the string pool/);
  });

  it("refuses a chunk whose header size is smaller than a chunk header", () => {
    const bad = xmlDocument([...u16(0x0001), ...u16(4), ...u32(8)]);
    expect(() => decodeBinaryXml(bad)).toThrow(/header size 4/);
  });

  it("refuses text and random bytes", () => {
    expect(() => decodeBinaryXml(new TextEncoder().encode("<manifest/>"))).toThrow(/is not a compiled Android binary XML file/);
  });
});
