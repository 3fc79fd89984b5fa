/**
 * The folder of the overask package, found by walking up from this module to the package.json named
 * "overask". Works the same from src/ (tests), dist/ (the compiled library) and the CLI bundle.
 */
import { existsSync, readFileSync } from "node:fs";
import { dirname, join } from "node:path";
import { fileURLToPath } from "node:url";

let root: string | undefined;

export function packageRoot(): string {
  if (root) return root;
  let dir = dirname(fileURLToPath(import.meta.url));
  for (;;) {
    const pkg = join(dir, "package.json");
    if (existsSync(pkg)) {
      try {
        if ((JSON.parse(readFileSync(pkg, "utf8")) as { name?: string }).name === "overask") return (root = dir);
      } catch {
        /* not ours; keep looking */
      }
    }
    const up = dirname(dir);
    if (up === dir) throw new Error("cannot find the overask package folder (its package.json)");
    dir = up;
  }
}
