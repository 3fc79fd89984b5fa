/**
 * All archive access lives here, so that the reader can change without touching the decoders. Two entry
 * points: `openArchive` for a random-access source (a file, opened by the ops layer: nothing here touches
 * the file system), `openArchiveBytes` for bytes in memory.
 *
 * Reading an APK: rather than read a 200 MB file to look at a 3 KB manifest, `openArchive` reads the
 * end-of-central-directory record and the central directory, parses the records itself, and reads an
 * entry's local header and data from the file when asked. Time and memory follow what is read, not the
 * file size. A caller that needs only some entries names them (`only`), and the one pass over the
 * directory keeps just those records. Zip64 archives (APPNOTE 4.3.14–4.3.15, 4.5.3: sizes and offsets
 * past 4 GiB or 65,535 entries) are read the same way, through the zip64 end record and extra fields.
 *
 * Inflation is ours: every entry is checked against its declared size and a named limit first, and
 * inflated with a hard output cap, so a zip bomb stops at the cap.
 */
import { crc32, inflateRawSync } from "node:zlib";
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
  return openSource(bufferSource(buf), only);
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
    return openSource(bufferSource(buf), only);
  }
  return openSource(src, only);
}

function openSource(src: Source, only: EntryFilter | undefined): ArchiveReader {
  try {
    const size = src.size;
    const tailStart = Math.max(0, size - EOCD_SEARCH);
    const tail = src.slice(tailStart, size - tailStart);
    const eocd = findEocd(tail);
    if (eocd < 0) throw new ArchiveError("no end of central directory record (not a zip archive, or truncated)");
    let cdSize = tail.readUInt32LE(eocd + 12); // EOCD: size of the central directory
    let cdOffset = tail.readUInt32LE(eocd + 16); // EOCD: offset of start of central directory
    let dirEnd = tailStart + eocd; // where the directory must end: the (zip64) end record
    if (cdOffset === 0xffffffff || cdSize === 0xffffffff || tail.readUInt16LE(eocd + 10) === 0xffff) {
      // Zip64 (APPNOTE 4.3.14, 4.3.15): the real values are in the zip64 end of central directory record,
      // found through its locator, the 20 bytes just before the end record.
      const z = zip64End(src, tailStart + eocd);
      cdSize = z.cdSize;
      cdOffset = z.cdOffset;
      dirEnd = z.at;
    }
    if (cdOffset + cdSize > dirEnd) throw new ArchiveError(`central directory (${cdSize} bytes at ${cdOffset}) overlaps its end record at ${dirEnd}`);
    // The record count is checked on the raw directory as it is parsed.
    const names = only === undefined || typeof only === "function" ? undefined : new Set(only);
    const keep = only === undefined ? () => true : typeof only === "function" ? only : (n: string) => names!.has(n);
    const records = selectRecords(src.slice(cdOffset, cdSize), keep);
    return new DirectoryArchive(records, () => src.close(), src);
  } catch (e) {
    try { src.close(); } catch { /* already closed */ }
    throw e;
  }
}

const ZIP64_LOCATOR_SIGNATURE = 0x07064b50;
const ZIP64_LOCATOR_SIZE = 20;
const ZIP64_END_SIGNATURE = 0x06064b50;
const ZIP64_END_SIZE = 56;

/** The zip64 end of central directory record, through its locator just before the end record at `eocdAt`. */
function zip64End(src: Source, eocdAt: number): { cdSize: number; cdOffset: number; at: number } {
  const locAt = eocdAt - ZIP64_LOCATOR_SIZE;
  if (locAt < 0) throw new ArchiveError("the end record marks a zip64 archive, but there is no room for its zip64 locator");
  const loc = src.slice(locAt, ZIP64_LOCATOR_SIZE);
  if (loc.readUInt32LE(0) !== ZIP64_LOCATOR_SIGNATURE) throw new ArchiveError(`the end record marks a zip64 archive, but no zip64 locator precedes it (at ${locAt})`);
  // Locator: disk with the zip64 end record (u32 at 4), its offset (u64 at 8), total disks (u32 at 16).
  const at = Number(loc.readBigUInt64LE(8));
  if (loc.readUInt32LE(16) > 1) throw new ArchiveError(`archive spans ${loc.readUInt32LE(16)} disks; Android reads single-file archives only`);
  if (at + ZIP64_END_SIZE > locAt) throw new ArchiveError(`zip64 end record offset ${at} is past its locator at ${locAt}`);
  const rec = src.slice(at, ZIP64_END_SIZE);
  if (rec.readUInt32LE(0) !== ZIP64_END_SIGNATURE) throw new ArchiveError(`no zip64 end of central directory record at offset ${at}`);
  // Zip64 end record: size of the central directory (u64 at 40), its offset (u64 at 48).
  const cdSize = rec.readBigUInt64LE(40);
  const cdOffset = rec.readBigUInt64LE(48);
  if (cdSize > BigInt(at) || cdOffset > BigInt(at)) throw new ArchiveError(`zip64 central directory (${cdSize} bytes at ${cdOffset}) lies past its end record at ${at}`);
  return { cdSize: Number(cdSize), cdOffset: Number(cdOffset), at };
}

const CENTRAL_SIGNATURE = 0x02014b50;
const CENTRAL_HEADER_SIZE = 46;

/** A central directory record as read: the entry's fields, its flags and where its local header is. */
interface DirectoryRecord extends ArchiveEntryInfo {
  flags: number;
  offset: number;
}

/**
 * Parses the central directory records whose names `keep` accepts, in one pass over the directory,
 * counting every record against MAX_ARCHIVE_ENTRIES as it goes. Sizes and offsets of 0xffffffff are
 * read from the record's zip64 extra field (id 1), in the order the format gives them.
 */
