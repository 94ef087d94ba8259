import { describe, expect, it } from "vitest";
import type { FieldDisposition, FieldFlag } from "@/lib/schemas/sync";
import { noticesFromPull, RELEASED_INSTRUCTION, REOPENED_INSTRUCTION, type PourState } from "./decision-notices";
import { DECISION_INSTRUCTIONS, WAITING_INSTRUCTION } from "./hold-view";

const POUR: PourState = { id: "p1", name: "Level 3 east", release: null, reopened: null };
const TENDONS = new Map([
  ["t1", { id: "t1", tag: "U07", pourId: "p1" }],
  ["t2", { id: "t2", tag: "U02", pourId: "p1" }],
  ["t9", { id: "t9", tag: "X01", pourId: "p9" }],
]);

const flag = (over: Partial<FieldFlag> = {}): FieldFlag => ({
  id: "f1",
  tendonId: "t1",
  kind: "out_of_band",
  status: "open",
  reason: "Measured 14.4 % long against the prediction.",
  createdAt: "2026-12-02T15:00:00.000Z",
  dispositions: [],
  ...over,
});

const restress: FieldDisposition = {
  decision: "restress",
  reasons: "Restress to 3,350 psi and re-read the marks.",
  engineerName: "P. Raman",
  createdAt: "2026-12-02T16:00:00.000Z",
};

function diff(
  before: { pours?: PourState[]; flags?: FieldFlag[] },
  arrived: { pours?: PourState[]; flags?: FieldFlag[] },
) {
  return noticesFromPull({
    before: {
      pours: new Map((before.pours ?? [POUR]).map((p) => [p.id, p])),
      flags: new Map((before.flags ?? []).map((f) => [f.id, f])),
    },
    arrived: { pours: arrived.pours ?? [], flags: arrived.flags ?? [] },
    tendons: TENDONS,
  });
}

