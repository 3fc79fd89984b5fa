import { describe, expect, it } from "vitest";
import { jobIdOf, keysOf, shortHash } from "../../../src/ops/queue/jobs.js";

describe("queue job ids", () => {
  it("are the same for the same input, and new when its size or time changes", () => {
    const a = { id: "apps/lamp.apk", size: 100, mtimeMs: 5 };
    expect(jobIdOf(a)).toBe(jobIdOf({ ...a }));
    expect(jobIdOf({ ...a, size: 101 })).not.toBe(jobIdOf(a));
    expect(jobIdOf({ ...a, mtimeMs: 6 })).not.toBe(jobIdOf(a));
  });

  it("never contain a colon, which BullMQ reserves in ids (from memory of its docs)", () => {
    expect(jobIdOf({ id: "a:b:c.apk", size: 1, mtimeMs: 1 })).not.toContain(":");
  });

  it("hash content to 16 hex digits (SHA-256 of 'abc' begins ba7816bf8f01cfea, FIPS 180-2 test vector)", () => {
    expect(shortHash("abc")).toBe("ba7816bf8f01cfea");
  });

  it("keep a sweep's keys under its queue's name", () => {
    expect(keysOf("shop")).toEqual({ meta: "bull:shop:overask:meta", rows: "bull:shop:overask:rows", done: "bull:shop:overask:done" });
  });
});
