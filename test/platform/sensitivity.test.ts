import { describe, expect, it } from "vitest";
import { platformPermission } from "../../src/platform/permissions.js";
import { isDangerous, isSensitive, storeAppCanHold } from "../../src/platform/sensitivity.js";

// Protection levels from the platform's own definitions (src/platform/data, API 34 framework manifest).
describe("sensitivity and store grants", () => {
  it("calls dangerous, app-op and restricted permissions sensitive, and normal ones not", () => {
    expect(isSensitive("android.permission.READ_SMS")).toBe(true); // dangerous, hard-restricted
    expect(isSensitive("android.permission.SYSTEM_ALERT_WINDOW")).toBe(true); // signature|appop
    expect(isSensitive("android.permission.INTERNET")).toBe(false); // normal
    expect(isSensitive("org.example.permission.OWN")).toBe(false); // not the platform's
    expect(isDangerous("android.permission.CAMERA")).toBe(true);
  });

  it("lets a store app hold normal, dangerous and app-op permissions only", () => {
    expect(storeAppCanHold(platformPermission("android.permission.INTERNET")!)).toBe(true);
    expect(storeAppCanHold(platformPermission("android.permission.CAMERA")!)).toBe(true);
    expect(storeAppCanHold(platformPermission("android.permission.SYSTEM_ALERT_WINDOW")!)).toBe(true);
    expect(storeAppCanHold(platformPermission("android.permission.INSTALL_PACKAGES")!)).toBe(false); // signature|privileged
  });
});

describe("the sensitivity table", () => {
  it("has a row with what it gives and why for every dangerous, app-op or restricted permission", async () => {
    const { platformPermissions } = await import("../../src/platform/permissions.js");
    const { sensitivityOf } = await import("../../src/platform/sensitivity.js");
    for (const p of platformPermissions().values()) {
      if (p.base !== "dangerous" && !p.flags.includes("appop") && !p.hardRestricted && !p.softRestricted) continue;
      const s = sensitivityOf(p.name);
      expect(s, p.name).toBeDefined();
      expect(s!.gives.length, p.name).toBeGreaterThan(8);
      expect(s!.reason.length, p.name).toBeGreaterThan(4);
    }
  });

  it("leaves out the permissions that give no access to data, and says what READ_SMS gives", async () => {
    const { sensitivityOf } = await import("../../src/platform/sensitivity.js");
    expect(isSensitive("android.permission.POST_NOTIFICATIONS")).toBe(false);
    expect(isSensitive("android.permission.READ_MEDIA_VISUAL_USER_SELECTED")).toBe(false);
    expect(isSensitive("android.permission.READ_MEDIA_IMAGES")).toBe(true);
    expect(sensitivityOf("android.permission.READ_SMS")?.gives).toBe("reads the user's text messages");
  });
});
