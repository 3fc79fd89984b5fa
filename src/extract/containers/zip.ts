/**
 * All archive access lives here (adm-zip underneath), so that the reader can change without touching
 * the decoders. Two entry points: `openArchive` for a random-access source (a file, opened by the ops
 * layer: nothing here touches the file system), `openArchiveBytes` for bytes in memory.
 *
 * Reading a large APK: adm-zip parses an in-memory buffer. Rather than read a 200 MB file to look at a
 * 3 KB manifest, `openArchive` reads the end-of-central-directory record and the central directory,
 * hands adm-zip just those (with the directory's offset rewritten to 0), and reads an entry's local
 * header and data from the file itself when asked. Time and memory follow what is read, not the file size.
 *
 * adm-zip also builds a full header object for every directory record, which we measured at tens of
 * microseconds each; APKs carry thousands of entries. A caller that needs only some entries names them
 * (`only`), and one pass over the directory keeps just those records for adm-zip to parse.
 *
 * Inflation is ours, not adm-zip's: it would inflate a zip bomb in full, so every entry is checked
 * against its declared size and a named limit first, and inflated with a hard output cap.
 */
import { crc32, inflateRawSync } from "node:zlib";
import AdmZip from "adm-zip";
import { ArchiveError, InputError, LimitError } from "../../errors.js";
import { LIMITS, type LimitName } from "../../limits.js";

export interface ArchiveEntryInfo {
  name: string;
  method: "stored" | "deflated" | `method-${number}`;
  compressedSize: number;
  size: number;
  crc: number;
}

export interface ArchiveReader {
  /** Every entry in the central directory, in order. */
  entries(): ArchiveEntryInfo[];
  /** Oddities met while reading (flags or fields that disagree), for the manifest's notes. */
  readonly notes: string[];
  /** Reads one entry, checking it against `limit` (a LIMITS name) before and while inflating. */
  read(name: string, limit: LimitName): Uint8Array;
  close(): void;
}

const ZIP_LOCAL_MAGIC = [0x50, 0x4b, 0x03, 0x04];
/** End of central directory record: signature PK\5\6, 22 bytes plus a comment of up to 65535. */
const EOCD_SIZE = 22;
const EOCD_SEARCH = EOCD_SIZE + 0xffff;
const LOCAL_HEADER_SIZE = 30;
/** Files up to this size are simply read whole. */
const READ_WHOLE_BELOW = 1024 * 1024;

/**
 * Random access to bytes kept elsewhere (a file): the ops layer adapts a file descriptor to this, so
 * that the container readers stay free of I/O.
 */
export interface RandomAccessSource {
  readonly size: number;
  /** Copies up to `length` bytes at `position` into `into` at `offset`; returns how many were copied (0 at the end). */
  read(into: Uint8Array, offset: number, length: number, position: number): number;
  close(): void;
}

/** The fields of a directory entry that a manifest's provenance records. */
export function entryProvenance(e: ArchiveEntryInfo): { name: string; method: "stored" | "deflated"; compressedSize: number; size: number } {
  return { name: e.name, method: e.method === "stored" ? "stored" : "deflated", compressedSize: e.compressedSize, size: e.size };
}

export function looksLikeZip(bytes: Uint8Array): boolean {
  return ZIP_LOCAL_MAGIC.every((b, i) => bytes[i] === b) || (bytes[0] === 0x50 && bytes[1] === 0x4b && bytes[2] === 0x05 && bytes[3] === 0x06);
}

/** Where archive bytes come from: a file (read on demand) or memory. */
interface Source {
  size: number;
  /** Copies [position, position + length) into `buf` at `offset`. */
  readAt(buf: Buffer, offset: number, length: number, position: number): void;
  /** The bytes [position, position + length) (a view when in memory). */
  slice(position: number, length: number): Buffer;
  close(): void;
}

function bufferSource(buf: Buffer): Source {
  return {
    size: buf.length,
    readAt(into, offset, length, position) {
      if (position + length > buf.length) throw new ArchiveError(`data ends while reading ${length} bytes at offset ${position}`);
      buf.copy(into, offset, position, position + length);
    },
    slice(position, length) {
      if (position + length > buf.length) throw new ArchiveError(`data ends while reading ${length} bytes at offset ${position}`);
      return buf.subarray(position, position + length);
    },
    close() {},
  };
}

