import { describe, expect, it } from "vitest";
import { ByteReader, checkLimit } from "../../../src/extract/binary/reader.js";
import { BinaryXmlError, LimitError } from "../../../src/errors.js";
import { LIMITS } from "../../../src/limits.js";

describe("the byte reader", () => {
  const r = new ByteReader(Uint8Array.from([0x03, 0x00, 0x08, 0x00, 0x78, 0x56, 0x34, 0x12]), (m) => new BinaryXmlError(m));

  it("reads little-endian fields", () => {
    // ResChunk_header of a binary XML file: type 0x0003 (u16), headerSize 8 (u16).
    expect(r.u16(0, "type")).toBe(3);
    expect(r.u16(2, "headerSize")).toBe(8);
    expect(r.u32(4, "size")).toBe(0x12345678);
    expect(r.u8(4, "byte")).toBe(0x78);
  });

  it("names the field that runs past the end, with the decoder's own error", () => {
    expect(() => r.u32(6, "ResStringPool_header.stringCount")).toThrow(BinaryXmlError);
    expect(() => r.u32(6, "ResStringPool_header.stringCount")).toThrow(/stringCount/);
    expect(() => r.need(4, 10, "string data")).toThrow(/string data/);
  });

  it("checks a count against its named limit", () => {
    expect(() => checkLimit("MAX_STRING_COUNT", LIMITS.MAX_STRING_COUNT + 1, "string pool declares a count of")).toThrow(LimitError);
    expect(() => checkLimit("MAX_STRING_COUNT", 5, "string pool declares a count of")).not.toThrow();
  });
});
