import { describe, expect, it } from "vitest";
import { formatResourceId, typedValue, valueToText, TYPE_DIMENSION, TYPE_INT_BOOLEAN, TYPE_INT_COLOR_ARGB8, TYPE_INT_DEC, TYPE_INT_HEX, TYPE_REFERENCE, TYPE_STRING } from "../../../src/extract/binary/values.js";

const none = () => undefined;

describe("Res_value", () => {
  // The textual forms are aapt's in `aapt dump xmltree` (fixtures/dumps/*.xmltree.txt): references as
  // @0x7f…, ints by value; dimensions as in ResourceTypes.h (complex: 24-bit mantissa, radix, unit).
  it("decodes integers, booleans, strings and references as aapt prints them", () => {
    expect(valueToText(typedValue(TYPE_INT_DEC, 34, none))).toBe("34");
    expect(valueToText(typedValue(TYPE_INT_HEX, 0x10, none))).toBe("0x10");
    expect(typedValue(TYPE_INT_BOOLEAN, -1, none)).toEqual({ kind: "boolean", value: true });
    expect(typedValue(TYPE_STRING, 2, (i) => ["a", "b", "c"][i])).toEqual({ kind: "string", value: "c" });
    expect(valueToText(typedValue(TYPE_REFERENCE, 0x7f0a0001, none))).toBe("@0x7f0a0001");
    expect(formatResourceId(0x01010003, "?")).toBe("?0x01010003");
  });

  it("decodes a dimension from its complex form: 16dp is mantissa 16 at radix 23p0, unit dp", () => {
    // 16 << 8 (mantissa, radix 0) | unit 1 (COMPLEX_UNIT_DIP, printed dp)
    expect(typedValue(TYPE_DIMENSION, (16 << 8) | 1, none)).toEqual({ kind: "dimension", value: 16, unit: "dp" });
  });

  it("keeps a colour's form and an unknown type's raw data", () => {
    expect(valueToText(typedValue(TYPE_INT_COLOR_ARGB8, 0xff336699 | 0, none))).toBe("#ff336699");
    expect(valueToText(typedValue(0x55, 7, none))).toBe("(type 0x55)0x7");
  });
});