function selectRecords(cd: Buffer, keep: (name: string) => boolean): DirectoryRecord[] {
  const kept: DirectoryRecord[] = [];
  let seen = 0;
  for (let p = 0; p + CENTRAL_HEADER_SIZE <= cd.length; ) {
    if (cd.readUInt32LE(p) !== CENTRAL_SIGNATURE) throw new ArchiveError(`central directory is damaged at byte ${p} of ${cd.length}`);
    if (++seen > LIMITS.MAX_ARCHIVE_ENTRIES) throw new LimitError("MAX_ARCHIVE_ENTRIES", seen, LIMITS.MAX_ARCHIVE_ENTRIES, "archive has an entry count of at least");
    // Central header: file name length (u16 at 28), extra field length (u16 at 30), comment length (u16 at 32).
    const nameLen = cd.readUInt16LE(p + 28);
    const extraLen = cd.readUInt16LE(p + 30);
    const next = p + CENTRAL_HEADER_SIZE + nameLen + extraLen + cd.readUInt16LE(p + 32);
    if (next > cd.length) throw new ArchiveError(`central directory record at byte ${p} runs past the directory's end`);
    const name = cd.toString("utf8", p + CENTRAL_HEADER_SIZE, p + CENTRAL_HEADER_SIZE + nameLen);
    if (keep(name)) {
      // Central header: flags (u16 at 8), method (u16 at 10), crc-32 (u32 at 16), compressed size (u32 at
      // 20), uncompressed size (u32 at 24), local header offset (u32 at 42).
      const m = cd.readUInt16LE(p + 10);
      const r: DirectoryRecord = {
        name,
        method: m === 0 ? "stored" : m === 8 ? "deflated" : `method-${m}`,
        compressedSize: cd.readUInt32LE(p + 20),
        size: cd.readUInt32LE(p + 24),
        crc: cd.readUInt32LE(p + 16),
        flags: cd.readUInt16LE(p + 8),
        offset: cd.readUInt32LE(p + 42),
      };
      if (r.size === 0xffffffff || r.compressedSize === 0xffffffff || r.offset === 0xffffffff) zip64Fields(cd, p + CENTRAL_HEADER_SIZE + nameLen, extraLen, r);
      kept.push(r);
    }
    p = next;
  }
  return kept;
}

/** Reads a record's zip64 extra field: the 8-byte values of the fields that are 0xffffffff, in order. */
function zip64Fields(cd: Buffer, at: number, length: number, r: DirectoryRecord): void {
  for (let q = at; q + 4 <= at + length; ) {
    const id = cd.readUInt16LE(q);
    const size = cd.readUInt16LE(q + 2);
    if (q + 4 + size > at + length) break;
    if (id === 0x0001) {
      let v = q + 4;
      const take = () => {
        if (v + 8 > q + 4 + size) throw new ArchiveError(`${r.name}: zip64 extra field is too short`);
        const n = Number(cd.readBigUInt64LE(v));
        v += 8;
        return n;
      };
      if (r.size === 0xffffffff) r.size = take();
      if (r.compressedSize === 0xffffffff) r.compressedSize = take();
      if (r.offset === 0xffffffff) r.offset = take();
      return;
    }
    q += 4 + size;
  }
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

/** An archive read by its (selected) central directory records; entry data comes from the source. */
class DirectoryArchive implements ArchiveReader {
  readonly notes: string[] = [];
  private readonly byName = new Map<string, DirectoryRecord>();

  constructor(
    private readonly records: DirectoryRecord[],
    private readonly onClose: () => void,
    private readonly file: Source,
  ) {
    for (const r of records) {
      // Two entries of one name: which one a reader takes is up to the reader, so neither is trusted.
      if (this.byName.has(r.name)) {
        onClose();
        throw new ArchiveError(`archive declares the same entry twice (${r.name}); refusing an ambiguous archive`);
      }
      this.byName.set(r.name, r);
    }
  }

  entries(): ArchiveEntryInfo[] {
    return this.records.map(({ name, method, compressedSize, size, crc }) => ({ name, method, compressedSize, size, crc }));
  }

  read(name: string, limit: LimitName): Uint8Array {
    const r = this.byName.get(name);
    if (!r) throw new ArchiveError(`no ${name} in archive`);
    return readEntry(r, limit, this.notes, (i) => readLocalEntry(this.file, r.offset, i, name, this.notes), r.flags);
  }

  close(): void {
    this.onClose();
  }
}

/**
 * Reads and checks one entry: declared sizes and ratio against the limit, then inflation with a hard
 * output cap, then size and CRC against the central directory (what the platform's zip reader trusts;
 * where an entry's other fields disagree with it, we read it the same way and say so).
 */
function readEntry(i: ArchiveEntryInfo, limit: LimitName, notes: string[], compressedOf: (i: ArchiveEntryInfo) => Buffer, flags: number): Uint8Array {
  const name = i.name;
  const allowed = LIMITS[limit];
  if (i.size > allowed) throw new LimitError(limit, i.size, allowed, `${name} declares an uncompressed size of`);
  if (i.compressedSize > allowed) throw new LimitError(limit, i.compressedSize, allowed, `${name} declares a compressed size of`);
  if (i.method === "deflated" && i.compressedSize > 0 && i.size / i.compressedSize > LIMITS.MAX_COMPRESSION_RATIO) {
    throw new LimitError("MAX_COMPRESSION_RATIO", Math.round(i.size / i.compressedSize), LIMITS.MAX_COMPRESSION_RATIO, `${name} declares a compression ratio of`);
  }
  if (flags & 0x1) notes.push(`${name} is marked encrypted in the archive but is read as plain, as Android reads it`);
  const compressed = compressedOf(i);
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
