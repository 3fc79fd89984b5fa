import { describe, expect, it } from "vitest";
import { readManifestFile } from "../../../src/ops/read-manifest.js";
import { defaultJudge, findingsOf, manifestText } from "../../helpers/judge.js";
import { APK_DIR } from "../../helpers/paths.js";

describe("debuggable", () => {
  it("warns about android:debuggable=\"true\" and says nothing otherwise", () => {
    const on = manifestText({}).replace("<application>", '<application android:debuggable="true">');
    expect(findingsOf("debuggable", on).map((f) => [f.subject, f.level])).toEqual([["application", "warning"]]);
    expect(findingsOf("debuggable", manifestText({}).replace("<application>", '<application android:debuggable="false">'))).toEqual([]);
    expect(findingsOf("debuggable", manifestText({}))).toEqual([]);
  });

  it("agrees with what aapt dumps of the fixture APKs: none of them is debuggable", () => {
    // fixtures/dumps/*.xmltree.txt: no android:debuggable attribute in any demo APK.
    for (const name of ["tidewatch", "snapshare", "beamtorch"]) {
      expect(defaultJudge.judge(readManifestFile(`${APK_DIR}${name}.apk`)).findings.some((f) => f.checkId === "debuggable"), name).toBe(false);
    }
  });
});
