import { describe, expect, it } from "vitest";
import { readManifestFile } from "../../src/ops/read-manifest.js";
import { factsToJson, factsToText } from "../../src/report/facts.js";
import { APK_DIR } from "../helpers/paths.js";

const lamp = readManifestFile(`${APK_DIR}pocketlamp.apk`);

describe("factsToText", () => {
  const text = factsToText([{ file: "pocketlamp.apk", manifest: lamp }]);

  it("heads the app with its package, label, versions and SDK levels", () => {
    // Values from fixtures/dumps/pocketlamp.badging.txt (aapt dump badging of the same APK).
    expect(text).toContain("org.example.pocketlamp  “Pocket Lamp”");
    expect(text).toContain("version     1.4.2 (code 42)");
    expect(text).toContain("SDK         min 21 · target 30 · compiled against 29");
  });

  it("lists every requested permission with its platform protection level", () => {
    // Protection levels from the platform table (API 34): READ_SMS dangerous, SYSTEM_ALERT_WINDOW signature|appop.
    expect(text).toMatch(/Runtime: the user is asked when the app uses it \(7\)\n(.*\n)*? {4}READ_SMS/);
    expect(text).toMatch(/Special access: the user grants it by hand \(settings, developer options\) \(1\)\n {4}SYSTEM_ALERT_WINDOW\s+signature, .*appop/);
  });

  it("keeps lines within 80 columns", () => {
    for (const line of text.split("\n")) expect(line.length).toBeLessThanOrEqual(80);
  });
});

describe("factsToJson", () => {
  it("keeps failed inputs as results beside the read ones", () => {
    const json = JSON.parse(factsToJson([{ file: "a.apk", manifest: lamp }, { file: "b.apk", error: { kind: "ArchiveError", message: "damaged" } }]));
    expect(json.results.map((r: { file: string }) => r.file)).toEqual(["a.apk", "b.apk"]);
    expect(json.results[0].manifest.package).toBe("org.example.pocketlamp");
    expect(json.results[1].error).toEqual({ kind: "ArchiveError", message: "damaged" });
  });
});
