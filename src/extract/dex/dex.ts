/**
 * A reader for Dalvik executables (`classes.dex` …; dex format versions 035–041, as the platform's
 * "Dalvik Executable format" page defines them): bytes in, the id tables and, per class, which framework
 * methods and fields its code references and which string constants it loads. Enough to tell which APIs an
 * app's code can reach — not a disassembler. Every count and offset passes a named limit; a damaged file
 * raises a DexError that says what was found.
 */
import { DexError } from "../../errors.js";
import { LIMITS } from "../../limits.js";
import { ByteReader, checkLimit } from "../binary/reader.js";

export interface DexMethodRef {
  /** Type descriptor of the class that declares the method: `Landroid/telephony/SmsManager;`. */
  owner: string;
  name: string;
  /** Parameter type descriptors and the return type descriptor. */
  params: string[];
  returns: string;
  /** `name(params)returns` in descriptors: the key a method is found by across dex files. */
  sig: string;
}

export interface DexFieldRef {
  owner: string;
  name: string;
  type: string;
}

/** How an invoke instruction dispatches (Dalvik bytecode, invoke-kind). */
export const InvokeKind = { Virtual: 0, Super: 1, Direct: 2, Static: 3, Interface: 4, Polymorphic: 5 } as const;
export type InvokeKind = (typeof InvokeKind)[keyof typeof InvokeKind];

/** A method the class defines (encoded_method of class_data_item), with what its own code refers to. */
export interface DexMethodDef {
  /** Index into the method ids. */
  id: number;
  accessFlags: number;
  /** Declared among direct_methods (static, private or a constructor): never dispatched virtually. */
  direct: boolean;
  /**
   * Where its references start in `DexFile.code` (see `methodCode`); -1 for a method without code
   * (abstract or native).
   */
  at: number;
}

export interface DexClass {
  descriptor: string;
  superclass?: string;
  /** Interfaces the class declares it implements (its own list, not inherited ones). */
  interfaces: string[];
  accessFlags: number;
  /** The methods it defines, direct then virtual, in file order. */
  methods: DexMethodDef[];
}

/** One method's references, each list unique in the order the code first uses it. */
export interface MethodCode {
  /** `methodIndex * 8 + InvokeKind`. */
  invokes: Int32Array;
  fields: Int32Array;
  strings: Int32Array;
  /** Types it instantiates (`new-instance`) or names as a class constant (`const-class`). */
  types: Int32Array;
}

/** ACC_INTERFACE, ACC_ABSTRACT, ACC_STATIC, ACC_PRIVATE, ACC_NATIVE, ACC_CONSTRUCTOR (dex format, access_flags). */
export const ACC = { PUBLIC: 0x1, PRIVATE: 0x2, STATIC: 0x8, NATIVE: 0x100, INTERFACE: 0x200, ABSTRACT: 0x400, CONSTRUCTOR: 0x10000 } as const;

export interface DexFile {
  version: string;
  /** How many strings the string table holds. */
  stringCount: number;
  /** String `i`, decoded from MUTF-8 on first use (most strings are never needed); bad bytes raise DexError. */
  string(i: number): string;
  /** Whether string `i` starts with the ASCII `prefix`, read from its bytes without decoding it. */
  stringStartsWith(i: number, prefix: string): boolean;
  /** Every string, decoded (a decode of each on first access: for listings and tests). */
  readonly strings: string[];
  typeCount: number;
  /** Type descriptor `i` (made on first use; a bad index raises DexError). */
  type(i: number): string;
  methodCount: number;
  /** Method id `i` (made on first use; a bad index raises DexError). */
  method(i: number): DexMethodRef;
  fieldCount: number;
  /** Field id `i` (made on first use; a bad index raises DexError). */
  field(i: number): DexFieldRef;
  /** Every type, method and field id, made on access (for listings and tests). */
  readonly types: string[];
  readonly methods: DexMethodRef[];
  readonly fields: DexFieldRef[];
  classes: DexClass[];
  /** The references of every method with code, packed; read through `methodCode`. */
  code: Int32Array;
}

