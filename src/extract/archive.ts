/**
 * All archive access lives here (adm-zip underneath), so that the reader can change without touching
 * the decoders. Two entry points: `openArchiveFile` for a path, `openArchiveBytes` for bytes in memory.
 *
 * Reading a large APK: adm-zip parses an in-memory buffer. Rather than read a 200 MB file to look at a
 * 3 KB manifest, `openArchiveFile` hands adm-zip a zero-filled buffer of the file's size into which only
 * the end-of-central-directory record, the central directory and (on request) the one entry's local
 * header and data are read. The kernel commits only the pages written, so time and memory follow what
 * is read, not the file size.
 *
 * Inflation is ours, not adm-zip's: it would inflate a zip bomb in full, so every entry is checked
 * against its declared size and a named limit first, and inflated with a hard output cap.
 */
import { closeSync, fstatSync, openSync, readSync } from "node:fs";
import { crc32, inflateRawSync } from "node:zlib";
import AdmZip from "adm-zip";
import { ArchiveError, LimitError } from "../errors.js";
import { LIMITS, type LimitName } from "../limits.js";

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
const READ_WHOLE_BELOW = 4 * 1024 * 1024;

export function looksLikeZip(bytes: Uint8Array): boolean {
  return ZIP_LOCAL_MAGIC.every((b, i) => bytes[i] === b) || (bytes[0] === 0x50 && bytes[1] === 0x4b && bytes[2] === 0x05 && bytes[3] === 0x06);
}

export function openArchiveBytes(bytes: Uint8Array): ArchiveReader {
  const buf = Buffer.isBuffer(bytes) ? bytes : Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  return new AdmArchive(buf, () => {});
}

/** Opens an archive on disk, reading only what is needed from large files. */
export function openArchiveFile(path: string): ArchiveReader {
  const fd = openSync(path, "r");
  try {
    const size = fstatSync(fd).size;
    if (size < READ_WHOLE_BELOW) {
      const buf = Buffer.alloc(size);
      readFully(fd, buf, 0, size);
      closeSync(fd);
      return new AdmArchive(buf, () => {});
    }
    const buf = Buffer.alloc(size); // zero pages: committed only where written
    const tailStart = Math.max(0, size - EOCD_SEARCH);
    readFully(fd, buf, tailStart, size - tailStart);
    const eocd = findEocd(buf, tailStart);
    if (eocd < 0) throw new ArchiveError("no end of central directory record (not a zip archive, or truncated)");
    const cdSize = buf.readUInt32LE(eocd + 12); // EOCD: size of the central directory
    const cdOffset = buf.readUInt32LE(eocd + 16); // EOCD: offset of start of central directory
    if (cdOffset === 0xffffffff || cdSize === 0xffffffff) {
      readFully(fd, buf, 0, tailStart); // zip64: let adm-zip find its way through the whole file
    } else {
      if (cdOffset + cdSize > eocd) throw new ArchiveError(`central directory (${cdSize} bytes at ${cdOffset}) overlaps its end record at ${eocd}`);
      if (cdOffset < tailStart) readFully(fd, buf, cdOffset, tailStart - cdOffset);
    }
    const archive = new AdmArchive(buf, () => closeSync(fd), (offset, length) => readFully(fd, buf, offset, length));
    return archive;
  } catch (e) {
    try { closeSync(fd); } catch { /* already closed */ }
    throw e;
  }
}

function readFully(fd: number, buf: Buffer, offset: number, length: number): void {
  let done = 0;
  while (done < length) {
    const n = readSync(fd, buf, offset + done, length - done, offset + done);
    if (n === 0) throw new ArchiveError(`file ended while reading ${length} bytes at offset ${offset}`);
    done += n;
  }
}

function findEocd(buf: Buffer, from: number): number {
  for (let i = buf.length - EOCD_SIZE; i >= from; i--) {
    if (buf[i] === 0x50 && buf[i + 1] === 0x4b && buf[i + 2] === 0x05 && buf[i + 3] === 0x06) return i;
  }
  return -1;
}

type AdmEntry = ReturnType<AdmZip["getEntries"]>[number];

class AdmArchive implements ArchiveReader {
  private readonly zip: AdmZip;
  private readonly list: AdmEntry[];

  constructor(
    private readonly buf: Buffer,
    private readonly onClose: () => void,
    /** Fills [offset, offset+length) of `buf` from the file, for sparse buffers. */
    private readonly fill?: (offset: number, length: number) => void,
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
    if (this.fill) {
      const at = e.header.offset;
      if (at + LOCAL_HEADER_SIZE > this.buf.length) throw new ArchiveError(`${name}: local header offset ${at} is past the end of the file`);
      this.fill(at, LOCAL_HEADER_SIZE);
      // Local header: file name length (u16 at 26) and extra field length (u16 at 28) precede the data.
      const nameLen = this.buf.readUInt16LE(at + 26);
      const extraLen = this.buf.readUInt16LE(at + 28);
      const end = Math.min(this.buf.length, at + LOCAL_HEADER_SIZE + nameLen + extraLen + i.compressedSize);
      this.fill(at + LOCAL_HEADER_SIZE, end - at - LOCAL_HEADER_SIZE);
    }
    let compressed: Buffer;
    try {
      compressed = e.getCompressedData();
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
