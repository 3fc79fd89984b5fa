import { describe, expect, it } from "vitest";
import { protectionFromInt, protectionFromText } from "../../src/platform/protection.js";

describe("protection levels", () => {
  // The integer forms are those aapt2 writes into a compiled manifest (attrs.xml of framework-res, API 29:
  // normal 0, dangerous 1, signature 2, privileged 0x10, development 0x20, appop 0x40).
  it("decode the integer form: base level in the low bits, flags above", () => {
    expect(protectionFromInt(0)).toMatchObject({ base: "normal", flags: [] });
    expect(protectionFromInt(1)).toMatchObject({ base: "dangerous", flags: [] });
    expect(protectionFromInt(0x12)).toMatchObject({ base: "signature", flags: ["privileged"] });
    expect(protectionFromInt(0x32).flags).toEqual(["privileged", "development"]);
  });

  it("decode the text form in any order, keeping tokens it does not know", () => {
    expect(protectionFromText("signature|privileged")).toMatchObject({ base: "signature", flags: ["privileged"] });
    expect(protectionFromText("privileged|signature").base).toBe("signature");
    expect(protectionFromText("dangerous").value).toBe(1);
    expect(protectionFromText("signature|madeUpFlag").flags).toContain("madeUpFlag");
  });

  it("agree between the two forms", () => {
    for (const text of ["normal", "dangerous", "signature", "signature|privileged", "signature|privileged|development|appop"]) {
      const t = protectionFromText(text);
      expect(protectionFromInt(t.value)).toMatchObject({ base: t.base, flags: t.flags });
    }
  });
});