/** One method's references, as views into the dex's packed table (no copy). */
export function methodCode(dex: Pick<DexFile, "code">, def: DexMethodDef): MethodCode {
  const c = dex.code;
  if (def.at < 0) return EMPTY_CODE;
  const [ni, nf, ns, nt] = [c[def.at], c[def.at + 1], c[def.at + 2], c[def.at + 3]];
  let p = def.at + 4;
  const take = (n: number) => c.subarray(p, (p += n));
  return { invokes: take(ni), fields: take(nf), strings: take(ns), types: take(nt) };
}

/** Indices into the method, field and string ids that a class's code uses, each once, in the order its methods first use them. */
export function classRefs(dex: Pick<DexFile, "code">, cls: DexClass): { methodRefs: number[]; fieldRefs: number[]; stringRefs: number[] } {
  const m = new Set<number>();
  const f = new Set<number>();
  const s = new Set<number>();
  for (const def of cls.methods) {
    const code = methodCode(dex, def);
    for (const v of code.invokes) m.add(v >>> 3);
    for (const v of code.fields) f.add(v);
    for (const v of code.strings) s.add(v);
  }
  return { methodRefs: [...m], fieldRefs: [...f], stringRefs: [...s] };
}

const EMPTY_CODE: MethodCode = { invokes: new Int32Array(0), fields: new Int32Array(0), strings: new Int32Array(0), types: new Int32Array(0) };

const NO_INDEX = 0xffffffff;

/** Dex files start with `dex\n` and a three-digit version and a NUL. */
export function looksLikeDex(bytes: Uint8Array): boolean {
  return bytes.length >= 8 && bytes[0] === 0x64 && bytes[1] === 0x65 && bytes[2] === 0x78 && bytes[3] === 0x0a && bytes[7] === 0;
}

/** Width in 16-bit code units of each opcode (Dalvik bytecode formats); 0: not a valid opcode. */
const WIDTH = new Uint8Array(256);
(() => {
  const set = (from: number, to: number, w: number) => {
    for (let op = from; op <= to; op++) WIDTH[op] = w;
  };
  set(0x00, 0x01, 1); WIDTH[0x02] = 2; WIDTH[0x03] = 3; WIDTH[0x04] = 1; WIDTH[0x05] = 2; WIDTH[0x06] = 3; WIDTH[0x07] = 1; WIDTH[0x08] = 2; WIDTH[0x09] = 3;
  set(0x0a, 0x12, 1); WIDTH[0x13] = 2; WIDTH[0x14] = 3; WIDTH[0x15] = 2; WIDTH[0x16] = 2; WIDTH[0x17] = 3; WIDTH[0x18] = 5; WIDTH[0x19] = 2;
  WIDTH[0x1a] = 2; WIDTH[0x1b] = 3; WIDTH[0x1c] = 2; WIDTH[0x1d] = 1; WIDTH[0x1e] = 1; WIDTH[0x1f] = 2; WIDTH[0x20] = 2; WIDTH[0x21] = 1; WIDTH[0x22] = 2; WIDTH[0x23] = 2;
  WIDTH[0x24] = 3; WIDTH[0x25] = 3; WIDTH[0x26] = 3; WIDTH[0x27] = 1; WIDTH[0x28] = 1; WIDTH[0x29] = 2; WIDTH[0x2a] = 3; WIDTH[0x2b] = 3; WIDTH[0x2c] = 3;
  set(0x2d, 0x3d, 2); set(0x44, 0x6d, 2); set(0x6e, 0x72, 3); set(0x74, 0x78, 3); set(0x7b, 0x8f, 1); set(0x90, 0xaf, 2); set(0xb0, 0xcf, 1); set(0xd0, 0xe2, 2);
  WIDTH[0xfa] = 4; WIDTH[0xfb] = 4; WIDTH[0xfc] = 3; WIDTH[0xfd] = 3; WIDTH[0xfe] = 2; WIDTH[0xff] = 2;
})();

