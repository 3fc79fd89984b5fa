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

  it("names the runtime permissions a type needs one of, when the app requests none of them", async () => {
    // A health service needs ACTIVITY_RECOGNITION, BODY_SENSORS or HIGH_SAMPLING_RATE_SENSORS … before it
    // starts (src/platform/data/foreground-service-types.tsv, after the platform's page of service types).
    const { wordFinding } = await import("../../../src/report/messages.js");
    const bare = findingsOf("service-type-permission", manifestText({ permissions: ["FOREGROUND_SERVICE", "FOREGROUND_SERVICE_HEALTH"], app: service("health"), target: 34 }));
    expect(bare[0].data.missing).toEqual([]);
    expect(bare[0].data.missingOneOf).toEqual(["health:android.permission.ACTIVITY_RECOGNITION|android.permission.BODY_SENSORS|android.permission.HIGH_SAMPLING_RATE_SENSORS|android.permission.health.READ_HEART_RATE|android.permission.health.READ_SKIN_TEMPERATURE|android.permission.health.READ_OXYGEN_SATURATION"]);
    expect(wordFinding(bare[0])).toMatch(/needs one of ACTIVITY_RECOGNITION, BODY_SENSORS, HIGH_SAMPLING_RATE_SENSORS, .* \(for health\), which the app does not request/);
    const one = manifestText({ permissions: ["FOREGROUND_SERVICE", "FOREGROUND_SERVICE_HEALTH", "HIGH_SAMPLING_RATE_SENSORS"], app: service("health"), target: 34 });
    expect(findingsOf("service-type-permission", one)).toEqual([]);
    // A microphone service without RECORD_AUDIO, a location one without either location permission.
    expect(findingsOf("service-type-permission", manifestText({ permissions: ["FOREGROUND_SERVICE", "FOREGROUND_SERVICE_MICROPHONE"], app: service("microphone"), target: 35 }))[0].data.missingOneOf).toEqual(["microphone:android.permission.RECORD_AUDIO"]);
  });

  it("reads the compiled type flags of an APK built by aapt2", () => {
    // fixtures/apk/snapshare.apk: aapt2 compiled foregroundServiceType="dataSync" to the flag 0x1 (fixtures/dumps/snapshare.xmltree.txt).
    const m = readManifestFile(`${APK_DIR}snapshare.apk`);
    expect(m.components.find((c) => c.kind === "service")?.foregroundServiceType).toEqual(["dataSync"]);
    expect(defaultJudge.judge(m, { category: "TOOLS" }).findings.filter((f) => f.checkId === "service-type-permission")).toEqual([]);
  });
});
