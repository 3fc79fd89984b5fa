/**
 * Fault injection: interrupted writes, full and read-only output locations.
 */
import { execFileSync, spawn } from "node:child_process";
import { mkdirSync, mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { EXIT } from "../../src/cli/exit-codes.js";
import { cli } from "../helpers/cli.js";
import { FIXTURES, ROOT } from "../helpers/paths.js";

const dir = mkdtempSync(join(tmpdir(), "overask-faults-"));
const CORPUS = `${FIXTURES}corpus/harbourview.jsonl`;

/** Mounts a small tmpfs (root only); undefined where mounting is not allowed. */
function tmpfs(name: string, kb: number): string | undefined {
  const at = join(dir, name);
  mkdirSync(at, { recursive: true });
  try {
    execFileSync("mount", ["-t", "tmpfs", "-o", `size=${kb}k`, "tmpfs", at], { stdio: "ignore" });
    return at;
  } catch {
    return undefined;
  }
}
const mounted: string[] = [];
afterAll(() => {
  for (const m of mounted) {
    try {
      execFileSync("umount", [m], { stdio: "ignore" });
    } catch {
      /* already gone */
    }
  }
});

describe("interrupted writes", () => {
  it("leave the old baseline or the new one, never a torn file (SIGKILL at many points)", async () => {
    const target = join(dir, "baseline.json");
    const oldText = `${JSON.stringify({ old: true, pad: "o".repeat(1_000_000) })}\n`;
    const newText = `${JSON.stringify({ new: true, pad: "n".repeat(8_000_000) })}\n`;
    writeFileSync(join(dir, "new.txt"), newText);
    const script = `import { writeFileAtomic } from ${JSON.stringify(`${ROOT}dist/ops/files.js`)};
import { readFileSync } from "node:fs";
const text = readFileSync(${JSON.stringify(join(dir, "new.txt"))}, "utf8");
process.stdout.write("go\\n");
writeFileAtomic(${JSON.stringify(target)}, text);`;
    let sawNew = 0;
    for (const delay of [0, 1, 2, 3, 5, 8, 12, 20, 35, 60]) {
      writeFileSync(target, oldText);
      await new Promise<void>((resolve) => {
        const child = spawn(process.execPath, ["--input-type=module", "-e", script], { stdio: ["ignore", "pipe", "ignore"] });
        child.stdout.once("data", () => setTimeout(() => child.kill("SIGKILL"), delay));
        child.on("exit", () => resolve());
      });
      const now = readFileSync(target, "utf8");
      expect(now === oldText || now === newText, `torn after ${delay} ms`).toBe(true);
      if (now === newText) sawNew++;
    }
    expect(sawNew).toBeLessThan(10); // some kills landed before the rename
  }, 60_000);
});

describe("output locations that cannot take the output", () => {
  it("a sweep to a full device fails with a clear message and the output code", async () => {
    const { code, stderr } = await cli(["sweep", `${FIXTURES}apk`, "-o", "/dev/full", "-j", "1"]);
    expect(code).toBe(EXIT.OUTPUT);
    expect(stderr).toMatch(/^overask: \/dev\/full: cannot be written: the disk is full$/m);
  });

  it("a baseline written to a full disk fails, and the old file stays as it was", async (ctx) => {
    const at = tmpfs("full", 64);
    if (!at) return ctx.skip("cannot mount a tmpfs here (needs root)");
    mounted.push(at);
    const target = join(at, "baseline.json");
    writeFileSync(target, "old baseline\n");
    writeFileSync(join(at, "filler"), Buffer.alloc(60 * 1024)); // fills the disk but for a few bytes
    const { code, stderr } = await cli(["learn", CORPUS, "--label-field", "none", "-o", target]);
    expect(code).toBe(EXIT.OUTPUT);
    expect(stderr).toMatch(/cannot be written: the disk is full/);
    expect(readFileSync(target, "utf8")).toBe("old baseline\n");
  });

  it("a baseline written to a read-only folder fails, and the old file stays as it was", async (ctx) => {
    const at = tmpfs("readonly", 256);
    if (!at) return ctx.skip("cannot mount a tmpfs here (needs root)");
    mounted.push(at);
    const target = join(at, "baseline.json");
    writeFileSync(target, "old baseline\n");
    execFileSync("mount", ["-o", "remount,ro", at]);
    const { code, stderr } = await cli(["learn", CORPUS, "--label-field", "none", "-o", target]);
    expect(code).toBe(EXIT.OUTPUT);
    expect(stderr).toMatch(/cannot be written: the folder is not writable/);
    expect(readFileSync(target, "utf8")).toBe("old baseline\n");
  });
});
