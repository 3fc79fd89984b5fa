/**
 * Decoder for the protobuf XML format of the Android resource toolchain (see resources.proto beside this
 * file): the manifest of an app bundle module, or of an `aapt2 link --proto-format` build. Bytes in, the
 * same XmlDocument as the binary and plain readers out; the manifest model is then built as for them.
 */
import { createRequire } from "node:module";
import type protobufNs from "protobufjs";
import { ProtoXmlError } from "../../errors.js";
import { RESOURCES_PROTO_DESCRIPTOR } from "./generated/descriptor.js";
import { LIMITS } from "../../limits.js";
import { checkLimit } from "../binary/reader.js";
import { typedValue, type TypedValue } from "../binary/values.js";
import { ANDROID_ATTRIBUTE_NAMES } from "../../platform/android-attributes.js";
import { ANDROID_NS, adoptChild, type XmlAttribute, type XmlDocument, type XmlElement } from "../xml-tree.js";

let root: protobufNs.Root | undefined;

function protoType(name: string): protobufNs.Type {
  // The descriptor is generated from resources.proto at build time (scripts/gen.mjs). protobufjs is loaded
  // on the first protobuf manifest only: most inputs are binary XML, and a command starts faster without it.
  const protobuf = createRequire(import.meta.url)("protobufjs") as typeof protobufNs;
  root ??= protobuf.Root.fromJSON(RESOURCES_PROTO_DESCRIPTOR as protobufNs.INamespace);
  return root.lookupType(`overask.aapt.${name}`);
}

const XmlNode = () => protoType("XmlNode");

interface PbTable {
  package?: { package_id?: { id?: number }; type?: { type_id?: { id?: number }; entry?: { entry_id?: { id?: number }; config_value?: { config?: Uint8Array; value?: { item?: PbItem } }[] }[] }[] }[];
}

/**
 * A bundle module's resources.pb, as a resolver of references to their default-configuration values
 * (following references up to MAX_REFERENCE_HOPS, as for resources.arsc).
 */
export function protoResourceResolver(bytes: Uint8Array): (id: number) => TypedValue | undefined {
  checkLimit("MAX_RESOURCE_TABLE_BYTES", bytes.length, "resource table has a size in bytes of");
  let table: PbTable;
  try {
    const type = protoType("ResourceTable");
    table = type.toObject(type.decode(bytes), { defaults: false, longs: Number, enums: Number }) as PbTable;
  } catch (e) {
    throw new ProtoXmlError(`not a protobuf resource table (${(e as Error).message})`);
  }
  const values = new Map<number, TypedValue>();
  for (const pkg of table.package ?? []) {
    for (const type of pkg.type ?? []) {
      for (const entry of type.entry ?? []) {
        const id = (((pkg.package_id?.id ?? 0) << 24) | ((type.type_id?.id ?? 0) << 16) | (entry.entry_id?.id ?? 0)) >>> 0;
        const def = entry.config_value?.find((cv) => !cv.config || cv.config.length === 0);
        if (def?.value?.item) values.set(id, itemValue(def.value.item, undefined));
      }
    }
  }
  return (id) => {
    let v = values.get(id >>> 0);
    for (let hop = 0; v?.kind === "reference" && hop < LIMITS.MAX_REFERENCE_HOPS; hop++) v = values.get(v.id);
    return v?.kind === "reference" ? undefined : v;
  };
}

interface PbPosition { line_number?: number }
interface PbPrimitive {
  float_value?: number; dimension_value?: number; fraction_value?: number; int_decimal_value?: number; int_hexadecimal_value?: number;
  boolean_value?: boolean; color_argb8_value?: number; color_rgb8_value?: number; color_argb4_value?: number; color_rgb4_value?: number;
  dimension_value_deprecated?: number; fraction_value_deprecated?: number; null_value?: object; empty_value?: object;
}
interface PbItem { ref?: { type?: number; id?: number; is_dynamic?: { value?: boolean } }; str?: { value?: string }; raw_str?: { value?: string }; styled_str?: { value?: string }; file?: { path?: string }; prim?: PbPrimitive }
interface PbAttribute { namespace_uri?: string; name?: string; value?: string; resource_id?: number; compiled_item?: PbItem; source?: PbPosition }
interface PbElement { namespace_declaration?: { prefix?: string; uri?: string }[]; namespace_uri?: string; name?: string; attribute?: PbAttribute[]; child?: PbNode[] }
interface PbNode { element?: PbElement; text?: string; source?: PbPosition }

