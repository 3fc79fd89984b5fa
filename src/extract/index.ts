/** The extract layer's surface: bytes in, a typed Manifest out. No file-system access below this folder. */
export { readManifestBytes, readManifestSource, type ReadOptions } from "./read.js";
export { detectKind, DETECT_BYTES, type DetectedKind } from "./detect.js";
export { openArchive, openArchiveBytes, type ArchiveReader, type ArchiveEntryInfo, type RandomAccessSource } from "./containers/zip.js";
