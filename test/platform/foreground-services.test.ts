import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { serviceTypeNames, SERVICE_TYPES } from "../../src/platform/foreground-services.js";
import { platformPermission } from "../../src/platform/permissions.js";
import { FIXTURES } from "../helpers/paths.js";

describe("foreground-service types", () => {
  it("use the flag values the API 29 framework defines", () => {
    // fixtures/platform/foregroundServiceType.values.txt: `aapt dump --values resources framework-res.apk` (API 29), attr 0x01010599.
    const dump = readFileSync(`${FIXTURES}platform/foregroundServiceType.values.txt`, "utf8");
    const flags = [...dump.matchAll(/\(color\) #([0-9a-f]{8})/g)].map((m) => Number.parseInt(m[1], 16)).slice(1); // the first is the attr's format
    expect(flags.sort((a, b) => a - b)).toEqual([0x1, 0x2, 0x4, 0x8, 0x10, 0x20]);
    for (const f of flags) expect(SERVICE_TYPES.some((t) => t.flag === f)).toBe(true);
  });

  it("require permissions the platform defines", () => {
    for (const t of SERVICE_TYPES) if (t.permission) expect(platformPermission(t.permission), t.name).toBeDefined();
  });

  it("read the names from flags and from text", () => {
    expect(serviceTypeNames(0x8 | 0x40)).toEqual(["location", "camera"]);
    expect(serviceTypeNames("dataSync|location")).toEqual(["dataSync", "location"]);
    expect(serviceTypeNames(0x1 | 0x100000)).toEqual(["dataSync", "0x100000"]);
  });
});
