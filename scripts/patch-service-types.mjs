#!/usr/bin/env node
// Fixture step (scripts/build-fixtures.sh): aapt2 links a manifest against the API-29 framework, which
// knows only the six oldest foregroundServiceType flags. The modern demo apps are linked with every type
// set to dataSync, and this writes the real flags (from their source manifest and
// src/platform/data/foreground-service-types.tsv) into the binary manifest, service by service in
// document order: the Res_value data of each android:foregroundServiceType attribute (resource id
// 0x01010599). `aapt dump xmltree` of the result shows the patched values.
//   node scripts/patch-service-types.mjs <source AndroidManifest.xml> <in.apk> <out.apk>
import { readFileSync, writeFileSync } from "node:fs";
import { createRequire } from "node:module";

const AdmZip = createRequire(import.meta.url)("adm-zip");
const [source, input, output] = process.argv.slice(2);
const types = new Map(
  readFileSync(new URL("../src/platform/data/foreground-service-types.tsv", import.meta.url), "utf8").trim().split("\n").slice(1).map((l) => l.split("\t")).map((f) => [f[0], Number(f[1])]),
);
const wanted = [...readFileSync(source, "utf8").matchAll(/android:foregroundServiceType="([^"]*)"/g)].map((m) =>
  m[1].split("|").reduce((v, t) => {
    if (!types.has(t)) throw new Error(`unknown service type ${t}`);
    return v | types.get(t);
  }, 0),
);
const zip = new AdmZip(input);
const xml = Buffer.from(zip.readFile("AndroidManifest.xml"));
// ResXMLTree_header (8 bytes), then chunks: the resource map (type 0x0180) gives the attribute name
// index of 0x01010599; each start element (0x0102) lists 20-byte attributes after its 36-byte header.
let nameIndex = -1;
let done = 0;
for (let p = 8; p < xml.length; ) {
  const type = xml.readUInt16LE(p);
  const headerSize = xml.readUInt16LE(p + 2);
  const size = xml.readUInt32LE(p + 4);
  if (type === 0x0180) {
    for (let i = 0; (i + 1) * 4 <= size - headerSize; i++) if (xml.readUInt32LE(p + headerSize + 4 * i) === 0x01010599) nameIndex = i;
  } else if (type === 0x0102) {
    const attrStart = xml.readUInt16LE(p + 16 + 8); // ResXMLTree_attrExt.attributeStart, after the node header
    const attrSize = xml.readUInt16LE(p + 16 + 10);
    const count = xml.readUInt16LE(p + 16 + 12);
    for (let i = 0; i < count; i++) {
      const a = p + 16 + attrStart + i * attrSize;
      if (xml.readUInt32LE(a + 4) !== nameIndex) continue;
      // ResXMLTree_attribute: ns, name, rawValue, then Res_value (size u16, res0 u8, dataType u8, data u32).
      xml.writeUInt8(0x11, a + 15); // TYPE_INT_HEX, as aapt2 writes flags
      xml.writeUInt32LE(wanted[done++] >>> 0, a + 16);
    }
  }
  p += size;
}
if (done !== wanted.length) throw new Error(`${source}: ${wanted.length} services with types, ${done} patched`);
zip.updateFile("AndroidManifest.xml", xml);
writeFileSync(output, zip.toBuffer());
