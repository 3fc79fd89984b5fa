/**
 * Little-endian reads over a byte array with bound checks. Decoders read through these helpers so
 * that an offset taken from the input can never read outside the buffer unnoticed.
 */
import { LimitError } from "../../errors.js";
import { LIMITS, type LimitName } from "../../limits.js";

/** A byte view plus the error type a decoder wants raised when the input is short or lies. */
export class ByteReader {
  readonly view: DataView;
  constructor(
    readonly bytes: Uint8Array,
    readonly fail: (message: string) => Error,
  ) {
    this.view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  }

  get length(): number {
    return this.bytes.byteLength;
  }

  /** Throws unless [offset, offset + size) lies inside the buffer. */
  need(offset: number, size: number, what: string): void {
    if (!Number.isInteger(offset) || offset < 0 || size < 0 || offset + size > this.bytes.byteLength) {
      throw this.fail(`${what} at offset ${offset} (+${size} bytes) runs past the end of the data (${this.bytes.byteLength} bytes)`);
    }
  }

  u8(offset: number, what: string): number {
    this.need(offset, 1, what);
    return this.view.getUint8(offset);
  }
  u16(offset: number, what: string): number {
    this.need(offset, 2, what);
    return this.view.getUint16(offset, true);
  }
  u32(offset: number, what: string): number {
    this.need(offset, 4, what);
    return this.view.getUint32(offset, true);
  }
  i32(offset: number, what: string): number {
    this.need(offset, 4, what);
    return this.view.getInt32(offset, true);
  }
  f32(offset: number, what: string): number {
    this.need(offset, 4, what);
    return this.view.getFloat32(offset, true);
  }
}

/** Throws a LimitError when a value read from the input exceeds its named cap. */
export function checkLimit(name: LimitName, found: number, what: string): void {
  const allowed = LIMITS[name];
  if (found > allowed) throw new LimitError(name, found, allowed, what);
}
