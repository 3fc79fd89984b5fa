/**
 * What the platform tolerates, overask tolerates: toolchain-built fixtures transformed the ways obfuscators
 * and odd tools change them must still give the same requested permissions as the untouched files.
 */
import AdmZip from "adm-zip";
import { describe, expect, it } from "vitest";
import { ByteReader } from "../../src/extract/binary/reader.js";
import { StringPool, readChunkHeader } from "../../src/extract/binary/chunks.js";
import { readManifestBytes } from "../../src/extract/index.js";
import { requestedPermissionNames } from "../../src/extract/manifest/model.js";
import { chunksOf, stringPool, u16, u32, xmlDocument } from "../helpers/axml.js";
import { APK_DIR, APK_VARIANTS } from "../helpers/paths.js";

const apk = (v: string) => new AdmZip(`${APK_DIR}${v}.apk`).toBuffer();
const manifestOf = (v: string) => new Uint8Array(new AdmZip(`${APK_DIR}${v}.apk`).getEntry("AndroidManifest.xml")!.getData());
const permissions = (bytes: Uint8Array) => requestedPermissionNames(readManifestBytes(bytes, "t"));

/** The strings of a document's pool, and how many of them the resource map covers (attribute names). */
function poolOf(bytes: Uint8Array): { strings: string[]; mapped: number } {
  const chunks = chunksOf(bytes);
  const c = chunks.find((x) => x.type === 0x0001)!.bytes;
  const r = new ByteReader(c, (m) => new Error(m));
  const pool = new StringPool(r, readChunkHeader(r, 0, c.length, "pool"));
  const map = chunks.find((x) => x.type === 0x0180);
  return { strings: Array.from({ length: pool.count }, (_, i) => pool.get(i) ?? ""), mapped: map ? (map.bytes.length - 8) / 4 : 0 };
}

/** Rebuilds a document with its pool strings changed by `f` (index, string) → string. */
function withStrings(bytes: Uint8Array, f: (i: number, s: string, mapped: number) => string): Uint8Array {
  const { strings, mapped } = poolOf(bytes);
  return xmlDocument(...chunksOf(bytes).map((c) => (c.type === 0x0001 ? stringPool(strings.map((s, i) => f(i, s, mapped)), false) : [...c.bytes])));
}

/** Rebuilds a document with each element chunk changed by `f`. */
function withElements(bytes: Uint8Array, f: (chunk: Uint8Array) => number[][]): Uint8Array {
  return xmlDocument(...chunksOf(bytes).flatMap((c) => (c.type === 0x0102 ? f(c.bytes) : [[...c.bytes]])));
}

const VARIANTS = APK_VARIANTS.filter((v) => v !== "flashdeck"); // flashdeck's 40,000-character value makes these rebuilds slow, not different

describe("transformations the platform tolerates", () => {
  for (const v of VARIANTS) {
    const original = manifestOf(v);
    const expected = permissions(original);

    it(`${v}: attribute name strings emptied (resource ids intact)`, () => {
      expect(permissions(withStrings(original, (i, s, mapped) => (i < mapped ? "" : s)))).toEqual(expected);
    });

    it(`${v}: attribute name strings scrambled`, () => {
      expect(permissions(withStrings(original, (i, s, mapped) => (i < mapped ? `x${i}q` : s)))).toEqual(expected);
    });

    it(`${v}: element chunks with a larger header (padding after the node header)`, () => {
      const padded = withElements(original, (c) => {
        const headerSize = c[2] | (c[3] << 8);
        const size = new DataView(c.buffer, c.byteOffset).getUint32(4, true);
        return [[...c.subarray(0, 2), ...u16(headerSize + 4), ...u32(size + 4), ...c.subarray(8, headerSize), 0, 0, 0, 0, ...c.subarray(headerSize)]];
      });
      expect(permissions(padded)).toEqual(expected);
    });

    it(`${v}: attribute entries of 24 bytes instead of 20`, () => {
      const wide = withElements(original, (c) => {
        const v = new DataView(c.buffer, c.byteOffset, c.byteLength);
        const headerSize = v.getUint16(2, true);
        const ext = headerSize;
        const start = v.getUint16(ext + 8, true);
        const attrSize = v.getUint16(ext + 10, true);
        const count = v.getUint16(ext + 12, true);
        const head = [...c.subarray(0, ext + start)];
        const attrs: number[] = [];
        for (let i = 0; i < count; i++) attrs.push(...c.subarray(ext + start + i * attrSize, ext + start + (i + 1) * attrSize), 0, 0, 0, 0);
        const out = [...head, ...attrs];
        const dv = new DataView(new Uint8Array(out).buffer);
        dv.setUint32(4, out.length, true);
        dv.setUint16(ext + 10, attrSize + 4, true);
        return [[...new Uint8Array(dv.buffer)]];
      });
      expect(permissions(wide)).toEqual(expected);
    });

    it(`${v}: unknown chunk types between elements, and trailing garbage`, () => {
      const unknown = [...u16(0x0777), ...u16(8), ...u32(12), 0xde, 0xad, 0xbe, 0xef];
      const mixed = withElements(original, (c) => [unknown, [...c]]);
      expect(permissions(Uint8Array.from([...mixed, 1, 2, 3, 4, 5]))).toEqual(expected);
    });
  }

  it("entries marked encrypted that are not: read as plain, with a note", () => {
    const buf = apk("tidewatch");
    for (let i = 0; i + 4 <= buf.length; i++) {
      const sig = buf.readUInt32LE(i);
      if (sig === 0x04034b50) buf.writeUInt16LE(buf.readUInt16LE(i + 6) | 1, i + 6); // local header flags
      if (sig === 0x02014b50) buf.writeUInt16LE(buf.readUInt16LE(i + 8) | 1, i + 8); // central header flags
    }
    const m = readManifestBytes(buf, "t.apk");
    expect(requestedPermissionNames(m)).toEqual(permissions(manifestOf("tidewatch")));
    expect(m.notes.join("\n")).toMatch(/marked encrypted in the archive but is read as plain/);
  });

  it("a local header whose compression method disagrees with the central directory: read by the directory, with a note", () => {
    const buf = apk("tidewatch");
    const at = buf.indexOf(Buffer.from([0x50, 0x4b, 0x03, 0x04])); // the first local header is the manifest's
    buf.writeUInt16LE(0, at + 8);
    const m = readManifestBytes(buf, "t.apk");
    expect(requestedPermissionNames(m)).toEqual(permissions(manifestOf("tidewatch")));
    expect(m.notes.join("\n")).toMatch(/local header says compression method 0, the central directory 8/);
  });
});
