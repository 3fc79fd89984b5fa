/**
 * The file-system side of reading a manifest: opens the file once, refuses what is not a regular file
 * (a folder, a FIFO or a device would block or mislead), and hands the extract layer a random-access
 * view of it.
 */
import { closeSync, constants as fsConstants, fstatSync, openSync, readSync } from "node:fs";
import { InputError, withFile } from "../errors.js";
import { readAppSource, type AppRead, type ReadOptions } from "../extract/read.js";
import { openArchive, type ArchiveReader, type RandomAccessSource } from "../extract/containers/zip.js";
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
  return readAppFile(path, options, false).manifest;
}

/**
 * Reads a file's manifest and, with `code`, its dex code, opening the file once: a bare manifest, or an
 * archive without dex (a resource-only build), has none. What the code means is for judging (score/).
 */
export function readAppFile(path: string, options: ReadOptions = {}, code = false): AppRead {
  let fd: number | undefined;
  try {
    // Opening a FIFO would wait for a writer: opened without blocking, then refused by what fstat says.
    // (On a regular file O_NONBLOCK changes nothing.) One open for everything: the kind is told from the
    // first bytes, then the same descriptor is read.
    fd = openSync(path, fsConstants.O_RDONLY | fsConstants.O_NONBLOCK);
    const st = fstatSync(fd);
    if (st.isDirectory()) throw new InputError("is a directory, not an APK or manifest");
    if (!st.isFile()) throw new InputError("is not a regular file (a device, FIFO or socket); give an APK or manifest file");
    const source = fdSource(fd, st.size);
    fd = undefined; // the source owns it now
    return readAppSource(source, path, options, code);
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
