import { describe, expect, it } from "vitest";
import { decodeModifiedUtf8 } from "../../../src/extract/binary/chunks.js";

describe("decodeModifiedUtf8", () => {
  it("joins surrogate pairs written as two 3-byte sequences (CESU-8), as aapt2 writes characters outside the BMP", () => {
    // U+1F4F6 (📶) = surrogates D83D DCF6 → ED A0 BD ED B3 B6 in CESU-8 (common practice: CESU-8 encodes each UTF-16 unit).
    expect(decodeModifiedUtf8(Uint8Array.of(0x53, 0x65, 0xc3, 0xb1, 0x61, 0x6c, 0x20, 0xed, 0xa0, 0xbd, 0xed, 0xb3, 0xb6))).toBe("Señal 📶");
  });

  it("reads plain UTF-8, 4-byte sequences included, as it is", () => {
    const s = "Señal 📶 – Hafen";
    expect(decodeModifiedUtf8(new TextEncoder().encode(s))).toBe(s);
  });

  it("replaces a lone surrogate, as a standard decoder would", () => {
    expect(decodeModifiedUtf8(Uint8Array.of(0x61, 0xed, 0xa0, 0xbd, 0x62))).toBe("a\ufffdb");
  });
});