function randomAccess(src: RandomAccessSource): Source {
  let open = true;
  return {
    size: src.size,
    readAt: (into, offset, length, position) => readFully(src, into, offset, length, position),
    slice(position, length) {
      const b = Buffer.alloc(length);
      readFully(src, b, 0, length, position);
      return b;
    },
    close() {
      if (open) {
        open = false;
        src.close();
      }
    },
  };
}

type EntryFilter = readonly string[] | ((name: string) => boolean);

export function openArchiveBytes(bytes: Uint8Array, only?: EntryFilter): ArchiveReader {
  const buf = Buffer.isBuffer(bytes) ? bytes : Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  return openSource(bufferSource(buf), only, buf);
}

/**
 * Opens an archive kept outside memory, reading only what is needed from large ones. With `only`, the
 * reader lists and reads just the entries of those names (all records of each name, so duplicates still
 * show). The source is closed by the reader, or here on failure.
 */
export function openArchive(source: RandomAccessSource, only?: EntryFilter): ArchiveReader {
  const src = randomAccess(source);
  if (source.size < READ_WHOLE_BELOW) {
    // Small files: one read, then everything from memory.
    const buf = Buffer.alloc(source.size);
    try {
      src.readAt(buf, 0, source.size, 0);
    } finally {
      src.close();
    }
    return openSource(bufferSource(buf), only, buf);
  }
  return openSource(src, only);
}

function openSource(src: Source, only: EntryFilter | undefined, whole?: Buffer): ArchiveReader {
  try {
    const size = src.size;
    const tailStart = Math.max(0, size - EOCD_SEARCH);
    const tail = src.slice(tailStart, size - tailStart);
    const eocd = findEocd(tail);
    if (eocd < 0) throw new ArchiveError("no end of central directory record (not a zip archive, or truncated)");
    const cdSize = tail.readUInt32LE(eocd + 12); // EOCD: size of the central directory
    const cdOffset = tail.readUInt32LE(eocd + 16); // EOCD: offset of start of central directory
    if (cdOffset === 0xffffffff || cdSize === 0xffffffff) {
      // Zip64: rare for APKs; adm-zip finds its way through the whole file, which is therefore read
      // whole — but only up to a named cap, never a file of any size.
      if (!whole && size > LIMITS.MAX_ZIP64_ARCHIVE_BYTES) throw new LimitError("MAX_ZIP64_ARCHIVE_BYTES", size, LIMITS.MAX_ZIP64_ARCHIVE_BYTES, "zip64 archive has a size in bytes of");
      const buf = whole ?? src.slice(0, size);
      src.close();
      return new AdmArchive(buf, () => {});
    }
    const eocdAt = tailStart + eocd;
    if (cdOffset + cdSize > eocdAt) throw new ArchiveError(`central directory (${cdSize} bytes at ${cdOffset}) overlaps its end record at ${eocdAt}`);
    // The record count is checked on the raw directory, before adm-zip builds an object per record.
    const names = only === undefined || typeof only === "function" ? undefined : new Set(only);
    const keep = only === undefined ? () => true : typeof only === "function" ? only : (n: string) => names!.has(n);
    const { records, count } = selectRecords(src.slice(cdOffset, cdSize), keep);
    if (count > 0xffff) throw new ArchiveError(`archive lists ${count} entries in a directory without zip64 records, which hold at most 65535`);
    // [central directory][end record], the end record pointing at offset 0 and without its comment.
    const end = Buffer.alloc(EOCD_SIZE);
    tail.copy(end, 0, eocd, eocd + EOCD_SIZE);
    end.writeUInt16LE(count, 8);
    end.writeUInt16LE(count, 10);
    end.writeUInt32LE(records.length, 12);
    end.writeUInt32LE(0, 16);
    end.writeUInt16LE(0, 20);
    return new AdmArchive(Buffer.concat([records, end]), () => src.close(), src);
  } catch (e) {
    try { src.close(); } catch { /* already closed */ }
    throw e;
  }
}

const CENTRAL_SIGNATURE = 0x02014b50;
const CENTRAL_HEADER_SIZE = 46;

/**
 * Keeps the central directory records whose names `keep` accepts, in one pass over the directory,
 * counting every record against MAX_ARCHIVE_ENTRIES as it goes.
 */
