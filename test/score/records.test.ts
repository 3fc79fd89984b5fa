import { describe, expect, it } from "vitest";
import { scoreRecord } from "../../src/score/records.js";
import { readFileSync } from "node:fs";
import { readManifestBytes } from "../../src/extract/read.js";
import { requestedPermissionNames } from "../../src/extract/manifest/model.js";
import { checkIdsTagged } from "../../src/score/registry.js";
import { defaultJudge } from "../helpers/judge.js";
import { APK_DIR } from "../helpers/paths.js";

const record = { id: "org.example.lamp", line: 1, permissions: ["android.permission.INTERNET", "android.permission.READ_SMS"] };

describe("scoreRecord", () => {
  it("finds the category whatever its case, like check -c does", () => {
    for (const name of ["TOOLS", "tools", "Tools"]) expect(scoreRecord(defaultJudge, { ...record, category: name }).category).toBe("TOOLS");
  });

  it("lets an explicit category win over the record's", () => {
    expect(scoreRecord(defaultJudge, { ...record, category: "SOCIAL" }, { category: "education" }).category).toBe("EDUCATION");
  });

  it("falls back to the pooled baseline for a category the baseline lacks, and says so", () => {
    const s = scoreRecord(defaultJudge, { ...record, category: "Weather" });
    expect(s.category).toBeUndefined();
    expect(s.fallback).toBe("unknown-category");
  });

  it("lists uncommon permissions and scores the risk", () => {
    const s = scoreRecord(defaultJudge, { ...record, category: "TOOLS" });
    expect(s.uncommon).toContain("android.permission.READ_SMS");
    expect(s.sensitiveUncommon).toBeGreaterThanOrEqual(1);
    expect(s.risk).toBeGreaterThan(0);
    expect(["low", "elevated", "high"]).toContain(s.band);
  });

  it("reports at the levels check gives the same findings, so --fail-on applies to records", () => {
    const s = scoreRecord(defaultJudge, { ...record, category: "TOOLS" });
    expect(s.worst).toBe("warning"); // READ_SMS: sensitive-uncommon, a warning by default
    const quiet = scoreRecord(defaultJudge, { ...record, category: "TOOLS" }, { levels: new Map([["sensitive-uncommon", "off"]]) });
    expect(quiet.uncommon).not.toContain("android.permission.READ_SMS");
    expect(quiet.worst).toBeUndefined();
  });
});

describe("a permission list reads the same as a record and as a file", () => {
  // Modern apps (targets 34, permissions newer than the bundled baseline's API-29 era) built by aapt2:
  // fixtures/apk/snapshare.apk (well-behaved) and fixtures/apk/beamtorch.apk (over-asking).
  for (const name of ["snapshare", "beamtorch", "tidewatch-next", "pocketlamp"]) {
    it(`gives ${name} the same uncommon set and risk either way`, () => {
      const manifest = readManifestBytes(readFileSync(`${APK_DIR}${name}.apk`));
      const asFile = defaultJudge.judge(manifest, { category: "TOOLS" });
      const rate = checkIdsTagged("rate");
      // One finding a permission: a rate finding may be folded under a more severe one (`also`).
      const fromFile = asFile.findings.filter((f) => [f.checkId, ...(f.also ?? []).map((a) => a.checkId)].some((id) => rate.has(id))).map((f) => f.subject).sort();
      const asRecord = scoreRecord(defaultJudge, { id: manifest.package, line: 1, category: "TOOLS", permissions: requestedPermissionNames(manifest) });
      expect([...asRecord.uncommon].sort()).toEqual(fromFile);
      expect(asRecord.risk).toBeCloseTo(asFile.risk!.probability, 12);
    });
  }
});
