import { describe, expect, it } from "vitest";
import { briefOf, judgeOptionsOf, scoreInput, scoreToLine, setupOf } from "../../../src/ops/sweep/rows.js";
import { defaultJudge } from "../../helpers/judge.js";
import { APK_DIR } from "../../helpers/paths.js";

const input = (file: string) => ({ id: file.split("/").at(-1)!, file, size: 1, mtimeMs: 1 });

describe("one sweep input", () => {
  it("becomes a scored row with its most severe finding in the summary fields", () => {
    const row = scoreInput(defaultJudge, input(`${APK_DIR}beamtorch.apk`), { category: "TOOLS" });
    expect(row.status).toBe("scored");
    expect(row.package).toBe("org.example.beamtorch");
    expect(briefOf(row).worst).toBe(row.counts!.error ? "error" : row.counts!.warning ? "warning" : "note");
  });

  it("becomes a failed row, never an exception, when the file cannot be read; a queue worker names its host", () => {
    const row = scoreInput(defaultJudge, input(`${APK_DIR}no-such.apk`), {}, true, "worker-7");
    expect(row.status).toBe("failed");
    expect(row.error?.message).toBe("no such file (on worker host worker-7)");
  });

  it("is serialised where it was scored, as the output line and its summary", () => {
    const line = scoreToLine(defaultJudge, input(`${APK_DIR}snapshare.apk`), { category: "TOOLS" }, "jsonl");
    expect(JSON.parse(line.line).package).toBe("org.example.snapshare");
    expect(line.package).toBe("org.example.snapshare");
  });

  it("crosses to a worker as plain data and comes back as the same judging options", () => {
    const options = { category: "TOOLS", categoryIndex: new Map([["org.example.a", "GAMES"]]), levels: new Map<string, "off">([["not-seen-in-code", "off"]]), prevalence: 0.1 };
    const setup = setupOf(options, "csv", false);
    expect(JSON.parse(JSON.stringify(setup))).toEqual(setup);
    expect(judgeOptionsOf(setup)).toEqual(options);
  });
});
