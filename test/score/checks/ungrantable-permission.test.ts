import { describe, expect, it } from "vitest";
import { findingsOf, manifestText } from "../../helpers/judge.js";

describe("ungrantable-permission", () => {
  it("fires for signature and privileged platform permissions", () => {
    // Levels from the platform table (API 34): INSTALL_PACKAGES signature|privileged, WRITE_SECURE_SETTINGS signature|privileged|development|role|installer.
    const f = findingsOf("ungrantable-permission", manifestText({ permissions: ["INSTALL_PACKAGES", "WRITE_SECURE_SETTINGS", "CAMERA"] }));
    expect(f.map((x) => [x.subject, x.data.role])).toEqual([
      ["android.permission.INSTALL_PACKAGES", false],
      ["android.permission.WRITE_SECURE_SETTINGS", true],
    ]);
  });

  it("does not fire for app-op permissions a user can grant as special access", () => {
    // SYSTEM_ALERT_WINDOW and REQUEST_INSTALL_PACKAGES carry the appop flag (platform table).
    expect(findingsOf("ungrantable-permission", manifestText({ permissions: ["SYSTEM_ALERT_WINDOW", "REQUEST_INSTALL_PACKAGES"] }))).toEqual([]);
  });
});

describe("ungrantable-permission: the ways a store app can still get one", () => {
  it("says when a role gives it, or the user can grant it over adb, and keeps 'ignored' for the rest", async () => {
    const { wordFinding } = await import("../../../src/report/messages.js");
    // Flags from the platform table (API 34): WRITE_SECURE_SETTINGS is signature|privileged|development|role|installer,
    // READ_LOGS signature|privileged|development, INSTALL_PACKAGES signature|privileged.
    const f = findingsOf("ungrantable-permission", manifestText({ permissions: ["WRITE_SECURE_SETTINGS", "READ_LOGS", "INSTALL_PACKAGES"] }));
    const msg = (p: string) => wordFinding(f.find((x) => x.subject === `android.permission.${p}`)!);
    expect(msg("WRITE_SECURE_SETTINGS")).toMatch(/system role .* over adb/);
    expect(msg("READ_LOGS")).toMatch(/over adb/);
    expect(msg("READ_LOGS")).not.toMatch(/ignored/);
    expect(msg("INSTALL_PACKAGES")).toMatch(/a store app's request is ignored$/);
  });
});
