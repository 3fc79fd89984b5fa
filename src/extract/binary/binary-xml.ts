/**
 * Decoder for Android binary XML, the chunked format the resource compiler writes for
 * AndroidManifest.xml and res/xml files (ResourceTypes.h: ResXMLTree_*). Bytes in, tree out; no I/O.
 *
 * Android-namespace attributes are named by the resource id the resource map gives them, not by the
 * name string: the platform's parser resolves attributes by id, so builds that strip or scramble the
 * name strings still mean the same thing to it. The ids are the ones `aapt dump xmltree` prints, as in
 * `android:name(0x01010003)`.
 */
import { BinaryXmlError } from "../../errors.js";
import { ANDROID_ATTRIBUTE_NAMES } from "../../platform/android-attributes.js";
import { ANDROID_NS, adoptChild, type XmlAttribute, type XmlDocument, type XmlElement } from "../xml-tree.js";
import {
  RES_STRING_POOL_TYPE,
  RES_XML_CDATA_TYPE,
  RES_XML_END_ELEMENT_TYPE,
  RES_XML_END_NAMESPACE_TYPE,
  RES_XML_RESOURCE_MAP_TYPE,
  RES_XML_START_ELEMENT_TYPE,
  RES_XML_START_NAMESPACE_TYPE,
  StringPool,
  readChunkHeader,
} from "./chunks.js";
import { ByteReader, checkLimit } from "./reader.js";
import { typedValue } from "./values.js";

/** The first four bytes of every binary XML file: RES_XML_TYPE (0x0003) with an 8-byte header. */
export function looksLikeBinaryXml(bytes: Uint8Array): boolean {
  return bytes.length >= 8 && bytes[0] === 0x03 && bytes[1] === 0x00 && bytes[2] === 0x08 && bytes[3] === 0x00;
}

/** The smallest ResXMLTree_attribute: ns, name, rawValue (u32 each) and an 8-byte Res_value. */
const MIN_ATTRIBUTE_SIZE = 20;

