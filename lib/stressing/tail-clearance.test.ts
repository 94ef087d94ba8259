import { describe, expect, it } from "vitest";
import { tailClearance, type ClearanceInput } from "./tail-clearance";

const base: ClearanceInput = {
  ends: "both",
  recordedEnds: ["A", "B"],
  openFlags: [],
  requiredConcreteMpa: 20,
  concreteStrengthMpa: 24,
};

describe("tailClearance", () => {
  it("is clear when every flag is closed, every end recorded and the concrete gate met", () => {
    expect(tailClearance(base)).toEqual({ clear: true, reasons: [] });
  });

  it("holds a tendon with an open flag", () => {
    const c = tailClearance({ ...base, openFlags: [{ kind: "wire_break" }] });
    expect(c.clear).toBe(false);
    expect(c.reasons).toEqual(["1 flag is still open."]);
  });

  it("holds a two-end tendon with one end unrecorded, naming the end", () => {
    const c = tailClearance({ ...base, recordedEnds: ["A"] });
    expect(c).toEqual({ clear: false, reasons: ["No record yet for end B."] });
  });

  it("needs only the scheduled end of a one-end tendon", () => {
    expect(tailClearance({ ...base, ends: "B", recordedEnds: ["B"] }).clear).toBe(true);
    expect(tailClearance({ ...base, ends: "A", recordedEnds: [] }).reasons).toEqual(["No record yet for end A."]);
  });

  it("holds while the concrete strength is unconfirmed or below the requirement, and passes at equality", () => {
    expect(tailClearance({ ...base, concreteStrengthMpa: null }).reasons).toEqual([
      "Concrete strength not confirmed (20.0 MPa required).",
    ]);
    expect(tailClearance({ ...base, concreteStrengthMpa: 19.9 }).clear).toBe(false);
    expect(tailClearance({ ...base, concreteStrengthMpa: 20 }).clear).toBe(true);
  });

  it("has no concrete gate when the project requires no strength", () => {
    expect(tailClearance({ ...base, requiredConcreteMpa: null, concreteStrengthMpa: null }).clear).toBe(true);
  });

  it("lists every reason at once", () => {
    const c = tailClearance({
      ...base,
      openFlags: [{ kind: "a" }, { kind: "b" }],
      recordedEnds: [],
      concreteStrengthMpa: null,
    });
    expect(c.reasons).toHaveLength(3);
    expect(c.reasons[0]).toBe("2 flags are still open.");
    expect(c.reasons[1]).toBe("No record yet for end A and B.");
  });
});