/**
 * One unsigned LEB128 value at `at.p` (dex format, "LEB128"): at most 5 bytes for 32 bits; `at.p` moves past
 * it. The one-byte case, most of a dex's values, returns at once. The one ULEB128 reader of the dex code.
 */
function uleb(bytes: Uint8Array, at: { p: number }, what: string): number {
  const first = bytes[at.p];
  // (Past the end, `first` is undefined: the comparison fails and the checked loop below says so.)
  if (first < 0x80) {
    at.p++;
    return first;
  }
  let v = 0;
  for (let shift = 0; shift < 35; shift += 7) {
    if (at.p >= bytes.length) throw new DexError(`${what}: a ULEB128 value runs past the end of the file at offset ${at.p}`);
    const b = bytes[at.p++];
    v += (b & 0x7f) * 2 ** shift;
    if (b < 0x80) return v;
  }
  throw new DexError(`${what}: a ULEB128 value runs past 5 bytes at offset ${at.p}`);
}

/** MUTF-8 (modified UTF-8, as dex strings are stored) to a string. */
function mutf8(bytes: Uint8Array, start: number, units: number, fail: (m: string) => Error): string {
  // Most dex strings are ASCII (class, method and field names): one check, then one conversion.
  if (units <= 1024 && start + units <= bytes.length) {
    let ascii = true;
    for (let p = start; p < start + units; p++) {
      if (bytes[p] >= 0x80 || bytes[p] === 0) {
        ascii = false;
        break;
      }
    }
    if (ascii) return String.fromCharCode.apply(null, bytes.subarray(start, start + units) as unknown as number[]);
  }
  let out = "";
  let p = start;
  for (let i = 0; i < units; i++) {
    if (p >= bytes.length) throw fail(`string data at ${start} runs past the end of the file`);
    const a = bytes[p++];
    if (a < 0x80) out += String.fromCharCode(a);
    else if ((a & 0xe0) === 0xc0) out += String.fromCharCode(((a & 0x1f) << 6) | (bytes[p++] & 0x3f));
    else if ((a & 0xf0) === 0xe0) {
      const b = bytes[p++];
      const c = bytes[p++];
      out += String.fromCharCode(((a & 0x0f) << 12) | ((b & 0x3f) << 6) | (c & 0x3f));
    } else throw fail(`string data at ${start} has a byte 0x${a.toString(16)} that MUTF-8 does not use`);
  }
  return out;
}

/** An id table of the header: its entry count and offset, checked to lie inside the file. */
interface IdTable {
  size: number;
  off: number;
}

/** The header's checks and its id tables (header_item, dex format). */
function readHeader(bytes: Uint8Array, r: ByteReader): { version: string; strT: IdTable; typeT: IdTable; protoT: IdTable; fieldT: IdTable; methodT: IdTable; classT: IdTable } {
  checkLimit("MAX_DEX_BYTES", bytes.length, "dex file has a size in bytes of");
  if (!looksLikeDex(bytes)) throw new DexError("is not a dex file (no dex magic)");
  const version = String.fromCharCode(bytes[4], bytes[5], bytes[6]);
  if (!/^0(3[5-9]|4[01])$/.test(version)) throw new DexError(`has dex version ${version}; versions 035 to 041 are read`);
  // header_item: endian_tag (0x28), then size/offset pairs of each id table.
  if (r.u32(0x28, "header endian_tag") !== 0x12345678) throw new DexError("is byte-swapped (endian_tag is not 0x12345678); only little-endian dex files exist on devices");
  const table = (at: number, what: string, entry: number): IdTable => {
    const size = r.u32(at, `${what}_size`);
    const off = r.u32(at + 4, `${what}_off`);
    checkLimit("MAX_DEX_IDS", size, `dex ${what} declares a count of`);
    if (size) r.need(off, size * entry, `${what} table`);
    return { size, off };
  };
  return {
    version,
    strT: table(0x38, "string_ids", 4),
    typeT: table(0x40, "type_ids", 4),
    protoT: table(0x48, "proto_ids", 12),
    fieldT: table(0x50, "field_ids", 8),
    methodT: table(0x58, "method_ids", 8),
    classT: table(0x60, "class_defs", 32),
  };
}

