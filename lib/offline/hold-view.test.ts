import { describe, expect, it } from "vitest";
import type { FieldFlag } from "@/lib/schemas/sync";
import { cutClearanceOf, heldUntil, holdsOf, holdSummary, verdictHolds, WAITING_INSTRUCTION } from "./hold-view";

const flag = (over: Partial<FieldFlag>): FieldFlag => ({
  id: crypto.randomUUID(),
  tendonId: "t1",
  kind: "out_of_band",
  status: "open",
  reason: "Measured 14.4 % long against the prediction.",
  createdAt: "2026-12-02T15:00:00.000Z",
  dispositions: [],
  ...over,
});

describe("holdsOf", () => {
  it("keeps only open flags, oldest first, each with why and what to do", () => {
    const holds = holdsOf([
      flag({ kind: "wire_break", createdAt: "2026-12-02T16:00:00.000Z", reason: "One wire broke at end B." }),
      flag({ status: "closed", kind: "calibration_expired" }),
      flag({}),
    ]);
    expect(holds.map((h) => h.kind)).toEqual(["out_of_band", "wire_break"]);
    expect(holds[0]).toMatchObject({
      reason: "Measured 14.4 % long against the prediction.",
      decision: null,
      instruction: WAITING_INSTRUCTION,
    });
  });

  it("says what the engineer's latest disposition asks for", () => {
    const [hold] = holdsOf([
      flag({
        status: "with_engineer",
        dispositions: [
          {
            decision: "liftoff_check",
            reasons: "Check first.",
            engineerName: "P. Raman",
            createdAt: "2026-12-02T16:00:00.000Z",
          },
          {
            decision: "restress",
            reasons: "Restress to 3,350 psi.",
            engineerName: "P. Raman",
            createdAt: "2026-12-02T17:00:00.000Z",
          },
        ],
      }),
    ]);
    expect(hold!.decision).toMatchObject({ decision: "restress", reasons: "Restress to 3,350 psi." });
    expect(hold!.instruction).toMatch(/Restress this tendon/);
  });

  it("works on flags pulled before reasons were synced", () => {
    const old: FieldFlag = { id: "f", tendonId: "t1", kind: "out_of_band", status: "open" };
    expect(holdsOf([old])).toEqual([
      {
        flagId: "f",
        kind: "out_of_band",
        status: "open",
        reason: null,
        decision: null,
        instruction: WAITING_INSTRUCTION,
      },
    ]);
  });
});

describe("holdSummary", () => {
  it("names the ordered work first, then who the tendon waits on, and nothing for a clear tendon", () => {
    expect(holdSummary([])).toBeNull();
    expect(holdSummary(holdsOf([flag({})]))).toBe("waiting for the engineer");
    expect(holdSummary(holdsOf([flag({ status: "with_engineer" })]))).toBe("with the engineer");
    const ordered = flag({
      status: "with_engineer",
      dispositions: [
        {
          decision: "detension_restress",
          reasons: "Slip at the wedges.",
          engineerName: "P. Raman",
          createdAt: "2026-12-02T17:00:00.000Z",
        },
      ],
    });
    expect(holdSummary(holdsOf([flag({}), ordered]))).toBe("detension and restress ordered");
  });
});

describe("holdSummary after the crew's follow-up", () => {
  const order = (decision: "liftoff_check" | "detension_restress", id: string) =>
    flag({
      status: "with_engineer",
      dispositions: [
        { id, decision, reasons: "As instructed.", engineerName: "P. Raman", createdAt: "2026-12-02T16:00:00.000Z" },
      ],
    });
  const check = (over: {
    withinBand?: boolean;
    syncState?: "pending" | "synced" | "rejected";
    checkedAt?: string;
  }) => ({
    dispositionId: "d1",
    checkedAt: "2026-12-02T17:00:00.000Z",
    syncState: "synced" as const,
    ...over,
  });

  it("says the lift-off result once it has come in, not the order again", () => {
    const holds = holdsOf([order("liftoff_check", "d1")]);
    expect(holdSummary(holds)).toBe("lift-off check ordered");
    expect(holdSummary(holds, { liftoffChecks: [check({ syncState: "pending" })] })).toBe(
      "lift-off check waiting to send",
    );
    expect(holdSummary(holds, { liftoffChecks: [check({ withinBand: true })] })).toBe(
      "lift-off within band: engineer to decide",
    );
    // The latest check speaks: outside the band after an earlier one within it.
    expect(
      holdSummary(holds, {
        liftoffChecks: [
          check({ withinBand: false, checkedAt: "2026-12-02T18:00:00.000Z" }),
          check({ withinBand: true }),
        ],
      }),
    ).toBe("lift-off outside band: engineer to decide");
    // A check answering another order does not count.
    expect(holdSummary(holds, { liftoffChecks: [{ ...check({ withinBand: true }), dispositionId: "d0" }] })).toBe(
      "lift-off check ordered",
    );
  });

  it("says a detensioned tendon waits for its restress", () => {
    const holds = holdsOf([order("detension_restress", "d2")]);
    expect(holdSummary(holds, { detensions: [{ dispositionId: "d2" }], awaitingRestress: ["A"] })).toBe(
      "detensioned: restress required",
    );
    expect(holdSummary(holds, { detensions: [{ dispositionId: "d2" }], awaitingRestress: [] })).toBe(
      "detensioned and restressed: waiting for the verdict",
    );
    // Held for the detension even when no flag is open on this tablet.
    expect(holdSummary([], { awaitingRestress: ["B"] })).toBe("detensioned: restress required");
  });
});

