import { describe, expect, it } from "vitest";
import { gatesOf, tripsGate, worstOf } from "../../src/score/gates.js";

describe("gates", () => {
  it("trip on a finding at or above --fail-on, and not below it", () => {
    expect(tripsGate({ worst: "warning" }, { failOn: "warning" })).toBe(true);
    expect(tripsGate({ worst: "error" }, { failOn: "warning" })).toBe(true);
    expect(tripsGate({ worst: "note" }, { failOn: "warning" })).toBe(false);
    expect(tripsGate({}, { failOn: "note" })).toBe(false);
  });

  it("trip on a risk above --max-risk, not at it", () => {
    expect(tripsGate({ risk: 0.31 }, { maxRisk: 0.3 })).toBe(true);
    expect(tripsGate({ risk: 0.3 }, { maxRisk: 0.3 })).toBe(false);
    expect(tripsGate({}, { maxRisk: 0 })).toBe(false); // no risk model: nothing to gate on
  });

  it("leave out the gates not set, and find the most severe level", () => {
    expect(gatesOf({})).toEqual({});
    expect(gatesOf({ failOn: "note", maxRisk: 0.5 })).toEqual({ failOn: "note", maxRisk: 0.5 });
    expect(worstOf(["note", "error", "warning"])).toBe("error");
    expect(worstOf([])).toBeUndefined();
  });
});
