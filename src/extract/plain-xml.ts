/**
 * Reader for plain-text manifests as developers write them (src/main/AndroidManifest.xml), built on
 * xml2js. Produces the same XmlDocument as the binary decoder, with source line numbers.
 *
 * Document type declarations are refused outright: a manifest never needs one, and refusing them
 * is the only sure way never to expand an entity bomb or fetch an external entity.
 */
import { createRequire } from "node:module";
import type * as Xml2js from "xml2js";
import { LimitError, PlainXmlError } from "../errors.js";
import { checkLimit } from "./binary/reader.js";
import { adoptChild, type XmlAttribute, type XmlDocument, type XmlElement } from "./xml-tree.js";

// Loaded on first use: most inputs are binary, and xml2js with its dependencies costs start-up time.
let xml2js: typeof Xml2js | undefined;
const loadXml2js = () => (xml2js ??= createRequire(import.meta.url)("xml2js") as typeof Xml2js);

const XMLNS_URI = "http://www.w3.org/2000/xmlns/";
const LINE_KEY = "\u0000line"; // cannot collide with a real attribute name

interface SaxAttribute { name: string; value: string; prefix: string; local: string; uri: string }
interface SaxNode { name: string; attributes: Record<string, SaxAttribute>; local?: string; uri?: string }
interface Xml2jsNode {
  "#name": string;
  $?: Record<string, SaxAttribute>;
  $ns?: { uri: string; local: string };
  $$?: Xml2jsNode[];
  _?: string;
}

/** Decodes text bytes: UTF-16 when a byte-order mark says so, UTF-8 otherwise. */
export function decodeText(bytes: Uint8Array): string {
  if (bytes[0] === 0xff && bytes[1] === 0xfe) return new TextDecoder("utf-16le").decode(bytes.subarray(2));
  if (bytes[0] === 0xfe && bytes[1] === 0xff) return new TextDecoder("utf-16be").decode(bytes.subarray(2));
  const s = new TextDecoder("utf-8").decode(bytes);
  return s.charCodeAt(0) === 0xfeff ? s.slice(1) : s;
}

export function parsePlainXml(bytes: Uint8Array): XmlDocument {
  checkLimit("MAX_MANIFEST_BYTES", bytes.length, "plain XML has a size in bytes of");
  const text = decodeText(bytes);
  const dtd = /<!DOCTYPE|<!ENTITY/i.exec(text);
  if (dtd) {
    throw new PlainXmlError(`line ${lineAt(text, dtd.index)}: document type declarations are not allowed in a manifest (entities are never expanded)`);
  }
  const lineStarts = [0];
  for (let i = text.indexOf("\n"); i !== -1; i = text.indexOf("\n", i + 1)) lineStarts.push(i + 1);

  const parser = new (loadXml2js().Parser)({
    xmlns: true,
    explicitChildren: true,
    preserveChildrenOrder: true,
    explicitArray: true,
    strict: true,
    async: false,
  });
  const namespaces: { prefix: string; uri: string }[] = [];
  // xml2js keeps no positions; record each start tag's line by hooking the underlying sax parser.
  const sax = (parser as unknown as { saxParser: { onopentag: (n: SaxNode) => void; startTagPosition: number; onclosetag: () => void } }).saxParser;
  const open = sax.onopentag;
  const close = sax.onclosetag;
  let depth = 0;
  let count = 0;
  let limitHit: LimitError | undefined;
  sax.onopentag = (node: SaxNode) => {
    depth++;
    count++;
    try {
      checkLimit("MAX_DEPTH", depth, "element nesting depth reaches");
      checkLimit("MAX_ELEMENT_COUNT", count, "document has an element count of");
    } catch (e) {
      limitHit ??= e as LimitError;
      throw e;
    }
    for (const a of Object.values(node.attributes)) {
      if (a.uri === XMLNS_URI) namespaces.push({ prefix: a.local === "xmlns" ? "" : a.local, uri: a.value });
    }
    const line = lineOfOffset(lineStarts, sax.startTagPosition - 1);
    node.attributes[LINE_KEY] = { name: LINE_KEY, value: String(line), prefix: "", local: LINE_KEY, uri: "" };
    open(node);
  };
  sax.onclosetag = () => {
    depth--;
    close();
  };

  let result: { [root: string]: Xml2jsNode } | undefined;
  let failure: unknown;
  try {
    parser.parseString(text, (err: unknown, res: { [root: string]: Xml2jsNode }) => {
      if (err) failure ??= err;
      else result = res;
    });
  } catch (e) {
    // xml2js rethrows some parser errors instead of passing them to the callback.
    failure ??= e;
  }
  if (limitHit) throw limitHit;
  if (failure) {
    const msg = failure instanceof Error ? failure.message.split("\n").filter(Boolean).join(", ") : String(failure);
    throw new PlainXmlError(`not well-formed XML (${msg})`);
  }
  const top = result ? Object.values(result)[0] : undefined;
  if (!top) throw new PlainXmlError("XML holds no element");
  return { root: convert(top, undefined), encoding: "text", namespaces };
}

function convert(node: Xml2jsNode, parent: XmlElement | undefined): XmlElement {
  const attributes: XmlAttribute[] = [];
  let line: number | undefined;
  for (const a of Object.values(node.$ ?? {})) {
    if (a.name === LINE_KEY) { line = Number(a.value); continue; }
    if (a.uri === XMLNS_URI || a.name === "xmlns") continue;
    const attr: XmlAttribute = { name: a.local || a.name, value: { kind: "string", value: a.value } };
    if (a.uri) attr.ns = a.uri;
    attributes.push(attr);
  }
  const name = node.$ns?.local || node["#name"];
  const el: XmlElement = { name, attributes, children: [], path: `/${name}` };
  if (node.$ns?.uri) el.ns = node.$ns.uri;
  if (line !== undefined) el.line = line;
  if (typeof node._ === "string" && node._.trim() !== "") el.text = node._;
  if (parent) adoptChild(parent, el);
  for (const child of node.$$ ?? []) {
    if (typeof child === "object" && child["#name"] && !child["#name"].startsWith("__")) convert(child, el);
  }
  return el;
}

function lineOfOffset(lineStarts: number[], offset: number): number {
  let lo = 0;
  let hi = lineStarts.length - 1;
  while (lo < hi) {
    const mid = (lo + hi + 1) >>> 1;
    if (lineStarts[mid] <= offset) lo = mid; else hi = mid - 1;
  }
  return lo + 1;
}

function lineAt(text: string, offset: number): number {
  let n = 1;
  for (let i = 0; i < offset; i++) if (text.charCodeAt(i) === 10) n++;
  return n;
}