/** The string table, walked now (every offset and length checked); each string decoded when first asked for. */
function stringTable(bytes: Uint8Array, r: ByteReader, strT: IdTable) {
  const starts = new Uint32Array(strT.size);
  const lengths = new Uint32Array(strT.size);
  const bytesLength = bytes.length;
  const maxLength = LIMITS.MAX_STRING_LENGTH;
  const sv = r.view;
  const at = { p: 0 };
  for (let i = 0; i < strT.size; i++) {
    at.p = sv.getUint32(strT.off + 4 * i, true); // inside the table, checked by readHeader()
    const units = uleb(bytes, at, "string length");
    const p = at.p;
    if (units > maxLength) checkLimit("MAX_STRING_LENGTH", units, "dex string declares a length of");
    if (p + units > bytesLength) throw new DexError(`string data at ${p} runs past the end of the file`);
    starts[i] = p;
    lengths[i] = units;
  }
  const decoded = new Array<string | undefined>(strT.size);
  const fail = (m: string) => new DexError(m);
  const stringAt = (i: number): string => {
    if (!(i >= 0 && i < strT.size)) throw new DexError(`string ${i} is past the ${strT.size} strings`);
    let v = decoded[i];
    if (v === undefined) decoded[i] = v = mutf8(bytes, starts[i], lengths[i], fail);
    return v;
  };
  const str = (i: number, what: string) => {
    if (i >= strT.size) throw new DexError(`${what} names string ${i}, past the ${strT.size} strings`);
    return stringAt(i);
  };
  const startsWith = (i: number, prefix: string): boolean => {
    if (!(i >= 0 && i < strT.size) || lengths[i] < prefix.length) return false;
    const p = starts[i];
    for (let k = 0; k < prefix.length; k++) if (bytes[p + k] !== prefix.charCodeAt(k)) return false;
    return true;
  };
  return { stringAt, str, startsWith };
}

/**
 * Types, protos, methods and fields, made when first asked for (a dex names far more than any caller looks
 * up); a bad index among them is a DexError then. Each id table lies inside the file (readHeader()), so its
 * entries are read directly.
 */
function idLookups(r: ByteReader, h: ReturnType<typeof readHeader>, str: (i: number, what: string) => string) {
  const { typeT, protoT, fieldT, methodT } = h;
  const dv = r.view;
  const typeCache = new Array<string | undefined>(typeT.size);
  const type = (i: number, what: string): string => {
    if (!(i >= 0 && i < typeT.size)) throw new DexError(`${what} names type ${i}, past the ${typeT.size} types`);
    return (typeCache[i] ??= str(dv.getUint32(typeT.off + 4 * i, true), "type_id"));
  };
  const protoCache = new Array<{ params: string[]; returns: string; shape: string } | undefined>(protoT.size);
  const proto = (i: number): { params: string[]; returns: string; shape: string } => {
    let v = protoCache[i];
    if (v) return v;
    const base = protoT.off + 12 * i;
    const returns = type(dv.getUint32(base + 4, true), "proto_id");
    const listOff = dv.getUint32(base + 8, true);
    const params: string[] = [];
    if (listOff) {
      const n = r.u32(listOff, "type_list size");
      checkLimit("MAX_DEX_IDS", n, "dex parameter list declares a count of");
      r.need(listOff + 4, 2 * n, "type_list");
      for (let k = 0; k < n; k++) params.push(type(dv.getUint16(listOff + 4 + 2 * k, true), "type_list"));
    }
    return (protoCache[i] = v = { params, returns, shape: `(${params.join("")})${returns}` });
  };
  const fieldCache = new Array<DexFieldRef | undefined>(fieldT.size);
  const field = (i: number): DexFieldRef => {
    if (!(i >= 0 && i < fieldT.size)) throw new DexError(`field ${i} is past the ${fieldT.size} field ids`);
    const base = fieldT.off + 8 * i;
    return (fieldCache[i] ??= { owner: type(dv.getUint16(base, true), "field_id"), type: type(dv.getUint16(base + 2, true), "field_id"), name: str(dv.getUint32(base + 4, true), "field_id") });
  };
  const methodCache = new Array<DexMethodRef | undefined>(methodT.size);
  const method = (i: number): DexMethodRef => {
    if (!(i >= 0 && i < methodT.size)) throw new DexError(`method ${i} is past the ${methodT.size} method ids`);
    let m = methodCache[i];
    if (m) return m;
    const base = methodT.off + 8 * i;
    const protoIdx = dv.getUint16(base + 2, true);
    if (protoIdx >= protoT.size) throw new DexError(`method_id ${i} names proto ${protoIdx}, past the ${protoT.size} protos`);
    const pr = proto(protoIdx);
    const name = str(dv.getUint32(base + 4, true), "method_id");
    return (methodCache[i] = m = { owner: type(dv.getUint16(base, true), "method_id"), name, params: pr.params, returns: pr.returns, sig: name + pr.shape });
  };
  return { type, field, method };
}

