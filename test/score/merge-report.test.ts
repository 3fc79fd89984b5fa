import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { parseMergeReport } from "../../src/score/merge-report.js";
import { FIXTURES } from "../helpers/paths.js";

describe("the manifest merger's report", () => {
  // fixtures/merge/pocketlamp-merger-report.txt: an invented report in the layout the build writes (see its README).
  const origins = parseMergeReport(readFileSync(`${FIXTURES}merge/pocketlamp-merger-report.txt`, "utf8"));

  it("tells the app's own requests from those libraries add, naming every library", () => {
    expect(origins.get("android.permission.CAMERA")).toEqual({ libraries: [], app: true });
    expect(origins.get("android.permission.READ_PHONE_STATE")).toEqual({ libraries: ["org.example.adnet:adnet-sdk:4.2.0", "org.example.analytics:tally:1.0.3"], app: false });
    expect(origins.get("org.example.adnet.permission.AD_ID")?.libraries).toEqual(["org.example.adnet:adnet-sdk:4.2.0"]);
  });

  it("reads nothing from other elements or from text that is no report", () => {
    expect([...origins.keys()].every((k) => !k.startsWith("application"))).toBe(true);
    expect(parseMergeReport("just some text\nwithout elements\n").size).toBe(0);
  });
});
