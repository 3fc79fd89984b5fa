import { describe, expect, it } from "vitest";
import { checkToJson, checkToText, messageOf, type CheckRun } from "../../src/report/check.js";
import { defaultJudge, judgeText, manifestText } from "../helpers/judge.js";

const app = manifestText({ pkg: "org.example.lantern", permissions: ["INTERNET", "READ_SMS", "CAMERA"] });
const runs: CheckRun[] = [
  { file: "lantern.xml", result: judgeText(app, { category: "TOOLS" }, defaultJudge) },
  { file: "broken.apk", error: { kind: "ArchiveError", message: "no end of central directory record (not a zip archive, or truncated)" } },
];
const info = { baseline: "the demo baseline", caution: "Risk figures are statistical associations; not evidence of intent or harm." };

describe("checkToText", () => {
  const text = checkToText(runs, info);

  it("heads each app with its file, category and baseline", () => {
    expect(text).toContain("org.example.lantern");
    expect(text).toMatch(/ {2}file {8}lantern\.xml/);
    expect(text).toMatch(/ {2}category {4}TOOLS/);
    expect(text).toContain("the demo baseline");
  });

  it("words every finding with its check's own message", () => {
    expect(runs[0].result!.findings.length).toBeGreaterThan(0);
    for (const f of runs[0].result!.findings) expect(text.replace(/\s+/g, " ")).toContain(messageOf(f).replace(/\s+/g, " ").slice(0, 40));
  });

  it("leaves an unreadable input to the command's one line on stderr", () => {
    expect(text).not.toContain("broken.apk");
  });

  it("keeps lines within 80 columns, but for the one-line errors", () => {
    for (const line of text.split("\n").filter((l) => !l.startsWith("error "))) expect(line.length).toBeLessThanOrEqual(80);
  });
});

describe("checkToJson", () => {
  const json = JSON.parse(checkToJson(runs, info));

  it("carries the tool, schema version, baseline and caution once", () => {
    expect(json).toMatchObject({ tool: "overask", schemaVersion: 1, baseline: "the demo baseline", caution: info.caution });
  });

  it("gives each finding its message beside its data", () => {
    const f = json.results[0].findings[0];
    expect(typeof f.message).toBe("string");
    expect(f).toHaveProperty("checkId");
    expect(f).toHaveProperty("data");
  });

  it("keeps a failed input as a result with its error", () => {
    expect(json.results[1]).toEqual({ file: "broken.apk", error: runs[1].error });
  });
});
