import { copyFileSync, mkdirSync, mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { listInputs, parseShard, shardOf } from "../../../src/ops/sweep/inputs.js";
import { fnv1a32 } from "../../../src/util/hash.js";
import { APK_DIR } from "../../helpers/paths.js";

const dir = mkdtempSync(join(tmpdir(), "overask-inputs-"));
mkdirSync(join(dir, "apps", "nested"), { recursive: true });
copyFileSync(`${APK_DIR}pocketlamp.apk`, join(dir, "apps", "b.apk"));
copyFileSync(`${APK_DIR}tidewatch.apk`, join(dir, "apps", "nested", "unnamed")); // an APK without its extension
writeFileSync(join(dir, "apps", "notes.txt"), "not an app\n");
writeFileSync(join(dir, "apps", ".hidden.apk"), "skipped\n");

describe("listInputs", () => {
  it("walks a folder in a stable order, taking apps by name or by content and skipping the rest", () => {
    expect(listInputs(join(dir, "apps")).map((i) => i.id)).toEqual(["b.apk", "nested/unnamed"]);
  });

  it("reads a list of files relative to the list, one a line, with comments", () => {
    const list = join(dir, "list.txt");
    writeFileSync(list, "# inventory\napps/b.apk\n\napps/missing.apk\n");
    const inputs = listInputs(list);
    expect(inputs.map((i) => i.id)).toEqual(["apps/b.apk", "apps/missing.apk"]);
    expect(inputs[1].size).toBe(-1); // a missing file becomes a failed row when swept
  });

  it("reads an index CSV with a category per file", () => {
    const index = join(dir, "index.csv");
    writeFileSync(index, "file,category\napps/b.apk,Tools\n");
    expect(listInputs(index)).toMatchObject([{ id: "apps/b.apk", category: "Tools" }]);
  });
});

describe("shards", () => {
  it("puts an id in the shard its 32-bit FNV-1a hash falls in", () => {
    expect(shardOf("foobar", 7)).toBe(fnv1a32("foobar") % 7);
  });

  it("parses i/n and refuses what is not one", () => {
    expect(parseShard("2/5")).toEqual({ index: 2, count: 5 });
    for (const bad of ["0/5", "6/5", "a/b", "3"]) expect(parseShard(bad)).toBeUndefined();
  });
});

describe("folders of source trees", () => {
  it("pass over resource XML whose root is not <manifest>, and count them", async () => {
    const { readFileSync: read } = await import("node:fs");
    const tree = join(dir, "tree", "app", "src", "main");
    mkdirSync(join(tree, "res", "values"), { recursive: true });
    writeFileSync(join(tree, "AndroidManifest.xml"), read(`${APK_DIR}../apps/tidewatch/AndroidManifest.xml`));
    writeFileSync(join(tree, "res", "values", "strings.xml"), '<?xml version="1.0"?>\n<!-- texts -->\n<resources><string name="a">A</string></resources>\n');
    // A compiled res/xml file (binary XML whose root is <network-security-config>), from the aapt2-built APK.
    const { openArchiveFile } = await import("../../../src/ops/read-manifest.js");
    const apk = openArchiveFile(`${APK_DIR}tidewatch.apk`);
    writeFileSync(join(tree, "res", "nsc.xml"), apk.read("res/xml/network_security_config.xml", "MAX_MANIFEST_BYTES"));
    apk.close();
    const report = { notManifests: 0 };
    expect(listInputs(join(dir, "tree"), report).map((i) => i.id)).toEqual(["app/src/main/AndroidManifest.xml"]);
    expect(report.notManifests).toBe(2);
  });
});