/** Protobuf manifests start with field 1 (the element) as a length-delimited field: byte 0x0a. */
export function looksLikeProtoXml(bytes: Uint8Array): boolean {
  return bytes.length > 2 && bytes[0] === 0x0a;
}

const none = (i: number) => { void i; return undefined; };

function itemValue(item: PbItem, fallback: string | undefined): TypedValue {
  if (item.ref) {
    const dynamic = item.ref.is_dynamic?.value === true;
    return item.ref.type === 1 ? { kind: "attribute", id: (item.ref.id ?? 0) >>> 0, dynamic } : { kind: "reference", id: (item.ref.id ?? 0) >>> 0, dynamic };
  }
  if (item.str) return { kind: "string", value: item.str.value ?? "" };
  if (item.raw_str) return { kind: "string", value: item.raw_str.value ?? "" };
  if (item.styled_str) return { kind: "string", value: item.styled_str.value ?? "" };
  if (item.file) return { kind: "string", value: item.file.path ?? "" };
  const p = item.prim;
  if (p) {
    if (p.int_decimal_value !== undefined) return { kind: "int", value: p.int_decimal_value | 0, hex: false };
    if (p.int_hexadecimal_value !== undefined) return { kind: "int", value: p.int_hexadecimal_value | 0, hex: true };
    if (p.boolean_value !== undefined) return { kind: "boolean", value: p.boolean_value };
    if (p.float_value !== undefined) return { kind: "float", value: p.float_value };
    // Complex values use the same encoding as binary XML's Res_value data.
    if (p.dimension_value !== undefined) return typedValue(0x05, p.dimension_value | 0, none);
    if (p.fraction_value !== undefined) return typedValue(0x06, p.fraction_value | 0, none);
    if (p.color_argb8_value !== undefined) return { kind: "color", argb: p.color_argb8_value >>> 0, form: "argb8" };
    if (p.color_rgb8_value !== undefined) return { kind: "color", argb: p.color_rgb8_value >>> 0, form: "rgb8" };
    if (p.color_argb4_value !== undefined) return { kind: "color", argb: p.color_argb4_value >>> 0, form: "argb4" };
    if (p.color_rgb4_value !== undefined) return { kind: "color", argb: p.color_rgb4_value >>> 0, form: "rgb4" };
    if (p.null_value !== undefined || p.empty_value !== undefined) return { kind: "null" };
  }
  return { kind: "string", value: fallback ?? "" };
}

/** Protobuf wire types (protobuf encoding guide: varint 0, 64-bit 1, length-delimited 2, 32-bit 5). */
const WIRE_VARINT = 0;
const WIRE_I64 = 1;
const WIRE_LEN = 2;
const WIRE_I32 = 5;

/**
 * protobufjs decodes nested messages recursively and has no depth limit, so a manifest nested a
 * hundred thousand elements deep would exhaust the stack inside it. Before decoding, this walks the wire
 * format along the only recursive path of the schema — XmlNode.element (field 1) → XmlElement.child
 * (field 5) → XmlNode — with an explicit stack, checking MAX_DEPTH and MAX_ELEMENT_COUNT. Bytes it cannot
 * make sense of are left to the decoder, which reports them.
 */
