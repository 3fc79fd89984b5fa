import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { apiPermissionMap, parseProviderMap, parseSdkMap, uriEntry, type MapEntry } from "../../src/platform/api-map.js";
import { ROOT } from "../helpers/paths.js";

describe("the API → permission maps", () => {
  const map = apiPermissionMap();

  it("hold the published API-25 rows and the project's own rows, every one with its source", () => {
    // The published maps (reference/api-permission-map, API 25) tie SmsManager.sendTextMessage to SEND_SMS.
    expect([...map.methods.keys()].some((k) => k.startsWith("android.telephony.SmsManager.sendTextMessage("))).toBe(true);
    for (const m of [map.methods, map.methodsAnyOverload, map.fields, map.uris, map.actions]) for (const [k, e] of m) expect(e.source, k).toMatch(/./);
  });

  it("has a source for every row of its own table, in the TSV beside it", () => {
    const lines = readFileSync(`${ROOT}src/platform/data/code-evidence-extra.tsv`, "utf8").trim().split("\n").slice(1);
    for (const l of lines) {
      const [kind, key, permissions, source] = l.split("\t");
      expect(["method", "field", "string", "action", "class"], l).toContain(kind);
      expect(key && permissions && source, l).toBeTruthy();
    }
  });

  it("has a source for every framework superclass and a reason for every correction", () => {
    for (const file of ["framework-superclasses", "code-evidence-corrections"]) {
      const [head, ...rows] = readFileSync(`${ROOT}src/platform/data/${file}.tsv`, "utf8").trim().split("\n");
      const width = head.split("\t").length;
      for (const l of rows) {
        const cells = l.split("\t");
        expect(cells, l).toHaveLength(width);
        expect(cells.every(Boolean), l).toBe(true);
        // Each row's source is a reference page or says "from memory".
        expect(cells[width - 1], l).toMatch(/^(https:\/\/developer\.android\.com\/|from memory: )/);
      }
    }
    expect(map.frameworkSuper.get("android.app.Service")).toBe("android.content.ContextWrapper");
  });

  it("finds a content URI by its authority, whatever path or query follows", () => {
    expect(uriEntry(map, "content://sms/inbox")?.uri).toBe("content://sms");
    expect(uriEntry(map, "content://sms")?.uri).toBe("content://sms");
    expect(uriEntry(map, "content://smsx/inbox")).toBeUndefined();
    expect(uriEntry(map, "https://sms/inbox")).toBeUndefined();
  });

  it("parses the published formats, skipping rows that name no permission", () => {
    const into = new Map<string, MapEntry>();
    // Line shapes of the published files (shared reference/api-permission-map/api-25: sdk-map-25.txt, cp-map-25.txt).
    parseSdkMap("android.app.WallpaperManager.clear()void  ::  android.permission.SET_WALLPAPER, android.permission.X\nnot a row\n", into, "test");
    parseProviderMap(["org.example.TideProvider  content://org.example.tides  <pathPrefix:/today>  [RW]  org.example.permission.READ_TIDES", "org.example.Heap  content://org.example.heap  [grant-uri-permission]"].join("\n"), into, "test");
    expect(into.get("android.app.WallpaperManager.clear()void")).toEqual({ permissions: ["android.permission.SET_WALLPAPER", "android.permission.X"], source: "test" });
    expect(into.get("content://org.example.tides")?.permissions).toEqual(["org.example.permission.READ_TIDES"]);
    expect(into.has("content://org.example.heap")).toBe(false); // no permission named: nothing to map
  });

  it("counts as covered every permission some row ties an API to", () => {
    expect(map.covered.has("android.permission.SEND_SMS")).toBe(true);
    expect(map.covered.has("android.permission.INTERNET")).toBe(true);
  });
});
