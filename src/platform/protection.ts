/**
 * android:protectionLevel: a base level in the low four bits plus flag bits above it.
 * Decodes both forms it takes: the integer the compiler writes into a binary manifest, and the
 * `signature|privileged` text of a source manifest or the platform's own table.
 */
import { PROTECTION_LEVEL_VALUES } from "./android-attributes.js";

export type BaseLevel = "normal" | "dangerous" | "signature" | "signatureOrSystem" | "internal" | "unknown";

export interface ProtectionLevel {
  base: BaseLevel;
  flags: string[];
  /** The integer form (mask as the platform stores it). */
  value: number;
}

/** PermissionInfo.PROTECTION_MASK_BASE (common practice: the base level lives in the low 4 bits). */
const BASE_MASK = 0xf;

/**
 * Values added to the platform after API 29, which the generated table (taken from API 29's
 * framework-res) does not have. From memory of PermissionInfo's constants; marked so.
 */
const LATER_VALUES: ReadonlyArray<readonly [string, number]> = [
  ["internal", 0x4], // from memory: PROTECTION_INTERNAL, API 31
  ["module", 0x400000], // from memory: PROTECTION_FLAG_MODULE, API 30
  ["companion", 0x800000], // from memory: PROTECTION_FLAG_COMPANION, API 30
  ["retailDemo", 0x1000000], // from memory: PROTECTION_FLAG_RETAIL_DEMO, API 30
  ["recents", 0x2000000], // from memory: PROTECTION_FLAG_RECENTS, API 31
  ["role", 0x4000000], // from memory: PROTECTION_FLAG_ROLE, API 31
  ["knownSigner", 0x8000000], // from memory: PROTECTION_FLAG_KNOWN_SIGNER, API 31
];

const ALL_VALUES = [...PROTECTION_LEVEL_VALUES, ...LATER_VALUES];
const BY_NAME = new Map<string, number>(ALL_VALUES.map(([n, v]) => [n, v]));
const BASE_NAMES = new Map<number, BaseLevel>([
  [0, "normal"],
  [1, "dangerous"],
  [2, "signature"],
  [3, "signatureOrSystem"],
  [4, "internal"],
]);
// Flag names by bit, first name wins ("privileged" before its old alias "system").
const FLAG_NAMES = new Map<number, string>();
for (const [n, v] of ALL_VALUES) if (v > BASE_MASK && !FLAG_NAMES.has(v)) FLAG_NAMES.set(v, n);

/** Decodes the integer form written by the resource compiler. */
export function protectionFromInt(value: number): ProtectionLevel {
  const v = value >>> 0;
  const base = BASE_NAMES.get(v & BASE_MASK) ?? "unknown";
  const flags: string[] = [];
  for (let bit = 0x10; bit !== 0 && bit <= 0x80000000; bit = (bit << 1) >>> 0) {
    if (v & bit) flags.push(FLAG_NAMES.get(bit) ?? `0x${bit.toString(16)}`);
  }
  return { base, flags, value: v };
}

/**
 * Decodes the text form (`signature|privileged`, tokens in any order as the platform's parser allows).
 * Unknown tokens are kept as flags so nothing the author wrote is lost.
 */
export function protectionFromText(text: string): ProtectionLevel {
  let value = 0;
  const unknown: string[] = [];
  for (const token of text.split("|").map((t) => t.trim()).filter(Boolean)) {
    const v = BY_NAME.get(token);
    if (v === undefined) unknown.push(token);
    else value |= v;
  }
  const decoded = protectionFromInt(value);
  return unknown.length ? { ...decoded, flags: [...decoded.flags, ...unknown] } : decoded;
}
