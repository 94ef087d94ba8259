import { describe, expect, it } from "vitest";
import { awaitingRestress, tailClearance, type ClearanceInput } from "./tail-clearance";

const base: ClearanceInput = {
  ends: "both",
  recordedEnds: ["A", "B"],
  openFlags: [],
  requiredConcreteMPa: 20,
  concreteStrengthMPa: 24,
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
    expect(tailClearance({ ...base, concreteStrengthMPa: null }).reasons).toEqual([
      "Concrete strength not confirmed (20.0 MPa required).",
    ]);
    expect(tailClearance({ ...base, concreteStrengthMPa: 19.9 }).clear).toBe(false);
    expect(tailClearance({ ...base, concreteStrengthMPa: 20 }).clear).toBe(true);
  });

  it("has no concrete gate when the project requires no strength", () => {
    expect(tailClearance({ ...base, requiredConcreteMPa: null, concreteStrengthMPa: null }).clear).toBe(true);
  });

  it("lists every reason at once", () => {
    const c = tailClearance({
      ...base,
      openFlags: [{ kind: "a" }, { kind: "b" }],
      recordedEnds: [],
      concreteStrengthMPa: null,
    });
    expect(c.reasons).toHaveLength(3);
    expect(c.reasons[0]).toBe("2 flags are still open.");
    expect(c.reasons[1]).toBe("No record yet for end A and B.");
  });
});

describe("a detensioned tendon", () => {
  const detensionedAt = ["2026-12-02T15:10:00.000Z"];
  const before = { stressedAt: "2026-12-02T14:00:00.000Z" };
  const after = { stressedAt: "2026-12-02T15:40:00.000Z" };

  it("waits for a record after the detension at every end it is stressed from", () => {
    const records = [
      { tendonEnd: "A" as const, ...before },
      { tendonEnd: "B" as const, ...before },
      { tendonEnd: "A" as const, ...after },
    ];
    expect(awaitingRestress({ ends: "both", detensionedAt, records })).toEqual(["B"]);
    expect(awaitingRestress({ ends: "A", detensionedAt, records })).toEqual([]);
    expect(awaitingRestress({ ends: "both", detensionedAt: [], records })).toEqual([]);
  });

  it("counts from the latest detension when there were several", () => {
    const records = [{ tendonEnd: "A" as const, ...after }];
    expect(
      awaitingRestress({ ends: "A", detensionedAt: [...detensionedAt, "2026-12-02T16:00:00.000Z"], records }),
    ).toEqual(["A"]);
  });

  it("is held with the reason in words until then", () => {
    const c = tailClearance({ ...base, awaitingRestress: ["A", "B"] });
    expect(c.clear).toBe(false);
    expect(c.reasons).toEqual(["Detensioned: restress required (no record since the detension at end A and B)."]);
    expect(tailClearance({ ...base, awaitingRestress: [] }).clear).toBe(true);
  });
});
