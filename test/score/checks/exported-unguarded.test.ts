import { describe, expect, it } from "vitest";
import { findingsOf, manifestText } from "../../helpers/judge.js";

describe("exported-unguarded", () => {
  it("fires for components exported explicitly or by default without a permission", () => {
    const app = `
    <receiver android:name=".Boot"><intent-filter><action android:name="android.intent.action.BOOT_COMPLETED" /></intent-filter></receiver>
    <provider android:name=".Files" android:authorities="org.example.case.files" android:exported="true" />`;
    const f = findingsOf("exported-unguarded", manifestText({ app, target: 30 }));
    expect(f.map((x) => [x.subject, x.data.reason])).toEqual([
      ["org.example.case.Boot", "intent-filter-default"],
      ["org.example.case.Files", "explicit"],
    ]);
    expect(f[0].level).toBe("note");
  });

  it("does not fire for the launcher, guarded, private or disabled components", () => {
    const app = `
    <activity android:name=".Main" android:exported="true"><intent-filter><action android:name="android.intent.action.MAIN" /><category android:name="android.intent.category.LAUNCHER" /></intent-filter></activity>
    <service android:name=".Guarded" android:exported="true" android:permission="org.example.case.permission.BIND" />
    <provider android:name=".Read" android:authorities="x.y" android:exported="true" android:readPermission="org.example.case.permission.READ" />
    <activity android:name=".Private" />
    <activity android:name=".Off" android:exported="true" android:enabled="false" />`;
    expect(findingsOf("exported-unguarded", manifestText({ app }))).toEqual([]);
  });

  it("does not fire for Health Connect's rationale activity, which Health Connect starts from outside the app", () => {
    // The rationale action and the Android 14 VIEW_PERMISSION_USAGE alias with category HEALTH_PERMISSIONS,
    // both exported in the Health Connect guide (from memory:
    // developer.android.com/health-and-fitness/health-connect/get-started). An activity that also handles
    // another action is still reported.
    const app = `
    <activity android:name=".Rationale" android:exported="true"><intent-filter><action android:name="androidx.health.ACTION_SHOW_PERMISSIONS_RATIONALE" /></intent-filter></activity>
    <activity-alias android:name=".UsageAlias" android:exported="true" android:targetActivity=".Rationale"><intent-filter><action android:name="android.intent.action.VIEW_PERMISSION_USAGE" /><category android:name="android.intent.category.HEALTH_PERMISSIONS" /></intent-filter></activity-alias>
    <activity android:name=".Both" android:exported="true"><intent-filter><action android:name="androidx.health.ACTION_SHOW_PERMISSIONS_RATIONALE" /></intent-filter><intent-filter><action android:name="android.intent.action.SEND" /></intent-filter></activity>`;
    expect(findingsOf("exported-unguarded", manifestText({ app, target: 34 })).map((x) => x.subject)).toEqual(["org.example.case.Both"]);
  });
});
