/**
 * Chunk types and the string pool of the Android resource format (ResourceTypes.h in the platform's
 * androidfw library), shared by the binary XML decoder and the resource table reader.
 */
import { ByteReader, checkLimit } from "./reader.js";

// ResChunk_header.type values (common practice; also visible in any `aapt2 dump chunks` listing).
export const RES_NULL_TYPE = 0x0000;
export const RES_STRING_POOL_TYPE = 0x0001;
export const RES_TABLE_TYPE = 0x0002;
export const RES_XML_TYPE = 0x0003;
export const RES_XML_START_NAMESPACE_TYPE = 0x0100;
export const RES_XML_END_NAMESPACE_TYPE = 0x0101;
export const RES_XML_START_ELEMENT_TYPE = 0x0102;
export const RES_XML_END_ELEMENT_TYPE = 0x0103;
export const RES_XML_CDATA_TYPE = 0x0104;
export const RES_XML_RESOURCE_MAP_TYPE = 0x0180;
export const RES_TABLE_PACKAGE_TYPE = 0x0200;
export const RES_TABLE_TYPE_TYPE = 0x0201;
export const RES_TABLE_TYPE_SPEC_TYPE = 0x0202;

/** Size of ResChunk_header: type (u16), headerSize (u16), size (u32). */
export const CHUNK_HEADER_SIZE = 8;

export interface ChunkHeader {
  offset: number;
  type: number;
  headerSize: number;
  size: number;
}

/**
 * Reads the ResChunk_header at `offset` and checks that the chunk lies within `end`.
 * A header size below 8 or a chunk smaller than its header is a lie we refuse.
 */
export function readChunkHeader(r: ByteReader, offset: number, end: number, what: string): ChunkHeader {
  // One bounds check for the 8-byte header (the message is built only when it fails).
  if (!(offset >= 0 && offset + CHUNK_HEADER_SIZE <= r.length)) r.need(offset, CHUNK_HEADER_SIZE, `${what} chunk header`);
  const type = r.view.getUint16(offset, true); // ResChunk_header.type (u16)
  const headerSize = r.view.getUint16(offset + 2, true); // ResChunk_header.headerSize (u16)
  const size = r.view.getUint32(offset + 4, true); // ResChunk_header.size (u32)
  if (headerSize < CHUNK_HEADER_SIZE || size < headerSize) {
    throw r.fail(
      `${what} chunk 0x${type.toString(16).padStart(4, "0")} at offset ${offset} has header size ${headerSize} and size ${size}`,
    );
  }
  if (offset + size > end) {
    throw r.fail(`${what} chunk 0x${type.toString(16).padStart(4, "0")} at offset ${offset} declares ${size} bytes but only ${end - offset} remain`);
  }
  return { offset, type, headerSize, size };
}

const UTF8_FLAG = 0x100; // ResStringPool_header::UTF8_FLAG

/**
 * A ResStringPool, decoded lazily: strings are read on first use, so a large pool in which we need
 * three strings costs three decodes.
 */
export class StringPool {
  private readonly cache: (string | undefined)[];
  readonly count: number;
  readonly utf8: boolean;
  private readonly offsetsAt: number;
  private readonly stringsAt: number;
  private readonly end: number;

  constructor(
    private readonly r: ByteReader,
    chunk: ChunkHeader,
  ) {
    const base = chunk.offset;
    if (chunk.headerSize < 28) throw r.fail(`string pool header is ${chunk.headerSize} bytes; at least 28 expected`);
    const stringCount = r.u32(base + 8, "string pool stringCount"); // ResStringPool_header.stringCount
    const styleCount = r.u32(base + 12, "string pool styleCount"); // ResStringPool_header.styleCount
    const flags = r.u32(base + 16, "string pool flags"); // ResStringPool_header.flags
    const stringsStart = r.u32(base + 20, "string pool stringsStart"); // ResStringPool_header.stringsStart
    checkLimit("MAX_STRING_COUNT", stringCount, "string pool declares a string count of");
    checkLimit("MAX_STRING_COUNT", styleCount, "string pool declares a style count of");
    this.count = stringCount;
    this.utf8 = (flags & UTF8_FLAG) !== 0;
    this.offsetsAt = base + chunk.headerSize;
    this.end = base + chunk.size;
    if (this.offsetsAt + 4 * (stringCount + styleCount) > this.end) {
      throw r.fail(`string pool declares ${stringCount} strings and ${styleCount} styles, more than its ${chunk.size} bytes can index`);
    }
    this.stringsAt = base + stringsStart;
    if (stringCount > 0 && (stringsStart === 0 || this.stringsAt > this.end)) {
      throw r.fail(`string pool stringsStart ${stringsStart} lies outside the ${chunk.size}-byte pool`);
    }
    this.cache = new Array(stringCount);
  }

