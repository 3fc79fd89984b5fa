import { describe, expect, it } from "vitest";
import { detectKind } from "../../src/extract/detect.js";

const bytes = (...b: number[]) => Uint8Array.from(b);
const text = (s: string) => new TextEncoder().encode(s);

describe("detectKind", () => {
  it("tells each input kind from its first bytes", () => {
    expect(detectKind(bytes(0x50, 0x4b, 0x03, 0x04))).toBe("zip"); // zip local file header signature (PKWARE APPNOTE 4.3.7)
    expect(detectKind(bytes(0x03, 0x00, 0x08, 0x00, 0, 0, 0, 0))).toBe("binary-xml"); // RES_XML_TYPE 0x0003, header size 8
    expect(detectKind(text('<?xml version="1.0"?><manifest/>'))).toBe("plain-xml");
    expect(detectKind(text("\uFEFF  \n<manifest/>"))).toBe("plain-xml");
    expect(detectKind(bytes(0x0a, 0x10, 0x1a))).toBe("proto-xml"); // field 1, wire type 2
    expect(detectKind(text("hello"))).toBe("unknown");
  });
});
