import { describe, expect, it } from "vitest";
import { LimitError, ManifestError, PlainXmlError } from "../../src/errors.js";
import { readManifestBytes } from "../../src/extract/index.js";
import { parsePlainXml } from "../../src/extract/plain-xml.js";

const enc = (s: string) => new TextEncoder().encode(s);
const read = (s: string) => readManifestBytes(enc(s), "AndroidManifest.xml");

describe("plain XML manifests", () => {
  it("keeps the line of each element's start tag", () => {
    const m = read(`<?xml version="1.0"?>
<manifest xmlns:android="http://schemas.android.com/apk/res/android" package="org.example.lines">
  <uses-permission
      android:name="android.permission.CAMERA" />
  <uses-permission android:name="android.permission.INTERNET"/>
</manifest>`);
    expect(m.usesPermissions.map((p) => [p.name, p.source.line, p.source.path])).toEqual([
      ["android.permission.CAMERA", 3, "/manifest/uses-permission"],
      ["android.permission.INTERNET", 5, "/manifest/uses-permission[2]"],
    ]);
  });

  it("resolves the android namespace by its URI, whatever the prefix", () => {
    const m = read(`<manifest xmlns:a="http://schemas.android.com/apk/res/android" package="org.example.prefix">
  <uses-permission a:name="android.permission.READ_SMS" />
  <uses-permission name="android.permission.SEND_SMS" />
</manifest>`);
    // The second element has no android:name, so the platform would ignore it too.
    expect(m.usesPermissions.map((p) => p.name)).toEqual(["android.permission.READ_SMS"]);
    expect(m.notes.join("\n")).toMatch(/without android:name ignored/);
  });

  it("marks requests removed with tools:node=\"remove\"", () => {
    const m = read(`<manifest xmlns:android="http://schemas.android.com/apk/res/android" xmlns:tools="http://schemas.android.com/tools" package="org.example.tools">
  <uses-permission android:name="android.permission.READ_PHONE_STATE" tools:node="remove" />
</manifest>`);
    expect(m.usesPermissions[0].removedByTools).toBe(true);
  });

  it("reads UTF-16 text with a byte-order mark", () => {
    const text = `<manifest xmlns:android="http://schemas.android.com/apk/res/android" package="org.example.wide"><application android:label="Ünïcode"/></manifest>`;
    const bytes = new Uint8Array(2 + text.length * 2);
    bytes[0] = 0xff;
    bytes[1] = 0xfe;
    for (let i = 0; i < text.length; i++) new DataView(bytes.buffer).setUint16(2 + 2 * i, text.charCodeAt(i), true);
    expect(readManifestBytes(bytes).label).toBe("Ünïcode");
  });

  it("refuses a document type declaration, never expanding entities", () => {
    const bomb = `<?xml version="1.0"?>
<!DOCTYPE lolz [<!ENTITY lol "lol"><!ENTITY lol2 "&lol;&lol;&lol;&lol;">]>
<manifest package="&lol2;"/>`;
    expect(() => parsePlainXml(enc(bomb))).toThrow(PlainXmlError);
    expect(() => parsePlainXml(enc(bomb))).toThrow(/line 2: document type declarations are not allowed/);
  });

  it("refuses an external entity", () => {
    const xxe = `<!DOCTYPE m [<!ENTITY x SYSTEM "file:///etc/passwd">]><manifest package="&x;"/>`;
    expect(() => parsePlainXml(enc(xxe))).toThrow(PlainXmlError);
  });

  it("refuses nesting deeper than MAX_DEPTH", () => {
    const deep = `${"<a>".repeat(300)}${"</a>".repeat(300)}`;
    expect(() => parsePlainXml(enc(deep))).toThrow(LimitError);
  });

  it("reports malformed XML on one line", () => {
    expect(() => parsePlainXml(enc("<manifest><uses-permission></manifest>"))).toThrow(/^not well-formed XML \([^\n]*\)$/);
  });

  it("refuses XML that is not a manifest", () => {
    expect(() => read("<resources/>")).toThrow(ManifestError);
    expect(() => read("<manifest/>")).toThrow(/no package attribute/);
  });
});
