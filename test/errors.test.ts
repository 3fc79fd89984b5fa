import { describe, expect, it } from "vitest";
import { ArchiveError, InputError, LimitError, UsageError, withEntry, withFile } from "../src/errors.js";

describe("typed errors", () => {
  it("describe themselves in one line: file, archive entry, problem", () => {
    const e = withFile(withEntry(new ArchiveError("fails its CRC check"), "split_b.apk"), "bundle.apks");
    expect(e.describe()).toBe("bundle.apks: split_b.apk: fails its CRC check");
    expect(e.detail()).toBe("split_b.apk: fails its CRC check");
    expect(e.message).toBe("fails its CRC check"); // the message itself is never rewritten
  });

  it("keep the innermost entry last and the first file given", () => {
    const e = withEntry(withEntry(new InputError("truncated"), "AndroidManifest.xml"), "base.apk");
    expect(e.detail()).toBe("base.apk: AndroidManifest.xml: truncated");
    expect(withFile(withFile(new InputError("x"), "a"), "b").file).toBe("a");
  });

  it("name the limit, the value found and the value allowed", () => {
    const e = new LimitError("MAX_DEPTH", 300, 256, "element nesting depth reaches");
    expect(e.message).toBe("element nesting depth reaches 300; the limit (MAX_DEPTH) is 256");
  });

  it("keep usage errors apart from input errors", () => {
    expect(new UsageError("x")).not.toBeInstanceOf(InputError);
  });
});
