import { describe, expect, it } from "vitest";
import { readManifestFile } from "../../../src/ops/read-manifest.js";
import { defaultJudge, findingsOf, manifestText } from "../../helpers/judge.js";
import { APK_DIR } from "../../helpers/paths.js";

const service = (type: string) => `<service android:name=".Sync" android:exported="false" android:foregroundServiceType="${type}" />`;

describe("service-type-permission", () => {
  it("names the typed permission a target-34 foreground service lacks", () => {
    const f = findingsOf("service-type-permission", manifestText({ permissions: ["FOREGROUND_SERVICE"], app: service("dataSync|location"), target: 34 }));
    expect(f).toHaveLength(1);
    expect(f[0].data.missing).toEqual(["android.permission.FOREGROUND_SERVICE_DATA_SYNC", "android.permission.FOREGROUND_SERVICE_LOCATION"]);
  });

  it("asks only for FOREGROUND_SERVICE below targetSdk 34, and nothing below 28", () => {
    expect(findingsOf("service-type-permission", manifestText({ app: service("dataSync"), target: 30 }))[0].data.missing).toEqual(["android.permission.FOREGROUND_SERVICE"]);
    expect(findingsOf("service-type-permission", manifestText({ app: service("dataSync"), target: 27 }))).toEqual([]);
  });

  it("is quiet when every permission is there, and for shortService", () => {
    expect(findingsOf("service-type-permission", manifestText({ permissions: ["FOREGROUND_SERVICE", "FOREGROUND_SERVICE_DATA_SYNC"], app: service("dataSync"), target: 34 }))).toEqual([]);
    expect(findingsOf("service-type-permission", manifestText({ permissions: ["FOREGROUND_SERVICE"], app: service("shortService"), target: 34 }))).toEqual([]);
  });

  it("reads the compiled type flags of an APK built by aapt2", () => {
    // fixtures/apk/snapshare.apk: aapt2 compiled foregroundServiceType="dataSync" to the flag 0x1 (fixtures/dumps/snapshare.xmltree.txt).
    const m = readManifestFile(`${APK_DIR}snapshare.apk`);
    expect(m.components.find((c) => c.kind === "service")?.foregroundServiceType).toEqual(["dataSync"]);
    expect(defaultJudge.judge(m, { category: "TOOLS" }).findings.filter((f) => f.checkId === "service-type-permission")).toEqual([]);
  });
});
