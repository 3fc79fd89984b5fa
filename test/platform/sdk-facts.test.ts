import { describe, expect, it } from "vitest";
import { noEffectAt, noEffectFacts, stillUsedBelow } from "../../src/platform/sdk-facts.js";

const P = (s: string) => `android.permission.${s}`;

describe("permissions with no effect at a target SDK", () => {
  it("has a source and a reason for every fact", () => {
    for (const f of noEffectFacts().values()) {
      expect(f.source, f.permission).toMatch(/./);
      expect(f.why, f.permission).toMatch(/./);
    }
  });

  it("knows the Bluetooth split of API 31 and scoped storage of API 30", () => {
    // From memory: Android 12 replaced BLUETOOTH/BLUETOOTH_ADMIN with BLUETOOTH_SCAN/CONNECT/ADVERTISE for
    // apps targeting 31; Android 11's scoped storage leaves WRITE_EXTERNAL_STORAGE without effect at 30.
    expect(noEffectAt(P("BLUETOOTH"), 31)).toBeDefined();
    expect(noEffectAt(P("BLUETOOTH"), 30)).toBeUndefined();
    expect(noEffectAt(P("WRITE_EXTERNAL_STORAGE"), 30)).toBeDefined();
    expect(noEffectAt(P("WRITE_EXTERNAL_STORAGE"), 34, 29)).toBeUndefined(); // limited by maxSdkVersion already
    expect(noEffectAt(P("CAMERA"), 34)).toBeUndefined();
  });

  it("says how long older devices still use a request", () => {
    const f = noEffectAt(P("BLUETOOTH"), 34)!;
    expect(stillUsedBelow(f, 26)).toBe(31);
    expect(stillUsedBelow(f, 31)).toBeUndefined();
  });
});