function selectRecords(cd: Buffer, keep: (name: string) => boolean): { records: Buffer; count: number } {
  const kept: Buffer[] = [];
  let seen = 0;
  for (let p = 0; p + CENTRAL_HEADER_SIZE <= cd.length; ) {
    if (cd.readUInt32LE(p) !== CENTRAL_SIGNATURE) throw new ArchiveError(`central directory is damaged at byte ${p} of ${cd.length}`);
    if (++seen > LIMITS.MAX_ARCHIVE_ENTRIES) throw new LimitError("MAX_ARCHIVE_ENTRIES", seen, LIMITS.MAX_ARCHIVE_ENTRIES, "archive has an entry count of at least");
    // Central header: file name length (u16 at 28), extra field length (u16 at 30), comment length (u16 at 32).
    const nameLen = cd.readUInt16LE(p + 28);
    const next = p + CENTRAL_HEADER_SIZE + nameLen + cd.readUInt16LE(p + 30) + cd.readUInt16LE(p + 32);
    if (next > cd.length) throw new ArchiveError(`central directory record at byte ${p} runs past the directory's end`);
    if (keep(cd.toString("utf8", p + CENTRAL_HEADER_SIZE, p + CENTRAL_HEADER_SIZE + nameLen))) kept.push(cd.subarray(p, next));
    p = next;
  }
  return { records: kept.length === 1 ? kept[0] : Buffer.concat(kept), count: kept.length };
}

function readFully(src: RandomAccessSource, buf: Buffer, offset: number, length: number, position: number): void {
  let done = 0;
  while (done < length) {
    const n = src.read(buf, offset + done, length - done, position + done);
    if (n === 0) throw new ArchiveError(`file ended while reading ${length} bytes at offset ${position}`);
    done += n;
  }
}

function findEocd(buf: Buffer): number {
  for (let i = buf.length - EOCD_SIZE; i >= 0; i--) {
    if (buf[i] === 0x50 && buf[i + 1] === 0x4b && buf[i + 2] === 0x05 && buf[i + 3] === 0x06) return i;
  }
  return -1;
}

type AdmEntry = ReturnType<AdmZip["getEntries"]>[number];

class AdmArchive implements ArchiveReader {
  readonly notes: string[] = [];
  private readonly zip: AdmZip;
  private readonly list: AdmEntry[];

  constructor(
    buf: Buffer,
    private readonly onClose: () => void,
    /** When set, `buf` holds only the central directory and entry data is read from this source. */
    private readonly file?: Source,
  ) {
    try {
      this.zip = new AdmZip(buf, { readEntries: true } as never);
      this.list = this.zip.getEntries();
    } catch (e) {
      onClose();
      throw admError(e);
    }
    if (this.list.length > LIMITS.MAX_ARCHIVE_ENTRIES) {
      onClose();
      throw new LimitError("MAX_ARCHIVE_ENTRIES", this.list.length, LIMITS.MAX_ARCHIVE_ENTRIES, "archive has an entry count of");
    }
  }

  entries(): ArchiveEntryInfo[] {
    return this.list.map(info);
  }

