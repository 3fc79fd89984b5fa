import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { EXIT, EXIT_CODES, exitCodesHelp } from "../../src/cli/exit-codes.js";
import { cli } from "../helpers/cli.js";
import { ROOT } from "../helpers/paths.js";

describe("exit codes", () => {
  it("are the README's table, row for row", () => {
    const readme = readFileSync(`${ROOT}README.md`, "utf8");
    const table = readme.slice(readme.indexOf("## Exit codes"));
    const rows = [...table.matchAll(/^\| (\d+) \| (.+) \|$/gm)].map((m) => [Number(m[1]), m[2]]);
    expect(rows).toEqual(EXIT_CODES.map((e) => [e.code, e.meaning]));
  });

  it("are listed by --help", async () => {
    const { stdout, code } = await cli(["--help"]);
    expect(code).toBe(EXIT.OK);
    expect(stdout).toContain(exitCodesHelp().trim());
  });

  it("are distinct", () => {
    expect(new Set(EXIT_CODES.map((e) => e.code)).size).toBe(EXIT_CODES.length);
  });
});
