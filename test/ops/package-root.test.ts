import { describe, expect, it } from "vitest";
import { packageRoot } from "../../src/ops/package-root.js";
import { ROOT } from "../helpers/paths.js";

describe("the package's folder", () => {
  it("is found from the source tree, where the bundled baselines live", () => {
    expect(`${packageRoot()}/`).toBe(ROOT);
  });
});
