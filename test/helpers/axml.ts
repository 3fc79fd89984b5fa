/**
 * A tiny writer for Android binary XML, used to build malformed and transformed inputs next to the
 * tests that need them. Layout as in ResourceTypes.h (ResChunk_header, ResStringPool_header, ResXMLTree_*).
 */

export function u16(n: number): number[] {
  return [n & 0xff, (n >>> 8) & 0xff];
}
export function u32(n: number): number[] {
  return [n & 0xff, (n >>> 8) & 0xff, (n >>> 16) & 0xff, (n >>> 24) & 0xff];
}

/** Encodes a ResStringPool chunk holding `strings`, in UTF-8 or UTF-16. */
export function stringPool(strings: string[], utf8: boolean): number[] {
  const data: number[] = [];
  const offsets: number[] = [];
  for (const s of strings) {
    offsets.push(data.length);
    if (utf8) {
      const bytes = [...new TextEncoder().encode(s)];
      const units = s.length;
      data.push(...(units > 0x7f ? [0x80 | (units >> 8), units & 0xff] : [units]));
      data.push(...(bytes.length > 0x7f ? [0x80 | (bytes.length >> 8), bytes.length & 0xff] : [bytes.length]));
      data.push(...bytes, 0);
    } else {
      const units = s.length;
      data.push(...(units > 0x7fff ? [...u16(0x8000 | (units >>> 16)), ...u16(units & 0xffff)] : u16(units)));
      for (let i = 0; i < s.length; i++) data.push(...u16(s.charCodeAt(i)));
      data.push(0, 0);
    }
  }
  while (data.length % 4) data.push(0);
  const headerSize = 28;
  const stringsStart = headerSize + 4 * strings.length;
  const size = stringsStart + data.length;
  return [
    ...u16(0x0001), ...u16(headerSize), ...u32(size),
    ...u32(strings.length), ...u32(0), ...u32(utf8 ? 0x100 : 0), ...u32(stringsStart), ...u32(0),
    ...offsets.flatMap(u32),
    ...data,
  ];
}

export function resourceMap(ids: number[]): number[] {
  return [...u16(0x0180), ...u16(8), ...u32(8 + 4 * ids.length), ...ids.flatMap(u32)];
}

export interface Attr { ns?: number; name: number; raw?: number; type: number; data: number }

export function startElement(name: number, attrs: Attr[], line = 1, ns = 0xffffffff, attributeSize = 20): number[] {
  const ext = [...u32(ns), ...u32(name), ...u16(20), ...u16(attributeSize), ...u16(attrs.length), ...u16(0), ...u16(0), ...u16(0)];
  const body = attrs.flatMap((a) => {
    const one = [...u32(a.ns ?? 0xffffffff), ...u32(a.name), ...u32(a.raw ?? 0xffffffff), ...u16(8), 0, a.type, ...u32(a.data)];
    while (one.length < attributeSize) one.push(0);
    return one;
  });
  const size = 16 + ext.length + body.length;
  return [...u16(0x0102), ...u16(16), ...u32(size), ...u32(line), ...u32(0xffffffff), ...ext, ...body];
}

export function endElement(name: number, ns = 0xffffffff): number[] {
  return [...u16(0x0103), ...u16(16), ...u32(24), ...u32(0), ...u32(0xffffffff), ...u32(ns), ...u32(name)];
}

/** Wraps chunks in the outer RES_XML_TYPE chunk. */
export function xmlDocument(...chunks: number[][]): Uint8Array {
  const body = chunks.flat();
  return Uint8Array.from([...u16(0x0003), ...u16(8), ...u32(8 + body.length), ...body]);
}

/** Splits a binary XML file into its top-level chunks (type and bytes). */
export function chunksOf(bytes: Uint8Array): { type: number; bytes: Uint8Array }[] {
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const out: { type: number; bytes: Uint8Array }[] = [];
  for (let p = 8; p + 8 <= view.getUint32(4, true); ) {
    const size = view.getUint32(p + 4, true);
    out.push({ type: view.getUint16(p, true), bytes: bytes.subarray(p, p + size) });
    p += size;
  }
  return out;
}

/** A minimal valid manifest: <manifest package="org.example.tiny"><uses-permission android:name="…"/></manifest>. */
export function tinyManifest(permission = "android.permission.INTERNET", utf8 = false): Uint8Array {
  // strings: 0 name (attr, id 0x01010003), 1 android uri, 2 package, 3 manifest, 4 org.example.tiny, 5 uses-permission, 6 permission, 7 android
  const strings = ["name", "http://schemas.android.com/apk/res/android", "package", "manifest", "org.example.tiny", "uses-permission", permission, "android"];
  return xmlDocument(
    stringPool(strings, utf8),
    resourceMap([0x01010003]),
    [...u16(0x0100), ...u16(16), ...u32(24), ...u32(1), ...u32(0xffffffff), ...u32(7), ...u32(1)],
    startElement(3, [{ name: 2, raw: 4, type: 0x03, data: 4 }], 1),
    startElement(5, [{ ns: 1, name: 0, raw: 6, type: 0x03, data: 6 }], 2),
    endElement(5),
    endElement(3),
    [...u16(0x0101), ...u16(16), ...u32(24), ...u32(1), ...u32(0xffffffff), ...u32(7), ...u32(1)],
  );
}