describe("cutClearanceOf", () => {
  const clearCase = {
    tendon: { ends: "both" as const },
    records: [
      { tendonEnd: "A" as const, syncState: "synced" as const },
      { tendonEnd: "B" as const, syncState: "synced" as const },
    ],
    flags: [flag({ status: "closed" })],
    heldOnTablet: false,
    project: { requiredConcreteMPa: 20, unitSystem: "si" as const },
    pour: { concreteStrengthMPa: 25 },
  };

  it("is clear when the server has both ends, every flag is closed and the concrete gate is met", () => {
    expect(cutClearanceOf(clearCase)).toEqual({ clear: true, reasons: [] });
  });

  it("holds a tendon with an open flag", () => {
    expect(cutClearanceOf({ ...clearCase, flags: [flag({})] }).clear).toBe(false);
  });

  it("holds while a record waits to be sent, even with both ends read", () => {
    const c = cutClearanceOf({
      ...clearCase,
      records: [clearCase.records[0]!, { tendonEnd: "B", syncState: "pending" }],
    });
    expect(c.clear).toBe(false);
    expect(c.reasons).toContain("No record yet for end B.");
  });

  it("holds when the tablet's own check is out of band and no flag came yet", () => {
    expect(cutClearanceOf({ ...clearCase, heldOnTablet: true }).reasons).toEqual([
      "This tablet's own check puts the tendon out of band.",
    ]);
  });

  it("holds while the concrete strength is below the requirement or the gate was never pulled", () => {
    expect(cutClearanceOf({ ...clearCase, pour: { concreteStrengthMPa: 15 } }).clear).toBe(false);
    expect(cutClearanceOf({ ...clearCase, project: { unitSystem: "si" } }).clear).toBe(false);
  });

  it("says the strengths in the project's units: psi on a US project", () => {
    // 1 psi = 0.006894757 MPa (NIST SP 811): 15 MPa = 2,175.6 psi, 20.684 MPa = 2,999.9 psi.
    const us = cutClearanceOf({
      ...clearCase,
      project: { requiredConcreteMPa: 20.684, unitSystem: "us" },
      pour: { concreteStrengthMPa: 15 },
    });
    expect(us.reasons).toEqual(["Confirmed concrete strength 2,176 psi is below the 3,000 psi required."]);
  });
});

describe("verdictHolds", () => {
  it("takes the tablet's expected flags until the server has judged, then the server's", () => {
    const local = { flagKinds: ["under_force"] };
    expect(verdictHolds({ settled: false, server: undefined, local })).toEqual(["under_force"]);
    expect(verdictHolds({ settled: false, server: { flagKinds: ["wire_break"] }, local })).toEqual(["wire_break"]);
    // The server judged and raised nothing: the tablet's expectation no longer holds the tendon.
    expect(verdictHolds({ settled: false, server: { flagKinds: [] }, local })).toEqual([]);
  });

  it("holds nothing once every flag is closed by a decision, and nothing without a verdict", () => {
    expect(verdictHolds({ settled: true, server: { flagKinds: ["out_of_band"] }, local: null })).toEqual([]);
    expect(verdictHolds({ settled: false, server: null, local: null })).toEqual([]);
  });
});

describe("heldUntil", () => {
  const decided = (decision: "restress" | "accept" | "replace") => ({
    decision,
    reasons: "As discussed on site.",
    engineerName: "P. Raman",
    createdAt: "2026-12-02T16:00:00.000Z",
  });

  it("waits for a disposition while no flag has one, and on the tablet's own check", () => {
    expect(heldUntil(holdsOf([flag({})]))).toBe(
      "Do not cut the tails or grout until the engineer of record gives a disposition.",
    );
    expect(heldUntil([])).toMatch(/until the engineer of record gives a disposition/);
  });

  it("says what the disposition orders once it has come, not that one is awaited", () => {
    const words = heldUntil(holdsOf([flag({ status: "with_engineer", dispositions: [decided("restress")] })]));
    expect(words).toMatch(/^The engineer of record's disposition: restress ordered\. Restress this tendon/);
    expect(words).not.toMatch(/gives a disposition/);
    // An order on one flag is said even while another flag still waits for its own.
    const both = holdsOf([
      flag({ kind: "wire_break", createdAt: "2026-12-02T14:00:00.000Z" }),
      flag({ dispositions: [decided("replace")] }),
    ]);
    expect(heldUntil(both)).toMatch(/disposition: replacement ordered/);
  });

  it("with every disposition an acceptance, names what is left: the flag's closing at the next sync", () => {
    const words = heldUntil(holdsOf([flag({ dispositions: [decided("accept")] })]));
    expect(words).toMatch(/^Accepted by the engineer of record: the hold lifts when the next sync closes the flag/);
    expect(words).not.toMatch(/gives a disposition/);
  });
});
