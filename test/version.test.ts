import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { TOOL_VERSION } from "../src/version.js";
import { ROOT } from "./helpers/paths.js";

describe("the tool's version", () => {
  it("is the package's version, as --version and every report print it", () => {
    expect(TOOL_VERSION).toBe(JSON.parse(readFileSync(`${ROOT}package.json`, "utf8")).version);
  });
});