describe("noticesFromPull", () => {
  it("tells of a new open flag on a tendon, with its reason and that the crew waits", () => {
    const [notice, ...rest] = diff({}, { flags: [flag()] });
    expect(rest).toEqual([]);
    expect(notice).toMatchObject({
      id: "flag:f1",
      kind: "flag",
      pourId: "p1",
      pourName: "Level 3 east",
      tendonId: "t1",
      tendonTag: "U07",
      what: "New flag: Out of band.",
      words: "Measured 14.4 % long against the prediction.",
      instruction: `Held. ${WAITING_INSTRUCTION}`,
      holds: true,
    });
    // Each thing is said once: "do not cut tails" was written twice in one line.
    expect(notice!.instruction).toBe("Held. Wait for the engineer of record's decision. Do not cut tails.");
    expect(notice!.instruction.match(/do not cut tails/gi)).toHaveLength(1);
  });

  it("tells of a new disposition with the engineer's instruction in words and what to do", () => {
    const notices = diff({ flags: [flag()] }, { flags: [flag({ status: "with_engineer", dispositions: [restress] })] });
    expect(notices).toEqual([
      {
        id: "decision:f1:2026-12-02T16:00:00.000Z:restress",
        kind: "decision",
        pourId: "p1",
        pourName: "Level 3 east",
        tendonId: "t1",
        tendonTag: "U07",
        what: "Engineer's decision on the out of band flag: restress ordered.",
        words: "Restress to 3,350 psi and re-read the marks.",
        by: "P. Raman",
        instruction: DECISION_INSTRUCTIONS.restress,
        holds: true,
        at: "2026-12-02T16:00:00.000Z",
      },
    ]);
  });

  it("gives only the decision when a flag and its decision arrive in the same pull", () => {
    const notices = diff({}, { flags: [flag({ dispositions: [restress] })] });
    expect(notices.map((n) => n.kind)).toEqual(["decision"]);
  });

  it("says nothing when the flag arrives again unchanged, or with only a status change", () => {
    const known = flag({ dispositions: [restress] });
    expect(diff({ flags: [known] }, { flags: [known] })).toEqual([]);
    expect(diff({ flags: [known] }, { flags: [{ ...known, status: "with_engineer" }] })).toEqual([]);
  });

  it("tells of each later decision once, an accept as well", () => {
    const accept: FieldDisposition = {
      ...restress,
      decision: "accept",
      reasons: "Accepted as is.",
      createdAt: "2026-12-02T18:00:00.000Z",
    };
    const notices = diff(
      { flags: [flag({ dispositions: [restress] })] },
      { flags: [flag({ status: "closed", dispositions: [restress, accept] })] },
    );
    expect(notices).toHaveLength(1);
    expect(notices[0]).toMatchObject({
      words: "Accepted as is.",
      instruction: DECISION_INSTRUCTIONS.accept,
      holds: false,
    });
  });

  it("says nothing of a flag that arrives already closed without a decision", () => {
    expect(diff({}, { flags: [flag({ status: "closed" })] })).toEqual([]);
  });

  it("says nothing about pours the tablet did not hold before (a first download)", () => {
    const newPour: PourState = {
      id: "p9",
      name: "Level 4",
      release: { by: "P. Raman", at: "2026-12-02T18:00:00.000Z", statement: "Released." },
      reopened: null,
    };
    expect(diff({}, { pours: [newPour], flags: [flag({ id: "f9", tendonId: "t9" })] })).toEqual([]);
  });

  it("skips a flag of a tendon the tablet does not know", () => {
    expect(diff({}, { flags: [flag({ tendonId: "unknown" })] })).toEqual([]);
  });

  it("tells of a release with the engineer's statement, and not again when the same release comes twice", () => {
    const release = {
      by: "P. Raman",
      at: "2026-12-02T18:00:00.000Z",
      statement: "All 12 tendons in band; released for tail cutting.",
    };
    const released = { ...POUR, release };
    const [notice, ...rest] = diff({}, { pours: [released] });
    expect(rest).toEqual([]);
    expect(notice).toMatchObject({
      id: `released:p1:${release.at}`,
      kind: "released",
      tendonTag: null,
      what: "Pour released by P. Raman.",
      words: release.statement,
      instruction: RELEASED_INSTRUCTION,
    });
    expect(diff({ pours: [released] }, { pours: [released] })).toEqual([]);
  });

  it("tells of a reopening with the reason, and of a second release after it", () => {
    const first = { by: "P. Raman", at: "2026-12-02T18:00:00.000Z", statement: "Released." };
    const reopened = { by: "P. Raman", at: "2026-12-02T19:00:00.000Z", reason: "U07 needs a lift-off check." };
    const [reopen] = diff({ pours: [{ ...POUR, release: first }] }, { pours: [{ ...POUR, reopened }] });
    expect(reopen).toMatchObject({
      kind: "reopened",
      words: "U07 needs a lift-off check.",
      instruction: REOPENED_INSTRUCTION,
    });
    const signed = { ...reopened, by: "P. Raman, P.E." };
    const [byEngineer] = diff({ pours: [{ ...POUR, release: first }] }, { pours: [{ ...POUR, reopened: signed }] });
    expect(byEngineer!.what).toBe("Pour reopened by P. Raman, P.E.");
    const again = { ...first, at: "2026-12-02T20:00:00.000Z" };
    const notices = diff({ pours: [{ ...POUR, reopened }] }, { pours: [{ ...POUR, release: again, reopened }] });
    expect(notices.map((n) => n.kind)).toEqual(["released"]);
  });

  it("lists pour notices first, then tendons by tag", () => {
    const release = { by: "P. Raman", at: "2026-12-02T18:00:00.000Z", statement: "Released." };
    const notices = diff(
      {},
      { pours: [{ ...POUR, release }], flags: [flag(), flag({ id: "f2", tendonId: "t2", kind: "wire_break" })] },
    );
    expect(notices.map((n) => n.tendonTag)).toEqual([null, "U02", "U07"]);
  });
});
