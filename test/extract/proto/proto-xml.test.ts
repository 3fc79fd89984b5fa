/**
 * Protobuf manifests (aapt2 --proto-format, app bundles): the shape check that bounds nesting before
 * protobufjs decodes recursively. Wire format from the protobuf encoding guide (common practice): a key is
 * (field << 3) | wire type, wire type 2 is length-delimited with a varint length.
 */
import { describe, expect, it } from "vitest";
import { LimitError, ProtoXmlError } from "../../../src/errors.js";
import { checkProtoXmlShape, decodeProtoXml } from "../../../src/extract/proto/proto-xml.js";
import { LIMITS } from "../../../src/limits.js";

function varint(n: number): number[] {
  const out: number[] = [];
  while (n >= 0x80) {
    out.push((n & 0x7f) | 0x80);
    n = Math.floor(n / 128);
  }
  out.push(n);
  return out;
}
const field = (num: number, body: number[]) => [(num << 3) | 2, ...varint(body.length), ...body];

/** An XmlNode whose element is named `e` and holds `depth − 1` nested elements. */
function nested(depth: number): number[] {
  let node: number[] = field(1, field(3, [0x65])); // XmlNode.element { name: "e" }
  for (let d = 1; d < depth; d++) node = field(1, [...field(3, [0x65]), ...field(5, node)]); // element { name, child: node }
  return node;
}

describe("checkProtoXmlShape", () => {
  it("accepts nesting up to MAX_DEPTH and decodes it", () => {
    expect(() => checkProtoXmlShape(Uint8Array.from(nested(LIMITS.MAX_DEPTH)))).not.toThrow();
    expect(decodeProtoXml(Uint8Array.from(nested(3))).root.children[0].children[0].name).toBe("e");
  });

  it("refuses deeper nesting before decoding, naming the limit", () => {
    expect(() => decodeProtoXml(Uint8Array.from(nested(LIMITS.MAX_DEPTH + 1)))).toThrow(LimitError);
    expect(() => checkProtoXmlShape(Uint8Array.from(nested(LIMITS.MAX_DEPTH + 1)))).toThrow(/MAX_DEPTH/);
  });

  it("leaves bytes it cannot follow to the decoder, which raises a ProtoXmlError", () => {
    expect(() => decodeProtoXml(Uint8Array.from([0x0a, 0xff, 0xff, 0xff, 0xff, 0x0f]))).toThrow(ProtoXmlError);
  });
});
