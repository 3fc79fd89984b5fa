/** FNV-1a string hashes (Fowler–Noll–Vo, variant 1a, 32-bit offset basis 0x811c9dc5, prime 0x01000193). */

/**
 * 32-bit FNV-1a over the string's UTF-16 code units, as an unsigned integer.
 * @example fnv1a32("") // 2166136261 (0x811c9dc5, the offset basis)
 */
export function fnv1a32(s: string): number {
  let h = 0x811c9dc5;
  for (let i = 0; i < s.length; i++) h = Math.imul(h ^ s.charCodeAt(i), 0x01000193);
  return h >>> 0;
}

/**
 * A 52-bit hash from two FNV-1a-style lanes (the second seeded differently and mixed with the first),
 * as a safe integer: compact duplicate detection over millions of ids with a low chance of collision.
 */
export function hash52(s: string): number {
  let h1 = 0x811c9dc5;
  let h2 = 0x050c5d1f;
  for (let i = 0; i < s.length; i++) {
    const c = s.charCodeAt(i);
    h1 = Math.imul(h1 ^ c, 0x01000193);
    h2 = Math.imul(h2 ^ c, 0x01000193) ^ (h1 >>> 7);
  }
  return (h1 >>> 0) * 0x100000 + ((h2 >>> 0) & 0xfffff);
}
