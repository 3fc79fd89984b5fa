import { copyFileSync, mkdtempSync, readFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { UsageError } from "../../src/errors.js";
import { trim } from "../../src/ops/trim.js";
import { defaultJudge } from "../helpers/judge.js";
import { APK_DIR, FIXTURES } from "../helpers/paths.js";

const dir = mkdtempSync(join(tmpdir(), "overask-optrim-"));
const SOURCE = `${FIXTURES}apps/pocketlamp/AndroidManifest.xml`;

describe("trim as a library call", () => {
  it("plans without writing, and writes a patched copy when asked", () => {
    const planned = trim(defaultJudge, SOURCE, { judge: { category: "TOOLS" } });
    expect(planned.written).toBeUndefined();
    expect(planned.plan.candidates.length).toBeGreaterThan(0);
    const out = join(dir, "patched.xml");
    const written = trim(defaultJudge, SOURCE, { judge: { category: "TOOLS" }, write: out });
    expect(written.written).toBe(out);
    expect(readFileSync(out, "utf8")).not.toBe(readFileSync(SOURCE, "utf8"));
  });

  it("leaves a permission it is told to keep", () => {
    const all = trim(defaultJudge, SOURCE, { judge: { category: "TOOLS" } }).plan.candidates.map((c) => c.permission);
    const kept = trim(defaultJudge, SOURCE, { judge: { category: "TOOLS" }, keep: [all[0]] }).plan.candidates.map((c) => c.permission);
    expect(kept).not.toContain(all[0]);
  });

  it("says nothing changed for --in-place on an app that needs no change, and writes nothing", () => {
    const copy = join(dir, "AndroidManifest.xml");
    copyFileSync(`${FIXTURES}apps/snapshare/AndroidManifest.xml`, copy);
    const before = readFileSync(copy, "utf8");
    const r = trim(defaultJudge, copy, { judge: { category: "TOOLS" }, inPlace: true });
    expect(r.unchanged).toBe(true);
    expect(readFileSync(copy, "utf8")).toBe(before);
  });

  it("refuses to patch an APK without its source manifest, and both --write and --in-place", () => {
    expect(() => trim(defaultJudge, SOURCE, { judge: {}, write: join(dir, "x.xml"), inPlace: true })).toThrow(UsageError);
    expect(() => trim(defaultJudge, `${APK_DIR}pocketlamp.apk`, { judge: {}, write: join(dir, "y.xml") })).toThrow(UsageError);
  });
});
