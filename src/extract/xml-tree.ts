/**
 * The XML tree both readers produce: the binary decoder from compiled manifests and the plain reader
 * from source manifests. The manifest model is built from this tree alone, so the two inputs cannot
 * drift apart in meaning.
 */
import type { TypedValue } from "./binary/values.js";

export const ANDROID_NS = "http://schemas.android.com/apk/res/android";
export const TOOLS_NS = "http://schemas.android.com/tools";

export interface XmlAttribute {
  /** Namespace URI, when the attribute has one (empty for `package`, and in namespace-stripped builds). */
  ns?: string;
  /** Local name. For binary input with an android resource id, the platform's name for that id. */
  name: string;
  /** Resource id from the binary resource map (android attributes are 0x0101xxxx). */
  resourceId?: number;
  /** Name string stored in the file, when it differs from `name` (stripped or scrambled builds). */
  storedName?: string;
  /** Typed value for binary input; plain input gives every value as a string. */
  value: TypedValue;
}

export interface XmlElement {
  ns?: string;
  name: string;
  attributes: XmlAttribute[];
  children: XmlElement[];
  /** Character data directly inside the element, if any. */
  text?: string;
  /** Source line: the line in a plain manifest, the line recorded by the compiler in a binary one. */
  line?: number;
  /** Element path, e.g. `/manifest/application/activity[2]` (1-based among same-named siblings). */
  path: string;
}

export interface XmlDocument {
  root: XmlElement;
  /** How the document was stored. */
  encoding: "binary-utf8" | "binary-utf16" | "protobuf" | "text";
  /** Namespace declarations, in document order. */
  namespaces: { prefix: string; uri: string }[];
}

// Per-parent counts of children by name, so that building a path costs O(1) even under the
// framework manifest's <manifest>, which has thousands of children.
const siblingCounts = new WeakMap<XmlElement, Map<string, number>>();
/** Parents with fewer children count them by a scan; larger ones keep a map of counts. */
const SCAN_BELOW = 32;

/** Appends `child` to `parent` and gives it its element path. */
export function adoptChild(parent: XmlElement, child: XmlElement): void {
  const siblings = parent.children;
  let n = 1;
  if (siblings.length < SCAN_BELOW) {
    // Few children (nearly every element): counting them is cheaper than keeping a map.
    for (const s of siblings) if (s.name === child.name) n++;
  } else {
    let counts = siblingCounts.get(parent);
    if (!counts) {
      siblingCounts.set(parent, (counts = new Map()));
      for (const s of siblings) counts.set(s.name, (counts.get(s.name) ?? 0) + 1);
    }
    n = (counts.get(child.name) ?? 0) + 1;
    counts.set(child.name, n);
  }
  child.path = `${parent.path}/${child.name}${n > 1 ? `[${n}]` : ""}`;
  parent.children.push(child);
}
