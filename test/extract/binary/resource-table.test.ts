import { readFileSync } from "node:fs";
import AdmZip from "adm-zip";
import { describe, expect, it } from "vitest";
import { ResourceTable } from "../../../src/extract/binary/resource-table.js";
import { ResourceTableError } from "../../../src/errors.js";
import { APK_DIR, DUMP_DIR } from "../../helpers/paths.js";

describe("resources.arsc", () => {
  // aapt dump xmltree (fixtures/dumps/tidewatch.xmltree.txt): android:label=@0x7f010000; aapt dump badging
  // (tidewatch.badging.txt) resolves it to the application label.
  const table = new ResourceTable(new AdmZip(`${APK_DIR}tidewatch.apk`).readFile("resources.arsc")!);

  it("resolves the label reference to the string aapt shows", () => {
    const id = Number(/android:label\(0x01010001\)=@(0x[0-9a-f]+)/.exec(readFileSync(`${DUMP_DIR}tidewatch.xmltree.txt`, "utf8"))![1]);
    const label = /application-label:'([^']*)'/.exec(readFileSync(`${DUMP_DIR}tidewatch.badging.txt`, "utf8"))![1];
    expect(table.resolveString(id)).toBe(label);
  });

  it("knows nothing of an id outside its package", () => {
    expect(table.resolveString(0x7f7f7f7f)).toBeUndefined();
    expect(table.resolve(0x01010001)).toBeUndefined(); // a framework id: not in the app's table
  });

  it("refuses bytes that are no resource table", () => {
    expect(() => new ResourceTable(Uint8Array.from([1, 2, 3, 4, 5, 6, 7, 8]))).toThrow(ResourceTableError);
  });
});
