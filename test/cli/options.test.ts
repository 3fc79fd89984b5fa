import { InvalidArgumentError } from "commander";
import { describe, expect, it } from "vitest";
import { closedUnit, collectLevels, collectPairs, shardParser, wholeNumber } from "../../src/cli/options.js";
import { EXIT } from "../../src/cli/exit-codes.js";
import { cli } from "../helpers/cli.js";

describe("typed option parsers", () => {
  it("turn good text into values", () => {
    expect(wholeNumber(1)("4")).toBe(4);
    expect(closedUnit("0.3")).toBe(0.3);
    expect(shardParser("2/3")).toEqual({ index: 2, count: 3 });
    expect(collectPairs("Educational=Education")).toEqual([["Educational", "Education"]]);
    expect([...collectLevels("unknown-permission=off")]).toEqual([["unknown-permission", "off"]]);
  });

  it("refuse bad text with commander's InvalidArgumentError", () => {
    for (const bad of [() => wholeNumber(1)("0"), () => wholeNumber(1)("1.5"), () => closedUnit("2"), () => closedUnit(""), () => shardParser("4/3"), () => collectPairs("nope"), () => collectLevels("x=loud")]) {
      expect(bad).toThrow(InvalidArgumentError);
    }
  });

  it("make a bad value a usage error (exit 2) naming the option", async () => {
    const r = await cli(["check", "--max-risk", "1.5", "x.apk"]);
    expect(r.code).toBe(EXIT.USAGE);
    expect(r.stderr).toMatch(/--max-risk <p>.*'1\.5' is invalid\. It must be between 0 and 1/);
  });

  it("list the valid check ids when --level names an unknown one", async () => {
    const r = await cli(["check", "--level", "nosuch=off", "x.apk"]);
    expect(r.code).toBe(EXIT.USAGE);
    expect(r.stderr).toMatch(/unknown check "nosuch"; the checks are background-location-alone, .*weak-guard/);
  });
});

describe("shares", () => {
  it("take a fraction or a percent, as the outputs print them", async () => {
    const { closedUnit, openUnit } = await import("../../src/cli/options.js");
    expect(closedUnit("0.5")).toBe(0.5);
    expect(closedUnit("50%")).toBe(0.5);
    expect(closedUnit(" 7.5% ")).toBeCloseTo(0.075, 12);
    expect(openUnit("95%")).toBeCloseTo(0.95, 12);
    for (const bad of ["%", "150%", "-1%", "abc%", "1.5"]) expect(() => closedUnit(bad), bad).toThrow(/between 0 and 1 \(or 0% and 100%\)/);
    expect(() => openUnit("100%")).toThrow();
  });
});
