/**
 * Code evidence on the invented voice-memo app (fixtures/apps/echomemo; code in fixtures/smali/echomemo,
 * assembled by Debian's smali), written the way real apps are built: a call through the app's own service
 * subclass, an anonymous listener created in onCreate and one nothing creates, a dead compatibility
 * library, constant-string reflection, a class loader, and its own server in a sibling package. Every
 * "used" claim is checked against Debian's dexdump listing of the same dex (fixtures/dumps).
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { readDexEntries } from "../../../src/extract/code.js";
import { openArchiveBytes } from "../../../src/extract/containers/zip.js";
import { readManifestBytes } from "../../../src/extract/read.js";
import { codeEvidence } from "../../../src/score/code-evidence.js";
import { APK_DIR, DUMP_DIR } from "../../helpers/paths.js";

const apk = readFileSync(`${APK_DIR}echomemo.apk`);
function evidence(options: Parameters<typeof codeEvidence>[2] = {}) {
  const archive = openArchiveBytes(apk);
  try {
    return codeEvidence(readManifestBytes(apk), readDexEntries(archive), options);
  } finally {
    archive.close();
  }
}
const dumps = ["classes", "classes2"].map((p) => readFileSync(`${DUMP_DIR}echomemo-${p}.dexdump.txt`, "utf8")).join("\n");

/** The methods dexdump lists with their instructions: "Lorg/…/Class;.method" → its lines. */
function dexdumpMethods(text: string): Map<string, string[]> {
  const out = new Map<string, string[]>();
  let cls = "";
  let cur: string[] | undefined;
  for (const line of text.split("\n")) {
    const c = /^ {2}Class descriptor {2}: '(.+)'$/.exec(line);
    if (c) cls = c[1];
    const m = /^ {6}name {10}: '(.+)'$/.exec(line);
    if (m) out.set(`${cls}.${m[1]}`, (cur = []));
    else if (cur && /\|[0-9a-f]{4}: /.test(line)) cur.push(line);
  }
  return out;
}

describe("code evidence on a modern app with real-world code shapes", () => {
  const ev = evidence();
  const by = Object.fromEntries(ev.permissions.map((p) => [p.permission.replace("android.permission.", ""), p]));

  it("gives each permission the status its code warrants", () => {
    expect(Object.fromEntries(Object.entries(by).map(([k, v]) => [k, v.status]))).toEqual({
      RECORD_AUDIO: "used", // AudioRecord.Builder.build and startRecording, API 23+: rows of the own table
      FOREGROUND_SERVICE: "used", // startForeground called on the app's own RecordService, declared by android.app.Service
      FOREGROUND_SERVICE_MICROPHONE: "not-mappable",
      INTERNET: "used", // its own server's ServerSocket, and the exporter loaded by a constant class name
      READ_SMS: "used",
      READ_PHONE_STATE: "unreached", // only in a listener nothing creates
      ACCESS_NETWORK_STATE: "unreached", // only in a compatibility library nothing calls
      WAKE_LOCK: "unreached",
      READ_CONTACTS: "unreached",
      CAMERA: "not-seen",
    });
  });

  it("backs every used claim with a call, field or string dexdump lists in a method the app reaches", () => {
    const methods = dexdumpMethods(dumps);
    for (const p of ev.permissions.filter((x) => x.status === "used")) {
      for (const e of p.evidence.filter((x) => x.reached)) {
        const name = e.what.split("(")[0];
        const member = name.slice(name.lastIndexOf(".") + 1);
        const found = [...methods.values()].some((lines) => lines.some((l) => (e.kind === "uri" ? l.includes(`"${e.what}`) : l.includes(`;.${member}:`))));
        expect(found, `${p.permission}: ${e.what}`).toBe(true);
      }
    }
    // The subclass call, as dexdump shows it: named on the app's class, landing on android.app.Service's member.
    expect(dumps).toMatch(/invoke-virtual \{[^}]*\}, Lorg\/example\/echomemo\/app\/RecordService;\.startForeground:\(ILandroid\/app\/Notification;I\)V/);
    expect(by.FOREGROUND_SERVICE.evidence.map((e) => e.what)).toContain("android.app.Service.startForeground");
  });

  it("counts its sibling-package server and reflectively loaded exporter as the app's own code, the dead library as a library", () => {
    expect(by.INTERNET).toMatchObject({ users: ["org.example.echomemo.app"], onlyLibraries: false });
    expect(by.ACCESS_NETWORK_STATE.users).toEqual(["org.example.compat"]);
  });

  it("names the app's blind spot: a class loader", () => {
    expect(ev.blind).toEqual([{ kind: "class-loader", where: ["DexClassLoader in org.example.echomemo.app.Plugins.load"] }]);
  });

  it("finds the path from the exported receiver to the SMS inbox", () => {
    expect(ev.componentUses.filter((u) => u.component.endsWith("SmsRelay"))).toEqual([
      { component: "org.example.echomemo.app.SmsRelay", permission: "android.permission.READ_SMS", path: ["org.example.echomemo.app.SmsRelay.onReceive", "org.example.echomemo.app.Inbox.lastCode", "content://sms string"] },
    ]);
    expect(ev.reachability).toMatchObject({ methods: 22 });
  });

  it("past the call graph cap, shows the evidence without reachability and says so", () => {
    const capped = evidence({ maxMethods: 10 });
    expect(capped.problems).toContain("call graph capped at 10 methods (the code defines 22): evidence shown without reachability");
    expect(capped.reachability).toBeUndefined();
    expect(capped.permissions.find((p) => p.permission.endsWith("READ_PHONE_STATE"))?.status).toBe("used");
  });
});
