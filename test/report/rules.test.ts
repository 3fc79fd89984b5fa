import { describe, expect, it } from "vitest";
import { readPolicyFile } from "../../src/ops/policy.js";
import { rulesToJson, rulesToText } from "../../src/report/rules.js";
import { FIXTURES } from "../helpers/paths.js";

describe("policy rules in words", () => {
  // fixtures/policies/harbourview.json: the invented Harbourview store's listing policy.
  const policy = readPolicyFile(`${FIXTURES}policies/harbourview.json`);

  it("say what each rule does, where it applies, its level, line and source", () => {
    const text = rulesToText([policy], false);
    expect(text).toMatch(/^harbourview-listing \(\d+ rules\)/);
    expect(text).toMatch(/ {2}no-sms-outside-messaging {2}\(error; line 6\)\n {4}forbids SEND_SMS/);
    expect(text).toMatch(/source: /);
    expect(text).not.toMatch(/bundled policies/);
  });

  it("say so when the listed policies are the bundled ones, not in force until passed", () => {
    expect(rulesToText([policy], true)).toMatch(/^No --policy given: these are the bundled policies/);
  });

  it("give JSON a summary of each rule beside the rule itself", () => {
    const json = JSON.parse(rulesToJson([policy], false));
    expect(json.policies[0].rules.find((r: { id: string }) => r.id === "kids-risk-cap").summary).toBe("caps the risk at 30%; only in EDUCATION");
  });
});
