/**
 * Policies: the install-time rules of Enck, Ongtang & McDaniel ("On Lightweight Mobile Phone Application
 * Certification", ACM CCS 2009), restated in baselines/policies/install-time-rules.json, each tried with an
 * invented app that breaks it and one that does not; the file format's checks; a reviewer's own policy.
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { readPolicyFile } from "../../../src/ops/policy.js";
import { parsePolicy, PolicyError } from "../../../src/score/policy/policy.js";
import { defaultJudge, judgeText, manifestText } from "../../helpers/judge.js";
import { FIXTURES, ROOT } from "../../helpers/paths.js";

const KIRIN = `${ROOT}baselines/policies/install-time-rules.json`;
const kirin = readPolicyFile(KIRIN);
const broken = (perms: string[], app = "") =>
  judgeText(manifestText({ permissions: perms, app }), { category: "TOOLS", policies: [kirin] }, defaultJudge)
    .findings.filter((f) => f.checkId.startsWith("policy:"))
    .map((f) => f.checkId.slice("policy:".length));

describe("the install-time rules (Enck et al., CCS 2009)", () => {
  // Each rule: the permissions that break it (the paper's combinations, from memory), and one taken away passes.
  const cases: [string, string[]][] = [
    ["debug-app", ["SET_DEBUG_APP"]],
    ["eavesdrop-phone-state", ["READ_PHONE_STATE", "RECORD_AUDIO", "INTERNET"]],
    ["eavesdrop-outgoing-calls", ["PROCESS_OUTGOING_CALLS", "RECORD_AUDIO", "INTERNET"]],
    ["track-fine-location", ["ACCESS_FINE_LOCATION", "INTERNET", "RECEIVE_BOOT_COMPLETED"]],
    ["track-coarse-location", ["ACCESS_COARSE_LOCATION", "INTERNET", "RECEIVE_BOOT_COMPLETED"]],
    ["sms-receive-write", ["RECEIVE_SMS", "WRITE_SMS"]],
    ["sms-send-write", ["SEND_SMS", "WRITE_SMS"]],
    ["shortcuts", ["com.android.launcher.permission.INSTALL_SHORTCUT", "com.android.launcher.permission.UNINSTALL_SHORTCUT"]],
  ];
  for (const [rule, perms] of cases) {
    it(`${rule}: broken by ${perms.join(" + ")}, not by fewer`, () => {
      expect(broken(perms)).toContain(rule);
      if (perms.length > 1) expect(broken(perms.slice(1))).not.toContain(rule);
    });
  }

  it("preferred-caller: broken only when the app also handles the CALL action", () => {
    const caller = `<activity android:name=".Call" android:exported="true"><intent-filter><action android:name="android.intent.action.CALL" /></intent-filter></activity>`;
    expect(broken(["SET_PREFERRED_APPLICATIONS"], caller)).toContain("preferred-caller");
    expect(broken(["SET_PREFERRED_APPLICATIONS"])).not.toContain("preferred-caller");
  });

  it("flags an invented eavesdropping app and passes the torch app's fixed version", () => {
    const eavesdropper = broken(["READ_PHONE_STATE", "RECORD_AUDIO", "INTERNET", "CAMERA"]);
    expect(eavesdropper).toEqual(["eavesdrop-phone-state", "eavesdrop-phone-state", "eavesdrop-phone-state"]); // one finding a permission of the combination
    // fixtures/apps/pocketlamp with what trim proposes removed and no start at boot: a torch needs the camera only.
    expect(broken(["CAMERA", "FLASHLIGHT"])).toEqual([]);
  });
});

describe("policy files", () => {
  it("refuse a typo in a permission name, naming the nearest", () => {
    const text = readFileSync(KIRIN, "utf8").replace('"android.permission.SET_DEBUG_APP"', '"android.permission.SET_DEBUG_AP"');
    expect(() => parsePolicy(text, "kirin.json")).toThrow(PolicyError);
    expect(() => parsePolicy(text, "kirin.json")).toThrow(/^kirin\.json:6: rule debug-app: "android\.permission\.SET_DEBUG_AP" is not a platform permission; did you mean android\.permission\.SET_DEBUG_APP\?$/);
  });

  it("refuse what the schema does not allow, in one line with the file, line and rule", () => {
    const bad = (rules: string) => () => parsePolicy(`{\n  "policy": "p",\n  "rules": [\n    ${rules}\n  ]\n}\n`, "p.json");
    expect(bad('{ "id": "a", "level": "loud", "message": "m", "source": "s", "forbid": ["CAMERA"] }')).toThrow(/^p\.json:4: rule a: level must be one of "error", "warning", "note"$/);
    expect(bad('{ "id": "b", "level": "note", "message": "m", "source": "s" }')).toThrow(/rule b: a rule needs exactly one of forbid/);
    expect(bad('{ "id": "c", "level": "note", "message": "m", "source": "s", "forbid": ["CAMERA"], "colour": "red" }')).toThrow(/rule c: unknown key "colour"/);
    expect(() => parsePolicy("{ nope", "q.json")).toThrow(/^q\.json:1: not valid JSON/);
  });

  it("keep each rule's line for the findings", () => {
    const f = judgeText(manifestText({ permissions: ["SET_DEBUG_APP"] }), { policies: [kirin] }, defaultJudge).findings.find((x) => x.checkId === "policy:debug-app")!;
    expect(f.data).toMatchObject({ file: KIRIN, line: 6, rule: "debug-app", policy: "install-time-rules" });
  });
});

describe("a reviewer's own policy (fixtures/policies/harbourview.json)", () => {
  const own = readPolicyFile(`${FIXTURES}policies/harbourview.json`);
  const ids = (perms: string[], category: string, extra = "") =>
    // A rule's finding on a permission may be folded into the permission's finding (`also`): look there too.
    judgeText(manifestText({ permissions: perms, extra }).replace("<application>", "<application>"), { category, policies: [own] }, defaultJudge)
      .findings.flatMap((f) => [f, ...(f.also ?? []).map((a) => ({ ...f, ...a }))])
      .filter((f) => f.checkId.startsWith("policy:"))
      .map((f) => f.checkId.slice(7));

  it("forbids SMS outside messaging apps, only there", () => {
    expect(ids(["SEND_SMS"], "TOOLS")).toContain("no-sms-outside-messaging");
    expect(ids(["SEND_SMS"], "COMMUNICATION")).not.toContain("no-sms-outside-messaging");
  });

  it("caps the risk in one category, needs maxSdkVersion, and asks for justifications", () => {
    expect(ids(["SEND_SMS", "READ_PHONE_STATE"], "EDUCATION")).toContain("kids-risk-cap");
    expect(ids(["SEND_SMS", "READ_PHONE_STATE"], "TOOLS")).not.toContain("kids-risk-cap");
    expect(ids(["WRITE_EXTERNAL_STORAGE"], "TOOLS")).toContain("storage-limited");
    const limited = judgeText(manifestText({}).replace("<application>", '<uses-permission android:name="android.permission.WRITE_EXTERNAL_STORAGE" android:maxSdkVersion="28" />\n  <application>'), { category: "TOOLS", policies: [own] }, defaultJudge);
    expect(limited.findings.flatMap((f) => [f.checkId, ...(f.also ?? []).map((a) => a.checkId)]).includes("policy:storage-limited")).toBe(false);
    expect(ids(["ACCESS_BACKGROUND_LOCATION", "ACCESS_FINE_LOCATION"], "TOOLS")).toContain("explain-background-location");
  });
});
