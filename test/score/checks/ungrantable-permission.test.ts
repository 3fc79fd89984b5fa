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