/** A growable Int32Array: the packed per-method references of one dex. */
class Packed {
  buf = new Int32Array(4096);
  length = 0;
  /** Room for `n` more values (grown by doubling). */
  reserve(n: number): void {
    if (this.length + n <= this.buf.length) return;
    let size = this.buf.length * 2;
    while (size < this.length + n) size *= 2;
    const next = new Int32Array(size);
    next.set(this.buf.subarray(0, this.length));
    this.buf = next;
  }
  /** Appends a list (room reserved first). */
  append(list: readonly number[]): void {
    const b = this.buf;
    let at = this.length;
    for (let k = 0; k < list.length; k++) b[at++] = list[k];
    this.length = at;
  }
}

/** Every class_def with the methods, fields and strings its code refers to, per class and per method. */
function readClasses(bytes: Uint8Array, r: ByteReader, h: ReturnType<typeof readHeader>, type: (i: number, what: string) => string): { classes: DexClass[]; code: Int32Array } {
  const { strT, typeT, fieldT, methodT, classT } = h;
  const classes: DexClass[] = [];
  let codeUnits = 0;
  // Which method last noted each id: a reference is listed once per method without a set per method.
  const seenByMethod = { m: new Int32Array(methodT.size), f: new Int32Array(fieldT.size), s: new Int32Array(strT.size), t: new Int32Array(typeT.size) };
  const sizes = { strings: strT.size, methods: methodT.size, fields: fieldT.size, types: typeT.size };
  const packed = new Packed();
  const scratch: MethodScratch = { stamp: 0, seen: seenByMethod, inv: [], f: [], s: [], t: [] };
  for (let i = 0; i < classT.size; i++) {
    const base = classT.off + 32 * i;
    const descriptor = type(r.u32(base, "class_def class_idx"), "class_def");
    const accessFlags = r.u32(base + 4, "class_def access_flags");
    const superIdx = r.u32(base + 8, "class_def superclass_idx");
    const interfacesOff = r.u32(base + 12, "class_def interfaces_off");
    const dataOff = r.u32(base + 24, "class_def class_data_off");
    const methods: DexMethodDef[] = [];
    const interfaces: string[] = [];
    if (interfacesOff) {
      const n = r.u32(interfacesOff, "class_def interfaces size");
      checkLimit("MAX_DEX_IDS", n, "dex interface list declares a count of");
      r.need(interfacesOff + 4, 2 * n, "interfaces type_list");
      for (let k = 0; k < n; k++) interfaces.push(type(r.view.getUint16(interfacesOff + 4 + 2 * k, true), "class_def interfaces"));
    }
    if (dataOff) {
      const at = { p: dataOff };
      const next = (what: string): number => uleb(bytes, at, what);
      const counts = [next("class_data"), next("class_data"), next("class_data"), next("class_data")];
      for (const n of counts) checkLimit("MAX_DEX_IDS", n, "dex class data declares a member count of");
      // Fields carry (field_idx_diff, access_flags); methods add code_off.
      for (let k = 0; k < counts[0] + counts[1]; k++) {
        next("encoded_field");
        next("encoded_field");
      }
      for (let list = 0; list < 2; list++) {
        // method_idx_diff: the first of each list is the index itself, the rest add to the one before.
        let id = 0;
        for (let k = 0; k < counts[2 + list]; k++) {
          id += next("encoded_method method_idx_diff");
          const flags = next("encoded_method access_flags");
          const codeOff = next("encoded_method code_off");
          if (id >= methodT.size) throw new DexError(`class ${descriptor} defines method ${id}, past the ${methodT.size} method ids`);
          if (!codeOff) {
            methods.push({ id, accessFlags: flags, direct: list === 0, at: -1 });
            continue;
          }
          // code_item: insns_size (u32) at +12, insns (u16 each) from +16.
          const insns = r.u32(codeOff + 12, "code_item insns_size");
          codeUnits += insns;
          checkLimit("MAX_DEX_CODE_UNITS", codeUnits, "dex code holds instructions, in 16-bit units, to a count of");
          r.need(codeOff + 16, 2 * insns, "code_item insns");
          scratch.stamp++;
          scratch.inv.length = scratch.f.length = scratch.s.length = scratch.t.length = 0;
          scanCode(r, codeOff + 16, insns, scratch, sizes);
          methods.push({ id, accessFlags: flags, direct: list === 0, at: packed.length });
          packed.reserve(4 + scratch.inv.length + scratch.f.length + scratch.s.length + scratch.t.length);
          const b = packed.buf;
          b[packed.length] = scratch.inv.length;
          b[packed.length + 1] = scratch.f.length;
          b[packed.length + 2] = scratch.s.length;
          b[packed.length + 3] = scratch.t.length;
          packed.length += 4;
          packed.append(scratch.inv);
          packed.append(scratch.f);
          packed.append(scratch.s);
          packed.append(scratch.t);
        }
      }
    }
    classes.push({
      descriptor,
      ...(superIdx !== NO_INDEX ? { superclass: type(superIdx, "class_def superclass") } : {}),
      interfaces,
      accessFlags,
      methods,
    });
  }
  return { classes, code: packed.buf.subarray(0, packed.length) };
}

