import { describe, expect, it } from "vitest";
import { readManifestFile } from "../../../src/ops/read-manifest.js";
import { defaultJudge, findingsOf, manifestText } from "../../helpers/judge.js";
import { APK_DIR } from "../../helpers/paths.js";

const receiver = `<receiver android:name=".Boot"><intent-filter><action android:name="android.intent.action.BOOT_COMPLETED" /></intent-filter></receiver>`;

describe("exported-missing", () => {
  it("is an error at targetSdk 31 and above for a component with an intent filter and no android:exported", () => {
    const f = findingsOf("exported-missing", manifestText({ app: receiver, target: 31 }));
    expect(f.map((x) => [x.subject, x.level])).toEqual([["org.example.case.Boot", "error"]]);
  });

  it("does not fire below targetSdk 31, or when android:exported is set", () => {
    expect(findingsOf("exported-missing", manifestText({ app: receiver, target: 30 }))).toEqual([]);
    expect(findingsOf("exported-missing", manifestText({ app: receiver.replace("<receiver ", '<receiver android:exported="false" '), target: 34 }))).toEqual([]);
  });

  it("fires on the APK aapt2 built from the modern over-asking demo app", () => {
    // fixtures/apk/beamtorch.apk: built by aapt2 (scripts/build-fixtures.sh); its receiver .Boot has an intent filter and no exported.
    const r = defaultJudge.judge(readManifestFile(`${APK_DIR}beamtorch.apk`), { category: "TOOLS" });
    expect(r.findings.filter((x) => x.checkId === "exported-missing").map((x) => x.subject)).toEqual(["org.example.beamtorch.Boot"]);
  });
});
