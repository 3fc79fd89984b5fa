/**
 * The README's examples run as tests: every `npx overask …` line in a shell block, and the library
 * snippet, must work as written from the project root.
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { run } from "../src/cli/main.js";
import { readManifestFile, requestedPermissionNames } from "../src/index.js";
import { ROOT } from "./helpers/paths.js";

const readme = readFileSync(`${ROOT}README.md`, "utf8");
const shellBlocks = [...readme.matchAll(/```sh\n([\s\S]*?)```/g)].map((m) => m[1]);
const commands = shellBlocks.flatMap((b) => b.split("\n")).map((l) => l.replace(/#.*$/, "").trim()).filter((l) => l.startsWith("npx overask "));

describe("README examples", () => {
  it("has examples to run", () => {
    expect(commands.length).toBeGreaterThan(0);
  });

  for (const command of commands) {
    it(`runs: ${command}`, async () => {
      const cwd = process.cwd();
      process.chdir(ROOT);
      let out = "";
      let err = "";
      try {
        const code = await run(command.split(/\s+/).slice(2), { stdout: { write: (s: string) => (out += s) }, stderr: { write: (s: string) => (err += s) }, env: {} });
        expect(err).toBe("");
        expect(code).toBe(0);
        expect(out.length).toBeGreaterThan(0);
      } finally {
        process.chdir(cwd);
      }
    });
  }

  it("shows an excerpt that the command really prints", async () => {
    const excerpt = /```text\n([\s\S]*?)```/.exec(readme)![1].split("\n").filter((l) => l.trim() && l.trim() !== "...");
    const cwd = process.cwd();
    process.chdir(ROOT);
    let out = "";
    try {
      await run(["facts", "fixtures/apk/pocketlamp.apk"], { stdout: { write: (s: string) => (out += s) }, stderr: { write: () => true }, env: {} });
    } finally {
      process.chdir(cwd);
    }
    for (const line of excerpt) expect(out.split("\n")).toContain(line);
  });

  it("runs the library snippet", () => {
    const m = readManifestFile(`${ROOT}fixtures/apk/chirpchat.apk`);
    expect(m.package).toBe("org.example.chirpchat");
    expect(requestedPermissionNames(m)).toContain("android.permission.READ_CONTACTS");
  });
});