export function readDex(bytes: Uint8Array): DexFile {
  const r = new ByteReader(bytes, (m: string) => new DexError(m));
  const h = readHeader(bytes, r);
  const strings = stringTable(bytes, r, h.strT);
  const { type, field, method } = idLookups(r, h, strings.str);
  const { classes, code } = readClasses(bytes, r, h, type);
  let all: string[] | undefined;
  return {
    version: h.version,
    stringCount: h.strT.size,
    string: strings.stringAt,
    stringStartsWith: strings.startsWith,
    get strings() {
      if (!all) all = Array.from({ length: h.strT.size }, (_, i) => strings.stringAt(i));
      return all;
    },
    typeCount: h.typeT.size,
    type: (i: number) => type(i, "type"),
    methodCount: h.methodT.size,
    method,
    fieldCount: h.fieldT.size,
    field,
    get types() {
      return Array.from({ length: h.typeT.size }, (_, i) => type(i, "type"));
    },
    get methods() {
      return Array.from({ length: h.methodT.size }, (_, i) => method(i));
    },
    get fields() {
      return Array.from({ length: h.fieldT.size }, (_, i) => field(i));
    },
    classes,
    code,
  };
}


/** The references of the method being scanned, with stamps of their own (one per method). */
interface MethodScratch {
  stamp: number;
  seen: { m: Int32Array; f: Int32Array; s: Int32Array; t: Int32Array };
  inv: number[];
  f: number[];
  s: number[];
  t: number[];
}

