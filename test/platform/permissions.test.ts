/**
 * The platform permission table (src/platform/data, from the API 34 framework manifest; see its
 * SOURCES.md). Counts below are the ones SOURCES.md states.
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { normalizePermissionName, parsePlatformTable, platformPermission, platformPermissions } from "../../src/platform/permissions.js";
import { protectionFromInt, protectionFromText } from "../../src/platform/protection.js";
import { ROOT } from "../helpers/paths.js";

describe("platform permission table", () => {
  it("parses every row, with the counts its SOURCES files state", () => {
    const table = platformPermissions();
    // SOURCES-api35-36-health.md: API 36 has 1,031 rows, 1,028 names (three defined twice under complementary
    // flags: one kept), 50 dangerous / 101 normal / 762 signature / 118 internal; Health Connect 103.
    const framework = [...table.values()].filter((p) => p.definedBy === "framework");
    const health = [...table.values()].filter((p) => p.definedBy === "health-connect");
    expect(framework).toHaveLength(1028);
    expect(health).toHaveLength(103);
    const byBase = new Map<string, number>();
    for (const p of framework) byBase.set(p.base, (byBase.get(p.base) ?? 0) + 1);
    // Of the rows, two signature and one internal name are the duplicates: 762 − 2 and 118 − 1.
    expect(Object.fromEntries(byBase)).toEqual({ dangerous: 50, normal: 101, signature: 760, internal: 117 });
    expect(framework.filter((p) => p.featureFlag)).toHaveLength(62);
    expect([...table.values()].filter((p) => p.hardRestricted)).toHaveLength(11);
    expect([...table.values()].filter((p) => p.softRestricted)).toHaveLength(2);
    expect([...table.values()].filter((p) => p.removed)).toHaveLength(15);
  });

  it("agrees with the sanity checks in SOURCES.md", () => {
    expect(platformPermission("android.permission.CAMERA")).toMatchObject({ base: "dangerous", flags: ["instant"] });
    expect(platformPermission("android.permission.READ_SMS")).toMatchObject({ base: "dangerous", hardRestricted: true });
    expect(platformPermission("android.permission.INSTALL_PACKAGES")).toMatchObject({ base: "signature", flags: ["privileged"] });
    expect(platformPermission("android.permission.ACCESS_BACKGROUND_LOCATION")).toMatchObject({ base: "dangerous", hardRestricted: true });
    // Token order does not matter to the platform's parser: `module|signature|role` is a signature permission.
    expect(platformPermission("android.permission.MANAGE_COMPANION_DEVICES")?.base).toBe("signature");
  });

  it("reads the integer and the text form of a protection level alike", () => {
    for (const p of platformPermissions().values()) {
      const text = protectionFromText(p.protectionLevel);
      expect(protectionFromInt(text.value).base).toBe(text.base);
    }
    expect(protectionFromText("signature|privileged").value).toBe(0x12);
  });

  it("normalizes bare platform names and keeps others as written", () => {
    expect(normalizePermissionName("SEND_SMS")).toBe("android.permission.SEND_SMS");
    expect(normalizePermissionName("com.google.android.c2dm.permission.RECEIVE")).toBe("com.google.android.c2dm.permission.RECEIVE");
    expect(normalizePermissionName("NOT_A_PLATFORM_NAME")).toBe("NOT_A_PLATFORM_NAME");
  });

  it("uses the same TSV as the shared reference, byte for byte, when that is at hand", () => {
    const ours = readFileSync(`${ROOT}src/platform/data/android-platform-permissions.tsv`, "utf8");
    let shared: string | undefined;
    try {
      shared = readFileSync(`${ROOT}../shared/reference/android-platform-permissions.tsv`, "utf8");
    } catch {
      return; // a user's clone has no ../shared: the copy in src/platform/data is the reference
    }
    expect(ours).toBe(shared);
    expect(parsePlatformTable(ours).size).toBe(913);
  });
});

describe("the nearest platform name", () => {
  it("is what a scan over every name finds, for platform names with one or two random edits", async () => {
    const { nearestPlatformPermission } = await import("../../src/platform/permissions.js");
    const { editDistance } = await import("../../src/util/edit-distance.js");
    const { seededRandom } = await import("../../src/util/random.js");
    const names = [...platformPermissions().keys()].filter((p) => p.startsWith("android.permission."));
    // The reference: every name, the first in table order among the nearest.
    const scan = (q: string) => {
      let best = { name: "", distance: Infinity };
      for (const p of names) {
        const d = editDistance(q, p);
        if (d < best.distance) best = { name: p, distance: d };
      }
      return best;
    };
    const rand = seededRandom(26);
    const letters = "ABCDEFGHIJKLMNOPQRSTUVWXYZ_";
    const edit = (s: string) => {
      const i = Math.floor(rand() * s.length);
      const r = rand();
      if (r < 0.3) return s.slice(0, i) + s.slice(i + 1); // delete
      if (r < 0.6) return s.slice(0, i) + letters[Math.floor(rand() * letters.length)] + s.slice(i); // insert
      if (r < 0.8) return s.slice(0, i) + letters[Math.floor(rand() * letters.length)] + s.slice(i + 1); // substitute
      return i + 1 < s.length ? s.slice(0, i) + s[i + 1] + s[i] + s.slice(i + 2) : s; // transpose
    };
    // Every 12th name (about 85), alternately one and two edits: the reference scan costs ~70 ms a query.
    let checked = 0;
    for (let k = 0; k < names.length; k += 12) {
      const q = (k / 12) % 2 ? edit(edit(names[k])) : edit(names[k]);
      const first = nearestPlatformPermission(q);
      expect(first, q).toEqual(scan(q));
      expect(nearestPlatformPermission(q)).toBe(first); // again: the same answer, from the cache
      checked++;
    }
    expect(checked).toBeGreaterThan(80);
  }, 60_000);
});
