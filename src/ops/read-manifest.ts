/**
 * The file-system side of reading a manifest: opens the file once, refuses what is not a regular file
 * (a folder, a FIFO or a device would block or mislead), and hands the extract layer a random-access
 * view of it.
 */
import { closeSync, fstatSync, openSync, readSync, statSync } from "node:fs";
import { InputError, withFile } from "../errors.js";
import { readManifestSource, type ReadOptions } from "../extract/read.js";
import { openArchive, type ArchiveReader, type RandomAccessSource } from "../extract/containers/zip.js";
import { readDexEntries, wantedCodeEntry, type DexInput } from "../extract/code.js";
import { codeEvidence, type CodeEvidence } from "../score/code-evidence.js";
import type { Manifest } from "../extract/manifest/model.js";
import { fsError } from "./files.js";

/** A random-access source over an open file descriptor; closing it closes the descriptor once. */
export function fdSource(fd: number, size: number): RandomAccessSource {
  let open = true;
  return {
    size,
    read: (into, offset, length, position) => readSync(fd, into, offset, length, position),
    close() {
      if (open) {
        open = false;
        closeSync(fd);
      }
    },
  };
}

/** Reads a manifest from a file on disk, touching only the parts of a large archive it needs. */
export function readManifestFile(path: string, options: ReadOptions = {}): Manifest {
  let fd: number | undefined;
  try {
    // Opening a FIFO waits for a writer, so the path is looked at before it is opened.
    const kind = statSync(path);
    if (!kind.isFile() && !kind.isDirectory()) throw new InputError("is not a regular file (a device, FIFO or socket); give an APK or manifest file");
    // One open for everything: the kind is told from the first bytes, then the same descriptor is read.
    fd = openSync(path, "r");
    const st = fstatSync(fd);
    if (st.isDirectory()) throw new InputError("is a directory, not an APK or manifest");
    if (!st.isFile()) throw new InputError("is not a regular file (a device, FIFO or socket); give an APK or manifest file");
    const source = fdSource(fd, st.size);
    fd = undefined; // the source owns it now
    return readManifestSource(source, path, options);
  } catch (e) {
    throw withFile(fsError(e), path);
  } finally {
    if (fd !== undefined) closeSync(fd);
  }
}

/**
 * Opens a zip archive on disk for reading entries (only those `only` names, when given); the reader
 * closes the file.
 */
export function openArchiveFile(path: string, only?: readonly string[] | ((name: string) => boolean)): ArchiveReader {
  const fd = openSync(path, "r");
  try {
    return openArchive(fdSource(fd, fstatSync(fd).size), only);
  } catch (e) {
    throw withFile(fsError(e), path);
  }
}

/** Input kinds that are archives, and so can carry the app's dex code. */
const ARCHIVE_KINDS: ReadonlySet<Manifest["input"]["kind"]> = new Set(["apk", "proto-apk", "app-bundle", "multi-apk"]);

/**
 * Code evidence for a file whose manifest was read: its dex code against the API→permission map. Only
 * archives carry code; a bare manifest, or an archive without dex (a resource-only build), has none:
 * `undefined`. A damaged dex is a problem in the evidence, never an error.
 */
export function readCodeEvidence(path: string, manifest: Manifest): CodeEvidence | undefined {
  if (!ARCHIVE_KINDS.has(manifest.input.kind)) return undefined;
  let dexes: DexInput[];
  let archive: ArchiveReader | undefined;
  try {
    archive = openArchiveFile(path, wantedCodeEntry);
    dexes = readDexEntries(archive);
  } catch (e) {
    const err = fsError(e);
    if (!(err instanceof InputError)) throw err;
    dexes = [{ entry: "archive", problem: err.detail() }];
  } finally {
    archive?.close();
  }
  return dexes.length ? codeEvidence(manifest, dexes) : undefined;
}
