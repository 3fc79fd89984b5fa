/**
 * Reading a manifest from whatever the user hands us: an APK (or any zip with an AndroidManifest.xml),
 * a bare binary AndroidManifest.xml, or a plain-text source manifest. The kind is told by content,
 * never by the file extension.
 */
import { closeSync, openSync, readFileSync, readSync, statSync } from "node:fs";
import { InputError, LimitError, withFile } from "../errors.js";
import { LIMITS } from "../limits.js";
import { decodeBinaryXml, looksLikeBinaryXml } from "./binary/binary-xml.js";
import { ResourceTable } from "./binary/resource-table.js";
import { buildManifest, type ReferenceResolver } from "./build-manifest.js";
import { looksLikeZip, openArchiveBytes, openArchiveFile, type ArchiveReader } from "./archive.js";
import type { Manifest } from "./model.js";
import { parsePlainXml } from "./plain-xml.js";

export type DetectedKind = "zip" | "binary-xml" | "plain-xml" | "unknown";

/** Tells the input kind from its first bytes. */
export function detectKind(head: Uint8Array): DetectedKind {
  if (looksLikeZip(head)) return "zip";
  if (looksLikeBinaryXml(head)) return "binary-xml";
  // Text: optional BOM, optional whitespace, then '<'.
  let i = 0;
  if (head[0] === 0xef && head[1] === 0xbb && head[2] === 0xbf) i = 3;
  else if ((head[0] === 0xff && head[1] === 0xfe) || (head[0] === 0xfe && head[1] === 0xff)) return "plain-xml";
  while (i < head.length && (head[i] === 0x20 || head[i] === 0x09 || head[i] === 0x0a || head[i] === 0x0d)) i++;
  return head[i] === 0x3c ? "plain-xml" : "unknown";
}

const MANIFEST_ENTRY = "AndroidManifest.xml";
const RESOURCE_TABLE_ENTRY = "resources.arsc";

/** Reads a manifest from bytes in memory. `label` names the input in errors. */
export function readManifestBytes(bytes: Uint8Array, label = "<input>"): Manifest {
  try {
    const kind = detectKind(bytes.subarray(0, 64));
    if (kind === "zip") return fromArchive(openArchiveBytes(bytes));
    return fromBareBytes(bytes, kind);
  } catch (e) {
    throw withFile(e, label);
  }
}

/** Reads a manifest from a file on disk, touching only the parts of a large archive it needs. */
export function readManifestFile(path: string): Manifest {
  try {
    const st = statSync(path);
    if (st.isDirectory()) throw new InputError("is a directory, not an APK or manifest");
    const head = Buffer.alloc(64);
    const fd = readHead(path, head);
    const kind = detectKind(head.subarray(0, fd));
    if (kind === "zip") return fromArchive(openArchiveFile(path, [MANIFEST_ENTRY, RESOURCE_TABLE_ENTRY]));
    if (kind === "unknown") return fromBareBytes(head.subarray(0, fd), kind);
    if (st.size > LIMITS.MAX_MANIFEST_BYTES) throw new LimitError("MAX_MANIFEST_BYTES", st.size, LIMITS.MAX_MANIFEST_BYTES, "manifest file has a size in bytes of");
    return fromBareBytes(readFileSync(path), kind);
  } catch (e) {
    throw withFile(fsError(e), path);
  }
}

function readHead(path: string, into: Buffer): number {
  const fd = openSync(path, "r");
  try {
    return readSync(fd, into, 0, into.length, 0);
  } finally {
    closeSync(fd);
  }
}

function fromBareBytes(bytes: Uint8Array, kind: ReturnType<typeof detectKind>): Manifest {
  if (kind === "binary-xml") {
    const doc = decodeBinaryXml(bytes);
    return buildManifest(doc, { kind: "binary-xml", encoding: doc.encoding, resourceTable: false });
  }
  if (kind === "plain-xml") {
    const doc = parsePlainXml(bytes);
    return buildManifest(doc, { kind: "plain-xml", encoding: "text", resourceTable: false });
  }
  if (bytes.length === 0) throw new InputError("is empty");
  throw new InputError("is not an APK, a binary AndroidManifest.xml or an XML manifest (unrecognised content)");
}

function fromArchive(archive: ArchiveReader): Manifest {
  try {
    const entries = archive.entries();
    const entry = entries.find((e) => e.name === MANIFEST_ENTRY);
    if (!entry) throw new InputError(`no ${MANIFEST_ENTRY} in archive (is this an APK?)`);
    const bytes = archive.read(MANIFEST_ENTRY, "MAX_MANIFEST_BYTES");
    const doc = decodeBinaryXml(bytes);
    // The table is read only when the manifest refers to resources, which is almost always (the label).
    let resolve: ReferenceResolver | undefined;
    let tableProblem: string | undefined;
    const hasTable = entries.some((e) => e.name === RESOURCE_TABLE_ENTRY);
    if (hasTable) {
      let table: ResourceTable | undefined;
      let failed = false;
      resolve = (id) => {
        if (!table && !failed) {
          try {
            table = new ResourceTable(archive.read(RESOURCE_TABLE_ENTRY, "MAX_RESOURCE_TABLE_BYTES"));
          } catch (e) {
            // A damaged table costs us the labels, not the manifest: references stay as @0x… ids.
            if (!(e instanceof InputError)) throw e;
            failed = true;
            tableProblem = e.message;
          }
        }
        return table?.resolve(id);
      };
    }
    const m = buildManifest(doc, {
      kind: "apk",
      encoding: doc.encoding,
      entry: { name: entry.name, method: entry.method === "stored" ? "stored" : "deflated", compressedSize: entry.compressedSize, size: entry.size },
      resourceTable: hasTable,
    }, resolve);
    if (tableProblem) m.notes.push(`resources.arsc could not be read (${tableProblem}); references are shown as ids`);
    return m;
  } finally {
    archive.close();
  }
}

function fsError(e: unknown): unknown {
  const code = (e as { code?: string }).code;
  if (code === "ENOENT") return new InputError("no such file");
  if (code === "EACCES" || code === "EPERM") return new InputError("permission denied");
  if (code === "EISDIR") return new InputError("is a directory, not an APK or manifest");
  return e;
}
