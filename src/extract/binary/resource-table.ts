/**
 * Just enough of resources.arsc (ResTable, ResourceTypes.h) to resolve a reference from the manifest to
 * its value in the default configuration: the app label and other string attributes given as `@string/…`.
 * Bytes in, resolver out; no I/O. Chunks are indexed on construction and entries decoded on demand.
 */
import { ResourceTableError } from "../../errors.js";
import { LIMITS } from "../../limits.js";
import {
  RES_STRING_POOL_TYPE,
  RES_TABLE_PACKAGE_TYPE,
  RES_TABLE_TYPE,
  RES_TABLE_TYPE_TYPE,
  StringPool,
  readChunkHeader,
} from "./chunks.js";
import { ByteReader, checkLimit } from "./reader.js";
import { typedValue, type TypedValue } from "./values.js";

// ResTable_type.flags
const FLAG_SPARSE = 0x01;
const FLAG_OFFSET16 = 0x02;
// ResTable_entry.flags
const ENTRY_FLAG_COMPLEX = 0x0001;
const ENTRY_FLAG_COMPACT = 0x0008;
const NO_ENTRY = 0xffffffff;

interface TypeChunk {
  offset: number;
  headerSize: number;
  size: number;
  flags: number;
  entryCount: number;
  entriesStart: number;
  isDefault: boolean;
}

export class ResourceTable {
  private readonly r: ByteReader;
  private globalPool?: StringPool;
  /** package id → type id → type chunks */
  private readonly types = new Map<number, Map<number, TypeChunk[]>>();

  constructor(bytes: Uint8Array) {
    this.r = new ByteReader(bytes, (m) => new ResourceTableError(m));
    checkLimit("MAX_RESOURCE_TABLE_BYTES", bytes.length, "resource table has a size in bytes of");
    const head = readChunkHeader(this.r, 0, bytes.length, "resource table");
    if (head.type !== RES_TABLE_TYPE) throw new ResourceTableError("not a resource table (no RES_TABLE_TYPE header)");
    let p = head.headerSize;
    while (p + 8 <= head.size) {
      const c = readChunkHeader(this.r, p, head.size, "resource table");
      if (c.type === RES_STRING_POOL_TYPE && !this.globalPool) this.globalPool = new StringPool(this.r, c);
      else if (c.type === RES_TABLE_PACKAGE_TYPE) this.indexPackage(c.offset, c.headerSize, c.size);
      p += c.size;
    }
  }

  private indexPackage(offset: number, headerSize: number, size: number): void {
    const r = this.r;
    const id = r.u32(offset + 8, "package id"); // ResTable_package.id
    const byType = this.types.get(id) ?? new Map<number, TypeChunk[]>();
    this.types.set(id, byType);
    let p = offset + headerSize;
    const end = offset + size;
    while (p + 8 <= end) {
      const c = readChunkHeader(r, p, end, "resource package");
      if (c.type === RES_TABLE_TYPE_TYPE) {
        // ResTable_type: id (u8), flags (u8), reserved (u16), entryCount (u32), entriesStart (u32), config
        const typeId = r.u8(p + 8, "type id");
        const flags = r.u8(p + 9, "type flags");
        const entryCount = r.u32(p + 12, "type entryCount");
        const entriesStart = r.u32(p + 16, "type entriesStart");
        checkLimit("MAX_TYPE_ENTRIES", entryCount, "resource type declares an entry count of");
        const configSize = r.u32(p + 20, "config size"); // ResTable_config.size
        const configEnd = Math.min(p + 20 + configSize, p + c.headerSize);
        let isDefault = true;
        for (let q = p + 24; q < configEnd; q++) if (r.u8(q, "config") !== 0) { isDefault = false; break; }
        const list = byType.get(typeId) ?? [];
        list.push({ offset: p, headerSize: c.headerSize, size: c.size, flags, entryCount, entriesStart, isDefault });
        byType.set(typeId, list);
      }
      p += c.size;
    }
  }

  /**
   * The value of resource `id` in the default configuration, following references up to
   * MAX_REFERENCE_HOPS. Undefined when the table has no default value for it (or it is a bag).
   */
  resolve(id: number): TypedValue | undefined {
    let current = id >>> 0;
    for (let hop = 0; hop <= LIMITS.MAX_REFERENCE_HOPS; hop++) {
      const v = this.lookup(current);
      if (!v || v.kind !== "reference") return v;
      current = v.id;
    }
    return undefined;
  }

  /** The string value of `id` in the default configuration, if it is a string. */
  resolveString(id: number): string | undefined {
    const v = this.resolve(id);
    return v?.kind === "string" ? v.value : undefined;
  }

  private lookup(id: number): TypedValue | undefined {
    const chunks = this.types.get(id >>> 24)?.get((id >>> 16) & 0xff);
    if (!chunks) return undefined;
    const entry = id & 0xffff;
    for (const t of chunks) {
      if (!t.isDefault) continue;
      const v = this.readEntry(t, entry);
      if (v) return v;
    }
    return undefined;
  }

  private readEntry(t: TypeChunk, index: number): TypedValue | undefined {
    const r = this.r;
    const offsetsAt = t.offset + t.headerSize;
    let rel: number = NO_ENTRY;
    if (t.flags & FLAG_SPARSE) {
      // Sparse: sorted (idx u16, offset/4 u16) pairs; binary search on idx.
      let lo = 0;
      let hi = t.entryCount - 1;
      while (lo <= hi) {
        const mid = (lo + hi) >>> 1;
        const idx = r.u16(offsetsAt + 4 * mid, "sparse entry index");
        if (idx === index) { rel = r.u16(offsetsAt + 4 * mid + 2, "sparse entry offset") * 4; break; }
        if (idx < index) lo = mid + 1; else hi = mid - 1;
      }
    } else {
      if (index >= t.entryCount) return undefined;
      if (t.flags & FLAG_OFFSET16) {
        const o = r.u16(offsetsAt + 2 * index, "entry offset");
        rel = o === 0xffff ? NO_ENTRY : o * 4;
      } else rel = r.u32(offsetsAt + 4 * index, "entry offset");
    }
    if (rel === NO_ENTRY) return undefined;
    const at = t.offset + t.entriesStart + rel;
    if (at + 8 > t.offset + t.size) throw new ResourceTableError(`resource entry ${index} lies outside its type chunk`);
    const size = r.u16(at, "entry size"); // ResTable_entry.size
    const flags = r.u16(at + 2, "entry flags"); // ResTable_entry.flags
    const str = (i: number) => this.globalPool?.get(i);
    if (flags & ENTRY_FLAG_COMPACT) {
      // Compact entry (newer toolchains): dataType in the high byte of flags, data in the key's place.
      return typedValue(flags >>> 8, r.i32(at + 4, "compact entry data"), str);
    }
    if (flags & ENTRY_FLAG_COMPLEX) return undefined; // a bag (style, plural, array): not a single value
    const v = at + size; // Res_value follows the entry header
    const dataType = r.u8(v + 3, "entry value type");
    const data = r.i32(v + 4, "entry value data");
    const value = typedValue(dataType, data, str);
    return value;
  }
}
