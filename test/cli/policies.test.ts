import { mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { EXIT } from "../../src/cli/exit-codes.js";
import { cli } from "../helpers/cli.js";
import { APK_DIR, FIXTURES, ROOT } from "../helpers/paths.js";

const dir = mkdtempSync(join(tmpdir(), "overask-policies-"));
const KIRIN = `${ROOT}baselines/policies/install-time-rules.json`;
const OWN = `${FIXTURES}policies/harbourview.json`;
const LAMP = `${APK_DIR}pocketlamp.apk`;

describe("--policy on the judging commands", () => {
  it("check reports a rule's findings with the rule, file and line, and gates on them", async () => {
    const r = await cli(["check", "-c", "TOOLS", "--policy", OWN, "--fail-on", "error", LAMP]);
    expect(r.stdout).toMatch(/SEND_SMS {2}\(error: policy:no-sms-outside-messaging\)\n {4}SMS access is for messaging apps only/);
    expect(r.stdout.replace(/\s+/g, " ")).toContain("(rule no-sms-outside-messaging of harbourview-listing, ");
    expect(r.code).toBe(EXIT.GATE);
  });

  it("gives a permission one finding, the rule's and the checks' reasons together", async () => {
    const r = await cli(["check", "-c", "TOOLS", "--policy", OWN, "-f", "json", LAMP]);
    const sms = JSON.parse(r.stdout).results[0].findings.filter((f: { subject: string }) => f.subject === "android.permission.SEND_SMS");
    expect(sms).toHaveLength(1);
    expect([sms[0].checkId, ...sms[0].also.map((a: { checkId: string }) => a.checkId)]).toEqual(expect.arrayContaining(["policy:no-sms-outside-messaging", "sensitive-uncommon"]));
  });

  it("refuses a bad policy in one line (exit 2)", async () => {
    const bad = join(dir, "bad.json");
    writeFileSync(bad, readFileSync(OWN, "utf8").replace('"SEND_SMS"', '"SEND_SMSS"'));
    const r = await cli(["check", "--policy", bad, LAMP]);
    expect(r.code).toBe(EXIT.USAGE);
    expect(r.stderr).toBe(`overask: ${bad}:6: rule no-sms-outside-messaging: "SEND_SMSS" is not a platform permission; did you mean android.permission.SEND_SMS?\n`);
  });

  it("gives SARIF the policy's rules", async () => {
    const log = JSON.parse((await cli(["check", "-f", "sarif", "-c", "TOOLS", "--policy", OWN, LAMP])).stdout);
    const rules = log.runs[0].tool.driver.rules;
    const rule = rules.find((x: { id: string }) => x.id === "policy:no-sms-outside-messaging");
    expect(rule.properties).toMatchObject({ policy: "harbourview-listing", line: 6 });
    const result = log.runs[0].results.find((x: { ruleId: string }) => x.ruleId === "policy:no-sms-outside-messaging");
    expect(rules[result.ruleIndex].id).toBe(result.ruleId);
  });

  it("trim offers a forbidden permission for removal and names the rule", async () => {
    const r = await cli(["trim", "-c", "TOOLS", "--policy", KIRIN, "-f", "json", `${FIXTURES}apps/pocketlamp/AndroidManifest.xml`]);
    const boot = JSON.parse(r.stdout).candidates.find((c: { permission: string }) => c.permission === "android.permission.RECEIVE_BOOT_COMPLETED");
    expect(boot.reasons[0].checkId).toBe("policy:track-fine-location");
    expect(boot.safe).toMatch(/a policy in force forbids it/);
  });

  it("delta reports the rules an update newly breaks", async () => {
    const d = JSON.parse((await cli(["delta", "-f", "json", "--policy", OWN, `${APK_DIR}tidewatch.apk`, `${APK_DIR}tidewatch-next.apk`])).stdout);
    expect(d.newlyBroken.map((f: { checkId: string }) => f.checkId)).toEqual(["policy:explain-background-location"]);
  });

  it("sweep evaluates policies on its worker threads too", async () => {
    const out = join(dir, "s.jsonl");
    await cli(["sweep", APK_DIR, "-o", out, "-c", "TOOLS", "--policy", KIRIN, "-j", "2"]);
    const lamp = readFileSync(out, "utf8").trim().split("\n").map((l) => JSON.parse(l)).find((x) => x.package === "org.example.pocketlamp");
    expect(lamp.findings.some((f: { checkId: string }) => f.checkId === "policy:track-fine-location")).toBe(true);
  });
});


describe("policy files with mistakes", () => {
  it("refuse a category the baseline does not have, with the nearest, for categories and exceptions alike (exit 2)", async () => {
    const bad = join(dir, "cats.json");
    const policy = JSON.parse(readFileSync(OWN, "utf8"));
    policy.rules[0].categories = ["TOOOLS"];
    policy.rules[0].exceptCategories = undefined;
    policy.rules[1].exceptCategories = ["COMUNICATION"];
    writeFileSync(bad, JSON.stringify(policy, null, 2));
    const r = await cli(["check", "--policy", bad, LAMP]);
    expect(r.code).toBe(EXIT.USAGE);
    const lines = r.stderr.trim().split("\n");
    expect(lines).toHaveLength(2);
    expect(lines[0]).toMatch(/^overask: .*cats\.json:\d+: rule [\w-]+: categories names "TOOOLS", which is not a category of the baseline; did you mean "TOOLS"\?$/);
    expect(lines[1]).toMatch(/exceptCategories names "COMUNICATION", which is not a category of the baseline; did you mean "COMMUNICATION"\?$/);
  });

  it("report every error of the file at once, and list the allowed levels", async () => {
    const bad = join(dir, "many.json");
    const policy = JSON.parse(readFileSync(OWN, "utf8"));
    policy.rules[0].level = "fatal";
    policy.rules[1].level = "severe";
    writeFileSync(bad, JSON.stringify(policy, null, 2));
    const r = await cli(["check", "--policy", bad, LAMP]);
    expect(r.code).toBe(EXIT.USAGE);
    const lines = r.stderr.trim().split("\n");
    expect(lines).toHaveLength(2);
    for (const l of lines) expect(l).toMatch(/level must be one of "error", "warning", "note"$/);
  });
});
