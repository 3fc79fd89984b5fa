/** Keeps the registry, the docs pages and the tests in step. */
import { existsSync, readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { CHECKS } from "../../src/score/registry.js";
import { ROOT } from "../helpers/paths.js";

describe("the check registry", () => {
  it("is sorted by id, with unique ids", () => {
    const ids = CHECKS.map((c) => c.meta.id);
    expect(ids).toEqual([...ids].sort());
    expect(new Set(ids).size).toBe(ids.length);
  });

  for (const c of CHECKS) {
    it(`${c.meta.id} has its docs page and its test`, () => {
      expect(c.meta.docs).toBe(`docs/checks/${c.meta.id}.md`);
      expect(readFileSync(`${ROOT}${c.meta.docs}`, "utf8")).toMatch(new RegExp(`^# ${c.meta.id}\\n\\n\\*\\*Default level: ${c.meta.defaultLevel}\\.\\*\\*`));
      expect(existsSync(`${ROOT}test/score/checks/${c.meta.id}.test.ts`)).toBe(true);
    });
  }
});
