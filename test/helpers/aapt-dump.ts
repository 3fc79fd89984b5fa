/**
 * Readers for the Android toolchain's own text dumps (Debian's aapt 1:10.0.0+r36-10), which the tests
 * use as the outside reference for what a compiled manifest contains.
 */
import { readFileSync } from "node:fs";
import type { TypedValue } from "../../src/extract/binary/values.js";
import type { XmlElement } from "../../src/extract/xml-tree.js";

export interface DumpValue { kind: "string"; value: string }
export interface DumpTyped { kind: "typed"; type: number; data: number }
export interface DumpRef { kind: "reference"; id: number }
export interface DumpAttribute { name: string; id?: number; value: DumpValue | DumpTyped | DumpRef }
export interface DumpElement { name: string; line: number; attributes: DumpAttribute[]; children: DumpElement[]; text?: string }

/** Parses `aapt dump xmltree` output into a tree. */
export function parseXmltree(text: string): DumpElement {
  const stack: { indent: number; el: DumpElement }[] = [];
  let root: DumpElement | undefined;
  for (const line of text.split("\n")) {
    const m = /^(\s*)([ENAC]): (.*)$/.exec(line);
    if (!m) continue;
    const indent = m[1].length;
    const [, , tag, rest] = m;
    if (tag === "N") continue;
    while (stack.length && stack[stack.length - 1].indent >= indent) stack.pop();
    const parent = stack[stack.length - 1]?.el;
    if (tag === "E") {
      const e = /^(\S+) \(line=(\d+)\)$/.exec(rest)!;
      const el: DumpElement = { name: e[1].replace(/^.*:/, ""), line: Number(e[2]), attributes: [], children: [] };
      if (parent) parent.children.push(el);
      else root ??= el;
      stack.push({ indent, el });
    } else if (tag === "A" && parent) {
      const a = /^(.*?)(?:\(0x([0-9a-f]{8})\))?=(.*)$/.exec(rest)!;
      const name = a[1].replace(/^.*:/, "");
      const raw = a[3];
      let value: DumpAttribute["value"];
      const typed = /^\(type 0x([0-9a-f]+)\)0x([0-9a-f]+)(?: \(Raw: .*\))?$/.exec(raw);
      const ref = /^@0x([0-9a-f]{8})$/.exec(raw);
      if (typed) value = { kind: "typed", type: parseInt(typed[1], 16), data: parseInt(typed[2], 16) };
      else if (ref) value = { kind: "reference", id: parseInt(ref[1], 16) };
      else value = { kind: "string", value: /^"(.*)" \(Raw: /.exec(raw)?.[1] ?? /^"(.*)"$/.exec(raw)?.[1] ?? raw };
      parent.attributes.push({ name, ...(a[2] ? { id: parseInt(a[2], 16) } : {}), value });
    } else if (tag === "C" && parent) {
      parent.text = (parent.text ?? "") + (/^"(.*)"$/.exec(rest)?.[1] ?? rest);
    }
  }
  if (!root) throw new Error("no element in dump");
  return root;
}

export function readXmltree(path: string): DumpElement {
  return parseXmltree(readFileSync(path, "utf8"));
}

/** Parses `aapt dump permissions` output: the requested permissions, in order. */
export function parsePermissionsDump(text: string): { element: string; name: string; maxSdkVersion?: number }[] {
  const out: { element: string; name: string; maxSdkVersion?: number }[] = [];
  for (const line of text.split("\n")) {
    const m = /^(uses-permission(?:-sdk-23)?): name='([^']*)'(?: maxSdkVersion='(\d+)')?/.exec(line);
    if (m) out.push({ element: m[1], name: m[2], ...(m[3] ? { maxSdkVersion: Number(m[3]) } : {}) });
  }
  return out;
}

/** Describes where a decoded element and the dump first disagree, or returns undefined when they agree. */
export function diffAgainstDump(el: XmlElement, d: DumpElement, where = ""): string | undefined {
  const here = `${where}/${d.name}`;
  if (el.name !== d.name) return `${here}: element ${el.name} decoded, ${d.name} dumped`;
  if ((el.line ?? 0) !== d.line) return `${here}: line ${el.line} decoded, ${d.line} dumped`;
  if (el.attributes.length !== d.attributes.length) return `${here}: ${el.attributes.length} attributes decoded, ${d.attributes.length} dumped`;
  // Compared by name: compiled binary XML orders attributes by resource id, the protobuf form by source.
  const mine = [...el.attributes].sort((x, y) => (x.storedName ?? x.name).localeCompare(y.storedName ?? y.name));
  const theirs = [...d.attributes].sort((x, y) => x.name.localeCompare(y.name));
  for (let i = 0; i < theirs.length; i++) {
    const a = mine[i];
    const b = theirs[i];
    if ((a.storedName ?? a.name) !== b.name && a.name !== b.name) return `${here}@${b.name}: name ${a.name} decoded`;
    if (b.id !== undefined && a.resourceId !== b.id) return `${here}@${b.name}: id ${a.resourceId} decoded, ${b.id} dumped`;
    const why = valueDiff(a.value, b.value);
    if (why) return `${here}@${b.name}: ${why}`;
  }
  if ((el.text ?? undefined) !== d.text) return `${here}: text ${JSON.stringify(el.text)} decoded, ${JSON.stringify(d.text)} dumped`;
  if (el.children.length !== d.children.length) return `${here}: ${el.children.length} children decoded, ${d.children.length} dumped`;
  for (let i = 0; i < d.children.length; i++) {
    const why = diffAgainstDump(el.children[i], d.children[i], here);
    if (why) return why;
  }
  return undefined;
}

function valueDiff(v: TypedValue, d: DumpAttribute["value"]): string | undefined {
  if (d.kind === "string") return v.kind === "string" && v.value === d.value ? undefined : `string ${JSON.stringify(d.value).slice(0, 60)} dumped, ${JSON.stringify(v).slice(0, 60)} decoded`;
  if (d.kind === "reference") return v.kind === "reference" && v.id === d.id ? undefined : `reference 0x${d.id.toString(16)} dumped, ${JSON.stringify(v)} decoded`;
  if (d.type === 0x12) return v.kind === "boolean" && v.value === (d.data !== 0) ? undefined : `boolean dumped, ${JSON.stringify(v)} decoded`;
  if (d.type === 0x10 || d.type === 0x11) {
    return v.kind === "int" && v.hex === (d.type === 0x11) && v.value >>> 0 === d.data ? undefined : `int ${d.data} dumped, ${JSON.stringify(v)} decoded`;
  }
  return `type 0x${d.type.toString(16)} not compared`;
}
