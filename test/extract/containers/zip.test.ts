import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { randomBytes } from "node:crypto";
import AdmZip from "adm-zip";
import { describe, expect, it } from "vitest";
import { ArchiveError, InputError, LimitError } from "../../../src/errors.js";
import { openArchiveBytes } from "../../../src/extract/containers/zip.js";
import { openArchiveFile } from "../../../src/ops/read-manifest.js";
import { readManifestBytes } from "../../../src/extract/index.js";
import { readManifestFile } from "../../../src/ops/read-manifest.js";
import { LIMITS } from "../../../src/limits.js";
import { tinyManifest } from "../../helpers/axml.js";
import { APK_DIR } from "../../helpers/paths.js";

const dir = mkdtempSync(join(tmpdir(), "overask-archive-"));

function zipWith(entries: Record<string, Uint8Array>): Buffer {
  const z = new AdmZip();
  for (const [name, data] of Object.entries(entries)) z.addFile(name, Buffer.from(data));
  return z.toBuffer();
}

/** Offsets of every local (PK\3\4) and central (PK\1\2) header in a zip. */
function headers(buf: Buffer): { local: number[]; central: number[] } {
  const local: number[] = [];
  const central: number[] = [];
  for (let i = 0; i + 4 <= buf.length; i++) {
    if (buf[i] === 0x50 && buf[i + 1] === 0x4b && buf[i + 2] === 3 && buf[i + 3] === 4) local.push(i);
    if (buf[i] === 0x50 && buf[i + 1] === 0x4b && buf[i + 2] === 1 && buf[i + 3] === 2) central.push(i);
  }
  return { local, central };
}

describe("archives", () => {
  it("finds the manifest in a zip built by another writer", () => {
    const m = readManifestBytes(zipWith({ "AndroidManifest.xml": tinyManifest(), "classes.dex": new Uint8Array(10) }), "app.apk");
    expect(m.package).toBe("org.example.tiny");
    expect(m.input.kind).toBe("apk");
  });

  it("says plainly when an archive has no manifest", () => {
    expect(() => readManifestBytes(zipWith({ "readme.txt": new Uint8Array(3) }), "notes.zip")).toThrow("no AndroidManifest.xml in archive (is this an APK?)");
  });

  it("refuses a small zip whose manifest declares an inflated size past MAX_MANIFEST_BYTES", () => {
    const bomb = zipWith({ "AndroidManifest.xml": new Uint8Array(LIMITS.MAX_MANIFEST_BYTES + 1) });
    expect(bomb.length).toBeLessThan(100_000);
    expect(() => readManifestBytes(bomb)).toThrow(LimitError);
  });

  it("stops inflating an entry that lies about its size", () => {
    const buf = zipWith({ "AndroidManifest.xml": new Uint8Array(2_000_000) });
    const { local, central } = headers(buf);
    buf.writeUInt32LE(100, local[0] + 22); // local header: uncompressed size
    buf.writeUInt32LE(100, central[0] + 24); // central directory: uncompressed size
    expect(() => readManifestBytes(buf)).toThrow(ArchiveError);
    expect(() => readManifestBytes(buf)).toThrow(/inflates past its declared 100 bytes/);
  });

  it("refuses an entry whose CRC does not match", () => {
    const buf = zipWith({ "AndroidManifest.xml": tinyManifest() });
    const { central } = headers(buf);
    buf.writeUInt32LE(0x12345678, central[0] + 16); // central directory: crc-32
    expect(() => readManifestBytes(buf)).toThrow(/fails its CRC check/);
  });

  it("refuses an archive naming AndroidManifest.xml twice", () => {
    const buf = zipWith({ "AndroidManifest.xml": tinyManifest(), "AndroidManifesX.xml": tinyManifest() });
    const { local, central } = headers(buf);
    for (const at of [local[1] + 30, central[1] + 46]) buf.write("AndroidManifest.xml", at, "latin1");
    expect(() => readManifestBytes(buf)).toThrow(/same entry twice/);
  });

  it("reads a large APK by its central directory, giving the same answer as reading it whole", () => {
    const big = zipWith({ "AndroidManifest.xml": tinyManifest("android.permission.CAMERA"), "assets/blob.bin": randomBytes(6 * 1024 * 1024) });
    const path = join(dir, "big.apk");
    writeFileSync(path, big);
    const sparse = openArchiveFile(path);
    const whole = openArchiveBytes(big);
    expect(sparse.entries()).toEqual(whole.entries());
    expect(Buffer.from(sparse.read("AndroidManifest.xml", "MAX_MANIFEST_BYTES"))).toEqual(Buffer.from(whole.read("AndroidManifest.xml", "MAX_MANIFEST_BYTES")));
    sparse.close();
    expect(readManifestFile(path).usesPermissions[0].name).toBe("android.permission.CAMERA");
  });

  it("names the file in every error, without a stack", () => {
    const path = join(dir, "truncated.apk");
    const apk = new AdmZip(`${APK_DIR}chirpchat.apk`).toBuffer();
    writeFileSync(path, apk.subarray(0, apk.length - 30));
    try {
      readManifestFile(path);
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(InputError);
      expect((e as InputError).describe()).toMatch(new RegExp(`^${path}: `));
      expect((e as InputError).describe()).not.toMatch(/\n/);
    }
  });
});
