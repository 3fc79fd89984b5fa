import { execFileSync } from "node:child_process";
import { copyFileSync, mkdirSync, mkdtempSync, readFileSync, statSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { EXIT } from "../../src/cli/exit-codes.js";
import { cli } from "../helpers/cli.js";
import { APK_DIR, FIXTURES, ROOT } from "../helpers/paths.js";

const dir = mkdtempSync(join(tmpdir(), "overask-baseline-command-"));
const LAMP = `${APK_DIR}pocketlamp.apk`;

describe("overask baseline", () => {
  it("shows what a baseline knows: categories, era, sources; rates for a category or a permission", async () => {
    const text = (await cli(["baseline"])).stdout;
    expect(text).toMatch(/TOOLS +2318 apps/);
    expect(text).toMatch(/era API 29, apps of 2020/);
    const cat = JSON.parse((await cli(["baseline", "-c", "tools", "-f", "json"])).stdout);
    expect(cat.categoryRates.category).toBe("TOOLS");
    expect(cat.categoryRates.rates[0]).toMatchObject({ permission: "android.permission.INTERNET", k: 2025, n: 2318 });
    const perm = (await cli(["baseline", "-p", "READ_SMS"])).stdout;
    expect(perm).toMatch(/TOOLS +18 of 2318 +0\.78% +0\.49%–1\.2% +uncommon/);
  });
});

describe("overask baseline -p says what check makes of a permission", () => {
  it("never calls a permission newer than the era uncommon when check does not judge it by frequency", async () => {
    // POST_NOTIFICATIONS (API 33) made an old behaviour explicit: the bundled API-29 baseline cannot judge it.
    const text = (await cli(["baseline", "-p", "POST_NOTIFICATIONS"])).stdout;
    expect(text).not.toMatch(/uncommon/);
    expect(text).toMatch(/not judged by frequency: made an older behaviour explicit in API 33/);
    const json = JSON.parse((await cli(["baseline", "-p", "POST_NOTIFICATIONS", "-f", "json"])).stdout);
    expect(json.permissionRates.rates.every((r: { uncommon: boolean; judged: string }) => !r.uncommon && r.judged === "made-explicit")).toBe(true);
  });

  it("shows a permission judged through its predecessor with the predecessor's rate, as check does", async () => {
    // BLUETOOTH_CONNECT (API 31) took over from BLUETOOTH (lineage table): judged by BLUETOOTH's rate.
    const json = JSON.parse((await cli(["baseline", "-p", "BLUETOOTH_CONNECT", "-f", "json"])).stdout);
    const tools = json.permissionRates.rates.find((r: { category: string }) => r.category === "TOOLS");
    expect(tools).toMatchObject({ judged: "by-predecessor", judgedBy: "android.permission.BLUETOOTH", permission: "android.permission.BLUETOOTH_CONNECT" });
    const bt = JSON.parse((await cli(["baseline", "-p", "BLUETOOTH", "-f", "json"])).stdout).permissionRates.rates.find((r: { category: string }) => r.category === "TOOLS");
    expect(tools.k).toBe(bt.k);
    expect((await cli(["baseline", "-p", "BLUETOOTH_CONNECT"])).stdout).toMatch(/judged by BLUETOOTH/);
  });

  it("agrees with check on a modern app: what check flags, baseline -p calls uncommon in that category", async () => {
    const r = JSON.parse((await cli(["check", "-c", "TOOLS", "-f", "json", `${APK_DIR}snapshare.apk`, `${APK_DIR}beamtorch.apk`])).stdout);
    for (const app of r.results) {
      const flagged = new Set<string>(app.findings.filter((f: { checkId: string; also?: { checkId: string }[] }) => [f.checkId, ...(f.also ?? []).map((a) => a.checkId)].some((id) => id === "uncommon-for-category" || id === "sensitive-uncommon")).map((f: { subject: string }) => f.subject));
      for (const p of app.findings.map((f: { subject: string }) => f.subject).filter((s: string) => s.startsWith("android.permission."))) {
        const rates = JSON.parse((await cli(["baseline", "-p", p, "-f", "json"])).stdout).permissionRates.rates;
        expect(rates.find((x: { category: string }) => x.category === "TOOLS").uncommon, `${app.package} ${p}`).toBe(flagged.has(p));
      }
    }
  });
});

describe("overask baseline -p with a name nobody knows", () => {
  it("says it is no permission the platform or the baseline knows, and suggests the nearest (exit 2)", async () => {
    const r = await cli(["baseline", "-p", "READ_SMSS"]);
    expect(r.code).toBe(EXIT.USAGE);
    expect(r.stderr).toBe('overask: --permission "READ_SMSS" is not a permission the platform defines or any app of the baseline requests; did you mean READ_SMS?\n');
    expect(r.stdout).toBe("");
  });

  it("still shows another app's permission that apps of the baseline request", async () => {
    // com.google.android.c2dm.permission.RECEIVE: requested by store apps of the bundled corpus (its counts).
    const r = await cli(["baseline", "-p", "com.google.android.c2dm.permission.RECEIVE"]);
    expect(r.code).toBe(EXIT.OK);
  });
});
