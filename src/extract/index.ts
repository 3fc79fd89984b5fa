/**
 * Reading a manifest from whatever the user hands us: an APK (or any zip with an AndroidManifest.xml),
 * a bare binary AndroidManifest.xml, or a plain-text source manifest. The kind is told by content,
 * never by the file extension.
 */
import { closeSync, fstatSync, openSync, readFileSync, readSync } from "node:fs";
import { InputError, LimitError, withFile } from "../errors.js";
import { LIMITS } from "../limits.js";
import { decodeBinaryXml, looksLikeBinaryXml } from "./binary/binary-xml.js";
import { ResourceTable } from "./binary/resource-table.js";
import { buildManifest, type ReferenceResolver } from "./manifest/build.js";
import { looksLikeZip, openArchiveBytes, openArchiveFd, type ArchiveEntryInfo, type ArchiveReader } from "./containers/zip.js";
import { requestedPermissionNames, type Manifest } from "./manifest/model.js";
import { parsePlainXml } from "./plain-xml.js";
import { decodeProtoXml, looksLikeProtoXml, protoResourceResolver } from "./proto/proto-xml.js";

export type DetectedKind = "zip" | "binary-xml" | "plain-xml" | "proto-xml" | "unknown";

/** Tells the input kind from its first bytes. */
export function detectKind(head: Uint8Array): DetectedKind {
  if (looksLikeZip(head)) return "zip";
  if (looksLikeBinaryXml(head)) return "binary-xml";
  // Text: optional BOM, optional whitespace, then '<'.
  let i = 0;
  if (head[0] === 0xef && head[1] === 0xbb && head[2] === 0xbf) i = 3;
  else if ((head[0] === 0xff && head[1] === 0xfe) || (head[0] === 0xfe && head[1] === 0xff)) return "plain-xml";
  while (i < head.length && (head[i] === 0x20 || head[i] === 0x09 || head[i] === 0x0a || head[i] === 0x0d)) i++;
  if (head[i] === 0x3c) return "plain-xml";
  return looksLikeProtoXml(head) ? "proto-xml" : "unknown";
}

const MANIFEST_ENTRY = "AndroidManifest.xml";
const RESOURCE_TABLE_ENTRY = "resources.arsc";

/** Reads a manifest from bytes in memory. `label` names the input in errors. */
export function readManifestBytes(bytes: Uint8Array, label = "<input>"): Manifest {
  try {
    const kind = detectKind(bytes.subarray(0, 64));
    if (kind === "zip") return fromArchive(openArchiveBytes(bytes, wantedEntry));
    return fromBareBytes(bytes, kind);
  } catch (e) {
    throw withFile(e, label);
  }
}

/** Reads a manifest from a file on disk, touching only the parts of a large archive it needs. */
export interface ReadOptions {
  /**
   * Resolve resource references (the label) through resources.arsc (default true). A sweep that does not
   * show labels turns it off: the resource table is often the largest thing read.
   */
  resolveResources?: boolean;
}

