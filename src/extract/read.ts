/**
 * Reading a manifest from whatever the user hands us: an APK (or any zip with an AndroidManifest.xml),
 * an app bundle, a multi-APK archive, a bare binary or protobuf AndroidManifest.xml, or a plain-text
 * source manifest. The kind is told by content, never by the file name. Bytes come from memory or from
 * a random-access source the ops layer opens; nothing here touches the file system.
 */
import { InputError, LimitError, withFile } from "../errors.js";
import { LIMITS } from "../limits.js";
import { decodeBinaryXml } from "./binary/binary-xml.js";
import { readDexEntries, type DexInput } from "./code.js";
import { MANIFEST_ENTRY, type ReadOptions } from "./containers/apk.js";
import { containerOf, wantedCodeEntry, wantedManifestEntry as wantedEntry } from "./kinds.js";
import { openArchive, openArchiveBytes, type ArchiveReader, type RandomAccessSource } from "./containers/zip.js";
import { DETECT_BYTES, detectKind, type DetectedKind } from "./detect.js";
import { buildManifest } from "./manifest/build.js";
import type { Manifest } from "./manifest/model.js";
import { parsePlainXml } from "./plain-xml.js";
import { decodeProtoXml } from "./proto/proto-xml.js";

export type { ReadOptions } from "./containers/apk.js";

/** Reads a manifest from bytes in memory. `label` names the input in errors. */
export function readManifestBytes(bytes: Uint8Array, label = "<input>", options: ReadOptions = {}): Manifest {
  try {
    const kind = detectKind(bytes.subarray(0, DETECT_BYTES));
    if (kind === "zip") return fromArchive(openArchiveBytes(bytes, wantedEntry), options);
    return fromBareBytes(bytes, kind);
  } catch (e) {
    throw withFile(e, label);
  }
}

/**
 * Reads a manifest from a random-access source (a file the ops layer opened), touching only the parts
 * of a large archive it needs. The source is closed before this returns or throws.
 */
export function readManifestSource(source: RandomAccessSource, label: string, options: ReadOptions = {}): Manifest {
  return readAppSource(source, label, options, false).manifest;
}

/** A manifest and, when asked for and the input is an archive that carries any, its dex code. */
export interface AppRead {
  manifest: Manifest;
  /** Each dex entry read (or its problem); absent for bare manifests and when code was not asked for. */
  dexes?: DexInput[];
}

/**
 * Reads a manifest and (with `code`) the app's dex entries in one opening of the archive. A damaged dex,
 * or dex entries that cannot be read at all, cost the code evidence (a problem entry), never the manifest.
 */
export function readAppSource(source: RandomAccessSource, label: string, options: ReadOptions = {}, code = false): AppRead {
  let owned = true;
  try {
    const head = new Uint8Array(Math.min(DETECT_BYTES, source.size));
    const n = head.length ? source.read(head, 0, head.length, 0) : 0;
    const kind = detectKind(head.subarray(0, n));
    if (kind === "zip") {
      owned = false; // from here the archive reader closes it, also when it fails
      const archive = openArchive(source, code ? (name) => wantedEntry(name) || wantedCodeEntry(name) : wantedEntry);
      try {
        const manifest = fromArchiveOpen(archive, options);
        return code ? { manifest, dexes: dexesOf(archive) } : { manifest };
      } finally {
        archive.close();
      }
    }
    if (kind === "unknown") return { manifest: fromBareBytes(head.subarray(0, n), kind) };
    if (source.size > LIMITS.MAX_MANIFEST_BYTES) throw new LimitError("MAX_MANIFEST_BYTES", source.size, LIMITS.MAX_MANIFEST_BYTES, "manifest file has a size in bytes of");
    const bytes = new Uint8Array(source.size);
    let done = 0;
    while (done < bytes.length) {
      const got = source.read(bytes, done, bytes.length - done, done);
      if (got === 0) break;
      done += got;
    }
    return { manifest: fromBareBytes(bytes.subarray(0, done), kind) };
  } catch (e) {
    throw withFile(e, label);
  } finally {
    if (owned) source.close();
  }
}

/** The archive's dex entries; an archive whose code cannot be listed is one problem entry. */
function dexesOf(archive: ArchiveReader): DexInput[] {
  try {
    return readDexEntries(archive);
  } catch (e) {
    if (!(e instanceof InputError)) throw e;
    return [{ entry: "archive", problem: e.detail() }];
  }
}

function fromBareBytes(bytes: Uint8Array, kind: DetectedKind): Manifest {
  if (kind === "binary-xml") {
    const doc = decodeBinaryXml(bytes);
    return buildManifest(doc, { kind: "binary-xml", encoding: doc.encoding, resourceTable: false });
  }
  if (kind === "plain-xml") {
    const doc = parsePlainXml(bytes);
    return buildManifest(doc, { kind: "plain-xml", encoding: "text", resourceTable: false });
  }
  if (kind === "proto-xml") {
    const doc = decodeProtoXml(bytes);
    return buildManifest(doc, { kind: "proto-xml", encoding: "protobuf", resourceTable: false });
  }
  if (bytes.length === 0) throw new InputError("is empty");
  throw new InputError("is not an APK, a binary AndroidManifest.xml or an XML manifest (unrecognised content)");
}

/** Dispatches a zip by what it holds: an APK, an app bundle, or a multi-APK archive. Closes the archive. */
function fromArchive(archive: ArchiveReader, options: ReadOptions): Manifest {
  try {
    return fromArchiveOpen(archive, options);
  } finally {
    archive.close();
  }
}

/** The dispatch of fromArchive, leaving the archive open. */
function fromArchiveOpen(archive: ArchiveReader, options: ReadOptions): Manifest {
  const entries = archive.entries();
  const container = containerOf(entries);
  if (!container) throw new InputError(`no ${MANIFEST_ENTRY} in archive (is this an APK?)`);
  return container.read(archive, entries, options);
}
