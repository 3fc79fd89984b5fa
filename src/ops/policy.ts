/** Policy files on disk, and the bundled ones (baselines/policies/). */
import { readdirSync } from "node:fs";
import { join } from "node:path";
import { InputError } from "../errors.js";
import { parsePolicy, type Policy } from "../score/policy/policy.js";
import { readTextFile } from "./files.js";
import { packageRoot } from "./package-root.js";

/** Reads and checks a policy file (a bad one is a PolicyError: one line, exit 2). */
export function readPolicyFile(path: string): Policy {
  return parsePolicy(readTextFile(path, InputError), path);
}

/** The bundled policies' paths, relative to the package (baselines/policies/*.json). */
export function bundledPolicyPaths(): string[] {
  const dir = join(packageRoot(), "baselines", "policies");
  return readdirSync(dir)
    .filter((f) => f.endsWith(".json"))
    .sort()
    .map((f) => join(dir, f));
}
