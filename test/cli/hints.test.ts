import { describe, expect, it } from "vitest";
import { describeForCli } from "../../src/cli/hints.js";
import { BaselineError, CorpusError, InputError } from "../../src/errors.js";

describe("the CLI's word on a library error", () => {
  it("adds the options to look at for a problem the command line can fix", () => {
    const e = new CorpusError("the labeled rows are all unflagged: no risk model can be learned", { file: "apps.jsonl", code: "labels-one-class" });
    expect(describeForCli(e)).toBe("apps.jsonl: the labeled rows are all unflagged: no risk model can be learned; check --label-field and --positive");
    expect(describeForCli(new BaselineError("holds the same counts as a.json", { file: "a.json", code: "fold-same-baseline" }))).toMatch(/; give each baseline once$/);
  });

  it("leaves any other error as the library worded it", () => {
    expect(describeForCli(new InputError("is empty", { file: "x.apk" }))).toBe("x.apk: is empty");
  });
});
