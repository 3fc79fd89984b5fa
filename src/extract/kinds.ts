/**
 * The registry of input kinds: every kind of input overask reads, how it is recognised, which archive
 * entries its reader needs (for the manifest and for the code), what it is called in reports, and which
 * file names a folder sweep takes as such without looking inside. Readers (extract/read.ts), the code
 * reader, reports, the sweep's folder walk and the corpus sniff all ask here.
 *
 * A new container kind is one module in containers/ (recognise, read) and one entry in CONTAINERS below;
 * a new bare manifest kind, one decoder and one entry in BARE (DEVELOPERS.md, "Adding an input kind").
 */
import { DEX_ENTRY } from "./code.js";
import { fromApk, MANIFEST_ENTRY, PROTO_RESOURCE_TABLE_ENTRY, RESOURCE_TABLE_ENTRY, type ReadOptions } from "./containers/apk.js";
import { BUNDLE_MANIFEST, BUNDLE_RESOURCE_TABLE, fromBundle, isBundle } from "./containers/bundle.js";
import { fromMultiApk, isMultiApk, NESTED_APK } from "./containers/multi-apk.js";
import type { ArchiveEntryInfo, ArchiveReader } from "./containers/zip.js";
import type { InputKind, Manifest } from "./manifest/model.js";

/** A zip container of an app: APK, app bundle, multi-APK archive. */
export interface ContainerKind {
  /** The kind a manifest read from it records (`Manifest.input.kind`); an APK may also give `proto-apk`. */
  id: Extract<InputKind, "apk" | "app-bundle" | "multi-apk">;
  /** Whether an archive with these entries is of this kind (asked in CONTAINERS order). */
  matches(entries: readonly ArchiveEntryInfo[]): boolean;
  /** The entries its manifest reader opens; an archive's thousands of others are never parsed. */
  manifestEntry(name: string): boolean;
  /** The entries its code reader opens (dex files, or the APKs holding them). */
  codeEntry(name: string): boolean;
  /** Reads the manifest; the archive stays open (the caller closes it). */
  read(archive: ArchiveReader, entries: ArchiveEntryInfo[], options: ReadOptions): Manifest;
}

export const CONTAINERS: readonly ContainerKind[] = [
  {
    id: "apk",
    matches: (entries) => entries.some((e) => e.name === MANIFEST_ENTRY),
    manifestEntry: (n) => n === MANIFEST_ENTRY || n === RESOURCE_TABLE_ENTRY || n === PROTO_RESOURCE_TABLE_ENTRY,
    codeEntry: (n) => DEX_ENTRY.test(n),
    read: (archive, _entries, options) => fromApk(archive, options),
  },
  {
    id: "app-bundle",
    matches: (entries) => isBundle(entries),
    manifestEntry: (n) => n === BUNDLE_RESOURCE_TABLE || BUNDLE_MANIFEST.test(n),
    codeEntry: (n) => DEX_ENTRY.test(n),
    read: (archive, entries) => fromBundle(archive, entries),
  },
  {
    id: "multi-apk",
    matches: (entries) => isMultiApk(entries),
    manifestEntry: (n) => NESTED_APK.test(n),
    codeEntry: (n) => NESTED_APK.test(n),
    read: (archive, entries) => fromMultiApk(archive, entries),
  },
];

/** What each kind is called in reports, and the file names a folder sweep takes as such. */
export const KIND_INFO: Readonly<Record<InputKind, { name: string; fileNames?: RegExp }>> = {
  apk: { name: "APK", fileNames: /\.apk$/i },
  "proto-apk": { name: "proto-format APK" },
  "app-bundle": { name: "app bundle", fileNames: /\.aab$/i },
  "multi-apk": { name: "multi-APK archive", fileNames: /\.apks$/i },
  "binary-xml": { name: "binary manifest", fileNames: /\.xml$/i },
  "proto-xml": { name: "protobuf manifest" },
  "plain-xml": { name: "source manifest", fileNames: /\.xml$/i },
};

/** Whether a file name is one a sweep takes as an app or manifest without looking inside. */
export function namedLikeInput(fileName: string): boolean {
  return Object.values(KIND_INFO).some((k) => k.fileNames?.test(fileName));
}

/** Whether a file name is a manifest's (`.xml`): a folder sweep checks such a file's root element first. */
export function namedLikeManifest(fileName: string): boolean {
  return KIND_INFO["plain-xml"].fileNames!.test(fileName);
}

/** Any container's manifest entry: what a reader opens before it knows the container's kind. */
export function wantedManifestEntry(name: string): boolean {
  return CONTAINERS.some((c) => c.manifestEntry(name));
}

/** Any container's code entry. */
export function wantedCodeEntry(name: string): boolean {
  return CONTAINERS.some((c) => c.codeEntry(name));
}

/** The container kind of an opened archive, or undefined when it is no app container. */
export function containerOf(entries: readonly ArchiveEntryInfo[]): ContainerKind | undefined {
  return CONTAINERS.find((c) => c.matches(entries));
}

/** The kinds in words, for help texts: "APK (.apk), proto-format APK, app bundle (.aab), …". */
export function kindsInWords(): string {
  return Object.values(KIND_INFO)
    .map((k) => (k.fileNames ? `${k.name} (${k.fileNames.source.replace(/^\\|\$$/g, "").replace(/\\/g, "")})` : k.name))
    .join(", ");
}
