/**
 * A multi-APK archive (base APK plus split APKs): the base APK's manifest governs what is installed; the
 * platform takes requested permissions from the base only (from memory of its package parser), so a
 * permission requested only in a split is reported in the notes, not added.
 */
import { InputError, withEntry } from "../../errors.js";
import { requestedPermissionNames, type Manifest } from "../manifest/model.js";
import { fromApk, MANIFEST_ENTRY, RESOURCE_TABLE_ENTRY } from "./apk.js";
import { entryProvenance, openArchiveBytes, type ArchiveEntryInfo, type ArchiveReader } from "./zip.js";

/** APKs at the top of a multi-APK archive (base and splits). */
export const NESTED_APK = /^[^/]+\.apk$/;

export function isMultiApk(entries: readonly ArchiveEntryInfo[]): boolean {
  return entries.some((e) => NESTED_APK.test(e.name));
}

function readNested(archive: ArchiveReader, e: ArchiveEntryInfo): Manifest {
  try {
    const nested = openArchiveBytes(archive.read(e.name, "MAX_NESTED_APK_BYTES"), [MANIFEST_ENTRY, RESOURCE_TABLE_ENTRY]);
    try {
      return fromApk(nested);
    } finally {
      nested.close();
    }
  } catch (err) {
    throw withEntry(err, e.name);
  }
}

export function fromMultiApk(archive: ArchiveReader, entries: ArchiveEntryInfo[]): Manifest {
  const manifests = entries.filter((e) => NESTED_APK.test(e.name)).map((e) => ({ entry: e, m: readNested(archive, e) }));
  const bases = manifests.filter((x) => x.m.split === undefined);
  if (bases.length !== 1) throw new InputError(`multi-APK archive has ${bases.length} base APKs (APKs without a split name); expected exactly one`);
  const base = bases[0];
  const m = base.m;
  m.input = { ...m.input, kind: "multi-apk", entry: entryProvenance(base.entry) };
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
