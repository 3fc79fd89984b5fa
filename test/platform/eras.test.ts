/**
 * The era tables (src/platform/data/permission-added-in.tsv, permission-lineage.tsv) against the platform's
 * own manifests: a permission said to be added at API 29 or earlier must be defined by the API 29
 * framework manifest (Debian's framework-res.apk, fixtures/platform), and one the API 31/32 snapshot lacks
 * (platform table column in_api31_32_snapshot) cannot have been added before API 32.
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { readManifestBytes } from "../../src/extract/index.js";
import { addedIn, addedInTable, judgeByEra, lineageOf, lineageTable } from "../../src/platform/eras.js";
import { platformPermission, platformPermissions } from "../../src/platform/permissions.js";
import { storeAppCanHold } from "../../src/platform/sensitivity.js";
import { FIXTURES, ROOT } from "../helpers/paths.js";

const api29 = new Set(readManifestBytes(readFileSync(`${FIXTURES}platform/framework-res-AndroidManifest.xml`)).declaredPermissions.map((p) => p.name));
const tsv = readFileSync(`${ROOT}src/platform/data/android-platform-permissions.tsv`, "utf8").trim().split("\n");
const head = tsv[0].split("\t");
const inSnapshot = new Map(tsv.slice(1).map((l) => l.split("\t")).map((f) => [f[0], f[head.indexOf("in_api31_32_snapshot")] === "yes"]));

describe("added-in table", () => {
  it("has a level and a source for every permission a store app can request", () => {
    const missing = [...platformPermissions().values()].filter((p) => storeAppCanHold(p) && !addedIn(p.name)).map((p) => p.name);
    expect(missing).toEqual([]);
    for (const [name, a] of addedInTable()) {
      expect(platformPermission(name), name).toBeDefined();
      expect(a.api, name).toBeGreaterThanOrEqual(1);
      expect(a.api, name).toBeLessThanOrEqual(36); // the newest platform table is API 36
      expect(a.source.length, name).toBeGreaterThan(10);
    }
  });

  it("agrees with the API 29 framework manifest and the API 31/32 snapshot", () => {
    expect(api29.size).toBeGreaterThan(500);
    for (const [name, a] of addedInTable()) {
      if (a.api <= 29 && a.basis !== "lower-bound") expect(api29.has(name), `${name} (API ${a.api}) in the API 29 manifest`).toBe(true);
      if (inSnapshot.get(name) === false) expect(a.api, `${name} is absent from the API 31/32 snapshot`).toBeGreaterThanOrEqual(32);
      if (a.api <= 31 && a.basis === "reference") expect(inSnapshot.get(name), `${name} (API ${a.api}) in the API 31/32 snapshot`).toBe(true);
    }
  });

  it("knows the levels the era rule leans on", () => {
    // POST_NOTIFICATIONS: ApiSince=33 in the binding of the Android reference (learn.microsoft.com, cited in the table).
    expect(addedIn("android.permission.POST_NOTIFICATIONS")?.api).toBe(33);
    expect(addedIn("android.permission.READ_MEDIA_VISUAL_USER_SELECTED")?.api).toBe(34);
    expect(addedIn("android.permission.BLUETOOTH_CONNECT")?.api).toBe(31);
  });
});

describe("lineage table", () => {
  it("has rows whose permissions the platform defines, added when the lineage says", () => {
    for (const [name, l] of lineageTable()) {
      expect(platformPermission(name), name).toBeDefined();
      expect(l.api, name).toBeGreaterThanOrEqual(addedIn(name)!.api); // the level it took over at (REQUEST_INSTALL_PACKAGES: added in 23, required from 26)
      expect(l.source, name).toMatch(/from memory|developer\.android\.com|reference/);
      if (l.kind === "made-explicit") expect(l.predecessors).toEqual([]);
      else expect(l.predecessors.length, name).toBeGreaterThan(0);
    }
  });

  it("has the splits and replacements the platform made", () => {
    for (const m of ["READ_MEDIA_IMAGES", "READ_MEDIA_VIDEO", "READ_MEDIA_AUDIO"]) expect(lineageOf(`android.permission.${m}`)?.predecessors).toEqual(["android.permission.READ_EXTERNAL_STORAGE"]);
    expect(lineageOf("android.permission.BLUETOOTH_SCAN")?.predecessors).toEqual(["android.permission.BLUETOOTH", "android.permission.BLUETOOTH_ADMIN"]);
    expect(lineageOf("android.permission.NEARBY_WIFI_DEVICES")?.predecessors).toEqual(["android.permission.ACCESS_FINE_LOCATION"]);
    expect(lineageOf("android.permission.FOREGROUND_SERVICE_CAMERA")?.predecessors).toEqual(["android.permission.FOREGROUND_SERVICE"]);
    expect(lineageOf("android.permission.READ_PHONE_NUMBERS")?.api).toBe(26);
    expect(lineageOf("android.permission.BODY_SENSORS_BACKGROUND")?.api).toBe(33);
    expect(lineageOf("android.permission.ACCESS_BACKGROUND_LOCATION")?.api).toBe(29);
    for (const p of ["POST_NOTIFICATIONS", "SCHEDULE_EXACT_ALARM", "USE_EXACT_ALARM", "QUERY_ALL_PACKAGES"]) expect(lineageOf(`android.permission.${p}`)?.kind).toBe("made-explicit");
  });
});

describe("judgeByEra", () => {
  it("judges a permission the corpus could have seen by itself", () => {
    expect(judgeByEra("android.permission.CAMERA", 29)).toEqual({ kind: "own" });
    expect(judgeByEra("android.permission.READ_MEDIA_IMAGES", 33)).toEqual({ kind: "own" });
    expect(judgeByEra("android.permission.READ_MEDIA_IMAGES", undefined)).toEqual({ kind: "own" });
  });

  it("follows predecessors back until one is within the era", () => {
    expect(judgeByEra("android.permission.READ_MEDIA_IMAGES", 29)).toMatchObject({ kind: "predecessor", predecessors: ["android.permission.READ_EXTERNAL_STORAGE"], addedIn: 33 });
    expect(judgeByEra("android.permission.BLUETOOTH_CONNECT", 29)).toMatchObject({ kind: "predecessor", predecessors: ["android.permission.BLUETOOTH", "android.permission.BLUETOOTH_ADMIN"], addedIn: 31 });
  });

  it("never judges a permission by those it is needed alongside (a service type's, partial photo access)", () => {
    // developer.android.com/develop/background-work/services/fgs/service-types: a type's permission is requested
    // "in addition to" FOREGROUND_SERVICE; partial photo access is declared beside READ_MEDIA_IMAGES/VIDEO.
    expect(judgeByEra("android.permission.READ_MEDIA_VISUAL_USER_SELECTED", 33)).toMatchObject({ kind: "alongside", addedIn: 34 });
    expect(judgeByEra("android.permission.FOREGROUND_SERVICE_DATA_SYNC", 29)).toMatchObject({ kind: "alongside", addedIn: 34 });
    expect(judgeByEra("android.permission.FOREGROUND_SERVICE_MEDIA_PROCESSING", 29)).toMatchObject({ kind: "alongside", addedIn: 35 });
    // All-files access (API 30) is special access, not a successor of WRITE_EXTERNAL_STORAGE.
    expect(judgeByEra("android.permission.MANAGE_EXTERNAL_STORAGE", 29)).toMatchObject({ kind: "no-evidence", addedIn: 30 });
  });

  it("does not measure what made an old behaviour explicit, and has no evidence for what is simply new", () => {
    expect(judgeByEra("android.permission.POST_NOTIFICATIONS", 29)).toMatchObject({ kind: "made-explicit", addedIn: 33 });
    expect(judgeByEra("android.permission.UWB_RANGING", 29)).toEqual({ kind: "no-evidence", addedIn: 31 });
  });
});
