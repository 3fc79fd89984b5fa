/**
 * The README's examples run as tests: every `npx overask …` line in a shell block must work as written
 * from the project root, each text excerpt must be what the command before it prints, and the library
 * snippet must run.
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { run } from "../src/cli/main.js";
import { readManifestFile, requestedPermissionNames } from "../src/index.js";
import { ROOT } from "./helpers/paths.js";
import { documentedCommands } from "./helpers/shell-words.js";

const readme = readFileSync(`${ROOT}README.md`, "utf8");
const commands = documentedCommands(readme);

async function runInRoot(argv: string[]) {
  const cwd = process.cwd();
  process.chdir(ROOT);
  let out = "";
  let err = "";
  try {
    const code = await run(argv, { stdout: { write: (s: string) => (out += s) }, stderr: { write: (s: string) => (err += s) }, env: {} });
    return { code, out, err };
  } finally {
    process.chdir(cwd);
  }
}

describe("README examples", () => {
  it("has examples to run", () => {
    expect(commands.length).toBeGreaterThan(3);
  });

  for (const argv of commands) {
    it(`runs: overask ${argv.join(" ")}`, async () => {
      const { code, out, err } = await runInRoot(argv);
      expect(err.split("\n").filter((l) => l && !l.startsWith("overask: note: "))).toEqual([]);
      // A gating example may well hit its gate (exit 1); everything else must succeed.
      const gating = argv.includes("--fail-on") || argv.includes("--max-risk");
      expect(gating ? [0, 1] : [0]).toContain(code);
      expect(out.length).toBeGreaterThan(0);
    });
  }

  // Each ```text excerpt shows the output of the first command of the nearest ```sh block before it.
  const blocks = [...readme.matchAll(/```(\w+)\n([\s\S]*?)```/g)].map((m) => ({ lang: m[1], body: m[2] }));
  const excerpts: [string[], string][] = [];
  blocks.forEach((b, i) => {
    if (b.lang !== "text") return;
    const sh = blocks.slice(0, i).reverse().find((p) => p.lang === "sh" && documentedCommands(`\`\`\`sh\n${p.body}\`\`\``).length > 0)!;
    excerpts.push([documentedCommands(`\`\`\`sh\n${sh.body}\`\`\``)[0], b.body]);
  });
  for (const [argv, text] of excerpts) {
    it(`shows an excerpt that "overask ${argv.slice(0, 2).join(" ")} …" really prints`, async () => {
      const { out } = await runInRoot(argv);
      const lines = out.split("\n");
      for (const line of text.split("\n").filter((l) => l.trim() && l.trim() !== "...")) expect(lines).toContain(line);
    });
  }

  it("runs the library snippet", () => {
    const m = readManifestFile(`${ROOT}fixtures/apk/chirpchat.apk`);
    expect(m.package).toBe("org.example.chirpchat");
    expect(requestedPermissionNames(m)).toContain("android.permission.READ_CONTACTS");
  });
});