/** invoke-kind of opcodes 0x6e-0x72 and their /range forms 0x74-0x78. */
const KIND_OF: readonly number[] = [InvokeKind.Virtual, InvokeKind.Super, InvokeKind.Direct, InvokeKind.Static, InvokeKind.Interface];

function scanCode(r: ByteReader, start: number, units: number, m: MethodScratch, sizes: { strings: number; methods: number; fields: number; types: number }): void {
  // The caller checked that all `units` code units lie inside the file: they are read directly.
  const b = r.bytes;
  const unit = (pc: number) => b[start + 2 * pc] | (b[start + 2 * pc + 1] << 8);
  let pc = 0;
  while (pc < units) {
    const u = unit(pc);
    const op = u & 0xff;
    if (op === 0x00 && u !== 0x0000) {
      // Payload pseudo-instructions after a nop opcode: packed-switch (0x0100), sparse-switch (0x0200),
      // fill-array-data (0x0300); anything else is a plain nop.
      const ident = u >> 8;
      if (ident >= 1 && ident <= 3 && pc + 4 > units) throw new DexError(`payload at ${pc} runs past the method's ${units} code units`);
      if (ident === 1) pc += 4 + 2 * unit(pc + 1);
      else if (ident === 2) pc += 2 + 4 * unit(pc + 1);
      else if (ident === 3) pc += 4 + Math.ceil((unit(pc + 1) * (unit(pc + 2) | (unit(pc + 3) << 16))) / 2);
      else pc += 1;
      continue;
    }
    const w = WIDTH[op];
    if (w === 0) throw new DexError(`instruction ${op.toString(16).padStart(2, "0")} at ${pc} is not a Dalvik opcode`);
    if (pc + w > units) throw new DexError(`instruction at ${pc} runs past the method's ${units} code units`);
    if (op === 0x1a || op === 0x1b) {
      const i = op === 0x1a ? unit(pc + 1) : unit(pc + 1) | (unit(pc + 2) << 16);
      const what = op === 0x1a ? "const-string" : "const-string/jumbo";
      note(m.s, m.seen.s, m.stamp, i, sizes.strings, what);
    } else if ((op >= 0x6e && op <= 0x72) || (op >= 0x74 && op <= 0x78) || op === 0xfa || op === 0xfb) {
      const i = unit(pc + 1);
      if (i >= sizes.methods) throw new DexError(`invoke names index ${i}, past a table of ${sizes.methods}`);
      // A method called two ways (rare) keeps its first kind.
      if (m.seen.m[i] !== m.stamp) {
        m.seen.m[i] = m.stamp;
        m.inv.push(i * 8 + (op >= 0xfa ? InvokeKind.Polymorphic : KIND_OF[(op - 0x6e) % 6]));
      }
    } else if (op >= 0x52 && op <= 0x6d) {
      const i = unit(pc + 1);
      note(m.f, m.seen.f, m.stamp, i, sizes.fields, "field access");
    } else if (op === 0x22 || op === 0x1c) note(m.t, m.seen.t, m.stamp, unit(pc + 1), sizes.types, op === 0x22 ? "new-instance" : "const-class");
    pc += w;
  }
}

function note(list: number[], seen: Int32Array, stamp: number, index: number, size: number, what: string): void {
  const i = index >>> 0;
  if (i >= size) throw new DexError(`${what} names index ${i}, past a table of ${size}`);
  if (seen[i] !== stamp) {
    seen[i] = stamp;
    list.push(i);
  }
}

/** `Landroid/telephony/SmsManager;` → `android.telephony.SmsManager`; arrays and primitives in Java form. */
export function javaName(descriptor: string): string {
  let dims = 0;
  while (descriptor[dims] === "[") dims++;
  const base = descriptor.slice(dims);
  const prim: Record<string, string> = { V: "void", Z: "boolean", B: "byte", S: "short", C: "char", I: "int", J: "long", F: "float", D: "double" };
  const name = base.startsWith("L") && base.endsWith(";") ? base.slice(1, -1).replace(/\//g, ".") : (prim[base] ?? base);
  return name + "[]".repeat(dims);
}