  read(name: string, limit: LimitName): Uint8Array {
    const matches = this.list.filter((e) => e.entryName === name);
    if (matches.length === 0) throw new ArchiveError(`no ${name} in archive`);
    const e = matches[0];
    const i = info(e);
    const allowed = LIMITS[limit];
    if (i.size > allowed) throw new LimitError(limit, i.size, allowed, `${name} declares an uncompressed size of`);
    if (i.compressedSize > allowed) throw new LimitError(limit, i.compressedSize, allowed, `${name} declares a compressed size of`);
    if (i.method === "deflated" && i.compressedSize > 0 && i.size / i.compressedSize > LIMITS.MAX_COMPRESSION_RATIO) {
      throw new LimitError("MAX_COMPRESSION_RATIO", Math.round(i.size / i.compressedSize), LIMITS.MAX_COMPRESSION_RATIO, `${name} declares a compression ratio of`);
    }
    // The central directory is what the platform's zip reader trusts; where an entry's other fields
    // disagree with it, we read it the same way and say so.
    if (e.header.flags & 0x1) this.notes.push(`${name} is marked encrypted in the archive but is read as plain, as Android reads it`);
    let compressed: Buffer;
    try {
      compressed = this.file ? readLocalEntry(this.file, e.header.offset, i, name, this.notes) : e.getCompressedData();
    } catch (err) {
      throw admError(err, name);
    }
    let data: Buffer;
    if (i.method === "stored") data = compressed;
    else if (i.method === "deflated") {
      try {
        // Cap the output one byte past the limit: an entry that lies about its size stops there.
        data = inflateRawSync(compressed, { maxOutputLength: Math.min(allowed, i.size) + 1 });
      } catch (err) {
        if (err instanceof RangeError || (err as { code?: string }).code === "ERR_BUFFER_TOO_LARGE") {
          throw new ArchiveError(`${name} inflates past its declared ${i.size} bytes (a zip bomb, or a damaged entry)`);
        }
        throw new ArchiveError(`${name} cannot be inflated (${(err as Error).message})`);
      }
    } else throw new ArchiveError(`${name} uses compression ${i.method}, which Android does not read`);
    if (data.length !== i.size) throw new ArchiveError(`${name} holds ${data.length} bytes but its header declares ${i.size}`);
    const crc = crc32(data) >>> 0;
    if (crc !== i.crc) throw new ArchiveError(`${name} fails its CRC check (0x${crc.toString(16)} read, 0x${i.crc.toString(16)} declared)`);
    return new Uint8Array(data.buffer, data.byteOffset, data.byteLength);
  }

  close(): void {
    this.onClose();
  }
}

/** Reads an entry's compressed bytes: local header (30 bytes, then name and extra), then data. */
function readLocalEntry(src: Source, at: number, i: ArchiveEntryInfo, name: string, notes: string[]): Buffer {
  if (at + LOCAL_HEADER_SIZE > src.size) throw new ArchiveError(`${name}: local header offset ${at} is past the end of the file`);
  const local = src.slice(at, LOCAL_HEADER_SIZE);
  if (local.readUInt32LE(0) !== 0x04034b50) throw new ArchiveError(`${name}: no local header signature at offset ${at}`);
  const localMethod = local.readUInt16LE(8); // local header: compression method
  const centralMethod = i.method === "stored" ? 0 : i.method === "deflated" ? 8 : -1;
  if (localMethod !== centralMethod) notes.push(`${name}: the local header says compression method ${localMethod}, the central directory ${centralMethod}; read by the central directory, as Android does`);
  const dataAt = at + LOCAL_HEADER_SIZE + local.readUInt16LE(26) + local.readUInt16LE(28); // name and extra lengths
  if (dataAt + i.compressedSize > src.size) throw new ArchiveError(`${name}: ${i.compressedSize} bytes of data at ${dataAt} run past the end of the file`);
  return src.slice(dataAt, i.compressedSize);
}

function info(e: AdmEntry): ArchiveEntryInfo {
  const h = e.header;
  const method = h.method === 0 ? "stored" : h.method === 8 ? "deflated" : (`method-${h.method}` as const);
  return { name: e.entryName, method, compressedSize: h.compressedSize, size: h.size, crc: h.crc >>> 0 };
}

/** Turns adm-zip's plain Errors into one-line ArchiveErrors. */
function admError(e: unknown, entry?: string): Error {
  if (e instanceof ArchiveError) return e;
  const msg = e instanceof Error ? e.message : String(e);
  const what = /END header/i.test(msg)
    ? "no end of central directory record (not a zip archive, or truncated)"
    : /Duplicate entry name/i.test(msg)
      ? `archive declares the same entry twice (${msg.replace(/^.*Duplicate entry name\s*/i, "")}); refusing an ambiguous archive`
      : `damaged archive (${msg})`;
  return new ArchiveError(entry ? `${entry}: ${what}` : what, { cause: e });
}

/**
 * Reads an optional table entry with `parse`, for labels: a damaged one costs the labels, not the manifest
 * (references then stay ids), so an InputError becomes a problem to note instead of a failure.
 */
export function readOptionalTable<T>(archive: ArchiveReader, entry: string, present: boolean, parse: (bytes: Uint8Array) => T): { value?: T; problem?: string } {
  if (!present) return {};
  try {
    return { value: parse(archive.read(entry, "MAX_RESOURCE_TABLE_BYTES")) };
  } catch (e) {
    if (!(e instanceof InputError)) throw e;
    return { problem: e.message };
  }
}
