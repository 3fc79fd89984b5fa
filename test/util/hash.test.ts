import { describe, expect, it } from "vitest";
import { fnv1a32, hash52 } from "../../src/util/hash.js";

describe("fnv1a32", () => {
  it("matches the FNV-1a 32-bit test vectors", () => {
    // From the FNV reference page (isthe.com/chongo/tech/comp/fnv), from memory.
    expect(fnv1a32("")).toBe(0x811c9dc5);
    expect(fnv1a32("a")).toBe(0xe40c292c);
    expect(fnv1a32("foobar")).toBe(0xbf9cf968);
  });
});

describe("hash52", () => {
  it("is a safe integer, stable, and tells apart ids that differ in one character", () => {
    const a = hash52("org.example.lamp");
    expect(Number.isSafeInteger(a)).toBe(true);
    expect(hash52("org.example.lamp")).toBe(a);
    expect(hash52("org.example.lamq")).not.toBe(a);
  });

  it("has no collision among 100,000 sequential ids", () => {
    const seen = new Set<number>();
    for (let i = 0; i < 100_000; i++) seen.add(hash52(`org.example.app${i}`));
    expect(seen.size).toBe(100_000);
  });
});
