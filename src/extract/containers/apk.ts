/**
 * An APK (or any zip whose top level holds AndroidManifest.xml): the binary manifest, with references
 * (the label) resolved through resources.arsc when the caller wants them.
 */
import { InputError } from "../../errors.js";
import { decodeBinaryXml, looksLikeBinaryXml } from "../binary/binary-xml.js";
import { ResourceTable } from "../binary/resource-table.js";
import { buildManifest, type ReferenceResolver } from "../manifest/build.js";
import type { Manifest } from "../manifest/model.js";
import { decodeProtoXml, looksLikeProtoXml, protoResourceResolver } from "../proto/proto-xml.js";
import { entryProvenance, readOptionalTable, type ArchiveEntryInfo, type ArchiveReader } from "./zip.js";

export const MANIFEST_ENTRY = "AndroidManifest.xml";
export const RESOURCE_TABLE_ENTRY = "resources.arsc";
/** The resource table of a proto-format build (`aapt2 link --proto-format`). */
export const PROTO_RESOURCE_TABLE_ENTRY = "resources.pb";

export interface ReadOptions {
  /**
   * Resolve resource references (the label) through the resource table (default true). A sweep that does
   * not show labels turns it off: the resource table is often the largest thing read.
   */
  resolveResources?: boolean;
}

/** Reads the APK's manifest; the archive stays open (the caller closes it). */
export function fromApk(archive: ArchiveReader, options: ReadOptions = {}): Manifest {
  const entries = archive.entries();
  const entry = entries.find((e) => e.name === MANIFEST_ENTRY);
  if (!entry) throw new InputError(`no ${MANIFEST_ENTRY} in archive (is this an APK?)`);
  const bytes = archive.read(MANIFEST_ENTRY, "MAX_MANIFEST_BYTES");
  if (!looksLikeBinaryXml(bytes)) {
    if (looksLikeProtoXml(bytes)) return fromProtoApk(archive, entries, entry, bytes);
    throw new InputError(`${MANIFEST_ENTRY} is neither a compiled binary manifest nor a protobuf one (the archive may be damaged, or not an Android app)`);
  }
  const doc = decodeBinaryXml(bytes);
  // The table is read only when the manifest refers to resources, which is almost always (the label).
  let resolve: ReferenceResolver | undefined;
  let tableProblem: string | undefined;
  const hasTable = entries.some((e) => e.name === RESOURCE_TABLE_ENTRY);
  if (hasTable && options.resolveResources !== false) {
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
  const m = buildManifest(doc, { kind: "apk", encoding: doc.encoding, entry: entryProvenance(entry), resourceTable: hasTable }, resolve);
  if (tableProblem) m.notes.push(`resources.arsc could not be read (${tableProblem}); references are shown as ids`);
  m.notes.push(...archive.notes);
  return m;
}

/**
 * An APK-shaped zip from `aapt2 link --proto-format` (the input of bundle tools): the manifest is protobuf
 * XML and the resource table is resources.pb. Read like an APK, with the kind saying which it is.
 */
function fromProtoApk(archive: ArchiveReader, entries: ArchiveEntryInfo[], entry: ArchiveEntryInfo, bytes: Uint8Array): Manifest {
  const hasTable = entries.some((e) => e.name === PROTO_RESOURCE_TABLE_ENTRY);
  const { value: resolve, problem: tableProblem } = readOptionalTable(archive, PROTO_RESOURCE_TABLE_ENTRY, hasTable, protoResourceResolver);
  const m = buildManifest(decodeProtoXml(bytes), { kind: "proto-apk", encoding: "protobuf", entry: entryProvenance(entry), resourceTable: hasTable }, resolve);
  if (tableProblem) m.notes.push(`${PROTO_RESOURCE_TABLE_ENTRY} could not be read (${tableProblem}); references are shown as ids`);
  m.notes.push(...archive.notes);
  return m;
}
