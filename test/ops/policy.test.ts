import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { OveraskError } from "../../src/errors.js";
import { bundledPolicyPaths, readPolicyFile } from "../../src/ops/policy.js";
import { FIXTURES } from "../helpers/paths.js";

describe("policy files on disk", () => {
  it("lists the bundled policies in name order, each one readable", () => {
    const paths = bundledPolicyPaths();
    expect(paths.map((p) => p.split("/").at(-1))).toEqual(["install-time-rules.json", "store-declarations.json"]);
    for (const p of paths) expect(readPolicyFile(p).rules.length).toBeGreaterThan(0);
  });

  it("reads a policy with the file and line of each rule", () => {
    const p = readPolicyFile(`${FIXTURES}policies/harbourview.json`);
    expect(p.file).toBe(`${FIXTURES}policies/harbourview.json`);
    expect(p.rules.find((r) => r.id === "no-sms-outside-messaging")?.line).toBe(6);
  });

  it("names the file when it cannot be read", () => {
    const dir = mkdtempSync(join(tmpdir(), "overask-policy-"));
    const line = (path: string) => {
      try {
        readPolicyFile(path);
        return "";
      } catch (e) {
        return e instanceof OveraskError ? e.describe() : (e as Error).message;
      }
    };
    expect(line(join(dir, "missing.json"))).toMatch(/missing\.json: no such file/);
    writeFileSync(join(dir, "broken.json"), "{");
    expect(line(join(dir, "broken.json"))).toMatch(/broken\.json/);
  });
});