export function decodeBinaryXml(bytes: Uint8Array): XmlDocument {
  const r = new ByteReader(bytes, (m) => new BinaryXmlError(m));
  checkLimit("MAX_MANIFEST_BYTES", bytes.length, "binary XML has a size in bytes of");
  if (!looksLikeBinaryXml(bytes)) throw new BinaryXmlError("is not a compiled Android binary XML file (it lacks the binary XML header)");
  // The outer chunk may claim less than the file holds (trailing bytes are ignored, as by the platform),
  // but not more.
  const outer = readChunkHeader(r, 0, bytes.length, "XML");
  const end = outer.size;

  let pool: StringPool | undefined;
  let resourceIds: Uint32Array | undefined;
  const namespaces: { prefix: string; uri: string }[] = [];
  const stack: XmlElement[] = [];
  let root: XmlElement | undefined;
  let elementCount = 0;
  let text: string[] | undefined;

  const str = (i: number): string | undefined => {
    if (!pool) throw new BinaryXmlError("element data appears before the string pool");
    return pool.get(i);
  };

  let p = outer.headerSize;
  while (p + 8 <= end) {
    const c = readChunkHeader(r, p, end, "XML");
    const body = p + c.headerSize;
    switch (c.type) {
      case RES_STRING_POOL_TYPE:
        // The first pool is the document's; a second one is not written by any toolchain, and the
        // platform reads only the first.
        if (!pool) pool = new StringPool(r, c);
        break;
      case RES_XML_RESOURCE_MAP_TYPE: {
        const n = Math.floor((c.size - c.headerSize) / 4);
        checkLimit("MAX_STRING_COUNT", n, "resource map declares an id count of");
        resourceIds = new Uint32Array(n);
        for (let i = 0; i < n; i++) resourceIds[i] = r.u32(body + 4 * i, "resource map id");
        break;
      }
      case RES_XML_START_NAMESPACE_TYPE: {
        // ResXMLTree_namespaceExt: prefix (u32 string ref), uri (u32 string ref)
        const prefix = str(r.u32(body, "namespace prefix")) ?? "";
        const uri = str(r.u32(body + 4, "namespace uri")) ?? "";
        namespaces.push({ prefix, uri });
        break;
      }
      case RES_XML_END_NAMESPACE_TYPE:
        break;
      case RES_XML_START_ELEMENT_TYPE: {
        if (root && stack.length === 0) {
          // A second root element: the platform stops at the end of the first document element.
          p = end;
          continue;
        }
        elementCount++;
        checkLimit("MAX_ELEMENT_COUNT", elementCount, "document has an element count of");
        checkLimit("MAX_DEPTH", stack.length + 1, "element nesting depth reaches");
        const line = r.u32(p + 8, "element line number"); // ResXMLTree_node.lineNumber
        // ResXMLTree_attrExt: ns, name (u32 string refs), attributeStart, attributeSize, attributeCount (u16) ...
        const nsIndex = r.u32(body, "element namespace");
        const name = str(r.u32(body + 4, "element name")) ?? "";
        const attributeStart = r.u16(body + 8, "attributeStart");
        const attributeSize = r.u16(body + 10, "attributeSize");
        const attributeCount = r.u16(body + 12, "attributeCount");
        checkLimit("MAX_ATTRIBUTE_COUNT", attributeCount, `element <${name}> declares an attribute count of`);
        if (attributeCount > 0 && attributeSize < MIN_ATTRIBUTE_SIZE) {
          throw new BinaryXmlError(`element <${name}> declares ${attributeSize}-byte attributes; at least ${MIN_ATTRIBUTE_SIZE} expected`);
        }
        const attrsAt = body + attributeStart;
        if (attrsAt + attributeCount * attributeSize > p + c.size) {
          throw new BinaryXmlError(`element <${name}> declares ${attributeCount} attributes, more than its chunk holds`);
        }
        const attributes: XmlAttribute[] = [];
        for (let i = 0; i < attributeCount; i++) {
          attributes.push(readAttribute(r, attrsAt + i * attributeSize, str, resourceIds));
        }
        const el: XmlElement = { name, attributes, children: [], line, path: `/${name}` };
        const ns = nsIndex === 0xffffffff ? undefined : str(nsIndex);
        if (ns) el.ns = ns;
        const parent = stack[stack.length - 1];
        if (parent) adoptChild(parent, el);
        else root = el;
        stack.push(el);
        text = undefined;
        break;
      }
      case RES_XML_END_ELEMENT_TYPE: {
        const el = stack.pop();
        if (el && text) el.text = text.join("");
        text = undefined;
        break;
      }
      case RES_XML_CDATA_TYPE: {
        // ResXMLTree_cdataExt: data (u32 string ref), typedData (Res_value)
        const s = str(r.u32(body, "CDATA string"));
        if (s !== undefined && stack.length > 0) (text ??= []).push(s);
        break;
      }
      default:
        // Unknown chunk types are skipped by their declared size, as the platform's parser does.
        break;
    }
    p += c.size;
  }
  if (!root) throw new BinaryXmlError("binary XML holds no element");
  return { root, encoding: pool?.utf8 ? "binary-utf8" : "binary-utf16", namespaces };
}

function readAttribute(
  r: ByteReader,
  at: number,
  str: (i: number) => string | undefined,
  resourceIds: Uint32Array | undefined,
): XmlAttribute {
  // ResXMLTree_attribute: ns (u32), name (u32), rawValue (u32), typedValue (Res_value: size u16, res0 u8, dataType u8, data u32).
  // The element checked that its attributes lie inside its chunk, and the chunk inside the file: read directly.
  const v = r.view;
  const nsIndex = v.getUint32(at, true);
  const nameIndex = v.getUint32(at + 4, true);
  const rawIndex = v.getUint32(at + 8, true);
  const dataType = v.getUint8(at + 15);
  const data = v.getInt32(at + 16, true);
  const storedName = str(nameIndex) ?? "";
  const resourceId = resourceIds && nameIndex < resourceIds.length ? resourceIds[nameIndex] : undefined;
  const attr: XmlAttribute = { name: storedName, value: typedValue(dataType, data, str) };
  // The raw string, when kept, is what the developer wrote; the typed value is what the platform reads.
  if (attr.value.kind === "null" && rawIndex !== 0xffffffff) attr.value = { kind: "string", value: str(rawIndex) ?? "" };
  const ns = nsIndex === 0xffffffff ? undefined : str(nsIndex);
  if (ns) attr.ns = ns;
  if (resourceId !== undefined && resourceId !== 0) {
    attr.resourceId = resourceId;
    const known = (resourceId >>> 16) === 0x0101 ? ANDROID_ATTRIBUTE_NAMES.get(resourceId) : undefined;
    if (known) {
      if (known !== storedName) attr.storedName = storedName;
      attr.name = known;
      attr.ns = ANDROID_NS;
    }
  }
  return attr;
}