  /** The string at `index`, or undefined for the "no string" index 0xffffffff. */
  get(index: number): string | undefined {
    if (index === 0xffffffff) return undefined;
    if (index >= this.count) throw this.r.fail(`string index ${index} is outside the pool of ${this.count} strings`);
    const hit = this.cache[index];
    if (hit !== undefined) return hit;
    const s = this.decode(index);
    this.cache[index] = s;
    return s;
  }

  private decode(index: number): string {
    const r = this.r;
    const rel = r.u32(this.offsetsAt + 4 * index, "string offset");
    let p = this.stringsAt + rel;
    if (p >= this.end) throw r.fail(`string ${index} starts at offset ${rel}, outside the pool`);
    if (this.utf8) {
      // UTF-8 entries: utf16 length (1 or 2 bytes, high bit = two bytes), then byte length (same form).
      let n = r.u8(p, "string length");
      p += n & 0x80 ? 2 : 1;
      let len = r.u8(p, "string byte length");
      if (len & 0x80) {
        len = ((len & 0x7f) << 8) | r.u8(p + 1, "string byte length");
        p += 2;
      } else p += 1;
      checkLimit("MAX_STRING_LENGTH", len, `string ${index} declares a byte length of`);
      if (p + len > this.end) throw r.fail(`string ${index} declares ${len} bytes, past the end of the pool`);
      return shortAscii(r.bytes, p, len, 1) ?? decodeModifiedUtf8(r.bytes.subarray(p, p + len));
    }
    // UTF-16 entries: length in u16 units (one u16, or two when the high bit is set), then the units.
    let len = r.u16(p, "string length");
    p += 2;
    if (len & 0x8000) {
      len = ((len & 0x7fff) << 16) | r.u16(p, "string length");
      p += 2;
    }
    checkLimit("MAX_STRING_LENGTH", len, `string ${index} declares a UTF-16 length of`);
    if (p + 2 * len > this.end) throw r.fail(`string ${index} declares ${len} UTF-16 units, past the end of the pool`);
    return shortAscii(r.bytes, p, len, 2) ?? utf16Decoder.decode(r.bytes.subarray(p, p + 2 * len));
  }
}

/**
 * A short ASCII string read directly (a decoder call costs more than the string for the short names a
 * manifest is made of); undefined when any unit is not ASCII, for the decoder to read exactly as before.
 * `width` is 1 for UTF-8 entries, 2 for UTF-16 (little-endian) ones.
 */
function shortAscii(bytes: Uint8Array, at: number, units: number, width: 1 | 2): string | undefined {
  if (units > 96) return undefined;
  let out = "";
  for (let i = 0; i < units; i++) {
    const lo = bytes[at + i * width];
    if (lo >= 0x80 || lo === 0 || (width === 2 && bytes[at + i * width + 1] !== 0)) return undefined;
    out += String.fromCharCode(lo);
  }
  return out;
}

const utf8Decoder = new TextDecoder("utf-8", { fatal: false });

/**
 * UTF-8 string-pool entries as the toolchain writes them: aapt2 encodes a character outside the Basic
 * Multilingual Plane (an emoji) as its two UTF-16 surrogates, each a 3-byte sequence (CESU-8, "modified
 * UTF-8"), and the platform decodes them back to the one character. A standard UTF-8 decoder would give
 * replacement characters, so surrogate sequences (ED A0–BF xx) are joined here; plain 4-byte UTF-8 is read
 * as it is.
 * @example decodeModifiedUtf8(Uint8Array.of(0xed, 0xa0, 0xbd, 0xed, 0xb3, 0xb6)) // → "📶" (U+1F4F6)
 */
export function decodeModifiedUtf8(bytes: Uint8Array): string {
  let surrogates = false;
  for (let i = 0; i + 1 < bytes.length; i++) if (bytes[i] === 0xed && bytes[i + 1] >= 0xa0) { surrogates = true; break; }
  if (!surrogates) return utf8Decoder.decode(bytes);
  // Decode each 3-byte surrogate sequence to its UTF-16 unit, the rest with the standard decoder.
  let out = "";
  let start = 0;
  for (let i = 0; i + 2 < bytes.length; ) {
    if (bytes[i] === 0xed && bytes[i + 1] >= 0xa0 && bytes[i + 1] <= 0xbf && (bytes[i + 2] & 0xc0) === 0x80) {
      out += utf8Decoder.decode(bytes.subarray(start, i));
      out += String.fromCharCode(0xd000 | ((bytes[i + 1] & 0x3f) << 6) | (bytes[i + 2] & 0x3f));
      i += 3;
      start = i;
    } else i++;
  }
  out += utf8Decoder.decode(bytes.subarray(start));
  // A lone surrogate (a damaged pair) is not text: replace it as a standard decoder would.
  return out.replace(/[\ud800-\udbff](?![\udc00-\udfff])|(?<![\ud800-\udbff])[\udc00-\udfff]/g, "\ufffd");
}
const utf16Decoder = new TextDecoder("utf-16le", { fatal: false });