export function checkProtoXmlShape(bytes: Uint8Array): void {
  // Each frame: the end of a message, and whether it is an XmlNode (else an XmlElement).
  const stack: { end: number; node: boolean }[] = [{ end: bytes.length, node: true }];
  let elements = 0;
  let p = 0;
  const varint = (): number | undefined => {
    let v = 0;
    for (let shift = 0; shift < 35; shift += 7) {
      if (p >= bytes.length) return undefined;
      const b = bytes[p++];
      v += (b & 0x7f) * 2 ** shift;
      if (b < 0x80) return v;
    }
    return undefined;
  };
  while (stack.length) {
    const frame = stack[stack.length - 1];
    if (p >= frame.end) {
      p = frame.end;
      stack.pop();
      continue;
    }
    const key = varint();
    if (key === undefined) return;
    const field = Math.floor(key / 8);
    const wire = key % 8;
    if (wire === WIRE_VARINT) { if (varint() === undefined) return; continue; }
    if (wire === WIRE_I64) { p += 8; continue; }
    if (wire === WIRE_I32) { p += 4; continue; }
    if (wire !== WIRE_LEN) return;
    const len = varint();
    if (len === undefined || p + len > frame.end) return;
    if ((frame.node && field === 1) || (!frame.node && field === 5)) {
      if (frame.node) {
        elements++;
        checkLimit("MAX_ELEMENT_COUNT", elements, "document has an element count of");
        // Elements so far on the path: every other frame below this one is an XmlNode.
        checkLimit("MAX_DEPTH", Math.ceil(stack.length / 2), "element nesting depth reaches");
      }
      stack.push({ end: p + len, node: !frame.node });
      continue;
    }
    p += len;
  }
}

export function decodeProtoXml(bytes: Uint8Array): XmlDocument {
  checkLimit("MAX_MANIFEST_BYTES", bytes.length, "protobuf XML has a size in bytes of");
  checkProtoXmlShape(bytes);
  let node: PbNode;
  try {
    const type = XmlNode();
    node = type.toObject(type.decode(bytes), { defaults: false, longs: Number, enums: Number }) as PbNode;
  } catch (e) {
    throw new ProtoXmlError(`not a protobuf XML manifest (${(e as Error).message})`);
  }
  if (!node.element) throw new ProtoXmlError("protobuf XML holds no element");
  const namespaces: { prefix: string; uri: string }[] = [];
  let count = 0;
  const convert = (pb: PbNode, parent: XmlElement | undefined, depth: number): XmlElement => {
    count++;
    checkLimit("MAX_ELEMENT_COUNT", count, "document has an element count of");
    checkLimit("MAX_DEPTH", depth, "element nesting depth reaches");
    const e = pb.element!;
    for (const ns of e.namespace_declaration ?? []) namespaces.push({ prefix: ns.prefix ?? "", uri: ns.uri ?? "" });
    checkLimit("MAX_ATTRIBUTE_COUNT", e.attribute?.length ?? 0, `element <${e.name}> declares an attribute count of`);
    const attributes: XmlAttribute[] = (e.attribute ?? []).map((a) => {
      const attr: XmlAttribute = { name: a.name ?? "", value: a.compiled_item ? itemValue(a.compiled_item, a.value) : { kind: "string", value: a.value ?? "" } };
      if (a.namespace_uri) attr.ns = a.namespace_uri;
      if (a.resource_id) {
        attr.resourceId = a.resource_id >>> 0;
        // As for binary XML: android attributes are named by their resource id.
        const known = (attr.resourceId >>> 16) === 0x0101 ? ANDROID_ATTRIBUTE_NAMES.get(attr.resourceId) : undefined;
        if (known) {
          if (known !== attr.name) attr.storedName = attr.name;
          attr.name = known;
          attr.ns = ANDROID_NS;
        }
      }
      return attr;
    });
    const name = e.name ?? "";
    const el: XmlElement = { name, attributes, children: [], path: `/${name}` };
    if (e.namespace_uri) el.ns = e.namespace_uri;
    if (pb.source?.line_number) el.line = pb.source.line_number;
    if (parent) adoptChild(parent, el);
    const text: string[] = [];
    for (const c of e.child ?? []) {
      if (c.element) convert(c, el, depth + 1);
      else if (c.text !== undefined && c.text.trim() !== "") text.push(c.text);
    }
    if (text.length) el.text = text.join("");
    return el;
  };
  const root = convert(node, undefined, 1);
  return { root, encoding: "protobuf", namespaces };
}
