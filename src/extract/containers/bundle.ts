/**
 * An app bundle (.aab): the base module's manifest governs, and the requested permissions of feature
 * modules are added to it, as the bundle tool merges them into the installed base APK (from memory of its
 * behaviour); each request keeps the module it came from.
 */
import { InputError, withEntry } from "../../errors.js";
import { decodeBinaryXml, looksLikeBinaryXml } from "../binary/binary-xml.js";
import { buildManifest } from "../manifest/build.js";
import { requestedPermissionNames, type Manifest } from "../manifest/model.js";
import { decodeProtoXml, protoResourceResolver } from "../proto/proto-xml.js";
import { entryProvenance, readOptionalTable, type ArchiveEntryInfo, type ArchiveReader } from "./zip.js";

/** Archive entries that make an app bundle module's manifest: `<module>/manifest/AndroidManifest.xml`. */
export const BUNDLE_MANIFEST = /^([^/]+)\/manifest\/AndroidManifest\.xml$/;
export const BUNDLE_RESOURCE_TABLE = "base/resources.pb";

export function isBundle(entries: readonly ArchiveEntryInfo[]): boolean {
  return entries.some((e) => BUNDLE_MANIFEST.test(e.name));
}

/** Module manifests are protobuf XML; a binary one (from other tools) is read too. */
function decodeModule(bytes: Uint8Array) {
  return looksLikeBinaryXml(bytes) ? decodeBinaryXml(bytes) : decodeProtoXml(bytes);
}

export function fromBundle(archive: ArchiveReader, entries: ArchiveEntryInfo[]): Manifest {
  const modules = entries
    .map((e) => ({ entry: e, name: BUNDLE_MANIFEST.exec(e.name)?.[1] }))
    .filter((x): x is { entry: ArchiveEntryInfo; name: string } => x.name !== undefined);
  const base = modules.find((x) => x.name === "base");
  if (!base) throw new InputError("app bundle has no base/manifest/AndroidManifest.xml");
  const read = (x: { entry: ArchiveEntryInfo; name: string }) => {
    try {
      return decodeModule(archive.read(x.entry.name, "MAX_MANIFEST_BYTES"));
    } catch (e) {
      throw withEntry(e, x.entry.name);
    }
  };
  const hasTable = entries.some((e) => e.name === BUNDLE_RESOURCE_TABLE);
  // As for resources.arsc: a damaged table costs the labels, not the manifest.
  const { value: resolve, problem: tableProblem } = readOptionalTable(archive, BUNDLE_RESOURCE_TABLE, hasTable, protoResourceResolver);
  const m = buildManifest(read(base), { kind: "app-bundle", encoding: "protobuf", entry: entryProvenance(base.entry), resourceTable: hasTable }, resolve);
  if (tableProblem) m.notes.push(`${BUNDLE_RESOURCE_TABLE} could not be read (${tableProblem}); references are shown as ids`);
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
