import { readFileSync } from "node:fs";
import AdmZip from "adm-zip";
import { describe, expect, it } from "vitest";
import { fromApk } from "../../../src/extract/containers/apk.js";
import { openArchiveBytes } from "../../../src/extract/containers/zip.js";
import { APK_DIR, DUMP_DIR } from "../../helpers/paths.js";

describe("an APK", () => {
  it("gives the manifest aapt reads, with the label resolved through resources.arsc", () => {
    // aapt dump badging fixtures/apk/tidewatch.apk (fixtures/dumps/tidewatch.badging.txt): the application label.
    const label = /application-label:'([^']*)'/.exec(readFileSync(`${DUMP_DIR}tidewatch.badging.txt`, "utf8"))![1];
    const a = openArchiveBytes(readFileSync(`${APK_DIR}tidewatch.apk`));
    const m = fromApk(a);
    expect(m.label).toBe(label);
    expect(m.input.kind).toBe("apk");
    expect(fromApk(a, { resolveResources: false }).label).not.toBe(label);
  });

  it("keeps the manifest when resources.arsc is damaged, and says so", () => {
    const z = new AdmZip(readFileSync(`${APK_DIR}tidewatch.apk`));
    z.updateFile("resources.arsc", Buffer.from([1, 2, 3, 4, 5, 6, 7, 8]));
    const m = fromApk(openArchiveBytes(z.toBuffer()));
    expect(m.package).toBe("org.example.tidewatch");
    expect(m.notes.join(" ")).toMatch(/resources\.arsc could not be read/);
  });

  it("refuses an AndroidManifest.xml that is neither binary nor protobuf XML", () => {
    const z = new AdmZip();
    z.addFile("AndroidManifest.xml", Buffer.from("<manifest package='org.example.plain'/>"));
    expect(() => fromApk(openArchiveBytes(z.toBuffer()))).toThrow(/neither a compiled binary manifest nor a protobuf one/);
  });
});