export function readManifestFile(path: string, options: ReadOptions = {}): Manifest {
  let fd: number | undefined;
  try {
    // One open for everything: the kind is told from the first bytes, then the same descriptor is read.
    fd = openSync(path, "r");
    const st = fstatSync(fd);
    if (st.isDirectory()) throw new InputError("is a directory, not an APK or manifest");
    const head = Buffer.alloc(64);
    const n = readSync(fd, head, 0, head.length, 0);
    const kind = detectKind(head.subarray(0, n));
    if (kind === "zip") {
      const owned = fd;
      fd = undefined; // from here the archive reader closes it, also when it fails
      return fromArchive(openArchiveFd(owned, st.size, wantedEntry), options);
    }
    if (kind === "unknown") return fromBareBytes(head.subarray(0, n), kind);
    if (st.size > LIMITS.MAX_MANIFEST_BYTES) throw new LimitError("MAX_MANIFEST_BYTES", st.size, LIMITS.MAX_MANIFEST_BYTES, "manifest file has a size in bytes of");
    return fromBareBytes(readFileSync(fd), kind);
  } catch (e) {
    throw withFile(fsError(e), path);
  } finally {
    if (fd !== undefined) closeSync(fd);
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
  if (kind === "proto-xml") {
    const doc = decodeProtoXml(bytes);
    return buildManifest(doc, { kind: "proto-xml", encoding: "protobuf", resourceTable: false });
  }
  if (bytes.length === 0) throw new InputError("is empty");
  throw new InputError("is not an APK, a binary AndroidManifest.xml or an XML manifest (unrecognised content)");
}

/** Archive entries that make an app bundle module's manifest: `<module>/manifest/AndroidManifest.xml`. */
const BUNDLE_MANIFEST = /^([^/]+)\/manifest\/AndroidManifest\.xml$/;
/** APKs at the top of a multi-APK archive (base and splits). */
const NESTED_APK = /^[^/]+\.apk$/;

/** The only entries a manifest reader needs; an APK's thousands of others are never parsed. */
function wantedEntry(name: string): boolean {
  return name === MANIFEST_ENTRY || name === RESOURCE_TABLE_ENTRY || name === "base/resources.pb" || BUNDLE_MANIFEST.test(name) || NESTED_APK.test(name);
}

function fromArchive(archive: ArchiveReader, options: ReadOptions = {}): Manifest {
  try {
    const entries = archive.entries();
    const entry = entries.find((e) => e.name === MANIFEST_ENTRY);
    if (!entry) {
      if (entries.some((e) => BUNDLE_MANIFEST.test(e.name))) return fromBundle(archive, entries);
      if (entries.some((e) => NESTED_APK.test(e.name))) return fromMultiApk(archive, entries);
      throw new InputError(`no ${MANIFEST_ENTRY} in archive (is this an APK?)`);
    }
    const bytes = archive.read(MANIFEST_ENTRY, "MAX_MANIFEST_BYTES");
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
    const m = buildManifest(doc, {
      kind: "apk",
      encoding: doc.encoding,
      entry: { name: entry.name, method: entry.method === "stored" ? "stored" : "deflated", compressedSize: entry.compressedSize, size: entry.size },
      resourceTable: hasTable,
    }, resolve);
    if (tableProblem) m.notes.push(`resources.arsc could not be read (${tableProblem}); references are shown as ids`);
    m.notes.push(...archive.notes);
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

/**
 * An app bundle: the base module's manifest governs, and the requested permissions of feature modules are
 * added to it, as the bundle tool merges them into the installed base APK (from memory of its behaviour);
 * each request keeps the module it came from.
 */
function fromBundle(archive: ArchiveReader, entries: ArchiveEntryInfo[]): Manifest {
  const modules = entries
    .map((e) => ({ entry: e, name: BUNDLE_MANIFEST.exec(e.name)?.[1] }))
    .filter((x): x is { entry: ArchiveEntryInfo; name: string } => x.name !== undefined);
  const base = modules.find((x) => x.name === "base");
  if (!base) throw new InputError("app bundle has no base/manifest/AndroidManifest.xml");
  const read = (x: { entry: ArchiveEntryInfo; name: string }) => {
    try {
      return decodeModule(archive.read(x.entry.name, "MAX_MANIFEST_BYTES"));
    } catch (e) {
      if (e instanceof InputError) e.message = `${x.entry.name}: ${e.message}`;
      throw e;
    }
  };
  const hasTable = entries.some((e) => e.name === "base/resources.pb");
  let resolve: ReferenceResolver | undefined;
  let tableProblem: string | undefined;
  if (hasTable) {
    try {
      resolve = protoResourceResolver(archive.read("base/resources.pb", "MAX_RESOURCE_TABLE_BYTES"));
    } catch (e) {
      // As for resources.arsc: a damaged table costs the labels, not the manifest.
      if (!(e instanceof InputError)) throw e;
      tableProblem = e.message;
    }
  }
  const m = buildManifest(read(base), {
    kind: "app-bundle",
    encoding: "protobuf",
    entry: { name: base.entry.name, method: base.entry.method === "stored" ? "stored" : "deflated", compressedSize: base.entry.compressedSize, size: base.entry.size },
    resourceTable: hasTable,
  }, resolve);
  if (tableProblem) m.notes.push(`base/resources.pb could not be read (${tableProblem}); references are shown as ids`);
  for (const p of m.usesPermissions) p.module = "base";
  m.modules = [{ name: "base", kind: "base", permissions: requestedPermissionNames(m) }];
  for (const x of modules.filter((y) => y.name !== "base").sort((a, b) => a.name.localeCompare(b.name))) {
    const feature = buildManifest(read(x), { kind: "app-bundle", encoding: "protobuf", resourceTable: false });
    m.modules.push({ name: x.name, kind: "feature", permissions: requestedPermissionNames(feature) });
    const have = new Set(m.usesPermissions.map((p) => p.name));
    for (const p of feature.usesPermissions) {
      if (have.has(p.name)) continue;
      m.usesPermissions.push({ ...p, module: x.name, source: { ...p.source, path: `${x.name}:${p.source.path}` } });
      have.add(p.name);
    }
  }
  return m;
}

/** Module manifests are protobuf XML; a binary one (from other tools) is read too. */
function decodeModule(bytes: Uint8Array) {
  return looksLikeBinaryXml(bytes) ? decodeBinaryXml(bytes) : decodeProtoXml(bytes);
}

/**
 * A multi-APK archive (base APK plus split APKs): the base APK's manifest governs what is installed; the
 * platform takes requested permissions from the base only (from memory of its package parser), so a
 * permission requested only in a split is reported in the notes, not added.
 */
function fromMultiApk(archive: ArchiveReader, entries: ArchiveEntryInfo[]): Manifest {
  const apks = entries.filter((e) => NESTED_APK.test(e.name));
  const read = (e: ArchiveEntryInfo) => {
    try {
      return fromArchive(openArchiveBytes(archive.read(e.name, "MAX_NESTED_APK_BYTES")));
    } catch (err) {
      if (err instanceof InputError) err.message = `${e.name}: ${err.message}`;
      throw err;
    }
  };
  const manifests = apks.map((e) => ({ entry: e, m: read(e) }));
  const bases = manifests.filter((x) => x.m.split === undefined);
  if (bases.length !== 1) throw new InputError(`multi-APK archive has ${bases.length} base APKs (APKs without a split name); expected exactly one`);
  const base = bases[0];
  const m = base.m;
  m.input = { ...m.input, kind: "multi-apk", entry: { name: base.entry.name, method: base.entry.method === "stored" ? "stored" : "deflated", compressedSize: base.entry.compressedSize, size: base.entry.size } };
  for (const p of m.usesPermissions) p.module = "base";
  m.modules = [{ name: "base", kind: "base", permissions: requestedPermissionNames(m) }];
  const have = new Set(requestedPermissionNames(m));
  for (const x of manifests.filter((y) => y !== base).sort((a, b) => (a.m.split ?? "").localeCompare(b.m.split ?? ""))) {
    if (x.m.package !== m.package) m.notes.push(`${x.entry.name} belongs to ${x.m.package}, not ${m.package}`);
    const perms = requestedPermissionNames(x.m);
    m.modules.push({ name: x.m.split ?? x.entry.name, kind: "split", permissions: perms });
    const extra = perms.filter((p) => !have.has(p));
    if (extra.length) m.notes.push(`split ${x.m.split} requests ${extra.join(", ")}, which the base does not; the platform grants permissions requested in the base APK only`);
  }
  return m;
}
