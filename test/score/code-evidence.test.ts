import AdmZip from "adm-zip";
import { readdirSync, readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { readDexEntries } from "../../src/extract/code.js";
import { openArchiveBytes } from "../../src/extract/containers/zip.js";
import { readManifestBytes } from "../../src/extract/read.js";
import { apiPermissionMap } from "../../src/platform/api-map.js";
import { codeEvidence, packageGroup } from "../../src/score/code-evidence.js";
import { APK_DIR, FIXTURES, ROOT } from "../helpers/paths.js";

const apkBytes = readFileSync(`${APK_DIR}beamtorch-code.apk`);
const evidenceOf = (bytes: Uint8Array) => {
  const manifest = readManifestBytes(bytes);
  const archive = openArchiveBytes(bytes);
  try {
    return codeEvidence(manifest, readDexEntries(archive));
  } finally {
    archive.close();
  }
};

/** Smali type descriptor → the maps' Java spelling (common practice: the dex type descriptor grammar). */
function javaOf(d: string): string {
  let dims = 0;
  while (d[dims] === "[") dims++;
  const base = d.slice(dims);
  const prim: Record<string, string> = { V: "void", Z: "boolean", B: "byte", S: "short", C: "char", I: "int", J: "long", F: "float", D: "double" };
  return (base.startsWith("L") ? base.slice(1, -1).replace(/\//g, ".") : prim[base]) + "[]".repeat(dims);
}
function splitParams(p: string): string[] {
  return p.match(/\[*(?:L[^;]+;|[VZBSCIJFD])/g) ?? [];
}

/**
 * What the published maps list for the calls written in the fixture's smali source, computed from the map
 * files' own text lines (Backes et al., USENIX Security 2016, sdk-map-25/cp-map-25) and the own table's rows —
 * not through the stage's parser. Returns one set of alternatives per reference.
 */
function expectedFromSmali(): string[][] {
  const dir = `${ROOT}src/platform/data/`;
  const sdk = readFileSync(`${dir}api-permission-map/sdk-map-25.txt`, "utf8").split("\n");
  const cp = readFileSync(`${dir}api-permission-map/cp-map-25.txt`, "utf8").split("\n");
  const extra = readFileSync(`${dir}code-evidence-extra.tsv`, "utf8").split("\n").slice(1).filter(Boolean).map((l) => l.split("\t"));
  const out: string[][] = [];
  const perms = (s: string) => s.split(",").map((x) => x.trim()).filter(Boolean);
  const files = ["classes", "classes2"].flatMap((part) => readdirSync(`${FIXTURES}smali/beamtorch/${part}`).map((f) => readFileSync(`${FIXTURES}smali/beamtorch/${part}/${f}`, "utf8")));
  const manifest = readFileSync(`${FIXTURES}apps/beamtorch/AndroidManifest.xml`, "utf8");
  for (const src of files) {
    {
      // A class nothing names (no other class's code, not the manifest) never runs: its calls are not reached.
      const cls = /^\.class .*?(L[^;]+;)/m.exec(src)![1];
      const simple = cls.slice(cls.lastIndexOf("/") + 1, -1);
      if (!manifest.includes(`.${simple}"`) && !files.some((other) => other !== src && other.includes(cls))) continue;
      for (const m of src.matchAll(/invoke-\S+ \{[^}]*\}, (L[^;]+;)->([^(]+)\(([^)]*)\)(\S+)/g)) {
        const [, owner, name, params, ret] = m;
        const sig = `${javaOf(owner)}.${name}(${splitParams(params).map(javaOf).join(",")})${javaOf(ret)}`;
        const set = new Set<string>();
        for (const line of sdk) if (line.startsWith(`${sig}  ::  `)) perms(line.split("  ::  ")[1]).forEach((p) => set.add(p));
        for (const r of extra) if (r[0] === "method" && r[1] === `${javaOf(owner)}.${name}`) perms(r[2]).forEach((p) => set.add(p));
        if (set.size) out.push([...set].sort());
      }
      for (const m of src.matchAll(/sget-object \S+, (L[^;]+;)->([^:]+):/g)) {
        const key = `${javaOf(m[1])}.${m[2]}`;
        for (const r of extra) if (r[0] === "field" && r[1] === key) out.push(perms(r[2]).sort());
      }
      for (const m of src.matchAll(/const-string \S+, "([^"]*)"/g)) {
        const s = m[1];
        const set = new Set<string>();
        for (const line of cp) {
          const cells = line.trim().split(/\s{2,}/);
          const uri = cells.find((c) => c.startsWith("content://"));
          if (uri && (s === uri || s.startsWith(`${uri}/`)) && /permission\./.test(cells[cells.length - 1])) set.add(cells[cells.length - 1]);
        }
        for (const r of extra) if ((r[0] === "string" && (s === r[1] || s.startsWith(`${r[1]}/`))) || (r[0] === "action" && s === r[1])) perms(r[2]).forEach((p) => set.add(p));
        if (set.size) out.push([...set].sort());
      }
    }
  }
  return out;
}

describe("code evidence", () => {
  it("reports as reached exactly what the maps list for the calls in the smali source of classes that run", () => {
    const ev = evidenceOf(apkBytes);
    const reached = new Set([...ev.permissions.filter((p) => p.status === "used").map((p) => p.permission), ...ev.unrequested.flatMap((u) => (u.evidence.every((e) => e.kind === "receiver") ? [] : u.permissions))]);
    const expected = expectedFromSmali();
    const requested = new Set(ev.permissions.map((p) => p.permission));
    // Every alternative of a reference counts as reached when none is requested; otherwise only the requested ones.
    const want = new Set(expected.flatMap((alts) => (alts.some((a) => requested.has(a)) ? alts.filter((a) => requested.has(a)) : alts)));
    expect([...reached].sort()).toEqual([...want].sort());
    expect(want.size).toBeGreaterThan(3);
  });

  it("tells used, not seen and not mappable apart for the demo torch, by package", () => {
    const ev = evidenceOf(apkBytes);
    const by = Object.fromEntries(ev.permissions.map((p) => [p.permission.replace("android.permission.", ""), p]));
    expect(ev.read).toEqual([{ entry: "classes.dex", classes: 2 }, { entry: "classes2.dex", classes: 1 }]);
    // The torch needs no CAMERA permission for CameraManager.setTorchMode (from memory: Android API reference).
    expect(by.CAMERA.status).toBe("not-seen");
    expect(by.POST_NOTIFICATIONS.status).toBe("not-seen");
    expect(by.ACCESS_BACKGROUND_LOCATION.status).toBe("not-mappable");
    expect(by.READ_CONTACTS).toMatchObject({ status: "used", users: ["org.example.beamtorch"], onlyLibraries: false });
    // The ad library's getLine1Number (READ_SMS among its alternatives) is never called: only the app's own use counts.
    expect(by.READ_SMS.users).toEqual(["org.example.beamtorch"]);
    expect(by.READ_SMS.evidence.find((e) => e.what.includes("getLine1Number"))).toMatchObject({ reached: false, packages: ["org.example.adnet"] });
    const sms = by.READ_SMS.evidence.find((e) => e.kind === "uri")!;
    expect(sms).toMatchObject({ what: "content://sms", classes: 1, packages: ["org.example.beamtorch"] });
    // The manifest's BOOT_COMPLETED receiver without RECEIVE_BOOT_COMPLETED never fires.
    expect(ev.unrequested.find((u) => u.evidence.some((e) => e.kind === "receiver"))?.permissions).toEqual(["android.permission.RECEIVE_BOOT_COMPLETED"]);
    const send = ev.unrequested.find((u) => u.permissions.includes("android.permission.SEND_SMS"))!;
    expect(send.evidence[0].packages).toEqual(["org.example.beamtorch"]);
  });

  it("a damaged dex costs only its own evidence, and says which", () => {
    const zip = new AdmZip(apkBytes);
    const second = zip.getEntry("classes2.dex")!.getData();
    zip.updateFile("classes2.dex", second.subarray(0, 60));
    const ev = evidenceOf(zip.toBuffer());
    expect(ev.read.map((d) => d.entry)).toEqual(["classes.dex"]);
    expect(ev.problems).toHaveLength(1);
    expect(ev.problems[0]).toMatch(/^could not read classes2\.dex: /);
    expect(ev.permissions.find((p) => p.permission.endsWith("READ_CONTACTS"))?.status).toBe("used");
  });

  it("reads an app bundle's module dex and orders classes10 after classes2", () => {
    const zip = new AdmZip(apkBytes);
    const first = zip.getEntry("classes.dex")!.getData();
    const bundle = new AdmZip();
    for (const name of ["base/dex/classes.dex", "base/dex/classes10.dex", "base/dex/classes2.dex"]) bundle.addFile(name, first);
    bundle.addFile("base/assets/classes.dex", first);
    const archive = openArchiveBytes(bundle.toBuffer());
    expect(readDexEntries(archive).map((d) => d.entry)).toEqual(["base/dex/classes.dex", "base/dex/classes2.dex", "base/dex/classes10.dex"]);
  });

  it("groups classes by the app's own package or the top three levels of a library's", () => {
    expect(packageGroup("org.example.beamtorch.ui.Main", "org.example.beamtorch")).toBe("org.example.beamtorch");
    expect(packageGroup("org.example.adnet.track.Beacon", "org.example.beamtorch")).toBe("org.example.adnet");
    expect(packageGroup("a.b", "org.example.beamtorch")).toBe("a");
    expect(packageGroup("Main", "org.example.beamtorch")).toBe("(default package)");
  });
});

describe("API → permission map", () => {
  it("keeps every line of the published SDK map", () => {
    // Quick-check values from the maps' SOURCES.md (counted in api-25/sdk-map-25.txt): SEND_SMS on 7 lines, BLUETOOTH on 97.
    const map = apiPermissionMap();
    const count = (p: string) => [...map.methods.values()].filter((e) => e.permissions.includes(p)).length;
    expect(count("android.permission.SEND_SMS")).toBe(7);
    expect(count("android.permission.BLUETOOTH")).toBe(97);
    // 475 lines, less the one the corrections table empties (getDeviceId(int) → ACCESS_NETWORK_STATE).
    expect(map.methods.size).toBe(474);
    expect(map.methods.has("android.telephony.TelephonyManager.getDeviceId(int)java.lang.String")).toBe(false);
  });

  it("ties no call to QUERY_ALL_PACKAGES: package lists are filtered by visibility, no API needs it", () => {
    // From memory: Android 11 package visibility page (the corrections table's reason).
    const map = apiPermissionMap();
    expect(map.covered.has("android.permission.QUERY_ALL_PACKAGES")).toBe(false);
    expect(map.corrections.find((c) => c.permission === "android.permission.QUERY_ALL_PACKAGES")?.reason).toMatch(/package visibility/);
  });

  it("covers the permissions its own table adds for checks the maps cannot see", () => {
    const map = apiPermissionMap();
    for (const p of ["CAMERA", "RECORD_AUDIO", "INTERNET", "POST_NOTIFICATIONS", "BLUETOOTH_SCAN", "BLUETOOTH_CONNECT", "NEARBY_WIFI_DEVICES", "SCHEDULE_EXACT_ALARM", "READ_MEDIA_IMAGES", "BODY_SENSORS", "ACCESS_MOCK_LOCATION", "MANAGE_OWN_CALLS", "health.READ_STEPS"]) {
      expect(map.covered.has(`android.permission.${p}`), p).toBe(true);
    }
  });
});

describe("map coverage", () => {
  it("ties at least one API, URI or action to most of the platform's dangerous permissions", async () => {
    // Dangerous permissions from the platform's own table (API 34, src/platform/data). Measured: 37 of 42;
    // the rest (background body sensors, UWB ranging, background location, selected-photos access,
    // handover) have no API of their own in any map — they are "not mappable".
    const { platformPermissions } = await import("../../src/platform/permissions.js");
    // The API-34 framework's (the maps stop at API 25; what came later, RANGING, XR and Health Connect, is not mapped).
    const dangerous = [...platformPermissions().values()].filter((p) => p.base === "dangerous" && p.definedBy === "framework" && p.tableAddedIn === undefined);
    const map = apiPermissionMap();
    const uncovered = dangerous.filter((p) => !map.covered.has(p.name)).map((p) => p.name.replace("android.permission.", "")).sort();
    expect(dangerous).toHaveLength(42);
    expect(uncovered).toEqual(["ACCEPT_HANDOVER", "ACCESS_BACKGROUND_LOCATION", "BODY_SENSORS_BACKGROUND", "READ_MEDIA_VISUAL_USER_SELECTED", "UWB_RANGING"]);
  });
});

describe("code in archives of archives", () => {
  it("reads the dex of each APK in a multi-APK archive, named by its APK", () => {
    const outer = new AdmZip();
    outer.addFile("base.apk", apkBytes);
    const archive = openArchiveBytes(outer.toBuffer());
    const read = readDexEntries(archive);
    expect(read.map((d) => d.entry)).toEqual(["base.apk!classes.dex", "base.apk!classes2.dex"]);
    expect(read.every((d) => d.dex)).toBe(true);
  });
});
