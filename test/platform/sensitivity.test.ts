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
