import { spawn } from "node:child_process";
import { describe, expect, it } from "vitest";
import { APK_DIR, ROOT } from "../helpers/paths.js";

describe("the overask command in a pipeline", () => {
  it("ends quietly when the reader closes the pipe early (`| head`)", async () => {
    // Long output: facts on many copies of the same APK, read for one chunk only.
    const files = Array.from({ length: 200 }, () => `${APK_DIR}pocketlamp.apk`);
    const child = spawn(process.execPath, [`${ROOT}bin/overask.js`, "facts", ...files], { stdio: ["ignore", "pipe", "pipe"] });
    let stderr = "";
    child.stderr.on("data", (d) => (stderr += d));
    child.stdout.once("data", () => child.stdout.destroy());
    const code = await new Promise<number | null>((done) => child.on("close", done));
    expect(stderr).toBe("");
    expect(code).toBe(0);
  });
});
