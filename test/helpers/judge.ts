import { readBaselineFile } from "../../src/ops/baseline.js";
import { readManifestBytes } from "../../src/extract/index.js";
import { Judge, type JudgeOptions } from "../../src/score/judge.js";
import { ROOT } from "./paths.js";

export const demoJudge = new Judge(readBaselineFile(`${ROOT}baselines/harbourview-demo.json`));
export const defaultJudge = new Judge(readBaselineFile(`${ROOT}baselines/default.json`));

/** A plain manifest with the given permissions, SDK and <application> body. */
export function manifestText(o: { permissions?: string[]; target?: number; app?: string; extra?: string; pkg?: string }): string {
  return `<manifest xmlns:android="http://schemas.android.com/apk/res/android" package="${o.pkg ?? "org.example.case"}">
  <uses-sdk android:minSdkVersion="21" android:targetSdkVersion="${o.target ?? 34}" />
${(o.permissions ?? []).map((p) => `  <uses-permission android:name="${p.includes(".") ? p : `android.permission.${p}`}" />`).join("\n")}
${o.extra ?? ""}
  <application>${o.app ?? ""}</application>
</manifest>
`;
}

export function judgeText(text: string, options: JudgeOptions = {}, judge = demoJudge) {
  return judge.judge(readManifestBytes(new TextEncoder().encode(text), "AndroidManifest.xml"), options);
}

/**
 * Findings of one check, including those folded into another check's finding on the same permission
 * (score/judge.ts keeps one finding a permission, the others' reasons in `also`).
 */
export function findingsOf(checkId: string, text: string, options: JudgeOptions = {}, judge = demoJudge) {
  return judgeText(text, options, judge).findings.flatMap((f) => {
    if (f.checkId === checkId) return [f];
    const a = f.also?.find((x) => x.checkId === checkId);
    return a ? [{ ...f, checkId: a.checkId, level: a.level, data: a.data, also: undefined }] : [];
  });
}
