import { describe, expect, it } from "vitest";
import { progressBar } from "../../src/cli/progress.js";

/** A stand-in terminal that keeps what was written to it. */
function terminal(isTTY: boolean) {
  const written: string[] = [];
  return { isTTY, columns: 100, written, write: (s: string) => (written.push(s), true), cursorTo: () => true, clearLine: () => true, moveCursor: () => true, on: () => {}, removeListener: () => {} };
}

describe("the progress bar", () => {
  it("writes nothing to a pipe or a file", () => {
    const t = terminal(false);
    const bar = progressBar(t);
    bar.update("sweeping", 5, 10, "apps");
    bar.stop();
    expect(t.written).toEqual([]);
  });

  it("draws on the stream it was given when that is a terminal, with the label and counts", () => {
    const t = terminal(true);
    const bar = progressBar(t);
    bar.update("sweeping", 0, 10, "apps");
    bar.update("sweeping", 5, 10, "apps");
    bar.stop();
    const text = t.written.join("");
    expect(text).toMatch(/sweeping/);
    expect(text).toMatch(/\/10 apps/);
  });
});
