/**
 * A small seeded pseudo-random generator (mulberry32, common practice), so that anything random in
 * overask — fixtures, cross-validation folds, samples — repeats exactly for the same seed.
 */
export type Random = () => number;

/** Returns a generator of floats in [0, 1) determined by `seed`. */
export function seededRandom(seed: number): Random {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** An integer in [lo, hi]. */
export function randomInt(rand: Random, lo: number, hi: number): number {
  return lo + Math.floor(rand() * (hi - lo + 1));
}

/** One element of `items`. */
export function pick<T>(rand: Random, items: readonly T[]): T {
  return items[Math.floor(rand() * items.length)];
}
